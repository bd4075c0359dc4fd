package dev.erg.budget;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import dev.erg.device.ProfileCalibration;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The error band of a calibration in a verdict, on the worked example of docs/method.md ("Calibrated
 * profiles"): errors are estimate / measured - 1, so the measured value is estimate / (1 + error), and
 * a frame rate, the inverse of a latency, ranges over estimate x (1 + error).
 */
class CalibratedBandTest {
    static final ProfileCalibration CAL = new ProfileCalibration(Map.of(),
            new ProfileCalibration.Band(-0.09, 0.12, 14, 3, "leave-one-model-out"), null);

    @Test
    void frameRateRangesOverTheLatencyErrors() {
        assertArrayEquals(new double[] {-0.09, 0.12}, BudgetRules.band(Metric.FRAME_RATE, CAL), 1e-12);
        // latency: 1/1.12 - 1 = -10.71%, 1/0.91 - 1 = +9.89%
        double[] lat = BudgetRules.band(Metric.LATENCY, CAL);
        assertEquals(1 / 1.12 - 1, lat[0], 1e-12);
        assertEquals(1 / 0.91 - 1, lat[1], 1e-12);
        assertNull(BudgetRules.band(Metric.POWER, CAL), "no energy was measured: no band");
        assertNull(BudgetRules.band(Metric.WEIGHTS, CAL), "a count has no band");
        assertEquals("14 layers of 3 models", CAL.latency().basis());
    }

    @Test
    void theWorkedExample() {
        double fps = 1 / 2.05e-3; // 487.8 fps
        double[] b = BudgetRules.band(Metric.FRAME_RATE, CAL);
        // 487.8 x 0.91 = 443.9 < 450 <= 487.8: holds, inside the band
        assertEquals(Verdict.AT_RISK, Verdict.of(fps, 450, false, b[0], b[1]));
        assertEquals(Verdict.PASS, Verdict.of(fps, 400, false, b[0], b[1]));
        assertEquals(Verdict.FAIL, Verdict.of(fps, 500, false, b[0], b[1]));
        assertEquals("\u22129%", BudgetRules.signed(-0.09));
        assertEquals("+12%", BudgetRules.signed(0.12));
    }
}
