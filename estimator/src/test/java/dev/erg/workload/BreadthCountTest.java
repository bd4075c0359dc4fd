package dev.erg.workload;

import static dev.erg.TestModels.analyze;
import static dev.erg.TestModels.node;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.shape.RuleTable;
import java.util.List;
import java.util.TreeSet;
import org.junit.jupiter.api.Test;

/**
 * Hand-worked counts of the workload rules added for the wider operator set (conventions and factors
 * of docs/counting.md: erg's own, common practice, no single source; shapes from the ONNX operator
 * definitions at the opset of each model).
 */
class BreadthCountTest {

    static OnnxWriter.Graph g() {
        return new OnnxWriter.Graph("t");
    }

    /** Every operator with a shape rule has a workload rule: none is shaped and then silently left out. */
    @Test
    void everyShapeRuleHasAWorkloadRule() {
        TreeSet<String> missing = new TreeSet<>(RuleTable.standard().operators());
        missing.removeAll(WorkloadRules.standard().operators());
        assertEquals(new TreeSet<>(), missing);
    }

    /**
     * Einsum bij,bjk->bik, [2, 3, 4] x [2, 4, 5]: batch b = 2, M = i = 3, K = j = 4, N = k = 5:
     * 2 * 3 * 4 * 5 = 120 MACs, as 2 groups of 3 x 4 x 5.
     */
    @Test
    void einsumBatchedProduct() {
        OnnxWriter.Graph graph = g()
                .input("a", ElemType.FLOAT, 2, 3, 4)
                .input("b", ElemType.FLOAT, 2, 4, 5)
                .node("Einsum", "e", List.of("a", "b"), List.of("y"), OnnxWriter.attr("equation", "bij,bjk->bik"))
                .output("y", ElemType.FLOAT);
        NodeWork e = node(analyze(12, graph), "e");
        assertEquals(Kind.MAC, e.kind());
        assertEquals(120L, e.macs());
        assertEquals(3L, e.gemmM());
        assertEquals(4L, e.gemmK());
        assertEquals(5L, e.gemmN());
        assertEquals(2L, e.gemmGroups());
    }

    /**
     * Einsum ij,jk->i, [3, 4] x [4, 5]: k occurs only in the second operand and not in the output, so it is
     * summed out first (4 * 5 = 20 vector ops); then i, j: 3 * 4 = 12 MACs.
     * Einsum ij,jk,kl->il, [2, 3] x [3, 4] x [4, 5]: first pair over i, j, k: 24 MACs, keeping i, k; then
     * i, k, l: 40 MACs; 64 in all.
     */
    @Test
    void einsumPreReductionAndThreeOperands() {
        OnnxWriter.Graph graph = g()
                .input("a", ElemType.FLOAT, 3, 4)
                .input("b", ElemType.FLOAT, 4, 5)
                .input("p", ElemType.FLOAT, 2, 3)
                .input("q", ElemType.FLOAT, 3, 4)
                .input("r", ElemType.FLOAT, 4, 5)
                .node("Einsum", "e2", List.of("a", "b"), List.of("y"), OnnxWriter.attr("equation", "ij,jk->i"))
                .node("Einsum", "e3", List.of("p", "q", "r"), List.of("z"), OnnxWriter.attr("equation", "ij,jk,kl->il"))
                .node("Einsum", "tr", List.of("a"), List.of("d"), OnnxWriter.attr("equation", "ij->ji"))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(12, graph);
        assertEquals(12L, node(w, "e2").macs());
        assertEquals(20L, node(w, "e2").vectorOps());
        assertEquals(64L, node(w, "e3").macs());
        assertEquals(0L, node(w, "e3").gemmGroups(), "no single matrix-product view for three operands");
        // One operand: a vector node, one op per point of the index space, 3 * 4 = 12.
        assertEquals(Kind.VECTOR, node(w, "tr").kind());
        assertEquals(12L, node(w, "tr").vectorOps());
    }

