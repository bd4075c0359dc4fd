package dev.erg.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.device.DeviceLoader;
import dev.erg.estimate.Energy.Destination;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The energy ladder (docs/method.md, "The energy ladder"): one model and one layer set on the five
 * edge22 presets, which share one technology's numbers (typical 22 nm figures, from memory). Each
 * step must lower the energy per MAC and move the dominant destination the way the rules of the
 * trade say (check-values.md, "Rules of thumb of the trade"; common practice, no single source):
 * <ol>
 *   <li>8-bit without reuse: about 500 fJ per MAC, most of it in memory (four accesses per MAC);</li>
 *   <li>reuse moves the dominant cost from memory to compute;</li>
 *   <li>binary (+1/-1) operands turn the multiply into an XNOR and cut both compute and memory;</li>
 *   <li>analog accumulation is about ten times cheaper than the digital adder tree;</li>
 *   <li>compute in memory removes the weight fetch, and memory or conversion dominates again.</li>
 * </ol>
 * The energy per MAC here is the datapath's: compute, registers, SRAM, conversion, cell writes and
 * row drive over the MACs. The frame's DRAM transfer of the model's input and output and static
 * power are left out (the presets set static power to 0): the rules speak of the MAC datapath.
 */
class EnergyLadderTest {
    private static final String[] STEPS = {"edge22-no-reuse", "edge22-reuse", "edge22-xnor", "edge22-analog",
        "edge22-in-memory"};
    private static ModelWorkload layers;
    private static final Map<Destination, Double>[] PER_MAC = perMacArray();

    @SuppressWarnings("unchecked")
    private static Map<Destination, Double>[] perMacArray() {
        return new Map[STEPS.length];
    }

    /** Three fully connected layers of 512 x 512 on 256 positions: 3 x 67 108 864 MACs. */
    @BeforeAll
    static void run() {
        layers = Models.analyze(new OnnxWriter.Graph("ladder")
                .input("x", ElemType.FLOAT, 256, 512)
                .weight("w1", ElemType.FLOAT, 512, 512)
                .weight("w2", ElemType.FLOAT, 512, 512)
                .weight("w3", ElemType.FLOAT, 512, 512)
                .node("MatMul", "fc1", List.of("x", "w1"), List.of("h1"))
                .node("MatMul", "fc2", List.of("h1", "w2"), List.of("h2"))
                .node("MatMul", "fc3", List.of("h2", "w3"), List.of("y"))
                .output("y", ElemType.FLOAT));
        for (int i = 0; i < STEPS.length; i++) {
            DeviceEstimate e = Estimator.estimate(layers, DeviceLoader.load("preset:" + STEPS[i], null));
            Map<Destination, Double> m = new EnumMap<>(Destination.class);
            for (Destination d : Destination.values()) {
                if (d != Destination.DRAM && d != Destination.STATIC) {
                    m.put(d, e.energy().of(d) / layers.macs() / 1e-15);
                }
            }
            PER_MAC[i] = m;
        }
    }

    static double total(int step) {
        return PER_MAC[step].values().stream().mapToDouble(Double::doubleValue).sum();
    }

    static Destination dominant(int step) {
        Destination best = null;
        for (Map.Entry<Destination, Double> e : PER_MAC[step].entrySet()) {
            if (best == null || e.getValue() > PER_MAC[step].get(best)) {
                best = e.getKey();
            }
        }
        return best;
    }

    static double memory(int step) {
        return PER_MAC[step].get(Destination.REGISTERS) + PER_MAC[step].get(Destination.SRAM);
    }

    /** Each step of the ladder lowers the datapath energy per MAC. */
    @Test
    void everyStepLowersTheEnergyPerMac() {
        for (int i = 1; i < STEPS.length; i++) {
            assertTrue(total(i) < total(i - 1), STEPS[i] + " " + total(i) + " fJ/MAC vs " + STEPS[i - 1] + " "
                    + total(i - 1));
        }
    }

