package dev.erg.calibrate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.Estimator;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

import static dev.erg.calibrate.Factor.Metric.LATENCY;

/**
 * The measurements recorded on a host with {@code erg measure} (onnxruntime 1.23.2, CPU, graph
 * optimisations off; origin in measurements/README.md and in the file's comment lines). Nothing is
 * timed here: the tests read the recorded file.
 */
class RecordedHostTest {
    static final Path DIR = Path.of("src/test/resources/measurements/host-cpu");
    static final Path MODELS = Path.of("src/test/resources/models");
    static MeasurementFile file;
    static Map<String, ModelWorkload> workloads = new LinkedHashMap<>();

    @BeforeAll
    static void read() {
        file = MeasurementFile.read(DIR.resolve("measurements.csv"));
        for (String m : file.models()) {
            Path p = Files.exists(MODELS.resolve(m)) ? MODELS.resolve(m) : MODELS.resolve("demo").resolve(m);
            workloads.put(m, Analyzer.analyze(p, Map.of()));
        }
    }

    /** The analysis of a recorded model (the same models in both recordings). */
    static ModelWorkload workload(String model) {
        return workloads.computeIfAbsent(model, m -> {
            Path p = Files.exists(MODELS.resolve(m)) ? MODELS.resolve(m) : MODELS.resolve("demo").resolve(m);
            return Analyzer.analyze(p, Map.of());
        });
    }

    @Test
    void everyRecordedNodeIsOneOfErgsNodes() {
        assertEquals(11, workloads.size(), file.models().toString());
        Map<String, List<String>> names = new LinkedHashMap<>();
        workloads.forEach((m, w) -> names.put(m, w.nodes().stream().map(NodeWork::name).toList()));
        // Every name onnxruntime's profile gave was matched to a node of erg's analysis of the same graph.
        file.checkNames(names);
        assertTrue(file.notes().isEmpty(), file.notes().toString());
    }

    @Test
    void onnxruntimeRanEveryNodeButConstants() {
        // With graph optimisations off, onnxruntime runs every node of the file as a kernel of its own,
        // except Constant nodes, which it turns into initializers (onnxruntime 1.23.2, as recorded).
        for (Map.Entry<String, ModelWorkload> e : workloads.entrySet()) {
            Set<String> timed = new TreeSet<>();
            boolean whole = false;
            for (Measurement m : file.rows()) {
                if (m.model().equals(e.getKey())) {
                    if (m.node() == null) {
                        whole = true;
                    } else {
                        timed.add(m.node());
                    }
                }
            }
            assertTrue(whole, e.getKey() + " has a whole-model row");
            Set<String> expected = new TreeSet<>();
            for (NodeWork nw : e.getValue().nodes()) {
                if (!nw.opType().equals("Constant")) {
                    expected.add(nw.name());
                }
            }
            assertEquals(expected, timed, e.getKey());
        }
    }

    /** The fit on the recorded data with the stand-in profile; prints the table for docs/validation.md. */
    @Test
    void fitOnRecordedData() {
        DeviceProfile host = DeviceLoader.load("stand-in-host.yaml", DIR);
        List<ModelCosts> costs = new ArrayList<>();
        workloads.forEach((m, w) -> costs.add(ModelCosts.of(m, Estimator.estimate(w, host))));
        Calibration c = Calibrator.fit(costs, List.of(file), 0);
        StringBuilder b = new StringBuilder();
        c.factors().values().forEach(f -> b.append(String.format(Locale.ROOT, "%s = %.4g %s%s%n", f.factor().key,
                f.shown(), f.fitted() ? "(fitted)" : "(kept)", f.note() == null ? "" : ": " + f.note())));
        for (Calibration.Scope s : Calibration.Scope.values()) {
            b.append(s).append(" before ").append(c.errorBefore(LATENCY, s)).append('\n');
            b.append(s).append(" after ").append(c.errorAfter(LATENCY, s)).append('\n');
            b.append(s).append(" held out ").append(c.leaveOneModelOut(LATENCY, s)).append('\n');
        }
        for (Residual r : c.residuals()) {
            if (r.node() == null) {
                b.append(String.format(Locale.ROOT, "%-34s measured %8.3f ms before %8.3f after %8.3f%n", r.model(),
                        r.measured() * 1e3, r.before() * 1e3, r.after() * 1e3));
            }
        }
        for (Residual r : c.heldOut()) {
            if (r.node() == null) {
                b.append(String.format(Locale.ROOT, "held out %-34s measured %8.3f ms predicted %8.3f%n", r.model(),
                        r.measured() * 1e3, r.after() * 1e3));
            }
        }
        System.out.println(b);
        // Fitting the named factors to 1009 measured layers must bring their error down, and so must
        // predicting each model from a fit on the others: the factors carry over between models.
        double before = c.errorBefore(LATENCY, Calibration.Scope.LAYERS).median();
        assertTrue(c.errorAfter(LATENCY, Calibration.Scope.LAYERS).median() < 0.5 * before, b.toString());
        assertTrue(c.leaveOneModelOut(LATENCY, Calibration.Scope.LAYERS).median() < 0.6 * before, b.toString());
        assertEquals(11, c.leaveOneModelOutByModel(LATENCY, Calibration.Scope.MODELS).size());
        for (FactorValue f : c.factors().values()) {
            assertTrue(f.fitted() == (f.factor().metric == LATENCY), f.toString());
        }
    }