    /**
     * RoiAlign [3, 4, 7, 5] = 420 outputs, sampling_ratio 2: 4 samples of 8 ops each: 420 * 32 = 13,440.
     * MaxRoiPool with 3 ROIs over [1, 4, 16, 16]: 3 * 4 * 16 * 16 = 3,072 (upper bound, noted).
     */
    @Test
    void roiPools() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 4, 16, 16)
                .input("rois", ElemType.FLOAT, 3, 4)
                .input("bi", ElemType.INT64, 3)
                .input("rois5", ElemType.FLOAT, 3, 5)
                .node("RoiAlign", "ra", List.of("x", "rois", "bi"), List.of("a"), OnnxWriter.attr("output_height", 7L),
                        OnnxWriter.attr("output_width", 5L), OnnxWriter.attr("sampling_ratio", 2L))
                .node("MaxRoiPool", "mrp", List.of("x", "rois5"), List.of("b"), OnnxWriter.ints("pooled_shape", 2, 2))
                .output("a", ElemType.FLOAT);
        ModelWorkload w = analyze(16, graph);
        assertEquals(13_440L, node(w, "ra").vectorOps());
        assertEquals(3_072L, node(w, "mrp").vectorOps());
        assertNotNull(node(w, "mrp").note());
    }

    /**
     * NonMaxSuppression, boxes [1, 8, 4], scores [1, 2, 8], M = 3: per class, sort 8 * ceil(log2 8) = 24
     * compares and 3 selected boxes x 8 IoU tests x 12 ops = 288: 312; 2 classes: 624.
     * Unique over 10 runtime elements: 10 * ceil(log2 10) = 40 compares.
     */
    @Test
    void nonMaxSuppressionAndUnique() {
        OnnxWriter.Graph graph = g()
                .input("boxes", ElemType.FLOAT, 1, 8, 4)
                .input("scores", ElemType.FLOAT, 1, 2, 8)
                .input("x", ElemType.FLOAT, 2, 5)
                .longs("m", 3)
                .node("NonMaxSuppression", "nms", List.of("boxes", "scores", "m"), List.of("sel"))
                .node("Unique", "u", List.of("x"), List.of("y"))
                .output("sel", ElemType.INT64);
        ModelWorkload w = analyze(11, graph);
        assertEquals(624L, node(w, "nms").vectorOps());
        assertEquals(40L, node(w, "u").vectorOps());
    }

    /**
     * DeformConv X [1, 2, 5, 5], W [4, 2, 3, 3] -> Y [1, 4, 3, 3]: MACs as Conv, 9 positions x (2 * 9) x 4
     * = 648. Sampled values: N * C * positions * kernel points = 1 * 2 * 9 * 9 = 162, 7 ops each = 1,134;
     * with a mask 8 each = 1,296, and a bias adds 36 outputs: 1,332.
     */
    @Test
    void deformConv() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 2, 5, 5)
                .input("off", ElemType.FLOAT, 1, 18, 3, 3)
                .input("mask", ElemType.FLOAT, 1, 9, 3, 3)
                .weight("w", ElemType.FLOAT, 4, 2, 3, 3)
                .weight("b", ElemType.FLOAT, 4)
                .node("DeformConv", "plain", List.of("x", "w", "off"), List.of("y"))
                .node("DeformConv", "full", List.of("x", "w", "off", "b", "mask"), List.of("z"))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(19, graph);
        assertEquals(648L, node(w, "plain").macs());
        assertEquals(1_134L, node(w, "plain").vectorOps());
        assertEquals(648L, node(w, "full").macs());
        assertEquals(1_332L, node(w, "full").vectorOps());
    }

    /**
     * GridSample to [1, 3, 5, 6] = 90 outputs: bilinear 4 taps, 7 ops each = 630; bicubic 16 taps, 31 ops
     * = 2,790; nearest is a move (GridSample, opset 16).
     */
    @Test
    void samplingOperators() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 3, 8, 8)
                .input("grid", ElemType.FLOAT, 1, 5, 6, 2)
                .node("GridSample", "bil", List.of("x", "grid"), List.of("a"))
                .node("GridSample", "cub", List.of("x", "grid"), List.of("b"), OnnxWriter.attr("mode", "bicubic"))
                .node("GridSample", "near", List.of("x", "grid"), List.of("c"), OnnxWriter.attr("mode", "nearest"))
                .output("a", ElemType.FLOAT);
        ModelWorkload w = analyze(18, graph);
        assertEquals(630L, node(w, "bil").vectorOps());
        assertEquals(2_790L, node(w, "cub").vectorOps());
        assertEquals(Kind.MOVE, node(w, "near").kind());
        assertEquals(0L, node(w, "near").vectorOps());
    }

    /**
     * AffineGrid (opset 20) [2, 5, 7, 2] = 140 coordinates, each a dot of 3 terms (5 ops): 700. Col2Im
     * (opset 18) over 72 input elements: 72 adds.
     */
    @Test
    void affineGridAndCol2Im() {
        OnnxWriter.Graph graph = g()
                .input("theta", ElemType.FLOAT, 2, 2, 3)
                .longs("size", 2, 3, 5, 7)
                .input("cols", ElemType.FLOAT, 1, 8, 9)
                .longs("image", 4, 4)
                .longs("block", 2, 2)
                .node("AffineGrid", "ag", List.of("theta", "size"), List.of("d"))
                .node("Col2Im", "ci", List.of("cols", "image", "block"), List.of("e"))
                .output("d", ElemType.FLOAT);
        ModelWorkload w = analyze(20, graph);
        assertEquals(700L, node(w, "ag").vectorOps());
        assertEquals(72L, node(w, "ci").vectorOps());
    }

    /**
     * BatchNormalization over [2, 3, 4, 4] = 96 elements: inference 2 ops each = 192; training_mode
     * (opset 15) adds the batch statistics: mean 1, variance 3, then the scale and shift 2 = 6 each = 576.
     * Dropout-13 with training_mode a known true: 3 ops per element over [2, 3] = 18; without, a view.
     */
    @Test
    void trainingModes() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 3, 4, 4)
                .input("v", ElemType.FLOAT, 2, 3)
                .weight("s", ElemType.FLOAT, 3).weight("b", ElemType.FLOAT, 3)
                .weight("m", ElemType.FLOAT, 3).weight("var", ElemType.FLOAT, 3)
                .initializer(new OnnxWriter.Tensor("ratio", ElemType.FLOAT).floats(0.5f))
                .initializer(new OnnxWriter.Tensor("train", ElemType.BOOL).raw(new byte[] {1}))
                .node("BatchNormalization", "inf", List.of("x", "s", "b", "m", "var"), List.of("y1"))
                .node("BatchNormalization", "tr", List.of("x", "s", "b", "m", "var"), List.of("y2", "rm", "rv"),
                        OnnxWriter.attr("training_mode", 1L))
                .node("Dropout", "dtr", List.of("v", "ratio", "train"), List.of("d1", "mask"))
                .node("Dropout", "dinf", List.of("v"), List.of("d2"))
                .output("y1", ElemType.FLOAT);
        ModelWorkload w = analyze(15, graph);
        assertEquals(192L, node(w, "inf").vectorOps());
        assertEquals(576L, node(w, "tr").vectorOps());
        assertEquals(Kind.VECTOR, node(w, "dtr").kind());
        assertEquals(18L, node(w, "dtr").vectorOps());
        assertEquals(Kind.VIEW, node(w, "dinf").kind());
    }

    /**
     * LSTM with peepholes, X [T=2, B=1, I=3], hidden 2: MACs T * B * 4H * (I + H) = 2 * 8 * 5 = 80; vector
     * ops per hidden unit and step 36 + 6 for the three peephole multiply-adds: 2 * 1 * 2 * 42 = 168.
     */
    @Test
    void lstmPeepholes() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 1, 3)
                .weight("w", ElemType.FLOAT, 1, 8, 3)
                .weight("r", ElemType.FLOAT, 1, 8, 2)
                .weight("p", ElemType.FLOAT, 1, 6)
                .node("LSTM", "lstm", List.of("x", "w", "r", "", "", "", "", "p"), List.of("y"),
                        OnnxWriter.attr("hidden_size", 2L))
                .output("y", ElemType.FLOAT);
        NodeWork l = node(analyze(13, graph), "lstm");
        assertEquals(80L, l.macs());
        assertEquals(168L, l.vectorOps());
    }

    /**
     * RandomNormal [2, 3]: 6 draws of 15 ops (Box-Muller: log, sqrt, cos at 4 each, 3 more) = 90;
     * Multinomial [4, 10] with 3 samples: 12 samples, classes + 1 = 11 ops each = 132; a window of constant
     * size is a constant: folded, no cost. MaxUnpool moves x (16 bytes in) into its output (64 bytes);
     * the indices are a parameter.
     */
    @Test
    void generatorsAndUnpool() {
        OnnxWriter.Graph graph = g()
                .input("p", ElemType.FLOAT, 4, 10)
                .input("x", ElemType.FLOAT, 1, 1, 2, 2)
                .input("i", ElemType.INT64, 1, 1, 2, 2)
                .initializer(new OnnxWriter.Tensor("size", ElemType.INT64).longs(16))
                .node("RandomNormal", "rn", List.of(), List.of("a"), OnnxWriter.ints("shape", 2, 3))
                .node("Multinomial", "mn", List.of("p"), List.of("d"), OnnxWriter.attr("sample_size", 3L))
                .node("HannWindow", "hw", List.of("size"), List.of("win"))
                .node("MaxUnpool", "up", List.of("x", "i"), List.of("u"), OnnxWriter.ints("kernel_shape", 2, 2),
                        OnnxWriter.ints("strides", 2, 2))
                .output("a", ElemType.FLOAT);
        ModelWorkload w = analyze(17, graph);
        assertEquals(90L, node(w, "rn").vectorOps());
        assertEquals(132L, node(w, "mn").vectorOps());
        assertEquals(Kind.FOLDED, node(w, "hw").kind());
        assertEquals(Kind.MOVE, node(w, "up").kind());
        assertEquals(16L, node(w, "up").inputBytes());
        assertEquals(64L, node(w, "up").outputBytes());
    }

    /** requireComplete returns a complete workload itself. */
    @Test
    void requireCompleteOnACompleteModel() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 3)
                .node("Relu", "r", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(13, graph);
        assertTrue(w.complete());
        assertSame(w, w.requireComplete());
    }
}
