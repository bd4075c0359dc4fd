package dev.erg.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.estimate.Models;
import dev.erg.estimate.TestDevice;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import org.junit.jupiter.api.Test;

/** A model whose only node is a view runs nothing on the device: zero latency, unbounded frame rate. */
class NoWorkTest {
    @Test
    void aFrameWithoutWorkDrawsOnlyStaticPower() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("view")
                .input("x", ElemType.FLOAT, 2, 8)
                .longs("shape", 16)
                .node("Reshape", "reshape", List.of("x", "shape"), List.of("y"))
                .output("y", ElemType.FLOAT);
        DeviceEstimate e = Estimator.estimate(Models.analyze(g), new TestDevice().build());
        assertEquals(0.0, e.latencySeconds());
        assertTrue(Double.isInfinite(e.maxFps()));
        // Dynamic energy 0 per frame: at any rate, even back to back, the power is the static 1 mW.
        assertEquals(1e-3, e.averagePowerWatts(e.maxFps()));
        PairResult p = Gate.evaluatePair("v.onnx", "dev", e, Budget.builder().maxPowerMw(5.0).build(), null, null);
        assertTrue(p.passed(), p.checks().get(0).message());
        assertEquals("v.onnx on dev: average power 1 mW at unbounded fps is within the limit of 5 mW",
                p.checks().get(0).message());
    }
}