    /**
     * 8-bit, no reuse: three operand-width SRAM reads and one write per MAC: 50 + 4 x 110 = 490 fJ, about
     * 500 fJ per MAC, most of it in memory (check-values.md, rules of the trade: "roughly 500 fJ per MAC,
     * most of it in the memory accesses"; common practice, no single source).
     */
    @Test
    void noReuseIsAbout500FjMostlyMemory() {
        assertEquals(490, total(0), 1e-6);
        assertTrue(total(0) > 400 && total(0) < 600, "about 500 fJ per MAC");
        assertEquals(Destination.SRAM, dominant(0));
        assertTrue(memory(0) > 0.5 * total(0), "most of it in memory");
    }

    /** Reuse moves the dominant share from memory to compute (rule of the trade; common practice, no single source). */
    @Test
    void reuseMovesTheDominantShareToCompute() {
        assertEquals(Destination.COMPUTE, dominant(1));
        assertTrue(PER_MAC[1].get(Destination.COMPUTE) > memory(1), "compute outweighs registers and SRAM together");
        assertTrue(memory(1) < memory(0) / 10);
    }

    /**
     * Binary operands turn the multiply into an XNOR: compute falls by more than ten times and memory
     * falls too ("binary cuts both"); with the arithmetic this cheap, memory dominates again.
     */
    @Test
    void binaryCutsComputeAndMemory() {
        assertTrue(PER_MAC[2].get(Destination.COMPUTE) < PER_MAC[1].get(Destination.COMPUTE) / 10);
        assertTrue(memory(2) < memory(1));
        assertEquals(Destination.SRAM, dominant(2));
    }

    /**
     * Analog accumulation is about ten times more efficient than a digital adder tree (rule of the trade;
     * common practice, no single source). The adder share per product: the popcount share on the XNOR
     * array against the analog column sum (the digital add of read-outs longer than a column is its own
     * term, taken out here, and is small). The ratio is the profiles' own numbers carried through.
     */
    @Test
    void analogAccumulationCutsTheAdderShareAboutTenfold() {
        DeviceEstimate xnor = Estimator.estimate(layers, DeviceLoader.load("preset:edge22-xnor", null));
        DeviceEstimate analog = Estimator.estimate(layers, DeviceLoader.load("preset:edge22-analog", null));
        long macs = layers.macs();
        long partialAdds = 0;
        for (NodeEstimate n : analog.nodes()) {
            partialAdds += n.partialAdds();
        }
        // 3 layers x 256 positions x 512 outputs x (ceil(512 / 64) - 1) = 7 read-outs added per output.
        assertEquals(3L * 256 * 512 * 7, partialAdds);
        double digitalAdder = xnor.energy().accumulation() / macs;
        double analogAdder = (analog.energy().accumulation() - partialAdds * 15e-15) / macs;
        assertEquals(1e-15, digitalAdder, 1e-24);
        assertEquals(0.1e-15, analogAdder, 1e-24);
        double ratio = digitalAdder / analogAdder;
        assertTrue(ratio > 8 && ratio < 12, "about tenfold: " + ratio);
        assertTrue(analog.energy().accumulation() < xnor.energy().accumulation() / 3, "read-outs included");
        assertTrue(PER_MAC[3].get(Destination.CONVERSION) > 0, "analog sums are converted");
    }

    /**
     * Computing in memory removes the weight fetch (no register traffic, no SRAM weight reads, no DRAM
     * weight reads: the weights stay in the cells), and then conversion dominates, as the trade expects of
     * such macros ("memory or conversion dominates again").
     */
    @Test
    void inMemoryRemovesTheWeightFetchAndConversionDominates() {
        DeviceEstimate e = Estimator.estimate(layers, DeviceLoader.load("preset:edge22-in-memory", null));
        assertFalse(e.weightsReloadedEachFrame());
        for (NodeEstimate n : e.nodes()) {
            assertEquals(0, n.registerReadBytes() + n.registerWriteBytes(), n.name());
            assertFalse(n.weightsReloaded(), n.name());
            assertEquals(0, n.cellWrites(), n.name());
        }
        assertEquals(0, PER_MAC[4].get(Destination.REGISTERS));
        assertTrue(PER_MAC[4].get(Destination.SRAM) < PER_MAC[3].get(Destination.SRAM) / 5);
        assertEquals(Destination.CONVERSION, dominant(4));
        Destination d = dominant(4);
        assertTrue(d == Destination.CONVERSION || d == Destination.SRAM || d == Destination.REGISTERS);
    }
}
