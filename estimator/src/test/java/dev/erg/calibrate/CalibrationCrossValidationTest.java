package dev.erg.calibrate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.Estimator;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The host protocol of docs/validation.md with every choice of fit set, not one: for each of the 165 ways
 * to pick 3 of the 11 recorded models, the host profile (as {@code erg host-profile} wrote it) is
 * calibrated on those 3 and the whole-model latency of the other 8 is predicted and compared with what
 * onnxruntime measured on the host (the recorded file; nothing is timed here). A method fitted to one
 * lucky fit set would show here as a wide spread over the others.
 *
 * <p>Two recordings: {@code host-cpu} (the host quiet) and {@code host-cpu-busy} (35 minutes later, the
 * host busier: some models ran up to 1.9 times slower, unevenly). The target of 25% is asserted on the
 * quiet one; on the busy one the calibration must still beat the profile.
 */
class CalibrationCrossValidationTest {
    @ParameterizedTest
    @ValueSource(strings = {"host-cpu", "host-cpu-busy"})
    void everyChoiceOfThreeFitModelsPredictsTheOthers(String recording) {
        Path dir = RecordedHostTest.DIR.resolveSibling(recording);
        MeasurementFile file = MeasurementFile.read(dir.resolve("measurements.csv"));
        DeviceProfile host = DeviceLoader.load(dir.resolve("host-1thread.yaml").toString(), Path.of("."));
        List<String> models = file.models();
        Map<String, ModelCosts> costs = new LinkedHashMap<>();
        Map<String, Double> measured = new LinkedHashMap<>();
        for (String m : models) {
            costs.put(m, ModelCosts.of(m, Estimator.estimate(RecordedHostTest.workload(m), host)));
        }
        for (Measurement r : file.rows()) {
            if (r.node() == null) {
                measured.put(r.model(), r.latencySeconds());
            }
        }
        List<List<String>> sets = new ArrayList<>();
        choose(models, 3, 0, new ArrayList<>(), sets);
        assertEquals(165, sets.size());

        List<Double> medians = new ArrayList<>();
        List<Double> before = new ArrayList<>();
        Map<String, List<Double>> byModel = new TreeMap<>();
        for (List<String> fit : sets) {
            List<ModelCosts> fc = fit.stream().map(costs::get).toList();
            Calibration c = Calibrator.fit(fc, List.of(file.only(fit)), 0);
            List<Double> err = new ArrayList<>();
            List<Double> err0 = new ArrayList<>();
            for (String m : models) {
                if (fit.contains(m)) {
                    continue;
                }
                double p = 0;
                double p0 = 0;
                for (NodeCost n : costs.get(m).nodes()) {
                    p += c.latencySeconds(n);
                    p0 += n.predictedSeconds();
                }
                double e = p / measured.get(m) - 1;
                err.add(Math.abs(e));
                err0.add(Math.abs(p0 / measured.get(m) - 1));
                byModel.computeIfAbsent(m, k -> new ArrayList<>()).add(e);
            }
            medians.add(median(err));
            before.add(median(err0));
        }
        medians.sort(null);
        StringBuilder b = new StringBuilder();
        b.append(String.format(Locale.ROOT, "CROSS-VALIDATION " + recording + " | 165 fit sets of 3 models | median held-out error before"
                        + " calibration %.1f%% | after: median of the fit sets' medians %.1f%%, 90th percentile %.1f%%,"
                        + " worst %.1f%%, share of fit sets at 25%% or less %.0f%%%n", 100 * median(before),
                100 * median(medians), 100 * medians.get((int) Math.round(0.9 * (medians.size() - 1))),
                100 * medians.get(medians.size() - 1),
                100.0 * medians.stream().filter(x -> x <= 0.25).count() / medians.size()));
        byModel.forEach((m, l) -> {
            List<Double> s = new ArrayList<>(l);
            s.sort(null);
            b.append(String.format(Locale.ROOT, "CROSS-VALIDATION " + recording + " | %s | held out in %d fit sets | signed error median"
                    + " %+.0f%%, from %+.0f%% to %+.0f%%%n", m, s.size(), 100 * median(s), 100 * s.get(0),
                    100 * s.get(s.size() - 1)));
        });
        System.out.print(b);
        assertTrue(median(medians) < median(before), b.toString());
        if (recording.equals("host-cpu")) {
            // The target of a median of 25% or less for one fit set, here held by the typical fit set.
            assertTrue(median(medians) <= 0.25, b.toString());
        }
    }

    private static void choose(List<String> from, int k, int at, List<String> cur, List<List<String>> out) {
        if (cur.size() == k) {
            out.add(List.copyOf(cur));
            return;
        }
        for (int i = at; i < from.size(); i++) {
            cur.add(from.get(i));
            choose(from, k, i + 1, cur, out);
            cur.remove(cur.size() - 1);
        }
    }

    private static double median(List<Double> values) {
        List<Double> s = new ArrayList<>(values);
        s.sort(null);
        int n = s.size();
        return n % 2 == 1 ? s.get(n / 2) : (s.get(n / 2 - 1) + s.get(n / 2)) / 2;
    }
}
