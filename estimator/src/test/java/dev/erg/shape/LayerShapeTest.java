package dev.erg.shape;

import static dev.erg.TestModels.dims;
import static dev.erg.TestModels.shaped;
import static dev.erg.shape.OpsetFormsShapeTest.assertBad;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.erg.graph.Graph;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Output shapes of normalisation, pooling, convolution, matrix, recurrent and sampling layers, each
 * worked out by hand from its ONNX operator definition (formulas in the comments).
 */
class LayerShapeTest {

    static OnnxWriter.Graph g() {
        return new OnnxWriter.Graph("t");
    }

    /** BatchNormalization-9: Y, mean, var, saved_mean, saved_var; the statistics are [C]. */
    @Test
    @DisplayName("ONNX operator definition: BatchNormalization, opset 9 (five outputs)")
    void batchNorm9() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 3, 4, 4)
                .weight("s", ElemType.FLOAT, 3).weight("b", ElemType.FLOAT, 3)
                .weight("m", ElemType.FLOAT, 3).weight("v", ElemType.FLOAT, 3)
                .node("BatchNormalization", "bn", List.of("x", "s", "b", "m", "v"), List.of("y", "rm", "rv", "sm", "sv"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(9, graph);
        assertArrayEquals(new long[] {2, 3, 4, 4}, dims(s, "y"));
        for (String v : new String[] {"rm", "rv", "sm", "sv"}) {
            assertArrayEquals(new long[] {3}, dims(s, v), v);
        }
    }

    /**
     * BatchNormalization-15 with training_mode: running_mean and running_var [C] of input_mean's type
     * (T2, here fp16); at most three outputs.
     */
    @Test
    @DisplayName("ONNX operator definition: BatchNormalization, opset 15 (training_mode outputs)")
    void batchNorm15() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 3, 4, 4)
                .weight("s", ElemType.FLOAT, 3).weight("b", ElemType.FLOAT, 3)
                .weight("m", ElemType.FLOAT16, 3).weight("v", ElemType.FLOAT16, 3)
                .node("BatchNormalization", "bn", List.of("x", "s", "b", "m", "v"), List.of("y", "rm", "rv"),
                        OnnxWriter.attr("training_mode", 1L))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(15, graph);
        assertArrayEquals(new long[] {3}, dims(s, "rm"));
        assertEquals(ElemType.FLOAT16, s.value("rv").type());
        OnnxWriter.Graph five = g()
                .input("x", ElemType.FLOAT, 2, 3, 4, 4)
                .weight("s", ElemType.FLOAT, 3).weight("b", ElemType.FLOAT, 3)
                .weight("m", ElemType.FLOAT, 3).weight("v", ElemType.FLOAT, 3)
                .node("BatchNormalization", "bn", List.of("x", "s", "b", "m", "v"), List.of("y", "a", "b2", "c", "d"))
                .output("y", ElemType.FLOAT);
        assertBad(15, five, "'bn' (BatchNormalization)", "at most 3");
    }

    /** Instance-, Group- (opset 18) and LayerNormalization (opset 17, axis 1: statistics [2, 1, 1, 1]). */
    @Test
    @DisplayName("ONNX operator definitions: InstanceNormalization 6, GroupNormalization 18, LayerNormalization 17")
    void otherNorms() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 2, 4, 3, 3)
                .weight("s", ElemType.FLOAT, 4).weight("b", ElemType.FLOAT, 4)
                .weight("gs", ElemType.FLOAT, 2).weight("gb", ElemType.FLOAT, 2)
                .weight("ls", ElemType.FLOAT, 4, 3, 3).weight("lb", ElemType.FLOAT, 4, 3, 3)
                .node("InstanceNormalization", "in", List.of("x", "s", "b"), List.of("yi"))
                .node("GroupNormalization", "gn", List.of("x", "gs", "gb"), List.of("yg"), OnnxWriter.attr("num_groups", 2L))
                .node("LayerNormalization", "ln", List.of("x", "ls", "lb"), List.of("yl", "mean", "inv"),
                        OnnxWriter.attr("axis", 1L))
                .output("yl", ElemType.FLOAT);
        Graph s = shaped(18, graph);
        assertArrayEquals(new long[] {2, 4, 3, 3}, dims(s, "yi"));
        assertArrayEquals(new long[] {2, 4, 3, 3}, dims(s, "yg"));
        assertArrayEquals(new long[] {2, 4, 3, 3}, dims(s, "yl"));
        assertArrayEquals(new long[] {2, 1, 1, 1}, dims(s, "mean"));
        assertEquals(ElemType.FLOAT, s.value("inv").type());
    }

    /**
     * MaxPool-12 on 8 x 8, kernel 3, dilation 2 (span 5), stride 2: floor((8 - 5) / 2) + 1 = 2, with
     * ceil_mode ceil(3 / 2) + 1 = 3 (the last window starts at 4, inside the input). storage_order 1 and
     * the Indices output: int64 of Y's shape.
     */
    @Test
    @DisplayName("ONNX operator definition: MaxPool, opset 12 (dilations, ceil_mode, storage_order, Indices)")
    void maxPoolDilatedCeil() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 1, 8, 8)
                .node("MaxPool", "floor", List.of("x"), List.of("a"), OnnxWriter.ints("kernel_shape", 3, 3),
                        OnnxWriter.ints("dilations", 2, 2), OnnxWriter.ints("strides", 2, 2))
                .node("MaxPool", "ceil", List.of("x"), List.of("b", "idx"), OnnxWriter.ints("kernel_shape", 3, 3),
                        OnnxWriter.ints("dilations", 2, 2), OnnxWriter.ints("strides", 2, 2),
                        OnnxWriter.attr("ceil_mode", 1L), OnnxWriter.attr("storage_order", 1L))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(12, graph);
        assertArrayEquals(new long[] {1, 1, 2, 2}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 1, 3, 3}, dims(s, "b"));
        assertArrayEquals(new long[] {1, 1, 3, 3}, dims(s, "idx"));
        assertEquals(ElemType.INT64, s.value("idx").type());
    }

    /**
     * ceil_mode with a window that would start in the end padding: in 4, kernel 2, stride 2, pads
     * [0, 1]: ceil((4 + 1 - 2) / 2) + 1 = 3, but the third window starts at 4 >= in + pad_begin = 4, so it
     * is dropped: 2 (the output-shape rule of the ONNX reference implementation, onnx.reference
     * op_pool_common, which drops a last window that starts in the padding).
     */
    @Test
    @DisplayName("ONNX operator definition: MaxPool, opset 12 (ceil_mode drops a window starting in the padding)")
    void maxPoolCeilDropsPaddedWindow() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 1, 4, 4)
                .node("MaxPool", "mp", List.of("x"), List.of("y"), OnnxWriter.ints("kernel_shape", 2, 2),
                        OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("pads", 0, 0, 1, 1), OnnxWriter.attr("ceil_mode", 1L))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 1, 2, 2}, dims(shaped(12, graph), "y"));
    }

    /**
     * AveragePool-19 (dilations, count_include_pad) with auto_pad SAME_LOWER: ceil(5 / 2) = 3; LpPool-18
     * with ceil_mode on 5, kernel 2, stride 2: ceil(3 / 2) + 1 = 3; GlobalLpPool keeps N and C.
     */
    @Test
    @DisplayName("ONNX operator definitions: AveragePool 19, LpPool 18, GlobalLpPool 2")
    void otherPools() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 2, 5, 5)
                .node("AveragePool", "ap", List.of("x"), List.of("a"), OnnxWriter.ints("kernel_shape", 3, 3),
                        OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("dilations", 2, 2),
                        OnnxWriter.attr("auto_pad", "SAME_LOWER"), OnnxWriter.attr("count_include_pad", 1L))
                .node("LpPool", "lp", List.of("x"), List.of("b"), OnnxWriter.ints("kernel_shape", 2, 2),
                        OnnxWriter.ints("strides", 2, 2), OnnxWriter.attr("ceil_mode", 1L), OnnxWriter.attr("p", 3L))
                .node("GlobalLpPool", "glp", List.of("x"), List.of("c"))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(19, graph);
        assertArrayEquals(new long[] {1, 2, 3, 3}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 2, 3, 3}, dims(s, "b"));
        assertArrayEquals(new long[] {1, 2, 1, 1}, dims(s, "c"));
        // AveragePool has no Indices output.
        OnnxWriter.Graph two = g()
                .input("x", ElemType.FLOAT, 1, 2, 5, 5)
                .node("AveragePool", "ap", List.of("x"), List.of("a", "i"), OnnxWriter.ints("kernel_shape", 3, 3))
                .output("a", ElemType.FLOAT);
        assertBad(19, two, "'ap' (AveragePool)", "second output");
    }

    /** MaxUnpool-11: (2 - 1) * 2 + 2 - 0 - 0 = 4 per axis; the output_shape input wins when given. */
    @Test
    @DisplayName("ONNX operator definition: MaxUnpool, opset 11")
    void maxUnpool() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 1, 2, 2)
                .input("i", ElemType.INT64, 1, 1, 2, 2)
                .longs("shape", 1, 1, 5, 5)
                .node("MaxUnpool", "u", List.of("x", "i"), List.of("a"), OnnxWriter.ints("kernel_shape", 2, 2),
                        OnnxWriter.ints("strides", 2, 2))
                .node("MaxUnpool", "u2", List.of("x", "i", "shape"), List.of("b"), OnnxWriter.ints("kernel_shape", 2, 2),
                        OnnxWriter.ints("strides", 2, 2))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(11, graph);
        assertArrayEquals(new long[] {1, 1, 4, 4}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 1, 5, 5}, dims(s, "b"));
    }

    /** RoiAlign-16: [num_rois, C, output_height, output_width]; MaxRoiPool-1: [num_rois, C, pooled_shape]. */
    @Test
    @DisplayName("ONNX operator definitions: RoiAlign 16 and MaxRoiPool 1")
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
        Graph s = shaped(16, graph);
        assertArrayEquals(new long[] {3, 4, 7, 5}, dims(s, "a"));
        assertArrayEquals(new long[] {3, 4, 2, 2}, dims(s, "b"));
    }

    /**
     * Conv-11 with dilations: SAME_LOWER, stride 2 on 7: ceil(7 / 2) = 4; VALID, dilation 2 (span 5) on 7:
     * 7 - 5 + 1 = 3; 3-D with pads 1: 5, 6, 7 kept. A kernel_shape that contradicts the weight is an error.
     */
    @Test
    @DisplayName("ONNX operator definition: Conv, opset 11 (dilations with SAME_LOWER and VALID, 3-D)")
    void convDilationsAndAutoPad() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 1, 7, 7)
                .input("v", ElemType.FLOAT, 1, 2, 5, 6, 7)
                .weight("w", ElemType.FLOAT, 1, 1, 3, 3)
                .weight("w3", ElemType.FLOAT, 4, 2, 3, 3, 3)
                .node("Conv", "same", List.of("x", "w"), List.of("a"), OnnxWriter.attr("auto_pad", "SAME_LOWER"),
                        OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("dilations", 2, 2))
                .node("Conv", "valid", List.of("x", "w"), List.of("b"), OnnxWriter.attr("auto_pad", "VALID"),
                        OnnxWriter.ints("dilations", 2, 2))
                .node("Conv", "c3", List.of("v", "w3"), List.of("c"), OnnxWriter.ints("pads", 1, 1, 1, 1, 1, 1))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {1, 1, 4, 4}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 1, 3, 3}, dims(s, "b"));
        assertArrayEquals(new long[] {1, 4, 5, 6, 7}, dims(s, "c"));
        OnnxWriter.Graph bad = g()
                .input("x", ElemType.FLOAT, 1, 1, 7, 7)
                .weight("w", ElemType.FLOAT, 1, 1, 3, 3)
                .node("Conv", "k", List.of("x", "w"), List.of("a"), OnnxWriter.ints("kernel_shape", 5, 5))
                .output("a", ElemType.FLOAT);
        assertBad(13, bad, "'k' (Conv)", "kernel_shape [5, 5]");
    }

    /**
     * ConvTranspose-11 on 3 x 3, kernel 3, stride 2: SAME_UPPER and SAME_LOWER give in * stride = 6;
     * VALID gives 2 * (3 - 1) + 3 = 7; dilation 2: 2 * 2 + (3 - 1) * 2 + 1 = 9, with output_padding 1: 10.
     */
    @Test
    @DisplayName("ONNX operator definition: ConvTranspose, opset 11 (auto_pad modes, dilations, output_padding)")
    void convTransposeModes() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 2, 3, 3)
                .weight("w", ElemType.FLOAT, 2, 5, 3, 3)
                .node("ConvTranspose", "su", List.of("x", "w"), List.of("a"), OnnxWriter.attr("auto_pad", "SAME_UPPER"),
                        OnnxWriter.ints("strides", 2, 2))
                .node("ConvTranspose", "sl", List.of("x", "w"), List.of("b"), OnnxWriter.attr("auto_pad", "SAME_LOWER"),
                        OnnxWriter.ints("strides", 2, 2))
                .node("ConvTranspose", "va", List.of("x", "w"), List.of("c"), OnnxWriter.attr("auto_pad", "VALID"),
                        OnnxWriter.ints("strides", 2, 2))
                .node("ConvTranspose", "dil", List.of("x", "w"), List.of("d"), OnnxWriter.ints("strides", 2, 2),
                        OnnxWriter.ints("dilations", 2, 2), OnnxWriter.ints("output_padding", 1, 1))
                .output("a", ElemType.FLOAT);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {1, 5, 6, 6}, dims(s, "a"));
        assertArrayEquals(new long[] {1, 5, 6, 6}, dims(s, "b"));
        assertArrayEquals(new long[] {1, 5, 7, 7}, dims(s, "c"));
        assertArrayEquals(new long[] {1, 5, 10, 10}, dims(s, "d"));
    }

    /** Gemm-13: C broadcasts unidirectionally to [M, N]: [N] and [M, 1] do, [5] for N = 3 does not. */
    @Test
    @DisplayName("ONNX operator definition: Gemm, opset 13 (C broadcast)")
    void gemmBias() {
        OnnxWriter.Graph graph = g()
                .input("a", ElemType.FLOAT, 4, 5)
                .weight("b", ElemType.FLOAT, 5, 3)
                .weight("c1", ElemType.FLOAT, 3)
                .weight("c2", ElemType.FLOAT, 4, 1)
                .node("Gemm", "g1", List.of("a", "b", "c1"), List.of("y1"))
                .node("Gemm", "g2", List.of("a", "b", "c2"), List.of("y2"))
                .output("y1", ElemType.FLOAT);
        Graph s = shaped(13, graph);
        assertArrayEquals(new long[] {4, 3}, dims(s, "y1"));
        assertArrayEquals(new long[] {4, 3}, dims(s, "y2"));
        OnnxWriter.Graph bad = g()
                .input("a", ElemType.FLOAT, 4, 5)
                .weight("b", ElemType.FLOAT, 5, 3)
                .weight("c", ElemType.FLOAT, 5)
                .node("Gemm", "gb", List.of("a", "b", "c"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertBad(13, bad, "'gb' (Gemm)", "does not broadcast to [4, 3]");
    }

    /**
     * Einsum-12: batched product bij,bjk->bik; implicit form with broadcast ellipses ([2, 1] and [5] ->
     * [2, 5]) then the labels seen once in alphabetical order (i, k); a diagonal ii->i; a trace ii (i
     * occurs twice: a scalar); a transpose ij->ji; a label with two sizes is an error.
     */
    @Test
    @DisplayName("ONNX operator definition: Einsum, opset 12 (explicit, implicit, ellipsis, diagonal)")
    void einsumForms() {
        OnnxWriter.Graph graph = g()
                .input("a", ElemType.FLOAT, 2, 3, 4)
                .input("b", ElemType.FLOAT, 2, 4, 5)
                .input("p", ElemType.FLOAT, 2, 1, 3, 4)
                .input("q", ElemType.FLOAT, 5, 4, 6)
                .input("sq", ElemType.FLOAT, 4, 4)
                .node("Einsum", "bmm", List.of("a", "b"), List.of("y1"), OnnxWriter.attr("equation", "bij,bjk->bik"))
                .node("Einsum", "ell", List.of("p", "q"), List.of("y2"), OnnxWriter.attr("equation", "...ij,...jk"))
                .node("Einsum", "diag", List.of("sq"), List.of("y3"), OnnxWriter.attr("equation", "ii->i"))
                .node("Einsum", "trace", List.of("sq"), List.of("y4"), OnnxWriter.attr("equation", "ii"))
                .node("Einsum", "tr", List.of("a"), List.of("y5"), OnnxWriter.attr("equation", "b i j -> b j i"))
                .output("y1", ElemType.FLOAT);
        Graph s = shaped(12, graph);
        assertArrayEquals(new long[] {2, 3, 5}, dims(s, "y1"));
        assertArrayEquals(new long[] {2, 5, 3, 6}, dims(s, "y2"));
        assertArrayEquals(new long[] {4}, dims(s, "y3"));
        assertArrayEquals(new long[0], dims(s, "y4"));
        assertArrayEquals(new long[] {2, 4, 3}, dims(s, "y5"));
        OnnxWriter.Graph bad = g()
                .input("a", ElemType.FLOAT, 2, 3)
                .input("b", ElemType.FLOAT, 4, 5)
                .node("Einsum", "e", List.of("a", "b"), List.of("y"), OnnxWriter.attr("equation", "ij,jk->ik"))
                .output("y", ElemType.FLOAT);
        assertBad(12, bad, "'e' (Einsum)", "label 'j' the sizes 3 and 4");
    }

    /**
     * RNN-14 layout 0, reverse: Y [T, 1, B, H], Y_h [1, B, H]; GRU-14 layout 1, bidirectional: Y [B, T, 2, H],
     * Y_h [B, 2, H].
     */
    @Test
    @DisplayName("ONNX operator definitions: RNN and GRU, opset 14 (layouts, directions)")
    void rnnAndGru() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 5, 2, 3)
                .input("xb", ElemType.FLOAT, 2, 5, 3)
                .weight("w", ElemType.FLOAT, 1, 4, 3).weight("r", ElemType.FLOAT, 1, 4, 4)
                .weight("gw", ElemType.FLOAT, 2, 12, 3).weight("gr", ElemType.FLOAT, 2, 12, 4)
                .node("RNN", "rnn", List.of("x", "w", "r"), List.of("y", "yh"), OnnxWriter.attr("hidden_size", 4L),
                        OnnxWriter.attr("direction", "reverse"))
                .node("GRU", "gru", List.of("xb", "gw", "gr"), List.of("gy", "gyh"), OnnxWriter.attr("hidden_size", 4L),
                        OnnxWriter.attr("direction", "bidirectional"), OnnxWriter.attr("layout", 1L))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(14, graph);
        assertArrayEquals(new long[] {5, 1, 2, 4}, dims(s, "y"));
        assertArrayEquals(new long[] {1, 2, 4}, dims(s, "yh"));
        assertArrayEquals(new long[] {2, 5, 2, 4}, dims(s, "gy"));
        assertArrayEquals(new long[] {2, 2, 4}, dims(s, "gyh"));
    }

    /** DeformConv-19: Conv's output (5 - 3 + 1 = 3); offset [N, 2 * 9, 3, 3]. */
    @Test
    @DisplayName("ONNX operator definition: DeformConv, opset 19")
    void deformConv() {
        OnnxWriter.Graph graph = g()
                .input("x", ElemType.FLOAT, 1, 2, 5, 5)
                .input("off", ElemType.FLOAT, 1, 18, 3, 3)
                .weight("w", ElemType.FLOAT, 4, 2, 3, 3)
                .node("DeformConv", "dc", List.of("x", "w", "off"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 4, 3, 3}, dims(shaped(19, graph), "y"));
    }

    /**
     * GridSample-16: [N, C] + the grid's spatial dims; GridSample-20 takes N-D (here 3-D); AffineGrid-20:
     * [N, H, W, 2] from size [N, C, H, W]; Col2Im-18: [N, C * 4, L] with block [2, 2] -> [N, C, image].
     */
    @Test
    @DisplayName("ONNX operator definitions: GridSample 16 and 20, AffineGrid 20, Col2Im 18")
    void sampling() {
        OnnxWriter.Graph v16 = g()
                .input("x", ElemType.FLOAT, 1, 3, 8, 8)
                .input("grid", ElemType.FLOAT, 1, 5, 6, 2)
                .node("GridSample", "gs", List.of("x", "grid"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertArrayEquals(new long[] {1, 3, 5, 6}, dims(shaped(16, v16), "y"));
        OnnxWriter.Graph v20 = g()
                .input("x", ElemType.FLOAT, 1, 2, 4, 4, 4)
                .input("grid", ElemType.FLOAT, 1, 3, 3, 3, 3)
                .input("theta", ElemType.FLOAT, 2, 2, 3)
                .longs("size", 2, 3, 5, 7)
                .input("cols", ElemType.FLOAT, 1, 8, 9)
                .longs("image", 4, 4)
                .longs("block", 2, 2)
                .node("GridSample", "gs", List.of("x", "grid"), List.of("y"), OnnxWriter.attr("mode", "linear"))
                .node("AffineGrid", "ag", List.of("theta", "size"), List.of("grid2"))
                .node("Col2Im", "ci", List.of("cols", "image", "block"), List.of("img"))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(20, v20);
        assertArrayEquals(new long[] {1, 2, 3, 3, 3}, dims(s, "y"));
        assertArrayEquals(new long[] {2, 5, 7, 2}, dims(s, "grid2"));
        assertArrayEquals(new long[] {1, 2, 4, 4}, dims(s, "img"));
        OnnxWriter.Graph old = g()
                .input("x", ElemType.FLOAT, 1, 2, 4, 4, 4)
                .input("grid", ElemType.FLOAT, 1, 3, 3, 3, 3)
                .node("GridSample", "gs", List.of("x", "grid"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertBad(16, old, "'gs' (GridSample)", "4-D input before opset 20");
    }
}
