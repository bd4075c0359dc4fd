package dev.erg.calibrate;

import dev.erg.workload.OpClass;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The fit on synthetic data: factors chosen here, measurements generated from them through the
 * latency and energy equations of docs/method.md, and the fit must return the same factors. A
 * least-squares fit recovers exactly the parameters that generated noise-free data from an
 * identifiable model (common practice, no single source).
 */
class CalibratorTest {
    @TempDir
    Path dir;

    /** The factors the data is generated from (invented for this test). */
    static Map<Factor, Double> truth() {
        Map<Factor, Double> t = new EnumMap<>(Factor.class);
        t.put(Factor.EFFICIENCY_DENSE_CONV, 0.42);
        t.put(Factor.EFFICIENCY_GROUPED_CONV, 0.09);
        t.put(Factor.EFFICIENCY_MATMUL, 0.63);
        t.put(Factor.EFFICIENCY_MATRIX_VECTOR, 0.17);
        t.put(Factor.EFFICIENCY_VECTOR, 0.21);
        t.put(Factor.LAYER_OVERHEAD, 7e-6);
        t.put(Factor.DRAM_BANDWIDTH_SCALE, 0.55);
        t.put(Factor.ENERGY_SCALE_COMPUTE, 1.3);
        t.put(Factor.ENERGY_SCALE_ON_CHIP, 0.7);
        t.put(Factor.ENERGY_SCALE_DRAM, 2.1);
        t.put(Factor.STATIC_POWER, 4.5e-3);
        return t;
    }

    /** A model of {@code layers} random nodes of every class; some DRAM-bound, some compute-bound. */
    static ModelCosts model(String name, int layers, long seed) {
        Random r = new Random(seed);
        List<NodeCost> nodes = new ArrayList<>();
        OpClass[] classes = OpClass.values();
        for (int i = 0; i < layers; i++) {
            OpClass c = classes[i % classes.length];
            double compute = 1e-6 * (5 + 200 * r.nextDouble());
            double sram = compute * 0.3 * r.nextDouble();
            // Every third node moves far more DRAM bytes than it computes.
            double dram = i % 3 == 0 ? compute * (2 + 3 * r.nextDouble()) : compute * 0.2 * r.nextDouble();
            nodes.add(new NodeCost(name + "/n" + i, c, compute, sram, dram, 1e-6, 1, 1e-6 * r.nextDouble(),
                    2e-6 * r.nextDouble(), 5e-6 * r.nextDouble()));
        }
        return new ModelCosts(name, nodes);
    }

    static double[] values(Map<Factor, Double> t) {
        double[] v = new double[Factor.values().length];
        t.forEach((k, x) -> v[k.ordinal()] = x);
        return v;
    }

    /** Writes a measurement file with the values the true factors give, every node and every whole model. */
    Path measure(List<ModelCosts> models, boolean nodes, String file) throws IOException {
        double[] v = values(truth());
        StringBuilder b = new StringBuilder("# generated from the factors of CalibratorTest.truth()\nmodel,node,latency-ms,energy-uj\n");
        for (ModelCosts m : models) {
            double t = 0;
            double e = 0;
            for (NodeCost n : m.nodes()) {
                double tn = Calibrator.latency(n, v, true);
                double en = Calibrator.energy(n, v, tn);
                t += tn;
                e += en;
                if (nodes) {
                    b.append(String.format(Locale.ROOT, "%s,%s,%.17g,%.17g%n", m.model(), n.name(), tn * 1e3, en * 1e6));
                }
            }
            b.append(String.format(Locale.ROOT, "%s,,%.17g,%.17g%n", m.model(), t * 1e3, e * 1e6));
        }
        Path p = dir.resolve(file);
        Files.writeString(p, b.toString());
        return p;
    }

