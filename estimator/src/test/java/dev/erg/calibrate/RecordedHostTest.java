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
    }
}
