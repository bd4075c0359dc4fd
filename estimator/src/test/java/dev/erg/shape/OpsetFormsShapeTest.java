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
 * Operators whose form changed between opsets (attribute versus input): each shaped at the opset the
 * model imports, from that version's ONNX operator definition.
 */
class OpsetFormsShapeTest {

    static OnnxWriter.Graph g() {
        return new OnnxWriter.Graph("t");
    }

    static OnnxWriter.Tensor floats(String name, float... v) {
        return new OnnxWriter.Tensor(name, ElemType.FLOAT, v.length).floats(v);
    }

    static OnnxWriter.Tensor floatScalar(String name, float v) {
        return new OnnxWriter.Tensor(name, ElemType.FLOAT).floats(v);
    }

    static void assertBad(long opset, OnnxWriter.Graph graph, String nodeLabel, String part) {
        BadInputException e = assertThrows(BadInputException.class, () -> shaped(opset, graph));
        assertTrue(e.getMessage().contains(nodeLabel) && e.getMessage().contains(part), e.getMessage());
    }

    /** Split-18 num_outputs: chunks of ceil(7 / 3) = 3, the last one 7 - 2 * 3 = 1. */
    @Test
    @DisplayName("ONNX operator definition: Split, opset 18 (num_outputs, uneven)")
    void splitNumOutputsUneven() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 7, 2)
                .node("Split", "sp", List.of("x"), List.of("a", "b", "c"), OnnxWriter.attr("num_outputs", 3L))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(18, graph);
        assertArrayEquals(new long[] {3, 2}, dims(s, "a"));
        assertArrayEquals(new long[] {3, 2}, dims(s, "b"));
        assertArrayEquals(new long[] {1, 2}, dims(s, "c"));
        // 5 into 4 chunks of ceil(5 / 4) = 2 leaves 5 - 3 * 2 = -1 for the last: invalid.
        OnnxWriter.Graph bad = g()
                .input("x", ElemType.FLOAT, 5)
                .node("Split", "sp", List.of("x"), List.of("a", "b", "c", "d"), OnnxWriter.attr("num_outputs", 4L))
                .output("a", ElemType.FLOAT);
        assertBad(18, bad, "'sp' (Split)", "last chunk would be -1");
        // num_outputs must equal the number of outputs.
        OnnxWriter.Graph mismatch = g()
                .input("x", ElemType.FLOAT, 6)
                .node("Split", "sp", List.of("x"), List.of("a", "b"), OnnxWriter.attr("num_outputs", 3L))
                .output("a", ElemType.FLOAT);
        assertBad(18, mismatch, "'sp' (Split)", "num_outputs 3 but 2 outputs");
    }

    /** Split-1 took the sizes as an attribute or as a second input; Split-2 and -11 as the attribute only. */
    @Test
    @DisplayName("ONNX operator definitions: Split, opsets 1 (split input) and 2 (split attribute)")
    void splitEarlyForms() {
        OnnxWriter.Graph v1 = g()
                .input("x", ElemType.FLOAT, 6, 2)
                .longs("parts", 1, 5)
                .node("Split", "sp", List.of("x", "parts"), List.of("a", "b"))
                .output("a", ElemType.FLOAT);
        Graph s1 = shaped(1, v1);
        assertArrayEquals(new long[] {1, 2}, dims(s1, "a"));
        assertArrayEquals(new long[] {5, 2}, dims(s1, "b"));
        OnnxWriter.Graph v2 = g()
                .input("x", ElemType.FLOAT, 6, 2)
                .node("Split", "sp", List.of("x"), List.of("a", "b"), OnnxWriter.ints("split", 4, 2))
                .output("a", ElemType.FLOAT);
        assertArrayEquals(new long[] {2, 2}, dims(shaped(7, v2), "b"));
    }

    /** Slice-1: starts, ends and axes are attributes; ends past the dim clamp to it. */
    @Test
    @DisplayName("ONNX operator definition: Slice, opset 1 (model opset 9; attributes)")
    void sliceAttributes() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 4, 10)
                .node("Slice", "sl", List.of("x"), List.of("y"), OnnxWriter.ints("starts", 1),
                        OnnxWriter.ints("ends", 1000), OnnxWriter.ints("axes", 1))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {4, 9}, dims(shaped(9, graph), "y"));
    }

    /**
     * Slice-13 with a negative step: start -1 -> 9, end -1000 -> clamped to -1, step -2:
     * ceil((9 - (-1)) / 2) = 5 elements (9, 7, 5, 3, 1), evaluated on a constant.
     */
    @Test
    @DisplayName("ONNX operator definition: Slice, opset 13 (negative step)")
    void sliceNegativeStep() {
        OnnxWriter.Graph graph = g()
                .longs("x", 0, 1, 2, 3, 4, 5, 6, 7, 8, 9)
                .longs("st", -1).longs("en", -1000).longs("ax", 0).longs("step", -2)
                .node("Slice", "sl", List.of("x", "st", "en", "ax", "step"), List.of("y"))
                .output("y", ElemType.INT64);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {5}, dims(s, "y"));
        assertArrayEquals(new long[] {9, 7, 5, 3, 1}, data(s, "y"));
    }

    /** Pad-1 'paddings', Pad-2 'pads' (attributes), Pad-11 pads input (negative pads crop), Pad-18 axes. */
    @Test
    @DisplayName("ONNX operator definitions: Pad, opsets 1, 2, 11 and 18")
    void padForms() {
        // [begin..., end...] = [0, 1, 0, 2] on [2, 3]: axis 1 grows by 1 + 2 -> [2, 6].
        OnnxWriter.Graph v1 = g()
                .input("x", ElemType.FLOAT, 2, 3)
                .node("Pad", "p", List.of("x"), List.of("y"), OnnxWriter.ints("paddings", 0, 1, 0, 2))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {2, 6}, dims(shaped(1, v1), "y"));
        OnnxWriter.Graph v2 = g()
                .input("x", ElemType.FLOAT, 2, 3)
                .node("Pad", "p", List.of("x"), List.of("y"), OnnxWriter.ints("pads", 0, 1, 0, 2),
                        OnnxWriter.attr("mode", "reflect"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {2, 6}, dims(shaped(7, v2), "y"));
        // Pad-11: [1, -1, 0, 0]: axis 0 + 1, axis 1 - 1 -> [3, 2].
        OnnxWriter.Graph v11 = g()
                .input("x", ElemType.FLOAT, 2, 3)
                .longs("pads", 1, -1, 0, 0)
                .node("Pad", "p", List.of("x", "pads"), List.of("y"), OnnxWriter.attr("mode", "edge"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {3, 2}, dims(shaped(11, v11), "y"));
        // Pad-18 axes [-1], pads [2, 3]: the last axis grows by 5 -> [2, 8]; Pad-19 wrap keeps the rule.
        OnnxWriter.Graph v18 = g()
                .input("x", ElemType.FLOAT, 2, 3)
                .longs("pads", 2, 3)
                .longs("axes", -1)
                .node("Pad", "p", List.of("x", "pads", "", "axes"), List.of("y"), OnnxWriter.attr("mode", "wrap"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {2, 8}, dims(shaped(19, v18), "y"));
    }

    /** Resize-10: X and scales; floor(in * scale). */
    @Test
    @DisplayName("ONNX operator definition: Resize, opset 10 (scales input)")
    void resize10() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 1, 3, 5)
                .initializer(floats("sc", 1, 1, 2, 2))
                .node("Resize", "rs", List.of("x", "sc"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 1, 6, 10}, dims(shaped(10, graph), "y"));
    }

    /** Resize-11: X, roi, scales (empty), sizes. */
    @Test
    @DisplayName("ONNX operator definition: Resize, opset 11 (sizes, empty scales)")
    void resize11Sizes() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 1, 3, 5)
                .initializer(new OnnxWriter.Tensor("roi", ElemType.FLOAT, 0).floats())
                .initializer(new OnnxWriter.Tensor("sc", ElemType.FLOAT, 0).floats())
                .longs("sz", 1, 1, 7, 9)
                .node("Resize", "rs", List.of("x", "roi", "sc", "sz"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 1, 7, 9}, dims(shaped(11, graph), "y"));
    }

    /** Resize-13: roi and scales optional; floor(3 * 1.5) = 4, floor(5 * 0.5) = 2. */
    @Test
    @DisplayName("ONNX operator definition: Resize, opset 13 (fractional scales)")
    void resize13Scales() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 1, 3, 5)
                .initializer(floats("sc", 1, 1, 1.5f, 0.5f))
                .node("Resize", "rs", List.of("x", "", "sc"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 1, 4, 2}, dims(shaped(13, graph), "y"));
    }

    /**
     * Resize-18 axes and keep_aspect_ratio_policy on [1, 1, 3, 5] with sizes [6, 6] over axes [2, 3]:
     * not_larger: scale = min(6/3, 6/5) = 1.2 -> round(3.6) = 4, round(6.0) = 6; not_smaller: scale =
     * max(2, 1.2) = 2 -> 6, 10; stretch: 6, 6. Scales [2] over axis [3] only: [1, 1, 3, 10].
     */
    @Test
    @DisplayName("ONNX operator definition: Resize, opset 18 (axes, keep_aspect_ratio_policy)")
    void resize18Policies() {
        long[][] expected = {{1, 1, 4, 6}, {1, 1, 6, 10}, {1, 1, 6, 6}};
        String[] policies = {"not_larger", "not_smaller", "stretch"};
        for (int i = 0; i < policies.length; i++) {
            OnnxWriter.Graph graph = g()
                    .input("x", ElemType.FLOAT, 1, 1, 3, 5)
                    .longs("sz", 6, 6)
                    .node("Resize", "rs", List.of("x", "", "", "sz"), List.of("y"), OnnxWriter.ints("axes", 2, 3),
                            OnnxWriter.attr("keep_aspect_ratio_policy", policies[i]))
                    .output("y", ElemType.FLOAT);
            assertArrayEquals(expected[i], dims(shaped(18, graph), "y"), policies[i]);
        }
        OnnxWriter.Graph scales = g()
                .input("x", ElemType.FLOAT, 1, 1, 3, 5)
                .initializer(floats("sc", 2))
                .node("Resize", "rs", List.of("x", "", "sc"), List.of("y"), OnnxWriter.ints("axes", -1),
                        OnnxWriter.attr("mode", "linear"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 1, 3, 10}, dims(shaped(19, scales), "y"));
    }

    /** Upsample-7: scales attribute; Upsample-9: scales input. */
    @Test
    @DisplayName("ONNX operator definitions: Upsample, opsets 7 and 9")
    void upsampleForms() {
        OnnxWriter.Graph v7 = g()
                .input("x", ElemType.FLOAT, 1, 1, 3, 5)
                .node("Upsample", "up", List.of("x"), List.of("y"), OnnxWriter.floats("scales", 1, 1, 2, 3))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 1, 6, 15}, dims(shaped(7, v7), "y"));
        OnnxWriter.Graph v9 = g()
                .input("x", ElemType.FLOAT, 1, 1, 3, 5)
                .initializer(floats("sc", 1, 1, 2, 3))
                .node("Upsample", "up", List.of("x", "sc"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 1, 6, 15}, dims(shaped(9, v9), "y"));
    }

    /** Clip-6: min and max attributes; Clip-11: min and max inputs (a constant is evaluated: [-1, 0, 2]). */
    @Test
    @DisplayName("ONNX operator definitions: Clip, opsets 6 and 11")
    void clipForms() {
        OnnxWriter.Graph v6 = g()
                .initializer(floats("x", -5, 0, 7))
                .node("Clip", "cl", List.of("x"), List.of("y"), OnnxWriter.attr("min", -1f), OnnxWriter.attr("max", 2f))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {-1, 0, 2}, data(shaped(6, v6), "y"));
        OnnxWriter.Graph v11 = g()
                .initializer(floats("x", -5, 0, 7))
                .initializer(floatScalar("lo", -1))
                .initializer(floatScalar("hi", 2))
                .node("Clip", "cl", List.of("x", "lo", "hi"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {-1, 0, 2}, data(shaped(11, v11), "y"));
    }

    /**
     * ReduceSum: axes attribute up to opset 11, input from opset 13 (with noop_with_empty_axes);
     * the other reductions take the input form from opset 18.
     */
    @Test
    @DisplayName("ONNX operator definitions: ReduceSum, opsets 11 and 13 (axes, noop_with_empty_axes)")
    void reduceSumForms() {
        OnnxWriter.Graph v11 = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .node("ReduceSum", "r", List.of("x"), List.of("y"), OnnxWriter.ints("axes", 1), OnnxWriter.attr("keepdims", 0L))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {2, 4}, dims(shaped(11, v11), "y"));
        OnnxWriter.Graph v13 = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .longs("ax", 1)
                .node("ReduceSum", "r", List.of("x", "ax"), List.of("y"), OnnxWriter.attr("keepdims", 0L))
                .node("ReduceSum", "all", List.of("x"), List.of("z"))
                .node("ReduceSum", "noop", List.of("x"), List.of("n"), OnnxWriter.attr("noop_with_empty_axes", 1L))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(13, v13);
        assertArrayEquals(new long[] {2, 4}, dims(s, "y"));
        assertArrayEquals(new long[] {1, 1, 1}, dims(s, "z"));
        assertArrayEquals(new long[] {2, 3, 4}, dims(s, "n"));
    }

    @Test
    @DisplayName("ONNX operator definitions: ReduceMean and ReduceMax, opsets 13 (attribute) and 18 (input)")
    void reduceOtherForms() {
        OnnxWriter.Graph v13 = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .node("ReduceMean", "r", List.of("x"), List.of("y"), OnnxWriter.ints("axes", -1))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {2, 3, 1}, dims(shaped(13, v13), "y"));
        OnnxWriter.Graph v18 = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .longs("ax", 0, 2)
                .node("ReduceMean", "r", List.of("x", "ax"), List.of("y"), OnnxWriter.attr("keepdims", 0L))
                .node("ReduceMax", "noop", List.of("x"), List.of("n"), OnnxWriter.attr("noop_with_empty_axes", 1L))
                .node("ReduceL2", "all", List.of("x"), List.of("z"), OnnxWriter.attr("keepdims", 0L))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(18, v18);
        assertArrayEquals(new long[] {3}, dims(s, "y"));
        assertArrayEquals(new long[] {2, 3, 4}, dims(s, "n"));
        assertArrayEquals(new long[0], dims(s, "z"));
        // At opset 13 the same input-form node is not the definition: axes come from the attribute, so the
        // second input is not read and all axes reduce (keepdims 0 -> a scalar).
        OnnxWriter.Graph old = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .node("ReduceMean", "r", List.of("x"), List.of("y"), OnnxWriter.attr("keepdims", 0L))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[0], dims(shaped(13, old), "y"));
    }

    /** ArgMax / ArgMin: int64 output, the axis kept as 1 or dropped (select_last_index does not change it). */
    @Test
    @DisplayName("ONNX operator definitions: ArgMax and ArgMin, opset 13")
    void argMaxMin() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 3, 4)
                .node("ArgMax", "amax", List.of("x"), List.of("a"), OnnxWriter.attr("axis", -1L),
                        OnnxWriter.attr("keepdims", 0L), OnnxWriter.attr("select_last_index", 1L))
                .node("ArgMin", "amin", List.of("x"), List.of("b"))
                .output("a", ElemType.INT64);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {2, 3}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 3, 4}, dims(s, "b"));
        assertEquals(ElemType.INT64, s.value("b").type());
    }

    /** Softmax changed its axis default at opset 13 (1 -> -1) and its coercion to 2-D; the shape is x's either way. */
    @Test
    @DisplayName("ONNX operator definitions: Softmax and LogSoftmax, opsets 11 and 13")
    void softmaxForms() {
        for (long opset : new long[] {11, 13}) {
            OnnxWriter.Graph graph = g()
                    .input("x", ElemType.FLOAT, 2, 3, 4)
                    .node("Softmax", "sm", List.of("x"), List.of("y"))
                    .node("LogSoftmax", "lsm", List.of("x"), List.of("z"), OnnxWriter.attr("axis", 1L))
                    .output("y", ElemType.FLOAT);
            Graph s = shaped(opset, graph);
            assertArrayEquals(new long[] {2, 3, 4}, dims(s, "y"));
            assertArrayEquals(new long[] {2, 3, 4}, dims(s, "z"));
        }
    }

    /** TopK-1: k attribute; TopK-10: K input [1]. Values keep x's type, indices are int64. */
    @Test
    @DisplayName("ONNX operator definitions: TopK, opsets 1 and 10")
    void topKForms() {
        OnnxWriter.Graph v1 = g()
                .input("x", ElemType.FLOAT, 3, 5)
                .node("TopK", "tk", List.of("x"), List.of("v", "i"), OnnxWriter.attr("k", 2L))
                .output("v", ElemType.FLOAT);
        Graph s1 = shaped(9, v1);
        assertArrayEquals(new long[] {3, 2}, dims(s1, "v"));
        assertEquals(ElemType.INT64, s1.value("i").type());
        OnnxWriter.Graph v10 = g()
                .input("x", ElemType.FLOAT, 3, 5)
                .longs("k", 4)
                .node("TopK", "tk", List.of("x", "k"), List.of("v", "i"), OnnxWriter.attr("axis", 0L))
                .output("v", ElemType.FLOAT);
        assertBad(11, v10, "'tk' (TopK)", "k = 4 along an axis of size 3");
    }

    /** Dropout-7: the mask has x's type; from Dropout-10 it is boolean. */
    @Test
    @DisplayName("ONNX operator definitions: Dropout, opsets 7 and 13 (mask type)")
    void dropoutMask() {
        for (long opset : new long[] {7, 13}) {
            OnnxWriter.Graph graph = g()
                    .input("x", ElemType.FLOAT, 2, 3)
                    .node("Dropout", "d", List.of("x"), List.of("y", "mask"))
                    .output("y", ElemType.FLOAT);
            Graph s = shaped(opset, graph);
            assertArrayEquals(new long[] {2, 3}, dims(s, "mask"));
            assertEquals(opset < 10 ? ElemType.FLOAT : ElemType.BOOL, s.value("mask").type());
        }
    }
}
