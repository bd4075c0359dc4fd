package dev.erg.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The cpu engine kind on examples small enough to work by hand (docs/method.md, section 10: every
 * number below is derived there too). Rates are the profile's; the mapping is the roofline of Williams,
 * Waterman, Patterson (CACM 2009) with the caches as the on-chip levels.
 */
class CpuEngineTest {
    private static final double EPS = 1e-12;

    /**
     * Worked example 9: x [64, 256] x w [256, 128] in fp32 on preset:host-2core-example (2 cores x 16 fp32
     * MACs per cycle at 2.4 GHz; L1 64 KiB, L2 2 MiB at 64 B/cycle, L3 8 MiB; DRAM 20 GB/s; 2400 cycles per
     * layer; no energies).
     */
    @Test
    void workedExampleOnTheTwoCoreHost() {
        ModelWorkload w = Models.analyze(Models.matmul(64, 256, 128));
        DeviceProfile d = DeviceLoader.load("preset:host-2core-example", null);
        DeviceEstimate e = Estimator.estimate(w, d);
        NodeEstimate m = Models.only(e, "MatMul");
        assertEquals(2_097_152, m.work().macs());
        assertEquals(65_536, m.computeCycles());            // 2 097 152 / (2 x 16)
        assertEquals(1.0, m.utilization(), EPS);
        assertEquals(65_536 + 131_072, m.sramReadBytes());  // x once, w once
        assertEquals(32_768, m.sramWriteBytes());           // y once
        assertEquals("l2", m.onChipLevel());                // working set 229 376 B: over L1, within L2
        assertEquals(65_536 / 2.4e9, m.computeSeconds(), EPS);
        assertEquals(229_376 / (64 * 2.4e9), m.sramSeconds(), EPS);
        assertTrue(e.weightsResident());                    // 131 072 + 98 304 B within the 8 MiB L3
        assertEquals(65_536, m.dramReadBytes());            // x, the graph input
        assertEquals(32_768, m.dramWriteBytes());           // y, the graph output
        assertEquals(98_304 / 20e9, m.dramSeconds(), EPS);
        assertEquals(Bound.COMPUTE, m.bound());
        assertEquals(65_536 / 2.4e9 + 2400 / 2.4e9, e.latencySeconds(), EPS); // 28.3067 us
        // no energies in the profile: energy is unknown, not zero
        assertFalse(d.energyKnown());
        assertFalse(e.energyKnown());
        assertFalse(m.energyKnown());
        assertTrue(Double.isNaN(e.energyPerFrameJoules()));
        assertTrue(Double.isNaN(e.averagePowerWatts(10)));
        assertTrue(Double.isNaN(e.opsPerWatt()));
        assertTrue(e.assumptions().contains("the profile gives no energies: energy and power are unknown"),
                e.assumptions().toString());
    }

