package dev.erg.shape;

import static dev.erg.TestModels.data;
import static dev.erg.TestModels.dims;
import static dev.erg.TestModels.shaped;
import static dev.erg.shape.OpsetFormsShapeTest.assertBad;
import static dev.erg.shape.OpsetFormsShapeTest.floatScalar;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.graph.Graph;
import dev.erg.graph.Node;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Shapes and types of the tensor, quantization, data-dependent and generator operators, each from its
 * ONNX operator definition at the opset named in the test.
 */
class TensorBreadthShapeTest {

    static OnnxWriter.Graph g() {
        return new OnnxWriter.Graph("t");
    }

    static Node nodeNamed(Graph s, String name) {
        for (Node n : s.nodes()) {
            if (n.name().equals(name)) {
                return n;
            }
        }
        throw new IllegalArgumentException(name);
    }

    /**
     * GatherElements-13: indices' shape; GatherND-12 batch_dims 1: [2, 3, 4] by [2, 5, 1] ->
     * indices[:-1] + data[1 + 1:] = [2, 5, 4]; batch_dims 0: [2, 3, 4] by [6, 2] -> [6, 4].
     * ScatterND-16 and ScatterElements-18 keep data's shape.
     */
    @Test
    @DisplayName("ONNX operator definitions: GatherElements 13, GatherND 12, ScatterND 16, ScatterElements 18")
    void gatherScatter() {
        OnnxWriter.Graph graph = g()
                .input("d", ElemType.FLOAT, 3, 4)
                .input("i", ElemType.INT64, 3, 2)
                .input("d3", ElemType.FLOAT, 2, 3, 4)
                .input("nb", ElemType.INT64, 2, 5, 1)
                .input("n0", ElemType.INT64, 6, 2)
                .input("u", ElemType.FLOAT, 6, 4)
                .node("GatherElements", "ge", List.of("d", "i"), List.of("a"), OnnxWriter.attr("axis", 1L))
                .node("GatherND", "gb", List.of("d3", "nb"), List.of("b"), OnnxWriter.attr("batch_dims", 1L))
                .node("GatherND", "g0", List.of("d3", "n0"), List.of("c"))
                .node("ScatterND", "sn", List.of("d3", "n0", "u"), List.of("e"), OnnxWriter.attr("reduction", "add"))
                .node("ScatterElements", "se", List.of("d", "i", "i"), List.of("f"), OnnxWriter.attr("axis", 1L))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(18, graph);
        assertArrayEquals(new long[] {3, 2}, dims(s, "a"));
        assertArrayEquals(new long[] {2, 5, 4}, dims(s, "b"));
        assertArrayEquals(new long[] {6, 4}, dims(s, "c"));
        assertArrayEquals(new long[] {2, 3, 4}, dims(s, "e"));
        assertArrayEquals(new long[] {3, 4}, dims(s, "f"));
        OnnxWriter.Graph bad = g()
                .input("d", ElemType.FLOAT, 3, 4)
                .input("i", ElemType.INT64, 3)
                .node("GatherElements", "ge", List.of("d", "i"), List.of("a"))
                .output("a", ElemType.FLOAT);
        assertBad(13, bad, "'ge' (GatherElements)", "same rank");
    }

