package dev.erg.validation;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.estimate.Models;
import dev.erg.estimate.NodeEstimate;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Path;
import java.util.Locale;
import org.junit.jupiter.api.Test;

/**
 * Validation against a published, measured chip: Chen, Krishna, Emer, Sze, IEEE JSSC 52(1), 2017
 * (status paper): AlexNet convolution layers at batch 4 run at 34.7 frames/s and 278 mW (chip only,
 * no DRAM). The profile {@code preset:validation-65nm} holds only published parameters (every number
 * sourced in the file, none tuned). The test asserts the +/-50% band that the method claims; the
 * ratios are reported in docs/validation.md.
 */
class PublishedChipValidationTest {
    static final double MEASURED_FPS = 34.7;
    static final double MEASURED_CHIP_WATTS = 0.278;

    @Test
    void alexNetConvLayersAtBatchFourWithinFiftyPercent() {
        ModelWorkload w = Models.analyze(AlexNetConv.graph(4));
        assertEquals(4 * AlexNetConv.MACS_PER_IMAGE, w.macs(), "the original layout: 666 M conv MACs per image");
        DeviceProfile d = DeviceLoader.load("preset:validation-65nm", Path.of("."));
        DeviceEstimate e = Estimator.estimate(w, d);
        double fps = 4 / e.latencySeconds();
        // Chip power: everything but DRAM, over the time the batch takes (frames back to back).
        double chipJoules = e.energy().compute() + e.energy().registers() + e.energy().sram()
                + e.energy().staticEnergy();
        double chipWatts = chipJoules / e.latencySeconds();
        double macRate = w.macs() / e.latencySeconds();
        System.out.printf(Locale.ROOT,
                "VALIDATION | AlexNet conv b4 | fps %.2f (measured %.1f, ratio %.3f) | chip power %.1f mW (measured %.0f,"
                        + " ratio %.3f) | %.2f GMAC/s (measured 23.1) | DRAM %.4f accesses/MAC (measured 0.0029)%n",
                fps, MEASURED_FPS, fps / MEASURED_FPS, chipWatts * 1e3, MEASURED_CHIP_WATTS * 1e3,
                chipWatts / MEASURED_CHIP_WATTS, macRate / 1e9, e.dramBytesPerFrame() / 2.0 / w.macs());
        for (NodeEstimate n : e.nodes()) {
            if (n.work().macs() > 0) {
                System.out.printf(Locale.ROOT, "VALIDATION | %s | util %.3f | %.3f ms | %s | %.1f uJ | tiling %s%n",
                        n.name(), n.utilization(), n.latencySeconds() * 1e3, n.bound().label,
                        n.energy().total() * 1e6, n.tiling());
            }
        }
        assertTrue(fps >= 0.5 * MEASURED_FPS && fps <= 1.5 * MEASURED_FPS, "frame rate within +/-50%: " + fps);
        assertTrue(chipWatts >= 0.5 * MEASURED_CHIP_WATTS && chipWatts <= 1.5 * MEASURED_CHIP_WATTS,
                "chip power within +/-50%: " + chipWatts);
    }
}