    /**
     * A cache keeps what was touched last (least recently used out first: common practice, no single
     * source), not what the next frame will need. Four MatMuls x [1024, 512] x w [512, 512] in fp32 on
     * preset:host-2core-example (L3 8 MiB): the weights (4 MiB) and the peak of live activations (input and
     * output of one layer, 4 MiB) fit in the L3 together, but a frame writes 8 MiB of activations besides
     * its 2 MiB input, so by the next frame the weights have left the cache: each layer reads its 1 MiB of
     * weights from DRAM.
     */
    @Test
    void aCacheKeepsTheWeightsOnlyWhenAFramesDataFits() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("chain").input("x0", ElemType.FLOAT, 1024, 512);
        for (int i = 1; i <= 4; i++) {
            g.weight("w" + i, ElemType.FLOAT, 512, 512)
                    .node("MatMul", "mm" + i, List.of("x" + (i - 1), "w" + i), List.of("x" + i));
        }
        g.output("x4", ElemType.FLOAT);
        DeviceEstimate e = Estimator.estimate(Models.analyze(g), DeviceLoader.load("preset:host-2core-example", null));
        assertEquals(4L << 20, e.activationPeakBytes());
        assertFalse(e.weightsResident());
        NodeEstimate mm2 = e.nodes().get(1);
        assertEquals("mm2", mm2.name());
        assertEquals(1L << 20, mm2.dramReadBytes());         // its weights, every frame
        assertTrue(e.assumptions().stream().anyMatch(a -> a.contains("exceed the last cache 'l3'")),
                e.assumptions().toString());
        // With two layers, 2 MiB of weights and 6 MiB of activations (the input included) fill the 8 MiB: they stay.
        OnnxWriter.Graph two = new OnnxWriter.Graph("two").input("x0", ElemType.FLOAT, 1024, 512);
        for (int i = 1; i <= 2; i++) {
            two.weight("w" + i, ElemType.FLOAT, 512, 512)
                    .node("MatMul", "mm" + i, List.of("x" + (i - 1), "w" + i), List.of("x" + i));
        }
        two.output("x2", ElemType.FLOAT);
        DeviceEstimate t = Estimator.estimate(Models.analyze(two), DeviceLoader.load("preset:host-2core-example", null));
        assertTrue(t.weightsResident());
        assertEquals(0, t.nodes().get(1).dramReadBytes());
    }

    /** An elementwise node runs on the same cores, at the ops rate: Relu of 64 x 256 fp32 = 16 384 ops / 32. */
    @Test
    void vectorWorkRunsOnTheSameCores() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("relu")
                .input("x", ElemType.FLOAT, 64, 256)
                .node("Relu", "relu", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT);
        DeviceEstimate e = Estimator.estimate(Models.analyze(g), DeviceLoader.load("preset:host-2core-example", null));
        NodeEstimate r = Models.only(e, "Relu");
        assertEquals("cpu", r.engine());
        assertEquals(512, r.computeCycles());
        assertEquals("l2", r.onChipLevel()); // 128 KiB in and out: over the 64 KiB L1
    }

    /**
     * Unlisted precisions: a narrower operand runs in the lanes of the narrowest listed precision at least
     * as wide (int4 and w4a8 as int8); a wider one in the widest listed lanes, holding fewer elements
     * (int16 at 32 x 8/16); floats from floats (common practice, no single source: SIMD lanes hold
     * register width / element width elements).
     */
    @Test
    void unlistedPrecisionsTakeTheLanesOfAListedOne() {
        Map<String, Double> t = Map.of("fp32", 16.0, "int8", 32.0);
        assertEquals(32, Engine.Cpu.rate(t, "int4").perCycle(), EPS);
        assertEquals("int8", Engine.Cpu.rate(t, "w4a8").from());
        assertEquals(16, Engine.Cpu.rate(t, "int16").perCycle(), EPS);
        assertEquals(16, Engine.Cpu.rate(t, "fp16").perCycle(), EPS);
        assertEquals(8, Engine.Cpu.rate(t, "fp64").perCycle(), EPS);
        assertEquals(16, Engine.Cpu.rate(Map.of("fp32", 16.0), "int8").perCycle(), EPS); // the other family
    }

    /** The profile of worked example 10: one core, with energies (invented round numbers). */
    private static DeviceProfile smallHost() {
        return Profiles.load(String.join("\n",
                "name: small host",
                "clock-mhz: 1000",
                "engines:",
                "  - id: core",
                "    kind: cpu",
                "    cores: 1",
                "    macs-per-cycle-per-core: { fp32: 8 }",
                "    mac-energy-pj: { fp32: 1 }",
                "    op-energy-fj: { fp32: 100 }",
                "memories:",
                "  - id: l1",
                "    level: cache",
                "    capacity-kib: 32",
                "    bytes-per-cycle: 64",
                "    read-energy-fj-per-byte: 50",
                "    write-energy-fj-per-byte: 50",
                "  - id: l2",
                "    level: cache",
                "    capacity-mib: 1",
                "    bytes-per-cycle: 32",
                "    read-energy-fj-per-byte: 200",
                "    write-energy-fj-per-byte: 200",
                "  - id: dram",
                "    gbytes-per-second: 10",
                "    read-energy-pj-per-byte: 20",
                "    write-energy-pj-per-byte: 20",
                ""));
    }

    /** Vector work on a processor with energies is priced at its op energy: Relu of 16 x 64 = 1024 ops x 100 fJ. */
    @Test
    void vectorOpsArePricedAtTheOpEnergy() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("relu")
                .input("x", ElemType.FLOAT, 16, 64)
                .node("Relu", "relu", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT);
        NodeEstimate r = Models.only(Estimator.estimate(Models.analyze(g), smallHost()), "Relu");
        assertEquals(128, r.computeCycles()); // 1024 / 8
        assertEquals(102.4e-15 * 1000, r.energy().compute(), 1e-18);
    }

    /**
     * Worked example 10: with energies, the split works as on an accelerator. x [16, 64] x w [64, 32] fp32 on
     * one core of 8 fp32 MACs per cycle at 1 GHz, MAC 1 pJ, L1 32 KiB at 50 fJ/B, DRAM 20 pJ/B (invented
     * round numbers): 4096 cycles; 14 336 B through L1 (the working set fits it); 6144 B of DRAM.
     */
    @Test
    void withEnergiesTheSplitIsPriced() {
        DeviceProfile d = smallHost();
        DeviceEstimate e = Estimator.estimate(Models.analyze(Models.matmul(16, 64, 32)), d);
        NodeEstimate m = Models.only(e, "MatMul");
        assertTrue(e.energyKnown());
        assertEquals(4096, m.computeCycles());
        assertEquals("l1", m.onChipLevel());
        assertEquals(12_288, m.sramReadBytes());
        assertEquals(2048, m.sramWriteBytes());
        assertEquals(6144, m.dramReadBytes() + m.dramWriteBytes());
        assertEquals(4.096e-6, e.latencySeconds(), EPS);
        assertEquals(32.768e-9, e.energy().compute(), 1e-18);
        assertEquals(0.7168e-9, e.energy().sram(), 1e-18);
        assertEquals(122.88e-9, e.energy().dram(), 1e-18);
        assertEquals(156.3648e-9, e.energyPerFrameJoules(), 1e-18);
    }
}
