package dev.erg.shape;

import static dev.erg.TestModels.data;
import static dev.erg.TestModels.dims;
import static dev.erg.TestModels.shaped;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Shapes (and, for the small integer tensors that feed shapes, values) of the operators that view,
 * select and move tensors, each from its ONNX operator definition at the opset the model imports.
 */
class TensorShapeTest {

    static OnnxWriter.Graph graph() {
        return new OnnxWriter.Graph("t");
    }

    /** Reshape: a 0 copies the input dim at that position, one -1 takes the remaining elements. */
    @Test
    @DisplayName("ONNX operator definition: Reshape, opset 13 (0 and -1)")
    void reshapeZeroAndMinusOne() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .longs("s", 0, -1)
                .longs("s2", -1, 0, 2)
                .node("Reshape", "r", List.of("x", "s"), List.of("y"))
                .node("Reshape", "r2", List.of("x", "s2"), List.of("y2"))
                .output("y", ElemType.FLOAT)
                .output("y2", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {2, 12}, dims(s, "y"));
        // -1, copy dim 1 (3), 2: 24 / (3 * 2) = 4.
        assertArrayEquals(new long[] {4, 3, 2}, dims(s, "y2"));
    }

    /** Reshape allowzero = 1 (added in opset 14): a 0 is a zero-sized dim, not a copy. */
    @Test
    @DisplayName("ONNX operator definition: Reshape, opset 14 (allowzero)")
    void reshapeAllowZero() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 0, 4)
                .longs("s", 4, 0)
                .node("Reshape", "r", List.of("x", "s"), List.of("y"), OnnxWriter.attr("allowzero", 1L))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {4, 0}, dims(shaped(14, g), "y"));
        // Without allowzero the same 0 copies dim 1 (4): [4, 4] holds 16 elements, the input 0.
        OnnxWriter.Graph bad = graph()
                .input("x", ElemType.FLOAT, 0, 4)
                .longs("s", 4, 0)
                .node("Reshape", "r", List.of("x", "s"), List.of("y"))
                .output("y", ElemType.FLOAT);
        BadInputException e = assertThrows(BadInputException.class, () -> shaped(14, bad));
        assertTrue(e.getMessage().contains("'r' (Reshape)"), e.getMessage());
    }

    /** Flatten: [prod(d[0:axis]), prod(d[axis:])], axis in [-r, r]. */
    @Test
    @DisplayName("ONNX operator definition: Flatten, opset 13")
    void flatten() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 2, 3, 4, 5)
                .node("Flatten", "f1", List.of("x"), List.of("y1"), OnnxWriter.attr("axis", 2L))
                .node("Flatten", "f0", List.of("x"), List.of("y0"), OnnxWriter.attr("axis", 0L))
                .node("Flatten", "fm", List.of("x"), List.of("ym"), OnnxWriter.attr("axis", -1L))
                .node("Flatten", "fd", List.of("x"), List.of("yd"))
                .output("y1", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {6, 20}, dims(s, "y1"));
        assertArrayEquals(new long[] {1, 120}, dims(s, "y0"));
        assertArrayEquals(new long[] {24, 5}, dims(s, "ym"));
        assertArrayEquals(new long[] {2, 60}, dims(s, "yd"));
    }

    /** Squeeze / Unsqueeze with the axes attribute (opset 11; negative axes allowed). */
    @Test
    @DisplayName("ONNX operator definitions: Squeeze and Unsqueeze, opset 11 (axes attribute)")
    void squeezeUnsqueezeAttr() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 1, 3, 1, 5)
                .input("v", ElemType.FLOAT, 3, 4)
                .node("Squeeze", "sq", List.of("x"), List.of("y"), OnnxWriter.ints("axes", 0, -2))
                .node("Squeeze", "sqall", List.of("x"), List.of("yall"))
                // Unsqueeze axes index the output: rank 2 + 2 = 4; -1 is axis 3.
                .node("Unsqueeze", "un", List.of("v"), List.of("u"), OnnxWriter.ints("axes", 0, -1))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(11, g);
        assertArrayEquals(new long[] {3, 5}, dims(s, "y"));
        assertArrayEquals(new long[] {3, 5}, dims(s, "yall"));
        assertArrayEquals(new long[] {1, 3, 4, 1}, dims(s, "u"));
    }

    /** Squeeze / Unsqueeze with axes as an input (opset 13). */
    @Test
    @DisplayName("ONNX operator definitions: Squeeze and Unsqueeze, opset 13 (axes input)")
    void squeezeUnsqueezeInput() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 1, 3, 1, 5)
                .input("v", ElemType.FLOAT, 3, 4)
                .longs("ax", 2)
                .longs("uax", 1, 3)
                .node("Squeeze", "sq", List.of("x", "ax"), List.of("y"))
                .node("Unsqueeze", "un", List.of("v", "uax"), List.of("u"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {1, 3, 5}, dims(s, "y"));
        assertArrayEquals(new long[] {3, 1, 4, 1}, dims(s, "u"));
    }

    /** Squeezing an axis whose size is not 1 is invalid under the definition: one clear error. */
    @Test
    @DisplayName("ONNX operator definition: Squeeze, opset 13 (axis of size 3 is an error)")
    void squeezeNonUnitAxis() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 1, 3)
                .longs("ax", 1)
                .node("Squeeze", "sq", List.of("x", "ax"), List.of("y"))
                .output("y", ElemType.FLOAT);
        BadInputException e = assertThrows(BadInputException.class, () -> shaped(13, g));
        assertTrue(e.getMessage().contains("'sq' (Squeeze)"), e.getMessage());
    }

    /**
     * Slice (opset 13): negative starts/ends count from the end; values are clamped to [0, dim] for
     * positive steps and to [0, dim - 1] / [-1, dim - 1] for negative ones; count = ceil((end - start) / step).
     * axis 0 (10): start -3 -> 7, end 100 -> 10: 3.
     * axis 1 (8): start 7, end -100 -> clamped to -1, step -2: 7, 5, 3, 1 -> 4.
     * axis 2 (6): start 1, end 6, step 2: 1, 3, 5 -> 3.
     */
    @Test
    @DisplayName("ONNX operator definition: Slice, opset 13 (negative, clamping, steps)")
    void slice() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 10, 8, 6)
                .longs("st", -3, 7, 1)
                .longs("en", 100, -100, 6)
                .longs("ax", 0, 1, 2)
                .longs("sp", 1, -2, 2)
                .longs("st2", 5)
                .longs("en2", 2)
                .longs("ax2", -1)
                .node("Slice", "s", List.of("x", "st", "en", "ax", "sp"), List.of("y"))
                // start past end with a positive step: empty axis.
                .node("Slice", "s2", List.of("x", "st2", "en2", "ax2"), List.of("y2"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {3, 4, 3}, dims(s, "y"));
        assertArrayEquals(new long[] {10, 8, 0}, dims(s, "y2"));
    }

    /** Slice of a Shape is evaluated: Shape([2,3,5,7])[-2:] = [5, 7]; reversed with step -1: [7, 5, 3, 2]. */
    @Test
    @DisplayName("ONNX operator definitions: Shape, opset 13 and Slice, opset 13 (constant evaluation)")
    void sliceOfShape() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 2, 3, 5, 7)
                .longs("st", -2)
                .longs("en", Long.MAX_VALUE)
                .longs("rst", -1)
                .longs("ren", Long.MIN_VALUE)
                .longs("ax", 0)
                .longs("rsp", -1)
                .node("Shape", "shape", List.of("x"), List.of("s"))
                .node("Slice", "tail", List.of("s", "st", "en"), List.of("t"))
                .node("Slice", "rev", List.of("s", "rst", "ren", "ax", "rsp"), List.of("r"))
                .output("t", ElemType.INT64);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {5, 7}, data(s, "t"));
        assertArrayEquals(new long[] {7, 5, 3, 2}, data(s, "r"));
    }

    /**
     * Gather of a Shape (axis 0): a scalar index gives a scalar (rank r - 1 + 0), a vector of indices a
     * vector; negative indices count from the end. Both are evaluated.
     */
    @Test
    @DisplayName("ONNX operator definitions: Shape, opset 13 and Gather, opset 13 (constant evaluation)")
    void gatherOfShape() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 2, 3, 5)
                .initializer(new OnnxWriter.Tensor("i", ElemType.INT64).longs(1))
                .longs("iv", -1, 0)
                .node("Shape", "shape", List.of("x"), List.of("s"))
                .node("Gather", "g1", List.of("s", "i"), List.of("c"), OnnxWriter.attr("axis", 0L))
                .node("Gather", "g2", List.of("s", "iv"), List.of("v"))
                .output("c", ElemType.INT64);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[0], dims(s, "c"));
        assertArrayEquals(new long[] {3}, data(s, "c"));
        assertArrayEquals(new long[] {2}, dims(s, "v"));
        assertArrayEquals(new long[] {5, 2}, data(s, "v"));
        assertTrue(s.value("v").isConstant());
    }

    /** Gather along axis 1 of a tensor: out = d[:axis] + indices.shape + d[axis+1:]. */
    @Test
    @DisplayName("ONNX operator definition: Gather, opset 13 (axis 1, 2-D indices)")
    void gatherAxis1() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 4, 10, 3)
                .initializer(new OnnxWriter.Tensor("i", ElemType.INT64, 2, 2).longs(0, 1, 2, 3))
                .node("Gather", "g", List.of("x", "i"), List.of("y"), OnnxWriter.attr("axis", 1L))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {4, 2, 2, 3}, dims(shaped(13, g), "y"));
    }

    /** Concat: inputs agree on every axis but axis, which adds up; negative axis allowed. Values evaluated. */
    @Test
    @DisplayName("ONNX operator definition: Concat, opset 13")
    void concat() {
        OnnxWriter.Graph g = graph()
                .input("a", ElemType.FLOAT, 2, 3)
                .input("b", ElemType.FLOAT, 2, 5)
                .longs("p", 1, 2)
                .longs("q", 3)
                .node("Concat", "c", List.of("a", "b", "a"), List.of("y"), OnnxWriter.attr("axis", -1L))
                .node("Concat", "cv", List.of("p", "q"), List.of("v"), OnnxWriter.attr("axis", 0L))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {2, 11}, dims(s, "y"));
        assertArrayEquals(new long[] {1, 2, 3}, data(s, "v"));
    }

    /**
     * Expand: the output is the multidirectional broadcast of the input shape and the given shape, so a
     * 1 in the shape keeps the input's dim and a shorter shape is aligned to the right.
     * [3, 1] with [2, 1, 4] -> [2, 3, 4]; [2, 1, 6] with [2, 1] -> [2, 2, 6].
     */
    @Test
    @DisplayName("ONNX operator definition: Expand, opset 13")
    void expand() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 3, 1)
                .input("z", ElemType.FLOAT, 2, 1, 6)
                .longs("s", 2, 1, 4)
                .longs("s2", 2, 1)
                .node("Expand", "e", List.of("x", "s"), List.of("y"))
                .node("Expand", "e2", List.of("z", "s2"), List.of("y2"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {2, 3, 4}, dims(s, "y"));
        assertArrayEquals(new long[] {2, 2, 6}, dims(s, "y2"));
    }

    /**
     * Resize (opset 13): with scales, out = floor(in * scale); with sizes, out = sizes. roi and scales
     * may be omitted ("") or given as empty tensors, as exporters write them.
     * [1, 3, 5, 5] with scales [1, 1, 0.5, 1.5] -> [1, 3, floor(2.5), floor(7.5)] = [1, 3, 2, 7].
     */
    @Test
    @DisplayName("ONNX operator definition: Resize, opset 13 (scales and sizes)")
    void resize() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 1, 3, 5, 5)
                .input("u", ElemType.FLOAT, 1, 32, 64, 64)
                .initializer(new OnnxWriter.Tensor("roi", ElemType.FLOAT, 0).raw(new byte[0]))
                .initializer(new OnnxWriter.Tensor("noscales", ElemType.FLOAT, 0).raw(new byte[0]))
                .initializer(new OnnxWriter.Tensor("sc", ElemType.FLOAT, 4).floats(1, 1, 0.5f, 1.5f))
                .initializer(new OnnxWriter.Tensor("sc2", ElemType.FLOAT, 4).floats(1, 1, 2, 2))
                .longs("sz", 1, 3, 7, 9)
                .node("Resize", "rs", List.of("x", "roi", "sc"), List.of("y"))
                .node("Resize", "rz", List.of("x", "", "noscales", "sz"), List.of("y2"))
                .node("Resize", "up", List.of("u", "roi", "sc2"), List.of("y3"), OnnxWriter.attr("mode", "linear"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {1, 3, 2, 7}, dims(s, "y"));
        assertArrayEquals(new long[] {1, 3, 7, 9}, dims(s, "y2"));
        assertArrayEquals(new long[] {1, 32, 128, 128}, dims(s, "y3"));
    }

    /** Transpose: out[i] = in[perm[i]]; without perm the axes are reversed. */
    @Test
    @DisplayName("ONNX operator definition: Transpose, opset 13")
    void transpose() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 1, 3, 4, 5)
                .node("Transpose", "t", List.of("x"), List.of("y"), OnnxWriter.ints("perm", 0, 2, 3, 1))
                .node("Transpose", "tr", List.of("x"), List.of("y2"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {1, 4, 5, 3}, dims(s, "y"));
        assertArrayEquals(new long[] {5, 4, 3, 1}, dims(s, "y2"));
    }

    /** Split with the split attribute (opset 11), and equal parts when it is absent. */
    @Test
    @DisplayName("ONNX operator definition: Split, opset 11 (split attribute)")
    void splitAttr() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 3, 6)
                .node("Split", "sp", List.of("x"), List.of("a", "b"), OnnxWriter.attr("axis", 1L),
                        OnnxWriter.ints("split", 2, 4))
                .node("Split", "eq", List.of("x"), List.of("c", "d", "e"), OnnxWriter.attr("axis", -1L))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(11, g);
        assertArrayEquals(new long[] {3, 2}, dims(s, "a"));
        assertArrayEquals(new long[] {3, 4}, dims(s, "b"));
        assertArrayEquals(new long[] {3, 2}, dims(s, "c"));
        assertArrayEquals(new long[] {3, 2}, dims(s, "e"));
    }

    /** Split with the split sizes as an input (opset 13). */
    @Test
    @DisplayName("ONNX operator definition: Split, opset 13 (split input)")
    void splitInput() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 3, 6)
                .longs("parts", 1, 5)
                .node("Split", "sp", List.of("x", "parts"), List.of("a", "b"), OnnxWriter.attr("axis", 1L))
                .node("Split", "eq", List.of("x"), List.of("c", "d", "e"))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {3, 1}, dims(s, "a"));
        assertArrayEquals(new long[] {3, 5}, dims(s, "b"));
        assertArrayEquals(new long[] {1, 6}, dims(s, "d"));
    }

    /** Split with num_outputs (opset 18): chunks of ceil(7 / 3) = 3, the last one smaller: 3, 3, 1. */
    @Test
    @DisplayName("ONNX operator definition: Split, opset 18 (num_outputs)")
    void splitNumOutputs() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 3, 7)
                .node("Split", "sp", List.of("x"), List.of("a", "b", "c"), OnnxWriter.attr("axis", 1L),
                        OnnxWriter.attr("num_outputs", 3L))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(18, g);
        assertArrayEquals(new long[] {3, 3}, dims(s, "a"));
        assertArrayEquals(new long[] {3, 3}, dims(s, "b"));
        assertArrayEquals(new long[] {3, 1}, dims(s, "c"));
    }

    /** A graph input of a zero-sized dim stays zero through an elementwise op. */
    @Test
    @DisplayName("ONNX operator definition: Relu, opset 14 (zero-sized dims)")
    void zeroSizedDims() {
        OnnxWriter.Graph g = graph()
                .input("x", ElemType.FLOAT, 0, 4)
                .node("Relu", "r", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(14, g);
        assertArrayEquals(new long[] {0, 4}, dims(s, "y"));
        assertEquals(0L, s.value("y").bytes());
    }
}