    /** The validation protocol of docs/validation.md: fit on three models, predict the whole latency of the others. */
    @Test
    void threeModelsPredictTheOthers() {
        DeviceProfile host = DeviceLoader.load("stand-in-host.yaml", DIR);
        Map<String, ModelCosts> costs = new LinkedHashMap<>();
        workloads.forEach((m, w) -> costs.put(m, ModelCosts.of(m, Estimator.estimate(w, host))));
        List<String> fitOn = List.of("mobilenet_v2.graph.onnx", "resnet18.graph.onnx", "tiny_transformer.graph.onnx");
        Calibration c = Calibrator.fit(fitOn.stream().map(costs::get).toList(), List.of(file.only(fitOn)), 0);
        List<Double> before = new ArrayList<>();
        List<Double> after = new ArrayList<>();
        List<Double> layersBefore = new ArrayList<>();
        List<Double> layersAfter = new ArrayList<>();
        StringBuilder b = new StringBuilder("fitted on " + fitOn + "\n");
        for (Measurement m : file.rows()) {
            if (fitOn.contains(m.model())) {
                continue;
            }
            if (m.node() != null) {
                NodeCost n = costs.get(m.model()).byName().get(m.node());
                if (n != null && m.latencySeconds() > 0) {
                    layersBefore.add(n.predictedSeconds() / m.latencySeconds() - 1);
                    layersAfter.add(c.latencySeconds(n) / m.latencySeconds() - 1);
                }
                continue;
            }
            double p0 = 0;
            double p1 = 0;
            for (NodeCost n : costs.get(m.model()).nodes()) {
                p0 += n.predictedSeconds();
                p1 += c.latencySeconds(n);
            }
            before.add(p0 / m.latencySeconds() - 1);
            after.add(p1 / m.latencySeconds() - 1);
            b.append(String.format(Locale.ROOT, "%-34s measured %8.3f ms  profile %8.3f ms (%+.0f%%)  calibrated %8.3f ms (%+.0f%%)%n",
                    m.model(), m.latencySeconds() * 1e3, p0 * 1e3, 100 * (p0 / m.latencySeconds() - 1), p1 * 1e3,
                    100 * (p1 / m.latencySeconds() - 1)));
        }
        ErrorSummary e0 = ErrorSummary.of(before);
        ErrorSummary e1 = ErrorSummary.of(after);
        b.append(String.format(Locale.ROOT, "before: median %.0f%%, worst %.0f%%; after: median %.0f%%, worst %.0f%%%n",
                100 * e0.median(), 100 * e0.worst(), 100 * e1.median(), 100 * e1.worst()));
        ErrorSummary l0 = ErrorSummary.of(layersBefore);
        ErrorSummary l1 = ErrorSummary.of(layersAfter);
        b.append(String.format(Locale.ROOT, "layers of the other models: before median %.0f%%, after median %.0f%% (%d layers)%n",
                100 * l0.median(), 100 * l1.median(), l1.count()));
        System.out.println(b);
        assertEquals(8, e1.count());
        // The factors fitted on three models carry over to the layers of eight others.
        assertTrue(l1.median() < 0.6 * l0.median(), b.toString());
    }
}