    @Test
    void recoversTheFactorsThatMadeTheData() throws IOException {
        List<ModelCosts> models = List.of(model("a.onnx", 24, 1), model("b.onnx", 17, 2), model("c.onnx", 30, 3));
        MeasurementFile f = MeasurementFile.read(measure(models, true, "all.csv"));
        Calibration c = Calibrator.fit(models, List.of(f), 0.0);
        for (Map.Entry<Factor, Double> e : truth().entrySet()) {
            FactorValue got = c.factor(e.getKey());
            assertTrue(got.fitted(), e.getKey() + " " + got.note());
            assertEquals(e.getValue(), got.value(), 1e-6 * e.getValue(), e.getKey().key);
        }
        ErrorSummary after = c.errorAfter(Factor.Metric.LATENCY, Calibration.Scope.ALL);
        assertEquals(71 + 3, after.count());
        assertEquals(3, c.errorAfter(Factor.Metric.LATENCY, Calibration.Scope.MODELS).count());
        assertTrue(after.worst() < 1e-6, "worst " + after.worst());
        assertTrue(c.errorBefore(Factor.Metric.LATENCY, Calibration.Scope.ALL).median() > 0.5, "the profile as given is far off");
        assertTrue(c.errorAfter(Factor.Metric.ENERGY, Calibration.Scope.ALL).worst() < 1e-6);
        // Three models: each one predicted from a fit on the other two is exact too.
        assertEquals(List.of("a.onnx", "b.onnx", "c.onnx"),
                List.copyOf(c.leaveOneModelOutByModel(Factor.Metric.LATENCY, Calibration.Scope.MODELS).keySet()));
        ErrorSummary held = c.leaveOneModelOut(Factor.Metric.LATENCY, Calibration.Scope.ALL);
        assertEquals(74, held.count());
        assertTrue(held.worst() < 1e-5, "held out " + held);
        // The calibration applies to a node of a model it never saw.
        NodeCost fresh = model("d.onnx", 1, 9).nodes().get(0);
        assertEquals(Calibrator.latency(fresh, values(truth()), true), c.latencySeconds(fresh), 1e-12);
    }

    /**
     * A class of layers that the profile's figures show as memory-bound but that really runs far below its
     * peak (on a processor, depthwise convolutions often do): at the profile's figures its efficiency moves
     * no prediction, since the maximum of compute and memory time hides it. The smoothed first stage of the
     * fit still finds it, and the exact stage then recovers it.
     */
    @Test
    void recoversASlowClassThatLooksMemoryBoundAtTheProfilesFigures() throws IOException {
        List<ModelCosts> models = new ArrayList<>();
        for (int m = 0; m < 3; m++) {
            Random r = new Random(40 + m);
            List<NodeCost> nodes = new ArrayList<>();
            OpClass[] classes = OpClass.values();
            for (int i = 0; i < 20; i++) {
                OpClass c = classes[i % classes.length];
                double compute = 1e-6 * (5 + 200 * r.nextDouble());
                // grouped layers: on-chip time twice their compute time at the profile's figures
                double sram = c == OpClass.GROUPED_CONV ? 2 * compute : compute * 0.3 * r.nextDouble();
                double dram = i % 3 == 0 ? compute * (2 + 3 * r.nextDouble()) : compute * 0.2 * r.nextDouble();
                nodes.add(new NodeCost("m" + m + "/n" + i, c, compute, sram, dram, 1e-6, 1, 0, 0, 0));
            }
            models.add(new ModelCosts("m" + m + ".onnx", nodes));
        }
        MeasurementFile f = MeasurementFile.read(measure(models, true, "hidden.csv"));
        Calibration c = Calibrator.fit(models, List.of(f), 0.0);
        // the truth's grouped efficiency 0.09 makes those layers compute-bound: 1/0.09 = 11x their compute time
        assertEquals(0.09, c.factor(Factor.EFFICIENCY_GROUPED_CONV).value(), 0.09 * 1e-3,
                c.factors().toString());
        assertTrue(c.errorAfter(Factor.Metric.LATENCY, Calibration.Scope.ALL).worst() < 1e-5);
    }

    @Test
    void withFewerValuesThanFactorsFitsFewerAndSaysWhich() throws IOException {
        List<ModelCosts> models = List.of(model("a.onnx", 24, 1), model("b.onnx", 17, 2), model("c.onnx", 30, 3));
        MeasurementFile f = MeasurementFile.read(measure(models, false, "whole.csv"));
        Calibration c = Calibrator.fit(models, List.of(f), 0.0);
        long fitted = c.factors().values().stream()
                .filter(v -> v.factor().metric == Factor.Metric.LATENCY && v.fitted()).count();
        assertEquals(3, fitted, "three whole-model latencies set three factors");
        String note = c.notes().stream().filter(n -> n.startsWith("only 3 latency values for 7 factors")).findFirst()
                .orElseThrow(() -> new AssertionError(c.notes()));
        assertTrue(note.contains("; kept "), note);
        for (FactorValue v : c.factors().values()) {
            if (v.factor().metric == Factor.Metric.LATENCY && !v.fitted()) {
                assertEquals("only 3 latency values for 7 factors", v.note());
                assertTrue(note.contains(v.factor().key), v.factor().key);
            }
        }
        // With as many factors as values, the fit goes through every value.
        assertTrue(c.errorAfter(Factor.Metric.LATENCY, Calibration.Scope.ALL).worst() < 1e-6, c.errorAfter(Factor.Metric.LATENCY, Calibration.Scope.ALL) + " " + c.factors());
        assertTrue(c.errorBefore(Factor.Metric.LATENCY, Calibration.Scope.ALL).median() > 0.5);
    }

