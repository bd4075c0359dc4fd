package dev.erg.shape;

import static dev.erg.TestModels.analyze;
import static dev.erg.TestModels.dims;
import static dev.erg.TestModels.node;
import static dev.erg.TestModels.shaped;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.Node;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Control flow (ONNX operator definitions: If, Loop and Scan): subgraphs shaped with their formal
 * inputs set, reading values of every enclosing scope, their cost counted into the node times the
 * trip count (hand-worked counts in the comments; vector-op factors from docs/counting.md).
 */
class ControlFlowTest {

    static OnnxWriter.Tensor int64Scalar(String name, long v) {
        return new OnnxWriter.Tensor(name, ElemType.INT64).longs(v);
    }

    static OnnxWriter.Tensor boolScalar(String name, boolean v) {
        return new OnnxWriter.Tensor(name, ElemType.BOOL).raw(new byte[] {(byte) (v ? 1 : 0)});
    }

    /**
     * The body of a for loop: acc = Relu(acc x w) with w read from the main graph, and a scan output
     * Sigmoid(acc x w). Formal inputs (iteration_num, cond, acc) carry no shapes in the file.
     */
    static OnnxWriter.Graph forBody(boolean scanOutput) {
        OnnxWriter.Graph b = new OnnxWriter.Graph("body")
                .inputNoShape("i", ElemType.INT64)
                .inputNoShape("cond_in", ElemType.BOOL)
                .inputNoShape("acc_in", ElemType.FLOAT)
                .node("MatMul", "b_mm", List.of("acc_in", "w"), List.of("mm"))
                .node("Relu", "b_relu", List.of("mm"), List.of("acc_out"))
                .node("Identity", "b_cond", List.of("cond_in"), List.of("cond_out"))
                .output("cond_out", ElemType.BOOL)
                .output("acc_out", ElemType.FLOAT);
        if (scanOutput) {
            b.node("Sigmoid", "b_sig", List.of("mm"), List.of("scan_out")).output("scan_out", ElemType.FLOAT);
        }
        return b;
    }

    /**
     * Loop with M = 4 and cond omitted (a for loop): the body runs exactly 4 times. Per iteration:
     * MatMul [2, 3] x [3, 3] = 2 * 3 * 3 = 18 MACs; Relu 6 ops; Sigmoid 6 * 4 = 24 ops.
     * Loop: 4 * 18 = 72 MACs and 4 * (6 + 24) = 120 vector ops. Final acc [2, 3]; scan output [4, 2, 3].
     */
    @Test
    @DisplayName("ONNX operator definition: Loop, opset 13 (constant trip count, cond omitted, scan output)")
    void forLoopWithScanOutput() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("loop")
                .input("x", ElemType.FLOAT, 2, 3)
                .weight("w", ElemType.FLOAT, 3, 3)
                .initializer(int64Scalar("M", 4))
                .node("Loop", "loop", List.of("M", "", "x"), List.of("acc", "scans"),
                        OnnxWriter.graph("body", forBody(true)))
                .node("Relu", "after", List.of("acc"), List.of("y"))
                .output("y", ElemType.FLOAT)
                .output("scans", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertTrue(w.complete(), w.unmodelled() + " " + w.unresolved());
        assertArrayEquals(new long[] {2, 3}, dims(w.graph(), "acc"));
        assertArrayEquals(new long[] {4, 2, 3}, dims(w.graph(), "scans"));
        NodeWork loop = node(w, "loop");
        assertEquals(Kind.MAC, loop.kind());
        assertEquals(72L, loop.macs());
        assertEquals(120L, loop.vectorOps());
        assertEquals(4L, loop.node().repeat());
        assertEquals(null, loop.note(), "a for loop's count is exact");
        // The model totals include the body: 72 MACs, 120 + 6 (the Relu after the loop) vector ops.
        assertEquals(72L, w.macs());
        assertEquals(126L, w.vectorOps());
    }

