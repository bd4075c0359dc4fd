package dev.erg.explore;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.budget.Budget;
import dev.erg.budget.BudgetRules;
import dev.erg.budget.Check;
import dev.erg.budget.Gate;
import dev.erg.budget.PairResult;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.error.BadInputException;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.PrecisionOverrides;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AdvisorTest {
    private static final Path FEEDER = Path.of("src/test/resources/models/demo/feeder_cnn.onnx");

    @TempDir
    Path dir;

    private static PairResult pair(ModelWorkload w, DeviceProfile d, Budget b) {
        return Gate.evaluatePair("feeder_cnn.onnx", d.id(), Estimator.estimate(w, d), b, null, null, false);
    }

    /**
     * Every candidate's numbers are those of a direct estimate: precision candidates through their
     * rules written as text (the form a user gives, {@code PATTERN[@OP]=wNaM}) and parsed again, device
     * candidates on their profile. No shortcut arithmetic may differ from the real estimate.
     */
    @Test
    void everyCandidateEqualsADirectEstimate() {
        ModelWorkload w = Analyzer.analyze(FEEDER, Map.of());
        DeviceProfile npu = DeviceLoader.load("preset:feeder-npu", null);
        Budget tight = Budget.builder().targetFps(4.0).maxPowerMw(3.04).maxWeightKib(256.0).build();
        Advice a = Advisor.advise(pair(w, npu, tight), null);
        assertNotNull(a);
        int precision = 0;
        for (Candidate c : a.candidates()) {
            DeviceEstimate direct;
            if (c.kind().equals("precision")) {
                precision++;
                List<String> texts = new ArrayList<>();
                for (PrecisionOverrides.Rule r : c.overrides().rules()) {
                    texts.add(r.toString());
                }
                direct = Estimator.estimate(w, npu, PrecisionOverrides.parse(texts));
            } else {
                direct = Estimator.estimate(w, c.device());
            }
            List<Check> checks = BudgetRules.check("x", direct, tight, 0);
            assertEquals(checks.size(), c.checks().size());
            for (int i = 0; i < checks.size(); i++) {
                assertEquals(checks.get(i).value(), c.checks().get(i).value(), 0.0, c.change());
                assertEquals(checks.get(i).verdict(), c.checks().get(i).verdict(), c.change());
            }
        }
        // feeder-npu prices int8 (deployed) and int4: top 1, 3, 5 layers and the whole model at int4.
        assertEquals(4, precision);
        // Ranked: a candidate that meets every limit (or fixes more) comes before one that does not.
        for (int i = 1; i < a.candidates().size(); i++) {
            Candidate p = a.candidates().get(i - 1);
            Candidate c = a.candidates().get(i);
            assertTrue(p.meetsAll() || !c.meetsAll());
            if (p.meetsAll() == c.meetsAll()) {
                assertTrue(p.fixed() >= c.fixed());
            }
        }
    }

    /**
     * Whole-model int4 halves the weight bytes of int8 (4 bits instead of 8 per weight, common
     * practice, no single source), so it alone meets a weight limit between the two.
     */
    @Test
    void wholeModelInt4MeetsAWeightLimitBetweenInt8AndInt4() {
        ModelWorkload w = Analyzer.analyze(FEEDER, Map.of());
        DeviceProfile npu = DeviceLoader.load("preset:feeder-npu", null);
        double int8Kib = Estimator.estimate(w, npu).weightBytes() / 1024.0;
        Budget b = Budget.builder().maxWeightKib(int8Kib * 0.6).build();
        Advice a = Advisor.advise(pair(w, npu, b), null);
        Candidate best = a.candidates().get(0);
        assertEquals("int4 on the whole model", best.change());
        assertTrue(best.meetsAll());
        assertEquals(int8Kib / 2, best.checks().get(0).value(), int8Kib * 0.01);
        assertNull(Advisor.advise(pair(w, npu, Budget.builder().maxWeightKib(int8Kib * 2).build()), null));
    }

    /** A declared maximum clock gives a clock candidate; static power is the profile's, unchanged. */
    @Test
    void maxClockIsReadAndGivesAClockCandidate() throws IOException {
        Path preset = dir.resolve("npu.yaml");
        String text = new String(DeviceLoader.class.getResourceAsStream("presets/feeder-npu.yaml").readAllBytes(),
                java.nio.charset.StandardCharsets.UTF_8);
        Files.writeString(preset, text.replace("clock-mhz: 200 ", "clock-mhz: 200\nmax-clock-mhz: 400 "));
        DeviceProfile d = DeviceLoader.load(preset.toString(), dir);
        assertEquals(400, d.maxClockMhz(), 0);
        ModelWorkload w = Analyzer.analyze(FEEDER, Map.of());
        double fps = Estimator.estimate(w, d).maxFps();
        Advice a = Advisor.advise(pair(w, d, Budget.builder().targetFps(fps * 1.5).build()), null);
        Candidate clock = a.candidates().stream().filter(c -> c.kind().equals("clock")).findFirst().orElseThrow();
        assertEquals(400, clock.device().clockMhz(), 0);
        assertEquals(d.staticPowerMw(), clock.device().staticPowerMw(), 0);
        assertTrue(clock.note().contains("voltage"));
        Files.writeString(preset, text.replace("clock-mhz: 200 ", "clock-mhz: 200\nmax-clock-mhz: 100 "));
        BadInputException x = assertThrows(BadInputException.class, () -> DeviceLoader.load(preset.toString(), dir));
        assertTrue(x.getMessage().contains("max-clock-mhz") && x.getMessage().contains("must be at least clock-mhz"),
                x.getMessage());
        assertFalse(x.getMessage().contains("\n"));
    }
}
