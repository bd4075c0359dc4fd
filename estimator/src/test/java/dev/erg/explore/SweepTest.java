package dev.erg.explore;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.budget.Budget;
import dev.erg.budget.BudgetRules;
import dev.erg.budget.Check;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.error.BadInputException;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.OnnxReader;
import dev.erg.workload.PrecisionOverrides;
import java.math.BigInteger;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.hipparchus.fraction.BigFraction;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SweepTest {
    @TempDir
    Path dir;

    private static final DeviceProfile NPU = DeviceLoader.load("preset:feeder-npu", null);

    private static BigFraction whole(long v) {
        return new BigFraction(BigInteger.valueOf(v));
    }

    private Sweep sweep(Path model, InputBindings base, String range, Budget budget) {
        return Sweeper.run(OnnxReader.read(model), model.getFileName().toString(), base,
                SweepRange.parse("sweep", range), NPU, budget, PrecisionOverrides.NONE);
    }

    /**
     * Hand count in docs/method.md ("Sweeps"): per layer QKV 3·seq·128², QKᵀ and AV 4 heads · seq² ·
     * 32 each, output projection seq·128², FFN 2·seq·128·512; embedding seq·32·128; head 128·5. So
     * MACs = 1,024·seq² + 790,528·seq + 640. At seq 64 that is 54,788,736, the analytic truth of the
     * shared tiny transformer (manifest.json, macs_truth of tiny_transformer.graph.onnx).
     */
    @Test
    void transformerMacsAreExactlyQuadraticInSequenceLength() {
        Path m = SymbolicModels.transformer(dir.resolve("t.onnx"));
        Sweep s = sweep(m, InputBindings.NONE, "seq=16..256:16", Budget.none());
        assertEquals(16, s.points().size());
        Polynomial macs = s.fits().get(SweepMetric.MACS);
        assertNotNull(macs, "MACs fit");
        assertEquals(2, macs.degree());
        assertEquals(List.of(whole(640), whole(790_528), whole(1_024)), macs.coefficients());
        assertEquals("1,024·seq² + 790,528·seq + 640", macs.formula("seq", true));
        assertEquals(54_788_736L, macs.valueExact(64).longValue());
        // Weights do not depend on the sequence length: degree 0.
        assertEquals(0, s.fits().get(SweepMetric.WEIGHT_BYTES).degree());
    }

    /** The shared export itself (fixed seq 64) counts the same, so the written model is the same network. */
    @Test
    void writtenTransformerMatchesTheSharedExportAtItsLength() {
        Path m = SymbolicModels.transformer(dir.resolve("t.onnx"));
        long written = Analyzer.analyze(m, Map.of("seq", 64L)).macs();
        long shared = Analyzer.analyze(Path.of("src/test/resources/models/tiny_transformer.graph.onnx"), Map.of()).macs();
        assertEquals(54_788_736L, shared, "manifest.json macs_truth");
        assertEquals(shared, written);
    }

    /** ONNX Conv with pads 1 keeps the side: MACs = 5,040·h·w + 320 (hand count in SymbolicModels.cnn). */
    @Test
    void cnnMacsAreLinearInEachSpatialDimSweptAlone() {
        Path m = SymbolicModels.cnn(dir.resolve("c.onnx"));
        Sweep byH = sweep(m, InputBindings.ofDims(Map.of("w", 32L)), "h=8..256*2", Budget.none());
        Polynomial h = byH.fits().get(SweepMetric.MACS);
        assertEquals(1, h.degree());
        assertEquals(List.of(whole(320), whole(5_040L * 32)), h.coefficients());
        Sweep byW = sweep(m, InputBindings.ofDims(Map.of("h", 20L)), "w=4..40:4", Budget.none());
        Polynomial w = byW.fits().get(SweepMetric.MACS);
        assertEquals(1, w.degree());
        assertEquals(List.of(whole(320), whole(5_040L * 20)), w.coefficients());
        // Peak activations grow with h too (the Conv outputs), linearly.
        assertEquals(1, byH.fits().get(SweepMetric.ACTIVATION_BYTES).degree());
    }

    private DeviceEstimate direct(Path m, long seq) {
        return Estimator.estimate(Analyzer.analyze(m, Map.of("seq", seq)), NPU);
    }

    private boolean passes(Path m, long seq, Budget b) {
        for (Check c : BudgetRules.check("t", direct(m, seq), b, 0)) {
            if (!c.passed()) {
                return false;
            }
        }
        return true;
    }

    /** The value found passes and one more fails, each checked with a direct estimate outside the sweep. */
    @Test
    void largestPassingValueIsExact() {
        Path m = SymbolicModels.transformer(dir.resolve("t.onnx"));
        double at100 = direct(m, 100).activationPeakBytes() / 1024.0;
        double fpsAt150 = direct(m, 150).maxFps();
        for (Budget b : List.of(Budget.builder().maxActivationKib(at100 + 0.5).build(),
                Budget.builder().targetFps(fpsAt150 * 0.9999).build())) {
            Sweep s = sweep(m, InputBindings.NONE, "seq=16..512:32", b);
            Long best = s.best();
            assertNotNull(best, s.bestText());
            assertTrue(passes(m, best, b), "passes at " + best);
            assertFalse(passes(m, best + 1, b), "fails at " + (best + 1));
            assertTrue(s.bestPoint().passed());
            assertEquals(1, s.breaks().size(), s.breaks().toString());
            assertTrue(s.breaks().get(0).endsWith("for seq ≥ " + dev.erg.format.Numbers.exact(best + 1)),
                    s.breaks().get(0));
        }
    }

    @Test
    void aDimThatIsNotSymbolicOrIsAlsoBoundIsAnError() {
        Path m = SymbolicModels.cnn(dir.resolve("c.onnx"));
        BadInputException x = assertThrows(BadInputException.class,
                () -> sweep(m, InputBindings.ofDims(Map.of("w", 8L)), "seq=1..4:1", Budget.none()));
        assertEquals(m + ": the dimension 'seq' cannot be swept: no graph input has a symbolic dim of that name"
                + " (symbolic dims: h, w)", x.getMessage());
        BadInputException y = assertThrows(BadInputException.class,
                () -> sweep(m, InputBindings.ofDims(Map.of("w", 8L, "h", 8L)), "h=1..4:1", Budget.none()));
        assertEquals(m + ": the dimension 'h' is both bound to 8 and swept; bind it one way only", y.getMessage());
    }

    @Test
    void rangesParse() {
        assertEquals(List.of(16L, 32L, 64L, 100L), SweepRange.parse("s", "seq=16..100*2").values());
        assertEquals(List.of(1L, 4L, 7L, 8L), SweepRange.parse("s", "n=1..8:3").values());
        assertEquals("s: 'seq=16..100' is not NAME=FROM..TO:STEP or NAME=FROM..TO*FACTOR (e.g. seq=64..1024:64"
                + " or seq=16..2048*2)", assertThrows(BadInputException.class,
                () -> SweepRange.parse("s", "seq=16..100")).getMessage());
        assertThrows(BadInputException.class, () -> SweepRange.parse("s", "seq=100..16:1"));
        assertThrows(BadInputException.class, () -> SweepRange.parse("s", "seq=1..100000000:1"));
    }
}
