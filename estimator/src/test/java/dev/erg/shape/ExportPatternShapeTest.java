package dev.erg.shape;

import static dev.erg.TestModels.analyze;
import static dev.erg.TestModels.data;
import static dev.erg.TestModels.dims;
import static dev.erg.TestModels.node;
import static dev.erg.TestModels.shaped;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.graph.Graph;
import dev.erg.graph.Node;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * The operator chains that exporters write into the reference models, shaped from the ONNX operator
 * definitions: the channel shuffle, the channel split ("chunk"), layer normalisation in one node and
 * decomposed, and the element types of the quantization pair.
 */
class ExportPatternShapeTest {

    static OnnxWriter.Tensor scalar(String name, long v) {
        return new OnnxWriter.Tensor(name, ElemType.INT64).longs(v);
    }

    /**
     * The channel shuffle with dynamic shape arithmetic (ONNX operator definitions, opset 13: Shape,
     * Gather, Div, Unsqueeze, Concat, Reshape, Transpose): x [1, 8, 4, 4], 2 groups.
     * s = Shape(x) = [1, 8, 4, 4]; n, c, h, w = Gather(s, 0..3) (scalars); c / 2 = 4;
     * Unsqueeze each to [1]; Concat(n, 2, c/2, h, w) = [1, 2, 4, 4, 4] -> Reshape -> [1, 2, 4, 4, 4];
     * Transpose perm [0, 2, 1, 3, 4] -> [1, 4, 2, 4, 4]; Concat(n, -1, h, w) = [1, -1, 4, 4] -> Reshape
     * -> [1, 8, 4, 4]. All the shape arithmetic is folded; the Reshapes are views and the Transpose moves
     * 8 * 16 * 4 = 512 bytes in and out.
     */
    @Test
    @DisplayName("ONNX operator definitions, opset 13: Shape -> Gather -> Div -> Unsqueeze -> Concat -> Reshape -> Transpose -> Reshape")
    void channelShuffle() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("shuffle")
                .input("in", ElemType.FLOAT, 1, 8, 4, 4)
                .initializer(scalar("i0", 0)).initializer(scalar("i1", 1))
                .initializer(scalar("i2", 2)).initializer(scalar("i3", 3))
                .initializer(scalar("two", 2))
                .longs("ax0", 0)
                .longs("groups", 2)
                .longs("minus1", -1)
                .node("Relu", "relu", List.of("in"), List.of("x"))
                .node("Shape", "shape", List.of("x"), List.of("s"))
                .node("Gather", "gn", List.of("s", "i0"), List.of("n"), OnnxWriter.attr("axis", 0L))
                .node("Gather", "gc", List.of("s", "i1"), List.of("c"), OnnxWriter.attr("axis", 0L))
                .node("Gather", "gh", List.of("s", "i2"), List.of("h"), OnnxWriter.attr("axis", 0L))
                .node("Gather", "gw", List.of("s", "i3"), List.of("w"), OnnxWriter.attr("axis", 0L))
                .node("Div", "div", List.of("c", "two"), List.of("cpg"))
                .node("Unsqueeze", "un", List.of("n", "ax0"), List.of("n1"))
                .node("Unsqueeze", "uc", List.of("cpg", "ax0"), List.of("cpg1"))
                .node("Unsqueeze", "uh", List.of("h", "ax0"), List.of("h1"))
                .node("Unsqueeze", "uw", List.of("w", "ax0"), List.of("w1"))
                .node("Concat", "cat5", List.of("n1", "groups", "cpg1", "h1", "w1"), List.of("shape5"),
                        OnnxWriter.attr("axis", 0L))
                .node("Reshape", "r5", List.of("x", "shape5"), List.of("x5"))
                .node("Transpose", "tr", List.of("x5"), List.of("t"), OnnxWriter.ints("perm", 0, 2, 1, 3, 4))
                .node("Concat", "cat4", List.of("n1", "minus1", "h1", "w1"), List.of("shape4"),
                        OnnxWriter.attr("axis", 0L))
                .node("Reshape", "r4", List.of("t", "shape4"), List.of("y"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[0], dims(s, "c"));
        assertArrayEquals(new long[] {4}, data(s, "cpg"));
        assertArrayEquals(new long[] {1}, dims(s, "cpg1"));
        assertArrayEquals(new long[] {1, 2, 4, 4, 4}, data(s, "shape5"));
        assertArrayEquals(new long[] {1, 2, 4, 4, 4}, dims(s, "x5"));
        assertArrayEquals(new long[] {1, 4, 2, 4, 4}, dims(s, "t"));
        assertArrayEquals(new long[] {1, -1, 4, 4}, data(s, "shape4"));
        assertArrayEquals(new long[] {1, 8, 4, 4}, dims(s, "y"));
        for (Node n : s.nodes()) {
            boolean runs = List.of("relu", "r5", "tr", "r4").contains(n.name());
            assertEquals(!runs, n.isFolded(), n.name());
            assertEquals(Node.Status.SHAPED, n.status(), n.name());
        }
        ModelWorkload w = analyze(13, g);
        assertEquals(Kind.VIEW, node(w, "r5").kind());
        assertEquals(Kind.VIEW, node(w, "r4").kind());
        assertEquals(Kind.MOVE, node(w, "tr").kind());
        assertEquals(512L, node(w, "tr").inputBytes());
        assertEquals(512L, node(w, "tr").outputBytes());
        assertEquals(Kind.FOLDED, node(w, "div").kind());
        assertTrue(w.complete());
    }