    @Test
    void powerTimesLatencyIsEnergy() throws IOException {
        // A power meter's reading while the model runs back to back: energy = power x latency.
        List<ModelCosts> models = List.of(model("a.onnx", 24, 1), model("b.onnx", 17, 2));
        double[] v = values(truth());
        StringBuilder b = new StringBuilder("model,node,latency-ms,power-mw\n");
        for (ModelCosts m : models) {
            for (NodeCost n : m.nodes()) {
                double t = Calibrator.latency(n, v, true);
                double e = Calibrator.energy(n, v, t);
                b.append(String.format(Locale.ROOT, "%s,%s,%.17g,%.17g%n", m.model(), n.name(), t * 1e3, e / t * 1e3));
            }
        }
        Path p = dir.resolve("meter.csv");
        Files.writeString(p, b.toString());
        Calibration c = Calibrator.fit(models, List.of(MeasurementFile.read(p)), 1e-3);
        for (Factor f : List.of(Factor.ENERGY_SCALE_COMPUTE, Factor.ENERGY_SCALE_ON_CHIP, Factor.ENERGY_SCALE_DRAM,
                Factor.STATIC_POWER)) {
            assertEquals(truth().get(f), c.factor(f).value(), 1e-6 * truth().get(f), f.key);
        }
        assertEquals(41, c.errorAfter(Factor.Metric.ENERGY, Calibration.Scope.LAYERS).count());
    }

    @Test
    void nothingToFitEndsInOneLine() throws IOException {
        List<ModelCosts> models = List.of(model("a.onnx", 4, 1));
        Path zeros = dir.resolve("zeros.csv");
        Files.writeString(zeros, "model,node,latency-ms\na.onnx,,0\na.onnx,a.onnx/n1,0\n");
        String e = assertThrows(BadInputException.class,
                () -> Calibrator.fit(models, List.of(MeasurementFile.read(zeros)), 0)).getMessage();
        assertEquals("cannot calibrate: every measured value in zeros.csv is zero; a fit needs measured values above zero", e);
        // Only a node that does not run on the device (absent from the costs): no value to fit one factor.
        Path views = dir.resolve("views.csv");
        Files.writeString(views, "model,node,latency-ms\na.onnx,reshape_3,0.01\n");
        e = assertThrows(BadInputException.class,
                () -> Calibrator.fit(models, List.of(MeasurementFile.read(views)), 0)).getMessage();
        assertEquals("cannot calibrate: no measured value in views.csv belongs to a node that runs on the device"
                + " or to a whole model; nothing to fit", e);
    }

    @Test
    void factorsWithoutDataAreKeptAndSaySo() throws IOException {
        // Only latency measured: the energy factors keep the profile's values.
        List<ModelCosts> models = List.of(model("a.onnx", 24, 1));
        Path p = dir.resolve("lat.csv");
        double[] v = values(truth());
        StringBuilder b = new StringBuilder("model,node,latency-ms\n");
        for (NodeCost n : models.get(0).nodes()) {
            b.append(String.format(Locale.ROOT, "a.onnx,%s,%.17g%n", n.name(), Calibrator.latency(n, v, true) * 1e3));
        }
        Files.writeString(p, b.toString());
        Calibration c = Calibrator.fit(models, List.of(MeasurementFile.read(p)), 2e-3);
        assertFalse(c.factor(Factor.STATIC_POWER).fitted());
        assertEquals(2e-3, c.factor(Factor.STATIC_POWER).value());
        assertEquals("no energy or power was measured", c.factor(Factor.ENERGY_SCALE_DRAM).note());
        assertEquals(1.0, c.factor(Factor.ENERGY_SCALE_DRAM).value());
        assertNull(c.heldOut(), "one model: no leave-one-model-out error");
        assertNull(c.leaveOneModelOut(Factor.Metric.LATENCY, Calibration.Scope.ALL));
        assertEquals(24, c.errorAfter(Factor.Metric.LATENCY, Calibration.Scope.LAYERS).count());
        assertEquals(0, c.errorAfter(Factor.Metric.ENERGY, Calibration.Scope.ALL).count());
        assertEquals(0.42, c.factor(Factor.EFFICIENCY_DENSE_CONV).value(), 1e-6);
    }
}
