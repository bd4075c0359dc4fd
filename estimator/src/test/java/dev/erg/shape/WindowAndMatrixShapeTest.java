package dev.erg.shape;

import static dev.erg.TestModels.dims;
import static dev.erg.TestModels.shaped;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.erg.graph.Graph;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

/**
 * Output shapes of the sliding-window and matrix operators, each worked out from its ONNX operator
 * definition (the version that the model's opset selects).
 */
class WindowAndMatrixShapeTest {

    static Graph conv(long opset, long[] x, long[] w, OnnxWriter.Attr... attrs) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("t")
                .input("x", ElemType.FLOAT, x)
                .weight("w", ElemType.FLOAT, w)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), attrs)
                .output("y", ElemType.FLOAT);
        return shaped(opset, g);
    }

    /**
     * Conv: out = floor((in + pad_begin + pad_end - ((k - 1) * dilation + 1)) / stride) + 1.
     * H: in 10, k 3, dilation 2 (span 5), pads 1 + 2, stride 2: floor((10 + 3 - 5) / 2) + 1 = 5.
     * W: in 12, k 3, dilation 1 (span 3), pads 0 + 1, stride 3: floor((12 + 1 - 3) / 3) + 1 = 4.
     */
    @Test
    @DisplayName("ONNX operator definition: Conv, opset 11 (explicit pads, strides, dilations)")
    void convExplicitPads() {
        Graph g = conv(11, new long[] {1, 3, 10, 12}, new long[] {5, 3, 3, 3},
                OnnxWriter.ints("strides", 2, 3), OnnxWriter.ints("dilations", 2, 1),
                OnnxWriter.ints("pads", 1, 0, 2, 1));
        assertArrayEquals(new long[] {1, 5, 5, 4}, dims(g, "y"));
    }

    /** Conv auto_pad SAME_UPPER: out = ceil(in / stride): ceil(10 / 2) = 5, ceil(11 / 2) = 6. */
    @Test
    @DisplayName("ONNX operator definition: Conv, opset 11 (auto_pad SAME_UPPER)")
    void convSameUpper() {
        Graph g = conv(11, new long[] {1, 3, 10, 11}, new long[] {5, 3, 3, 3},
                OnnxWriter.attr("auto_pad", "SAME_UPPER"), OnnxWriter.ints("strides", 2, 2));
        assertArrayEquals(new long[] {1, 5, 5, 6}, dims(g, "y"));
    }

    /** Conv auto_pad VALID: out = ceil((in - span + 1) / stride): ceil(8 / 2) = 4, ceil(9 / 2) = 5. */
    @Test
    @DisplayName("ONNX operator definition: Conv, opset 11 (auto_pad VALID)")
    void convValid() {
        Graph g = conv(11, new long[] {1, 3, 10, 11}, new long[] {5, 3, 3, 3},
                OnnxWriter.attr("auto_pad", "VALID"), OnnxWriter.ints("strides", 2, 2));
        assertArrayEquals(new long[] {1, 5, 4, 5}, dims(g, "y"));
    }

    /** Conv without pads or strides attributes: defaults 0 and 1; 1-D input [1, 4, 9], kernel 3 -> 7. */
    @Test
    @DisplayName("ONNX operator definition: Conv, opset 11 (model opset 13; defaults, 1-D)")
    void convDefaults1d() {
        Graph g = conv(13, new long[] {1, 4, 9}, new long[] {6, 4, 3});
        assertArrayEquals(new long[] {1, 6, 7}, dims(g, "y"));
    }

    static Graph convTranspose(long[] x, long[] w, OnnxWriter.Attr... attrs) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("t")
                .input("x", ElemType.FLOAT, x)
                .weight("w", ElemType.FLOAT, w)
                .node("ConvTranspose", "ct", List.of("x", "w"), List.of("y"), attrs)
                .output("y", ElemType.FLOAT);
        return shaped(13, g);
    }

    /**
     * ConvTranspose: out = stride * (in - 1) + output_padding + ((k - 1) * dilation + 1) - pad_begin - pad_end.
     * in 5, stride 2, k 3, pads 1 + 1, output_padding 1: 2 * 4 + 1 + 3 - 2 = 10. Channels: W is
     * [C, M/group, k, k] = [4, 6, 3, 3], group 1 -> 6 output channels.
     */
    @Test
    @DisplayName("ONNX operator definition: ConvTranspose, opset 11 (model opset 13; stride, pads, output_padding)")
    void convTransposeStride() {
        Graph g = convTranspose(new long[] {1, 4, 5, 5}, new long[] {4, 6, 3, 3},
                OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("pads", 1, 1, 1, 1),
                OnnxWriter.ints("output_padding", 1, 1));
        assertArrayEquals(new long[] {1, 6, 10, 10}, dims(g, "y"));
    }

    /** ConvTranspose group 2: W [4, 3, 3, 3] gives M = 3 * 2 = 6 channels; no pads: 2 * 4 + 3 = 11. */
    @Test
    @DisplayName("ONNX operator definition: ConvTranspose, opset 11 (model opset 13; group)")
    void convTransposeGroups() {
        Graph g = convTranspose(new long[] {1, 4, 5, 5}, new long[] {4, 3, 3, 3},
                OnnxWriter.ints("strides", 2, 2), OnnxWriter.attr("group", 2L));
        assertArrayEquals(new long[] {1, 6, 11, 11}, dims(g, "y"));
    }

    /** ConvTranspose output_shape: the spatial output is output_shape itself (the pads are derived from it). */
    @Test
    @DisplayName("ONNX operator definition: ConvTranspose, opset 11 (model opset 13; output_shape)")
    void convTransposeOutputShape() {
        Graph g = convTranspose(new long[] {1, 4, 5, 5}, new long[] {4, 6, 3, 3},
                OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("output_shape", 10, 9));
        assertArrayEquals(new long[] {1, 6, 10, 9}, dims(g, "y"));
    }

    /** ConvTranspose as exported for the reference U-Net: kernel 2, stride 2 doubles each side. */
    @Test
    @DisplayName("ONNX operator definition: ConvTranspose, opset 11 (model opset 13; kernel 2, stride 2)")
    void convTransposeDoubling() {
        Graph g = convTranspose(new long[] {1, 64, 32, 32}, new long[] {64, 32, 2, 2},
                OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("kernel_shape", 2, 2));
        assertArrayEquals(new long[] {1, 32, 64, 64}, dims(g, "y"));
    }

    static Graph maxPool(long[] x, OnnxWriter.Attr... attrs) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("t")
                .input("x", ElemType.FLOAT, x)
                .node("MaxPool", "pool", List.of("x"), List.of("y"), attrs)
                .output("y", ElemType.FLOAT);
        return shaped(13, g);
    }

    /**
     * MaxPool ceil_mode: out = ceil((in + pads - span) / stride) + 1 instead of floor.
     * in 112, k 3, stride 2: floor(109 / 2) + 1 = 55; ceil(109 / 2) + 1 = 56.
     */
    @Test
    @DisplayName("ONNX operator definition: MaxPool, opset 12 (model opset 13; ceil_mode 0 and 1)")
    void maxPoolCeilMode() {
        OnnxWriter.Attr k = OnnxWriter.ints("kernel_shape", 3, 3);
        OnnxWriter.Attr s = OnnxWriter.ints("strides", 2, 2);
        assertArrayEquals(new long[] {1, 8, 55, 55}, dims(maxPool(new long[] {1, 8, 112, 112}, k, s), "y"));
        assertArrayEquals(new long[] {1, 8, 56, 56},
                dims(maxPool(new long[] {1, 8, 112, 112}, k, s, OnnxWriter.attr("ceil_mode", 1L)), "y"));
        // SqueezeNet 1.1's first pool: 111 -> (111 - 3) / 2 + 1 = 55 either way.
        assertArrayEquals(new long[] {1, 8, 55, 55},
                dims(maxPool(new long[] {1, 8, 111, 111}, k, s, OnnxWriter.attr("ceil_mode", 1L)), "y"));
    }

    /** MaxPool with pads (ResNet's stem pool): 112 + 1 + 1 - 3 = 111, floor(111 / 2) + 1 = 56. */
    @Test
    @DisplayName("ONNX operator definition: MaxPool, opset 12 (model opset 13; pads)")
    void maxPoolPads() {
        Graph g = maxPool(new long[] {1, 64, 112, 112}, OnnxWriter.ints("kernel_shape", 3, 3),
                OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("pads", 1, 1, 1, 1));
        assertArrayEquals(new long[] {1, 64, 56, 56}, dims(g, "y"));
    }

    /** Gemm: Y [M, N] with A' = transA ? A^T : A and B' = transB ? B^T : B. */
    @Test
    @DisplayName("ONNX operator definition: Gemm, opset 13 (transA, transB)")
    void gemmTranspose() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("t")
                .input("a", ElemType.FLOAT, 3, 5)
                .weight("b", ElemType.FLOAT, 4, 5)
                .weight("c", ElemType.FLOAT, 4)
                .node("Gemm", "fc", List.of("a", "b", "c"), List.of("y"), OnnxWriter.attr("transB", 1L))
                .input("at", ElemType.FLOAT, 5, 3)
                .weight("b2", ElemType.FLOAT, 5, 4)
                .node("Gemm", "fc2", List.of("at", "b2"), List.of("y2"), OnnxWriter.attr("transA", 1L))
                .output("y", ElemType.FLOAT)
                .output("y2", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {3, 4}, dims(s, "y"));
        assertArrayEquals(new long[] {3, 4}, dims(s, "y2"));
    }

    /** MatMul: numpy semantics; a 1-D operand gets a 1 prepended (A) or appended (B), removed afterwards. */
    @Test
    @DisplayName("ONNX operator definition: MatMul, opset 13 (broadcast batch, 1-D operands)")
    void matMulShapes() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("t")
                .input("a", ElemType.FLOAT, 2, 1, 5, 6)
                .input("b", ElemType.FLOAT, 3, 6, 4)
                .input("v", ElemType.FLOAT, 6)
                .node("MatMul", "m1", List.of("a", "b"), List.of("y1"))
                .node("MatMul", "m2", List.of("v", "b"), List.of("y2"))
                .node("MatMul", "m3", List.of("a", "v"), List.of("y3"))
                .output("y1", ElemType.FLOAT)
                .output("y2", ElemType.FLOAT)
                .output("y3", ElemType.FLOAT);
        Graph s = shaped(13, g);
        assertArrayEquals(new long[] {2, 3, 5, 4}, dims(s, "y1"));
        assertArrayEquals(new long[] {3, 4}, dims(s, "y2"));
        assertArrayEquals(new long[] {2, 1, 5}, dims(s, "y3"));
        assertEquals(ElemType.FLOAT, s.value("y1").type());
    }

    /** LSTM layout 1 (batch first, added in opset 14): X [B, T, I] -> Y [B, T, dirs, H], Y_h [B, dirs, H]. */
    @Test
    @DisplayName("ONNX operator definition: LSTM, opset 14 (layout 1)")
    void lstmBatchFirst() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("t")
                .input("x", ElemType.FLOAT, 2, 7, 5)
                .weight("w", ElemType.FLOAT, 1, 12, 5)
                .weight("r", ElemType.FLOAT, 1, 12, 3)
                .node("LSTM", "lstm", List.of("x", "w", "r"), List.of("y", "y_h", "y_c"),
                        OnnxWriter.attr("hidden_size", 3L), OnnxWriter.attr("layout", 1L))
                .output("y", ElemType.FLOAT);
        Graph s = shaped(14, g);
        assertArrayEquals(new long[] {2, 7, 1, 3}, dims(s, "y"));
        assertArrayEquals(new long[] {2, 1, 3}, dims(s, "y_h"));
        assertArrayEquals(new long[] {2, 1, 3}, dims(s, "y_c"));
    }
}
