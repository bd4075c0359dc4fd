package dev.erg.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.device.DeviceLoader;
import dev.erg.error.BadInputException;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A profile without energies cannot check a power or energy budget: that is a configuration error, not a pass. */
class UnknownEnergyBudgetTest {
    @TempDir
    Path dir;

    private DeviceEstimate estimate() throws Exception {
        Path f = dir.resolve("m.onnx");
        new OnnxWriter.Model(13, new OnnxWriter.Graph("m").input("x", ElemType.FLOAT, 8, 16)
                .weight("w", ElemType.FLOAT, 16, 4).node("MatMul", "mm", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT)).write(f);
        return Estimator.estimate(Analyzer.analyze(f, Map.of()), DeviceLoader.load("preset:host-2core-example", null));
    }

    @Test
    void aPowerBudgetOnAProfileWithoutEnergiesIsAConfigurationError() throws Exception {
        DeviceEstimate e = estimate();
        BadInputException x = assertThrows(BadInputException.class, () -> Gate.evaluatePair("m.onnx",
                "preset:host-2core-example", e, Budget.builder().maxPowerMw(25.0).build(), null, null));
        assertEquals("m.onnx on preset:host-2core-example: the device profile gives no energies, so a power budget "
                + "cannot be checked on it (leave the limit out for this device, or use a profile with energies)",
                x.getMessage());
        assertThrows(BadInputException.class, () -> Gate.evaluatePair("m.onnx", "d", e,
                Budget.builder().maxEnergyPerFrameUj(1.0).build(), null, null));
    }

    @Test
    void latencyBudgetsStillWork() throws Exception {
        PairResult r = Gate.evaluatePair("m.onnx", "d", estimate(), Budget.builder().maxLatencyMs(1.0).build(),
                null, null);
        assertEquals(1, r.checks().size());
        assertTrue(r.checks().get(0).passed());
    }
}
