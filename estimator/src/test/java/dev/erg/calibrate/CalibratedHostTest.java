package dev.erg.calibrate;

import static dev.erg.calibrate.Factor.Metric.LATENCY;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The validation of docs/validation.md on the recorded host measurements (nothing is timed here): a
 * cpu-kind profile of the recording host (its measured peak and DRAM bandwidth) is calibrated on three
 * models, written as a calibrated profile, loaded back, and the estimator's whole-model latency of the
 * other eight models is compared with what onnxruntime measured on that host.
 */
class CalibratedHostTest {
    /** Chosen before looking at the held-out models: one convolution network of each kind and one transformer. */
    static final List<String> FIT_ON = List.of("mobilenet_v2.graph.onnx", "resnet18.graph.onnx",
            "tiny_transformer.graph.onnx");
    /**
     * {@code host-cpu}: the host quiet, where the target (a median of 25% or less) is asserted;
     * {@code host-cpu-busy}: 35 minutes later with the host busier, where the calibration must still beat
     * the profile (measurements/README.md).
     */
    @ParameterizedTest
    @ValueSource(strings = {"host-cpu", "host-cpu-busy"})
    void calibratedProfilePredictsTheOtherModels(String recording, @TempDir Path dir) throws IOException {
        Path rec = RecordedHostTest.DIR.resolveSibling(recording);
        MeasurementFile file = MeasurementFile.read(rec.resolve("measurements.csv"));
        Map<String, ModelWorkload> workloads = new LinkedHashMap<>();
        for (String m : file.models()) {
            workloads.put(m, RecordedHostTest.workload(m));
        }
        Path src = rec.resolve("host-1thread.yaml");
        DeviceProfile host = DeviceLoader.load(src.toString(), Path.of("."));
        List<ModelCosts> costs = new ArrayList<>();
        for (String m : FIT_ON) {
            costs.add(ModelCosts.of(m, Estimator.estimate(workloads.get(m), host)));
        }
        Calibration c = Calibrator.fit(costs, List.of(file.only(FIT_ON)), 0);
        Path out = dir.resolve("host-1thread.calibrated.yaml");
        Files.writeString(out, CalibratedProfile.of(Files.readString(src), c), StandardCharsets.UTF_8);
        DeviceProfile calibrated = DeviceLoader.load(out.toString(), dir);
        assertNotNull(calibrated.calibration());
        assertEquals(3, calibrated.calibration().latency().models());

        // The estimator applies the factors through its own stages: on a fitted model its latency is the fit's.
        for (ModelCosts mc : costs) {
            double fit = 0;
            for (NodeCost n : mc.nodes()) {
                fit += c.latencySeconds(n);
            }
            double est = Estimator.estimate(workloads.get(mc.model()), calibrated).latencySeconds();
            assertEquals(fit, est, 1e-3 * fit, mc.model());
        }

        List<Double> before = new ArrayList<>();
        List<Double> after = new ArrayList<>();
        StringBuilder b = new StringBuilder(recording + ": fitted on " + FIT_ON + "\n");
        c.factors().values().forEach(f -> b.append(String.format(Locale.ROOT, "  %s = %.4g%s%n", f.factor().key,
                f.shown(), f.fitted() ? "" : " (not fitted: " + f.note() + ")")));
        for (Measurement m : file.rows()) {
            if (m.node() != null || FIT_ON.contains(m.model())) {
                continue;
            }
            DeviceEstimate e0 = Estimator.estimate(workloads.get(m.model()), host);
            DeviceEstimate e1 = Estimator.estimate(workloads.get(m.model()), calibrated);
            double t = m.latencySeconds();
            before.add(e0.latencySeconds() / t - 1);
            after.add(e1.latencySeconds() / t - 1);
            b.append(String.format(Locale.ROOT, "| %s | %.2f | %.2f (%+.0f%%) | %.2f (%+.0f%%) |%n", m.model(), t * 1e3,
                    e0.latencySeconds() * 1e3, 100 * (e0.latencySeconds() / t - 1), e1.latencySeconds() * 1e3,
                    100 * (e1.latencySeconds() / t - 1)));
        }
        ErrorSummary e0 = ErrorSummary.of(before);
        ErrorSummary e1 = ErrorSummary.of(after);
        b.append(String.format(Locale.ROOT, "before: median %.0f%%, worst %.0f%%; after: median %.0f%%, worst %.0f%%%n",
                100 * e0.median(), 100 * e0.worst(), 100 * e1.median(), 100 * e1.worst()));
        System.out.println(b);
        assertEquals(8, e1.count());
        assertTrue(e1.median() < e0.median(), b.toString());
        if (recording.equals("host-cpu")) {
            assertTrue(e1.median() <= 0.25, "the target: a median of 25% or less after calibration\n" + b);
        }
    }
}
