package dev.erg.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The hearing-aid keyword spotter sample (samples/hearing-aid-kws) on its invented in-memory part: the
 * LSTM layers map as worked out by hand in its README and docs/method.md, section 7.
 */
class HearingAidSampleTest {
    @Test
    void theLstmLayersFoldOntoFourTilesAndTheWeightsStay() {
        Path root = Path.of("").toAbsolutePath();
        while (!Files.isDirectory(root.resolve("samples/hearing-aid-kws"))) {
            root = root.getParent();
        }
        Path dir = root.resolve("samples/hearing-aid-kws");
        ModelWorkload w = Analyzer.analyze(dir.resolve("kws.onnx"), Map.of());
        DeviceProfile d = DeviceLoader.load("earbud-imc.yaml", dir);
        DeviceEstimate e = Estimator.estimate(w, d);
        assertFalse(e.weightsReloadedEachFrame());
        NodeEstimate lstm = e.nodes().stream().filter(n -> n.name().equals("/rnn/LSTM")).findFirst().orElseThrow();
        // m = 49 steps, k = 40 + 128 = 168, n = 4 x 128 = 512 (the workload's view of an LSTM).
        assertEquals(49L * 168 * 512, lstm.work().macs());
        // 512 outputs x 8 weight bits = 4096 columns: 4 tiles of 1024 columns, one round on 8 macros.
        assertEquals(4, lstm.passes());
        // Utilisation: MACs x 8 slices x 8 input cycles / (49 x 8 x ceil(168 / 64) = 1176 cycles x 256 x 1024 x 8).
        assertEquals(49.0 * 168 * 512 * 64 / (1176.0 * 256 * 1024 * 8), lstm.utilization(), 1e-12);
        assertEquals(Energy.Destination.CONVERSION, lstm.energy().dominant());
        assertTrue(e.averagePowerWatts(4) < 0.3e-3, "the sample's budget: 4 inferences per second within 0.3 mW");
    }
}