    /** The body's formal inputs get iteration_num int64 [], cond bool [] and the carried value's shape. */
    @Test
    @DisplayName("ONNX operator definition: Loop, opset 13 (body formal inputs)")
    void bodyFormalInputs() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("loop")
                .input("x", ElemType.FLOAT, 2, 3)
                .weight("w", ElemType.FLOAT, 3, 3)
                .initializer(int64Scalar("M", 2))
                .initializer(boolScalar("go", true))
                .node("Loop", "loop", List.of("M", "go", "x"), List.of("acc"), OnnxWriter.graph("body", forBody(false)))
                .output("acc", ElemType.FLOAT);
        Graph s = shaped(13, g);
        Node loop = s.nodes().get(0);
        Graph body = loop.subgraphs().get(0);
        assertArrayEquals(new long[0], body.value("i").dims());
        assertEquals(ElemType.INT64, body.value("i").type());
        assertEquals(ElemType.BOOL, body.value("cond_in").type());
        assertArrayEquals(new long[] {2, 3}, body.value("acc_in").dims());
        // cond is a known true and the body passes it through: the count is exact.
        assertEquals(2L, loop.repeat());
        assertEquals(null, loop.note());
    }

    /**
     * A while loop: M = 10 and a body condition computed from the data. 10 is an upper bound and the
     * note says so; per iteration Relu 6 + ReduceSum 6 + Less 1 (1 op per output element) = 13 ops:
     * 130 vector ops.
     */
    @Test
    @DisplayName("ONNX operator definition: Loop, opset 13 (body condition: trip count is an upper bound)")
    void whileLoopUpperBound() {
        OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                .inputNoShape("i", ElemType.INT64)
                .inputNoShape("cond_in", ElemType.BOOL)
                .inputNoShape("acc_in", ElemType.FLOAT)
                .node("Relu", "b_relu", List.of("acc_in"), List.of("acc_out"))
                .node("ReduceSum", "b_sum", List.of("acc_out"), List.of("total"), OnnxWriter.attr("keepdims", 0L))
                .node("Less", "b_less", List.of("total", "limit"), List.of("cond_out"))
                .output("cond_out", ElemType.BOOL)
                .output("acc_out", ElemType.FLOAT);
        OnnxWriter.Graph g = new OnnxWriter.Graph("while")
                .input("x", ElemType.FLOAT, 2, 3)
                .initializer(new OnnxWriter.Tensor("limit", ElemType.FLOAT).floats(100f))
                .initializer(int64Scalar("M", 10))
                .initializer(boolScalar("go", true))
                .node("Loop", "loop", List.of("M", "go", "x"), List.of("acc"), OnnxWriter.graph("body", body))
                .output("acc", ElemType.FLOAT);
        NodeWork loop = node(analyze(13, g), "loop");
        assertEquals(130L, loop.vectorOps());
        assertNotNull(loop.note());
        assertTrue(loop.note().contains("upper bound"), loop.note());
    }

    /**
     * M computed at run time: the trip count is unknown, so the Loop is listed as unmodelled with the
     * reason; its carried value keeps its shape (the body does not change it) and the Relu after it is
     * still shaped and priced.
     */
    @Test
    @DisplayName("ONNX operator definition: Loop, opset 13 (trip count not known: unmodelled, shapes flow on)")
    void unknownTripCount() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("loop")
                .input("x", ElemType.FLOAT, 2, 3)
                .input("m", ElemType.INT64)
                .weight("w", ElemType.FLOAT, 3, 3)
                .node("Loop", "loop", List.of("m", "", "x"), List.of("acc"), OnnxWriter.graph("body", forBody(false)))
                .node("Relu", "after", List.of("acc"), List.of("y"))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertFalse(w.complete());
        assertEquals(Map.of("Loop", 1), w.unmodelled());
        assertEquals(Map.of(), w.unresolved());
        NodeWork loop = node(w, "loop");
        assertEquals(Kind.UNMODELLED, loop.kind());
        assertTrue(loop.note().contains("trip count is not known"), loop.note());
        assertEquals(6L, node(w, "after").vectorOps());
        BadInputException e = assertThrows(BadInputException.class, w::requireComplete);
        assertTrue(e.getMessage().contains("no rule for Loop (1 node)"), e.getMessage());
    }

    /**
     * Loop-carried values that change shape: seq [1, 2] grows by one row per iteration (Concat, then
     * Relu). Each of the 3 iterations is shaped from the previous one: Relu costs 4, 6 and 8 ops = 18;
     * the final seq is [4, 2].
     */
    @Test
    @DisplayName("ONNX operator definition: Loop, opset 13 (carried value grows: every iteration shaped)")
    void growingCarriedValue() {
        OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                .inputNoShape("i", ElemType.INT64)
                .inputNoShape("cond_in", ElemType.BOOL)
                .inputNoShape("seq_in", ElemType.FLOAT)
                .node("Concat", "b_cat", List.of("seq_in", "row"), List.of("cat"), OnnxWriter.attr("axis", 0L))
                .node("Relu", "b_relu", List.of("cat"), List.of("seq_out"))
                .node("Identity", "b_cond", List.of("cond_in"), List.of("cond_out"))
                .output("cond_out", ElemType.BOOL)
                .output("seq_out", ElemType.FLOAT);
        OnnxWriter.Graph g = new OnnxWriter.Graph("grow")
                .input("seq0", ElemType.FLOAT, 1, 2)
                .input("row", ElemType.FLOAT, 1, 2)
                .initializer(int64Scalar("M", 3))
                .node("Loop", "loop", List.of("M", "", "seq0"), List.of("seq"), OnnxWriter.graph("body", body))
                .output("seq", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertArrayEquals(new long[] {4, 2}, dims(w.graph(), "seq"));
        assertEquals(18L, node(w, "loop").vectorOps());
        assertEquals(3, node(w, "loop").node().subgraphs().size());
    }

    /** An unmodelled operator inside a body is listed with the model's unmodelled operators. */
    @Test
    @DisplayName("ONNX operator definition: Loop, opset 13 (an unmodelled body operator is listed)")
    void unmodelledInsideBody() {
        OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                .inputNoShape("i", ElemType.INT64)
                .inputNoShape("cond_in", ElemType.BOOL)
                .inputNoShape("acc_in", ElemType.FLOAT)
                .domainNode("com.example", "Fancy", "b_fancy", List.of("acc_in"), List.of("acc_out"))
                .node("Identity", "b_cond", List.of("cond_in"), List.of("cond_out"))
                .output("cond_out", ElemType.BOOL)
                .output("acc_out", ElemType.FLOAT);
        OnnxWriter.Graph g = new OnnxWriter.Graph("loop")
                .input("x", ElemType.FLOAT, 2, 3)
                .initializer(int64Scalar("M", 3))
                .node("Loop", "loop", List.of("M", "", "x"), List.of("acc"), OnnxWriter.graph("body", body))
                .output("acc", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertEquals(Map.of("Loop", 1, "com.example.Fancy", 1), w.unmodelled());
        assertTrue(node(w, "loop").note().contains("'b_fancy' (Fancy) is unmodelled"), node(w, "loop").note());
    }

    /**
     * Scan, opset 11: state s [3] and scan input xs [3, 5] sliced along axis 1 (5 iterations of [3]).
     * Body: s' = s + x (3 ops), y = s' * s' (3 ops), scan output y stacked along axis -1 -> [3, 5].
     * Cost: 5 * 6 = 30 vector ops.
     */
    @Test
    @DisplayName("ONNX operator definition: Scan, opset 11 (scan_input_axes, negative scan_output_axes)")
    void scanAxes() {
        OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                .inputNoShape("s_in", ElemType.FLOAT)
                .inputNoShape("x_in", ElemType.FLOAT)
                .node("Add", "b_add", List.of("s_in", "x_in"), List.of("s_out"))
                .node("Mul", "b_mul", List.of("s_out", "s_out"), List.of("y"))
                .output("s_out", ElemType.FLOAT)
                .output("y", ElemType.FLOAT);
        OnnxWriter.Graph g = new OnnxWriter.Graph("scan")
                .input("s0", ElemType.FLOAT, 3)
                .input("xs", ElemType.FLOAT, 3, 5)
                .node("Scan", "scan", List.of("s0", "xs"), List.of("s", "ys"), OnnxWriter.graph("body", body),
                        OnnxWriter.attr("num_scan_inputs", 1L), OnnxWriter.ints("scan_input_axes", 1),
                        OnnxWriter.ints("scan_output_axes", -1))
                .output("s", ElemType.FLOAT)
                .output("ys", ElemType.FLOAT);
        ModelWorkload w = analyze(11, g);
        assertTrue(w.complete());
        assertArrayEquals(new long[] {3}, dims(w.graph(), "s"));
        assertArrayEquals(new long[] {3, 5}, dims(w.graph(), "ys"));
        assertArrayEquals(new long[] {3}, w.graph().nodes().get(0).subgraphs().get(0).value("x_in").dims());
        assertEquals(30L, node(w, "scan").vectorOps());
    }

    /**
     * Scan, opset 8: sequence_lens (omitted), batch axis 0 and scan axis 1 on every input. State [2, 3],
     * scan input [2, 4, 3]: the body sees [3] and [3] and runs 2 * 4 = 8 times; Add 3 + Relu 3 = 6 ops each:
     * 48. Outputs: final state [2, 3], scan output [2, 4, 3].
     */
    @Test
    @DisplayName("ONNX operator definition: Scan, opset 8 (batch and sequence axes)")
    void scanOpset8() {
        OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                .inputNoShape("s_in", ElemType.FLOAT)
                .inputNoShape("x_in", ElemType.FLOAT)
                .node("Add", "b_add", List.of("s_in", "x_in"), List.of("s_out"))
                .node("Relu", "b_relu", List.of("s_out"), List.of("y"))
                .output("s_out", ElemType.FLOAT)
                .output("y", ElemType.FLOAT);
        OnnxWriter.Graph g = new OnnxWriter.Graph("scan8")
                .input("s0", ElemType.FLOAT, 2, 3)
                .input("xs", ElemType.FLOAT, 2, 4, 3)
                .node("Scan", "scan", List.of("", "s0", "xs"), List.of("s", "ys"), OnnxWriter.graph("body", body),
                        OnnxWriter.attr("num_scan_inputs", 1L))
                .output("s", ElemType.FLOAT)
                .output("ys", ElemType.FLOAT);
        ModelWorkload w = analyze(8, g);
        assertArrayEquals(new long[] {2, 3}, dims(w.graph(), "s"));
        assertArrayEquals(new long[] {2, 4, 3}, dims(w.graph(), "ys"));
        assertEquals(48L, node(w, "scan").vectorOps());
    }

    /** Scan inputs of different lengths along their scan axes break the definition: one clear error. */
    @Test
    @DisplayName("ONNX operator definition: Scan, opset 11 (scan inputs of different lengths)")
    void scanLengthMismatch() {
        OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                .inputNoShape("a_in", ElemType.FLOAT)
                .inputNoShape("b_in", ElemType.FLOAT)
                .node("Add", "b_add", List.of("a_in", "b_in"), List.of("y"))
                .output("y", ElemType.FLOAT);
        OnnxWriter.Graph g = new OnnxWriter.Graph("scan")
                .input("a", ElemType.FLOAT, 4, 3)
                .input("b", ElemType.FLOAT, 5, 3)
                .node("Scan", "scan", List.of("a", "b"), List.of("ys"), OnnxWriter.graph("body", body),
                        OnnxWriter.attr("num_scan_inputs", 2L))
                .output("ys", ElemType.FLOAT);
        BadInputException e = assertThrows(BadInputException.class, () -> shaped(11, g));
        assertTrue(e.getMessage().contains("'scan' (Scan)") && e.getMessage().contains("lengths 4 and 5"), e.getMessage());
    }

    /**
     * If whose condition is a constant takes that branch; a nested If inside it reads x from the main
     * graph, two scopes out. The taken path: else branch of the inner If, y = x * x on [2, 2]: 4 ops,
     * counted at the outer If node.
     */
    @Test
    @DisplayName("ONNX operator definition: If, opset 13 (constant conditions, nested, outer-scope values)")
    void nestedIfReadsMainGraph() {
        OnnxWriter.Graph innerThen = new OnnxWriter.Graph("inner_then")
                .node("Neg", "t_neg", List.of("x"), List.of("t_y"))
                .output("t_y", ElemType.FLOAT);
        OnnxWriter.Graph innerElse = new OnnxWriter.Graph("inner_else")
                .node("Mul", "e_mul", List.of("x", "x"), List.of("e_y"))
                .output("e_y", ElemType.FLOAT);
        OnnxWriter.Graph outerThen = new OnnxWriter.Graph("outer_then")
                .node("If", "inner_if", List.of("no"), List.of("inner_y"), OnnxWriter.graph("then_branch", innerThen),
                        OnnxWriter.graph("else_branch", innerElse))
                .output("inner_y", ElemType.FLOAT);
        OnnxWriter.Graph outerElse = new OnnxWriter.Graph("outer_else")
                .node("Relu", "o_relu", List.of("x"), List.of("o_y"))
                .output("o_y", ElemType.FLOAT);
        OnnxWriter.Graph g = new OnnxWriter.Graph("if")
                .input("x", ElemType.FLOAT, 2, 2)
                .initializer(boolScalar("yes", true))
                .initializer(boolScalar("no", false))
                .node("If", "outer_if", List.of("yes"), List.of("y"), OnnxWriter.graph("then_branch", outerThen),
                        OnnxWriter.graph("else_branch", outerElse))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertTrue(w.complete());
        assertArrayEquals(new long[] {2, 2}, dims(w.graph(), "y"));
        assertEquals(4L, node(w, "outer_if").vectorOps());
        assertEquals(4L, w.vectorOps());
    }
}