    /** Tile-13 evaluated on a constant: [[1, 2]] by repeats [2, 2] -> [[1, 2, 1, 2], [1, 2, 1, 2]]. */
    @Test
    @DisplayName("ONNX operator definition: Tile, opset 13 (constant evaluation)")
    void tile() {
        OnnxWriter.Graph graph = g()
                .initializer(new OnnxWriter.Tensor("x", ElemType.INT64, 1, 2).longs(1, 2))
                .longs("rep", 2, 2)
                .node("Tile", "t", List.of("x", "rep"), List.of("y"))
                .output("y", ElemType.INT64);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {2, 4}, dims(s, "y"));
        assertArrayEquals(new long[] {1, 2, 1, 2, 1, 2, 1, 2}, data(s, "y"));
    }

    /** DepthToSpace-13 (DCR and CRD alike) [1, 8, 2, 3] blocksize 2 -> [1, 2, 4, 6]; SpaceToDepth-13 the inverse. */
    @Test
    @DisplayName("ONNX operator definitions: DepthToSpace and SpaceToDepth, opset 13")
    void depthSpace() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 8, 2, 3)
                .node("DepthToSpace", "dcr", List.of("x"), List.of("a"), OnnxWriter.attr("blocksize", 2L))
                .node("DepthToSpace", "crd", List.of("x"), List.of("b"), OnnxWriter.attr("blocksize", 2L),
                        OnnxWriter.attr("mode", "CRD"))
                .node("SpaceToDepth", "s2d", List.of("a"), List.of("c"), OnnxWriter.attr("blocksize", 2L))
                .output("c", ElemType.FLOAT);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {1, 2, 4, 6}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 2, 4, 6}, dims(s, "b"));
        assertArrayEquals(new long[] {1, 8, 2, 3}, dims(s, "c"));
    }

    /**
     * Where-16 broadcasts all three: [2, 1], [1, 3], [] -> [2, 3]; CumSum-14 and Trilu-14 keep the
     * shape; OneHot-11 depth 10 at axis -1 -> [2, 3, 10], axis 0 -> [10, 2, 3], of the values' type.
     */
    @Test
    @DisplayName("ONNX operator definitions: Where 16, CumSum 14, Trilu 14, OneHot 11")
    void whereCumSumTriluOneHot() {
        OnnxWriter.Graph graph = g()
                .input("c", ElemType.BOOL, 2, 1)
                .input("x", ElemType.FLOAT, 1, 3)
                .input("ind", ElemType.INT64, 2, 3)
                .initializer(floatScalar("y", 0))
                .longs("ax", 1)
                .longs("depth", 10)
                .initializer(new OnnxWriter.Tensor("vals", ElemType.FLOAT, 2).floats(0, 1))
                .node("Where", "w", List.of("c", "x", "y"), List.of("a"))
                .node("CumSum", "cs", List.of("a", "ax"), List.of("b"), OnnxWriter.attr("reverse", 1L))
                .node("Trilu", "tl", List.of("a"), List.of("t"), OnnxWriter.attr("upper", 0L))
                .node("OneHot", "oh", List.of("ind", "depth", "vals"), List.of("o1"))
                .node("OneHot", "oh0", List.of("ind", "depth", "vals"), List.of("o0"), OnnxWriter.attr("axis", 0L))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(16, graph);
        assertArrayEquals(new long[] {2, 3}, dims(s, "a"));
        assertArrayEquals(new long[] {2, 3}, dims(s, "b"));
        assertArrayEquals(new long[] {2, 3}, dims(s, "t"));
        assertArrayEquals(new long[] {2, 3, 10}, dims(s, "o1"));
        assertArrayEquals(new long[] {10, 2, 3}, dims(s, "o0"));
        assertEquals(ElemType.FLOAT, s.value("o0").type());
    }

    /**
     * Range-11: max(ceil((limit - start) / delta), 0) elements: (0, 10, 3) -> 4 values 0, 3, 6, 9;
     * Size-13 and Shape-15 (start 1, end -1 on rank 4: dims 1 and 2; start -10 clamps to 0) are folded values.
     */
    @Test
    @DisplayName("ONNX operator definitions: Range 11, Size 13, Shape 15 (start, end)")
    void rangeSizeShape() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 3, 4, 5)
                .initializer(new OnnxWriter.Tensor("s", ElemType.INT64).longs(0))
                .initializer(new OnnxWriter.Tensor("l", ElemType.INT64).longs(10))
                .initializer(new OnnxWriter.Tensor("d", ElemType.INT64).longs(3))
                .node("Range", "r", List.of("s", "l", "d"), List.of("rg"))
                .node("Size", "sz", List.of("x"), List.of("n"))
                .node("Shape", "sh", List.of("x"), List.of("mid"), OnnxWriter.attr("start", 1L), OnnxWriter.attr("end", -1L))
                .node("Shape", "sh2", List.of("x"), List.of("all"), OnnxWriter.attr("start", -10L))
                .output("rg", ElemType.INT64);
        Graph s = shaped(15, graph);
        assertArrayEquals(new long[] {0, 3, 6, 9}, data(s, "rg"));
        assertArrayEquals(new long[] {120}, data(s, "n"));
        assertArrayEquals(new long[] {3, 4}, data(s, "mid"));
        assertArrayEquals(new long[] {2, 3, 4, 5}, data(s, "all"));
    }

    /**
     * ConstantOfShape-9 takes its type from the value tensor; EyeLike-9 needs a 2-D input and takes dtype;
     * CastLike-15 takes the second input's type; Identity, Gelu-20 (approximate tanh), Celu, Mish and
     * HardSwish keep shape and type.
     */
    @Test
    @DisplayName("ONNX operator definitions: ConstantOfShape 9, EyeLike 9, CastLike 15, Gelu 20, Celu 12, Mish 18, HardSwish 14")
    void generatorsAndActivations() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 3, 4)
                .input("h", ElemType.FLOAT16, 1)
                .longs("shape", 2, 3)
                .node("ConstantOfShape", "cos", List.of("shape"), List.of("k"),
                        OnnxWriter.tensor("value", new OnnxWriter.Tensor("v", ElemType.INT64, 1).longs(7)))
                .node("EyeLike", "eye", List.of("x"), List.of("e"), OnnxWriter.attr("dtype", 7L))
                .node("CastLike", "cl", List.of("x", "h"), List.of("c"))
                .node("Identity", "id", List.of("x"), List.of("i"))
                .node("Gelu", "gelu", List.of("x"), List.of("g1"), OnnxWriter.attr("approximate", "tanh"))
                .node("Celu", "celu", List.of("x"), List.of("g2"))
                .node("Mish", "mish", List.of("x"), List.of("g3"))
                .node("HardSwish", "hs", List.of("x"), List.of("g4"))
                .output("k", ElemType.INT64);
        Graph s = shaped(20, graph);
        assertArrayEquals(new long[] {2, 3}, dims(s, "k"));
        assertEquals(ElemType.INT64, s.value("k").type());
        assertArrayEquals(new long[] {7, 7, 7, 7, 7, 7}, data(s, "k"));
        assertEquals(ElemType.INT64, s.value("e").type());
        assertArrayEquals(new long[] {3, 4}, dims(s, "e"));
        assertEquals(ElemType.FLOAT16, s.value("c").type());
        for (String v : new String[] {"i", "g1", "g2", "g3", "g4"}) {
            assertArrayEquals(new long[] {3, 4}, dims(s, v), v);
        }
        OnnxWriter.Graph bad = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .node("EyeLike", "eye", List.of("x"), List.of("e"))
                .output("e", ElemType.FLOAT);
        assertBad(9, bad, "'eye' (EyeLike)", "2-D input");
    }

    /** CenterCropPad-18 on axes [0, 1] to [8, 9]: [10, 7, 3] -> [8, 9, 3]; ReverseSequence-10 keeps the shape. */
    @Test
    @DisplayName("ONNX operator definitions: CenterCropPad 18, ReverseSequence 10")
    void cropAndReverse() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 10, 7, 3)
                .input("lens", ElemType.INT64, 7)
                .longs("shape", 8, 9)
                .node("CenterCropPad", "ccp", List.of("x", "shape"), List.of("a"), OnnxWriter.ints("axes", 0, 1))
                .node("ReverseSequence", "rs", List.of("x", "lens"), List.of("b"), OnnxWriter.attr("batch_axis", 1L),
                        OnnxWriter.attr("time_axis", 0L))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(18, graph);
        assertArrayEquals(new long[] {8, 9, 3}, dims(s, "a"));
        assertArrayEquals(new long[] {10, 7, 3}, dims(s, "b"));
    }

    /**
     * RandomNormal-1 [2, 3] fp32 (default dtype); RandomUniformLike-1 and Bernoulli-15 take the input's shape
     * (dtype when given); Multinomial-7 [4, 10] with sample_size 3 -> int32 [4, 3]; HannWindow-17 size 16 -> [16].
     * Random values are never folded, even from constant inputs.
     */
    @Test
    @DisplayName("ONNX operator definitions: RandomNormal 1, RandomUniformLike 1, Bernoulli 15, Multinomial 7, HannWindow 17")
    void randomAndWindows() {
        OnnxWriter.Graph graph = g()
                .input("p", ElemType.FLOAT, 4, 10)
                .initializer(new OnnxWriter.Tensor("size", ElemType.INT64).longs(16))
                .node("RandomNormal", "rn", List.of(), List.of("a"), OnnxWriter.ints("shape", 2, 3))
                .node("RandomUniformLike", "rul", List.of("p"), List.of("b"), OnnxWriter.attr("dtype", 11L))
                .node("Bernoulli", "be", List.of("p"), List.of("c"))
                .node("Multinomial", "mn", List.of("p"), List.of("d"), OnnxWriter.attr("sample_size", 3L))
                .node("HannWindow", "hw", List.of("size"), List.of("w"))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(17, graph);
        assertArrayEquals(new long[] {2, 3}, dims(s, "a"));
        assertEquals(ElemType.FLOAT, s.value("a").type());
        assertEquals(ElemType.DOUBLE, s.value("b").type());
        assertArrayEquals(new long[] {4, 10}, dims(s, "c"));
        assertArrayEquals(new long[] {4, 3}, dims(s, "d"));
        assertEquals(ElemType.INT32, s.value("d").type());
        assertArrayEquals(new long[] {16}, dims(s, "w"));
        assertTrue(!nodeNamed(s, "rn").isFolded(), "a random generator is never folded");
    }

    /**
     * QuantizeLinear-13 per axis: a 1-D scale of x.shape[axis] values; a scale of another length is an
     * error. QuantizeLinear-21 blocked: x [4, 6], block_size 3 on axis 1 -> scale [4, ceil(6 / 3) = 2];
     * output_dtype sets the type without a zero point. DequantizeLinear-21 blocked gives the scale's type.
     */
    @Test
    @DisplayName("ONNX operator definitions: QuantizeLinear and DequantizeLinear, opsets 13 (per axis) and 21 (blocked)")
    void quantizationForms() {
        OnnxWriter.Graph perAxis = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .weight("s", ElemType.FLOAT, 3)
                .weight("z", ElemType.INT8, 3)
                .node("QuantizeLinear", "q", List.of("x", "s", "z"), List.of("y"), OnnxWriter.attr("axis", 1L))
                .output("y", ElemType.INT8);
        Graph s13 = shaped(13, perAxis);
        assertEquals(ElemType.INT8, s13.value("y").type());
        assertArrayEquals(new long[] {2, 3, 4}, dims(s13, "y"));
        OnnxWriter.Graph wrongAxis = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .weight("s", ElemType.FLOAT, 4)
                .node("QuantizeLinear", "q", List.of("x", "s"), List.of("y"), OnnxWriter.attr("axis", 1L))
                .output("y", ElemType.UINT8);
        assertBad(13, wrongAxis, "'q' (QuantizeLinear)", "per axis 1");
        // Per-axis scales are not in QuantizeLinear-10.
        OnnxWriter.Graph v10 = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .weight("s", ElemType.FLOAT, 3)
                .node("QuantizeLinear", "q", List.of("x", "s"), List.of("y"))
                .output("y", ElemType.UINT8);
        assertBad(10, v10, "'q' (QuantizeLinear)", "at opset 10");
        OnnxWriter.Graph blocked = g()
                .input("x", ElemType.FLOAT, 4, 6)
                .input("xq", ElemType.INT8, 4, 6)
                .weight("s", ElemType.FLOAT, 4, 2)
                .node("QuantizeLinear", "q", List.of("x", "s"), List.of("y"), OnnxWriter.attr("axis", 1L),
                        OnnxWriter.attr("block_size", 3L), OnnxWriter.attr("output_dtype", 3L))
                .node("DequantizeLinear", "dq", List.of("xq", "s"), List.of("f"), OnnxWriter.attr("axis", 1L),
                        OnnxWriter.attr("block_size", 3L))
                .output("y", ElemType.INT8);
        Graph s21 = shaped(21, blocked);
        assertEquals(ElemType.INT8, s21.value("y").type());
        assertEquals(ElemType.FLOAT, s21.value("f").type());
        assertArrayEquals(new long[] {4, 6}, dims(s21, "f"));
        OnnxWriter.Graph badBlock = g()
                .input("xq", ElemType.INT8, 4, 6)
                .weight("s", ElemType.FLOAT, 4, 3)
                .node("DequantizeLinear", "dq", List.of("xq", "s"), List.of("f"), OnnxWriter.attr("axis", 1L),
                        OnnxWriter.attr("block_size", 3L))
                .output("f", ElemType.FLOAT);
        assertBad(21, badBlock, "'dq' (DequantizeLinear)", "blocked");
    }

    /**
     * QLinearConv-10 (y_zero_point's type), ConvInteger-10 and MatMulInteger-10 (int32), QLinearMatMul-10,
     * DynamicQuantizeLinear-11 (uint8 y, fp32 scalar scale, uint8 scalar zero point).
     */
    @Test
    @DisplayName("ONNX operator definitions: QLinearConv, ConvInteger, QLinearMatMul, MatMulInteger, DynamicQuantizeLinear")
    void integerOperators() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.UINT8, 1, 2, 5, 5)
                .input("a", ElemType.INT8, 2, 3)
                .input("f", ElemType.FLOAT, 2, 3)
                .weight("w", ElemType.UINT8, 4, 2, 3, 3)
                .weight("b", ElemType.INT8, 3, 4)
                .initializer(floatScalar("sc", 0.1f))
                .initializer(new OnnxWriter.Tensor("zu", ElemType.UINT8).raw(new byte[] {0}))
                .initializer(new OnnxWriter.Tensor("zi", ElemType.INT8).raw(new byte[] {0}))
                .node("QLinearConv", "qc", List.of("x", "sc", "zu", "w", "sc", "zu", "sc", "zu"), List.of("y1"))
                .node("ConvInteger", "ci", List.of("x", "w"), List.of("y2"))
                .node("QLinearMatMul", "qm", List.of("a", "sc", "zi", "b", "sc", "zi", "sc", "zi"), List.of("y3"))
                .node("MatMulInteger", "mi", List.of("a", "b"), List.of("y4"))
                .node("DynamicQuantizeLinear", "dql", List.of("f"), List.of("q", "qs", "qz"))
                .output("y1", ElemType.UINT8);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {1, 4, 3, 3}, dims(s, "y1"));
        assertEquals(ElemType.UINT8, s.value("y1").type());
        assertEquals(ElemType.INT32, s.value("y2").type());
        assertArrayEquals(new long[] {2, 4}, dims(s, "y3"));
        assertEquals(ElemType.INT8, s.value("y3").type());
        assertEquals(ElemType.INT32, s.value("y4").type());
        assertEquals(ElemType.UINT8, s.value("q").type());
        assertArrayEquals(new long[0], dims(s, "qs"));
        assertEquals(ElemType.UINT8, s.value("qz").type());
    }

    /**
     * NonMaxSuppression-11 on boxes [2, 50, 4] and scores [2, 3, 50]: at most min(M, N) boxes per class and
     * batch. M = 10: 2 * 3 * 10 = 60 rows; M = 100: min(100, 50) = 50, 300 rows; M omitted (default 0): none;
     * M computed at run time: every box, 300 rows. The bound is stated in the node's note.
     */
    @Test
    @DisplayName("ONNX operator definition: NonMaxSuppression, opset 11 (upper bound on the selected count)")
    void nonMaxSuppression() {
        OnnxWriter.Graph graph = g()
                .input("boxes", ElemType.FLOAT, 2, 50, 4)
                .input("scores", ElemType.FLOAT, 2, 3, 50)
                .input("mrun", ElemType.INT64, 1)
                .longs("m10", 10)
                .longs("m100", 100)
                .node("NonMaxSuppression", "n10", List.of("boxes", "scores", "m10"), List.of("a"))
                .node("NonMaxSuppression", "n100", List.of("boxes", "scores", "m100"), List.of("b"),
                        OnnxWriter.attr("center_point_box", 1L))
                .node("NonMaxSuppression", "none", List.of("boxes", "scores"), List.of("c"))
                .node("NonMaxSuppression", "run", List.of("boxes", "scores", "mrun"), List.of("d"))
                .output("a", ElemType.INT64);
        Graph s = shaped(11, graph);
        assertArrayEquals(new long[] {60, 3}, dims(s, "a"));
        assertArrayEquals(new long[] {300, 3}, dims(s, "b"));
        assertArrayEquals(new long[] {0, 3}, dims(s, "c"));
        assertArrayEquals(new long[] {300, 3}, dims(s, "d"));
        assertEquals(ElemType.INT64, s.value("a").type());
        assertTrue(nodeNamed(s, "n10").note().contains("upper bound"), nodeNamed(s, "n10").note());
        assertTrue(nodeNamed(s, "run").note().contains("computed at run time"), nodeNamed(s, "run").note());
        assertNull(nodeNamed(s, "none").note());
    }

    /**
     * Unique-11: flat, every element assumed distinct (upper bound, noted): [2, 5] -> Y [10], indices [10],
     * inverse_indices [10], counts [10]; known values [1, 2, 2, 3] -> 3 unique; axis 0 on [4, 3]: Y [4, 3],
     * inverse_indices [4]. NonZero-13 on a runtime [3, 4]: [2, 12] (noted), on a constant: the exact count.
     */
    @Test
    @DisplayName("ONNX operator definitions: Unique 11 and NonZero 13 (data-dependent sizes)")
    void uniqueAndNonZero() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 5)
                .input("m", ElemType.FLOAT, 4, 3)
                .longs("k", 1, 2, 2, 3)
                .longs("nz", 0, 4, 0, 5)
                .node("Unique", "u", List.of("x"), List.of("y", "idx", "inv", "cnt"))
                .node("Unique", "uk", List.of("k"), List.of("yk"))
                .node("Unique", "ua", List.of("m"), List.of("ya", "ia", "inva", "ca"), OnnxWriter.attr("axis", 0L))
                .node("NonZero", "nzr", List.of("m"), List.of("p"))
                .node("NonZero", "nzc", List.of("nz"), List.of("q"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, graph);
        for (String v : new String[] {"y", "idx", "inv", "cnt"}) {
            assertArrayEquals(new long[] {10}, dims(s, v), v);
        }
        assertNotNull(nodeNamed(s, "u").note());
        assertArrayEquals(new long[] {3}, dims(s, "yk"));
        assertArrayEquals(new long[] {4, 3}, dims(s, "ya"));
        assertArrayEquals(new long[] {4}, dims(s, "inva"));
        assertArrayEquals(new long[] {2, 12}, dims(s, "p"));
        assertNotNull(nodeNamed(s, "nzr").note());
        assertArrayEquals(new long[] {1, 2}, dims(s, "q"));
    }
}