    /**
     * The channel split of the reference ShuffleNet and the attention's QKV split (ONNX operator
     * definitions, opset 13: Shape, Gather, Add, Div, Mul, Slice): x [1, 48, 7, 7];
     * c = Gather(Shape(x), [1]) = [48]; half = (c + 1) / 2 = 24 (integer division);
     * Slice(x, [0], [half], [1]) -> [1, 24, 7, 7]; Slice(x, [half], [2 * half], [1]) -> [1, 24, 7, 7].
     */
    @Test
    @DisplayName("ONNX operator definitions, opset 13: Shape -> Gather -> Add -> Div -> Mul -> Slice")
    void channelChunk() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("chunk")
                .input("x", ElemType.FLOAT, 1, 48, 7, 7)
                .longs("one", 1)
                .longs("zero", 0)
                .longs("two", 2)
                .node("Shape", "shape", List.of("x"), List.of("s"))
                .node("Gather", "g", List.of("s", "one"), List.of("c"), OnnxWriter.attr("axis", 0L))
                .node("Add", "add", List.of("c", "one"), List.of("c1"))
                .node("Div", "div", List.of("c1", "two"), List.of("half"))
                .node("Mul", "mul", List.of("half", "one"), List.of("e1"))
                .node("Mul", "mul2", List.of("half", "two"), List.of("e2"))
                .node("Slice", "first", List.of("x", "zero", "e1", "one"), List.of("a"))
                .node("Slice", "second", List.of("x", "e1", "e2", "one"), List.of("b"))
                .output("a", ElemType.FLOAT)
                .output("b", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {24}, data(s, "half"));
        assertArrayEquals(new long[] {1, 24, 7, 7}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 24, 7, 7}, dims(s, "b"));
        assertFalse(s.value("a").isConstant());
    }

    /**
     * LayerNormalization (opset 17): Y has X's shape; Mean and InvStdDev keep dims before axis and are
     * 1 from axis on, at stash_type (default 1 = float). X [1, 64, 128], axis -1 -> [1, 64, 1].
     */
    @Test
    @DisplayName("ONNX operator definition: LayerNormalization, opset 17")
    void layerNormalization() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("ln")
                .input("x", ElemType.FLOAT, 1, 64, 128)
                .weight("gamma", ElemType.FLOAT, 128)
                .weight("beta", ElemType.FLOAT, 128)
                .node("LayerNormalization", "ln", List.of("x", "gamma", "beta"), List.of("y", "mean", "inv"),
                        OnnxWriter.attr("axis", -1L), OnnxWriter.attr("epsilon", 1e-5f))
                .input("x2", ElemType.FLOAT16, 2, 3, 4, 5)
                .weight("g2", ElemType.FLOAT16, 4, 5)
                .node("LayerNormalization", "ln2", List.of("x2", "g2"), List.of("y2", "mean2"),
                        OnnxWriter.attr("axis", 2L))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(17, g);
        assertArrayEquals(new long[] {1, 64, 128}, dims(s, "y"));
        assertArrayEquals(new long[] {1, 64, 1}, dims(s, "mean"));
        assertArrayEquals(new long[] {1, 64, 1}, dims(s, "inv"));
        assertEquals(ElemType.FLOAT, s.value("mean").type());
        assertArrayEquals(new long[] {2, 3, 4, 5}, dims(s, "y2"));
        assertEquals(ElemType.FLOAT16, s.value("y2").type());
        assertArrayEquals(new long[] {2, 3, 1, 1}, dims(s, "mean2"));
        assertEquals(ElemType.FLOAT, s.value("mean2").type());
        ModelWorkload w = analyze(17, g);
        // 8 vector ops per element (WorkloadRules): 1 * 64 * 128 * 8.
        assertEquals(65_536L, node(w, "ln").vectorOps());
    }

    /**
     * Layer normalisation as the opset-13 export writes it (ONNX operator definitions, opset 13:
     * ReduceMean with the axes attribute, Sub, Pow, Add, Sqrt, Div, Mul): the statistics have shape
     * [1, 64, 1] and broadcast back to [1, 64, 128].
     */
    @Test
    @DisplayName("ONNX operator definitions, opset 13: ReduceMean -> Sub -> Pow -> ReduceMean -> Add -> Sqrt -> Div")
    void decomposedLayerNorm() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("ln13")
                .input("x", ElemType.FLOAT, 1, 64, 128)
                .initializer(new OnnxWriter.Tensor("p", ElemType.FLOAT).floats(2f))
                .initializer(new OnnxWriter.Tensor("eps", ElemType.FLOAT).floats(1e-5f))
                .weight("gamma", ElemType.FLOAT, 128)
                .node("ReduceMean", "m", List.of("x"), List.of("mean"), OnnxWriter.ints("axes", -1))
                .node("Sub", "sub", List.of("x", "mean"), List.of("d"))
                .node("Pow", "pow", List.of("d", "p"), List.of("d2"))
                .node("ReduceMean", "v", List.of("d2"), List.of("var"), OnnxWriter.ints("axes", -1))
                .node("Add", "add", List.of("var", "eps"), List.of("ve"))
                .node("Sqrt", "sqrt", List.of("ve"), List.of("sd"))
                .node("Div", "div", List.of("d", "sd"), List.of("n"))
                .node("Mul", "mul", List.of("n", "gamma"), List.of("y"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {1, 64, 1}, dims(s, "mean"));
        assertArrayEquals(new long[] {1, 64, 128}, dims(s, "d"));
        assertArrayEquals(new long[] {1, 64, 128}, dims(s, "d2"));
        assertArrayEquals(new long[] {1, 64, 1}, dims(s, "var"));
        assertArrayEquals(new long[] {1, 64, 1}, dims(s, "sd"));
        assertArrayEquals(new long[] {1, 64, 128}, dims(s, "n"));
        assertArrayEquals(new long[] {1, 64, 128}, dims(s, "y"));
        assertEquals(ElemType.FLOAT, s.value("d2").type());
        ModelWorkload w = analyze(13, g);
        long e = 64 * 128;
        assertEquals(e, node(w, "m").vectorOps()); // one per input element
        assertEquals(e, node(w, "sub").vectorOps()); // one per output element
        assertEquals(4 * e, node(w, "pow").vectorOps()); // transcendental: 4 per output element
        assertEquals(4 * 64, node(w, "sqrt").vectorOps());
        assertEquals(e, node(w, "div").vectorOps());
    }

    /** ReduceMean with axes as an input (opset 18) and keepdims 0. */
    @Test
    @DisplayName("ONNX operator definition: ReduceMean, opset 18 (axes input, keepdims 0)")
    void reduceMeanInputAxes() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("rm")
                .input("x", ElemType.FLOAT, 2, 64, 128)
                .longs("ax", 1, -1)
                .node("ReduceMean", "m", List.of("x", "ax"), List.of("y"), OnnxWriter.attr("keepdims", 0L))
                .node("ReduceMean", "all", List.of("x"), List.of("z"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(18, g);
        assertArrayEquals(new long[] {2}, dims(s, "y"));
        assertArrayEquals(new long[] {1, 1, 1}, dims(s, "z"));
    }

    /**
     * QuantizeLinear: y has x's shape and the zero point's type (uint8 when the zero point is omitted);
     * DequantizeLinear: y has x's shape and the scale's type (ONNX operator definitions, opset 13, with
     * per-axis scales).
     */
    @Test
    @DisplayName("ONNX operator definitions: QuantizeLinear and DequantizeLinear, opset 13 (types)")
    void quantizationTypes() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("q")
                .input("x", ElemType.FLOAT, 1, 3, 8, 8)
                .initializer(new OnnxWriter.Tensor("s", ElemType.FLOAT).floats(0.1f))
                .initializer(new OnnxWriter.Tensor("z8", ElemType.INT8).raw(new byte[] {0}))
                .weight("w", ElemType.INT8, 12, 3, 3, 3)
                .weight("ws", ElemType.FLOAT, 12)
                .weight("wz", ElemType.INT8, 12)
                .node("QuantizeLinear", "q", List.of("x", "s", "z8"), List.of("xq"))
                .node("QuantizeLinear", "qu", List.of("x", "s"), List.of("xu"))
                .node("DequantizeLinear", "dq", List.of("xq", "s", "z8"), List.of("xd"))
                .node("DequantizeLinear", "wdq", List.of("w", "ws", "wz"), List.of("wd"), OnnxWriter.attr("axis", 0L))
                .output("xd", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertEquals(ElemType.INT8, s.value("xq").type());
        assertArrayEquals(new long[] {1, 3, 8, 8}, dims(s, "xq"));
        assertEquals(ElemType.UINT8, s.value("xu").type());
        assertEquals(ElemType.FLOAT, s.value("xd").type());
        assertEquals(ElemType.FLOAT, s.value("wd").type());
        assertArrayEquals(new long[] {12, 3, 3, 3}, dims(s, "wd"));
        assertTrue(s.value("wd").isConstant());
    }
}
