package dev.erg.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.estimate.Models;
import dev.erg.estimate.TestDevice;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Budgets and growth checks on worked example 1 of docs/method.md (latency 74.72 us, frame energy
 * 146.5056 nJ, 71.7856 nJ of it dynamic, static power 1 mW).
 */
class GateTest {
    private static DeviceEstimate example() {
        return Estimator.estimate(Models.analyze(Models.conv(8, 10, 10, 16, 3, 1)), new TestDevice().build());
    }

    @Test
    void framesAndPowerAgainstTheBudget() {
        DeviceEstimate e = example();
        // 1 / 74.72 us = 13383.3 fps; power at 20000 fps = 71.7856 nJ * 20000 + 1 mW = 2.4357 mW.
        Budget b = Budget.builder().targetFps(20000.0).maxPowerMw(2.0).maxLatencyMs(0.1).build();
        PairResult p = Gate.evaluatePair("m.onnx", "dev", e, b, null, null);
        assertEquals(3, p.checks().size());
        Check fps = p.checks().get(0);
        assertFalse(fps.passed());
        assertEquals(1 / 74.72e-6, fps.value(), 1e-6);
        assertEquals("m.onnx on dev: frame rate 13383 fps is below the target of 20000 fps"
                + " (top layers by latency: conv 100.0%)", fps.message());
        Check power = p.checks().get(1);
        assertFalse(power.passed());
        assertEquals(2.435712, power.value(), 1e-9);
        assertEquals("m.onnx on dev: average power 2.44 mW at 20000 fps exceeds the limit of 2 mW; static power is 1 mW of it"
                + " (top layers by energy: conv 100.0%)", power.message());
        Check latency = p.checks().get(2);
        assertTrue(latency.passed());
        assertEquals("m.onnx on dev: latency 0.0747 ms is within the limit of 0.1 ms", latency.message());
    }

    @Test
    void growthOverTheBaselineFailsWithTheLayersThatGrew(@TempDir Path dir) {
        DeviceEstimate before = example();
        Baseline base = Baseline.of(List.of(Gate.evaluatePair("m.onnx", "dev", before, Budget.none(), null, null)));
        Path file = dir.resolve("baseline.json");
        base.write(file);
        Baseline read = Baseline.read(file);
        assertEquals(base.toJson(), read.toJson(), "the baseline survives a round trip byte for byte");
        // The same layer with 24 output channels instead of 16: MACs grow by 50%.
        DeviceEstimate after = Estimator.estimate(Models.analyze(Models.conv(8, 10, 10, 24, 3, 1)),
                new TestDevice().build());
        PairResult p = Gate.evaluatePair("m.onnx", "dev", after, Budget.none(), read, 5.0);
        Check macs = p.checks().get(0);
        assertEquals(Metric.MACS, macs.metric());
        assertFalse(macs.passed());
        assertEquals("m.onnx on dev: MACs changed +50.0% over the baseline (115200 -> 172800 MACs), more than the"
                + " allowed 5% (layers that grew most: conv +57600 MACs)", macs.message());
        assertEquals(1, p.diff().size());
        assertEquals(LayerDiff.Change.CHANGED, p.diff().get(0).change());
        assertEquals(57_600, p.diff().get(0).macsDelta());
        // Unchanged model: every growth check passes.
        PairResult same = Gate.evaluatePair("m.onnx", "dev", before, Budget.none(), read, 5.0);
        assertTrue(same.passed());
        assertEquals(5, same.checks().size());
        assertTrue(same.diff().isEmpty());
    }

    @Test
    void missingBaselineIsANoteNotAFailure(@TempDir Path dir) {
        assertNull(Baseline.read(dir.resolve("none.json")));
        GateResult r = new GateResult(List.of(), Budget.none(), 5.0, "src/erg/baseline.json", false);
        assertTrue(r.passed());
        assertTrue(r.baselineNote().startsWith("no baseline at src/erg/baseline.json"));
    }

    @Test
    void badBudgetsAndBaselinesAreOneLineErrors(@TempDir Path dir) throws Exception {
        BadInputException e = assertThrows(BadInputException.class, () -> Budget.builder().maxPowerMw(-1.0));
        assertEquals("budget maxPowerMw: must be a number greater than 0 (got -1.0)", e.getMessage());
        Path bad = dir.resolve("b.json");
        Files.writeString(bad, "{\"format\": \"something-else\"}");
        e = assertThrows(BadInputException.class, () -> Baseline.read(bad));
        assertTrue(e.getMessage().startsWith(bad + ": not an erg baseline"));
        Files.writeString(bad, "{ not json");
        e = assertThrows(BadInputException.class, () -> Baseline.read(bad));
        assertTrue(e.getMessage().contains("JSON error at line 1"));
    }
}
