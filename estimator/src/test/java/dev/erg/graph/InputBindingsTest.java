package dev.erg.graph;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.AnalysisOptions;
import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.onnx.VoiceActivityModel;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Binding runtime inputs: whole shapes for anonymous dims, constant values folded like initializers,
 * and an If whose condition is unknown shaped branch by branch (ONNX operator definitions: If,
 * Reshape, LSTM; counts by the formulas of docs/counting.md, hand-worked in {@link VoiceActivityModel}).
 */
class InputBindingsTest {
    @TempDir
    Path dir;

    private Path vad() {
        return VoiceActivityModel.write(dir.resolve("vad.onnx"));
    }

    private static InputBindings bind(int samples, Integer rate) {
        return InputBindings.parse(Map.of(), Map.of("input", "1x" + samples, "state", "2x1x128"),
                rate == null ? Map.of() : Map.of("sr", rate.toString()), "test");
    }

    private static NodeWork node(ModelWorkload w, String name) {
        return w.nodes().stream().filter(n -> n.name().equals(name)).findFirst().orElseThrow();
    }

    @Test
    void anonymousDimNamesInputAxisAndHowToBindIt() {
        Path f = vad();
        BadInputException e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f, Map.of()));
        assertEquals(f + ": graph input 'input' has axis 0 of [?, ?] with neither a value nor a name; its whole"
                + " shape must be bound", e.getMessage());
        UnboundDimException u = (UnboundDimException) e;
        assertEquals("input", u.input(), "the front ends' hint names the input");
        assertEquals(null, u.dim(), "no dim name to bind");
        assertEquals("NxN", u.shapeExample(), "a shape of the declared rank");
    }

    @Test
    void valueSelectsTheBranchAndGivesItsExactMacs() {
        Path f = vad();
        for (int rate : new int[] {16000, 8000}) {
            int samples = VoiceActivityModel.steps(rate) * 128;
            ModelWorkload w = Analyzer.analyze(f, bind(samples, rate), AnalysisOptions.DEFAULTS);
            // LSTM: T·B·4·H·(I+H) (docs/counting.md) plus the score MatMul 1·128·1.
            assertEquals(VoiceActivityModel.branchMacs(VoiceActivityModel.steps(rate)), w.macs(), "rate " + rate);
            assertTrue(w.complete());
            assertEquals("shapes input=1x" + samples + ", state=2x1x128; values sr=" + rate,
                    w.graph().bindings().describe());
            Value seq = w.graph().value("seq");
            assertArrayEquals(new long[] {VoiceActivityModel.steps(rate), 1, 1, 128}, seq.dims());
        }
    }

    @Test
    void withoutValueTheBranchThatCannotBeShapedIsDroppedWithANote() {
        Path f = vad();
        ModelWorkload w = Analyzer.analyze(f, bind(256, null), AnalysisOptions.DEFAULTS);
        assertEquals(VoiceActivityModel.branchMacs(2), w.macs());
        String note = node(w, "rate_switch").note();
        assertTrue(note.startsWith("If condition is not known at analysis time; its then branch cannot be shaped"
                + " (node 'k16_frames' (Reshape) "), note);
        assertTrue(note.endsWith("and is dropped; erg prices the else branch; the condition depends on the graph"
                + " input sr: bind it (--value sr=...) to price the branch that runs"), note);
        // The dropped branch left no consumer behind on the main graph's values.
        for (Node n : w.graph().value("h0").consumers()) {
            assertTrue(!n.name().startsWith("k16"), n.name());
        }
        assertEquals(2, w.graph().value("h0").consumers().size()); // the If and the else branch's LSTM
    }

    @Test
    void noBranchShapesIsAnErrorNamingBoth() {
        Path f = vad();
        BadInputException e = assertThrows(BadInputException.class,
                () -> Analyzer.analyze(f, bind(100, null), AnalysisOptions.DEFAULTS));
        assertTrue(e.getMessage().startsWith(f + ": node 'rate_switch' (If) has a condition not known at analysis"
                + " time, and neither branch can be shaped (then: node 'k16_frames' (Reshape) "), e.getMessage());
        assertTrue(e.getMessage().contains("; else: node 'k8_frames' (Reshape) "), e.getMessage());
    }

    @Test
    void valueMustFitTheDeclaredTypeAndShape() {
        Path f = vad();
        BadInputException e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f,
                InputBindings.parse(Map.of(), Map.of("input", "1x512", "state", "2x1x128"), Map.of("sr", "16000,8000"),
                        "test"), AnalysisOptions.DEFAULTS));
        assertEquals(f + ": graph input 'sr' (int64) has the shape [] of 1 elements but is bound to 2 values",
                e.getMessage());
        e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f,
                InputBindings.parse(Map.of(), Map.of("input", "1x512", "state", "2x1x128"), Map.of("sr", "16000.5"),
                        "test"), AnalysisOptions.DEFAULTS));
        assertEquals(f + ": graph input 'sr' (int64) is bound to '16000.5', which is not a whole number", e.getMessage());
        e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f,
                InputBindings.parse(Map.of(), Map.of("input", "1x512", "state", "3x1x128"), Map.of(), "test"),
                AnalysisOptions.DEFAULTS));
        assertEquals(f + ": graph input 'state' is declared [2, ?, 128] but is bound to the shape 3x1x128: axis 0 is"
                + " fixed at 2", e.getMessage());
        e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f,
                InputBindings.parse(Map.of(), Map.of("inptu", "1x512"), Map.of(), "test"), AnalysisOptions.DEFAULTS));
        assertEquals(f + ": a shape or value is bound to 'inptu', which is not a runtime graph input (the inputs are"
                + " input, sr, state)", e.getMessage());
    }

    @Test
    void valueFoldsThroughShapeChainsAndReshapeTargets() {
        // A 1-D int64 input gives a Reshape its target: [2, 3] from --value shape=2,3 (ONNX: Reshape).
        OnnxWriter.Graph g = new OnnxWriter.Graph("g")
                .input("x", ElemType.FLOAT, 6)
                .inputDims("shape", ElemType.INT64, "")
                .node("Reshape", "r", List.of("x", "shape"), List.of("y"))
                .node("Relu", "relu", List.of("y"), List.of("z"))
                .output("z", ElemType.FLOAT);
        Path f = dir.resolve("reshape.onnx");
        new OnnxWriter.Model(13, g).write(f);
        ModelWorkload w = Analyzer.analyze(f, InputBindings.parse(Map.of(), Map.of(), Map.of("shape", "2,3"), "test"),
                AnalysisOptions.DEFAULTS);
        assertArrayEquals(new long[] {2, 3}, w.graph().value("z").dims());
        assertArrayEquals(new long[] {2}, w.graph().value("shape").dims());
    }

    @Test
    void shapeBindsAnInputThatDeclaresNoShape() {
        // MatMul [1, 576] x [576, 10]: 5,760 MACs (ONNX: MatMul; docs/counting.md m·k·n).
        OnnxWriter.Graph g = new OnnxWriter.Graph("g")
                .inputNoShape("x", ElemType.FLOAT)
                .weight("w", ElemType.FLOAT, 576, 10)
                .node("MatMul", "mm", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT);
        Path f = dir.resolve("noshape.onnx");
        new OnnxWriter.Model(13, g).write(f);
        BadInputException e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f, Map.of()));
        assertEquals(f + ": graph input 'x' declares no shape", e.getMessage());
        assertEquals("x", ((UnboundDimException) e).input());
        ModelWorkload w = Analyzer.analyze(f, InputBindings.parse(Map.of(), Map.of("x", "1x576"), Map.of(), "test"),
                AnalysisOptions.DEFAULTS);
        assertEquals(5760, w.macs());
        assertArrayEquals(new long[] {1, 10}, w.graph().value("y").dims());
    }

    @Test
    void malformedTextsNameTheEntry() {
        BadInputException e = assertThrows(BadInputException.class,
                () -> InputBindings.parse(Map.of(), Map.of("input", "1by576"), Map.of(), "--shape"));
        assertEquals("--shape: shape of 'input' is '1by576'; write whole dims joined by x, e.g. 1x576", e.getMessage());
        e = assertThrows(BadInputException.class,
                () -> InputBindings.parse(Map.of(), Map.of(), Map.of("sr", "16k"), "--value"));
        assertEquals("--value: value of 'sr' has '16k', which is not a number", e.getMessage());
    }
}
