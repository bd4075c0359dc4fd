package dev.erg.workload;

import static dev.erg.TestModels.analyze;
import static dev.erg.TestModels.node;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Models built with OnnxWriter whose counts are worked out by hand, here and step by step in
 * docs/counting.md. Shapes follow the ONNX operator definitions; MACs follow the convention of the
 * published MAC tables (one multiply-add per weight use; bias adds and activations are vector ops).
 */
class HandCountTest {

    /**
     * Conv with groups and stride (ONNX operator definition: Conv, opset 11).
     *
     * <pre>
     * X [N=1, C=8, H=15, W=15], W [K=12, C/g=4, R=3, S=3], B [12], group 2, strides 2, pads 1 on every side.
     * P = floor((15 + 1 + 1 - 3) / 2) + 1 = floor(14 / 2) + 1 = 8, Q = 8 likewise -> Y [1, 12, 8, 8].
     * MACs = N * K * P * Q * (C/g) * R * S = 1 * 12 * 8 * 8 * 4 * 3 * 3 = 768 * 36 = 27,648.
     * As matrix products: per group, (N*P*Q = 64) x (C/g*R*S = 36) x (K/g = 6), 2 groups: 64*36*6*2 = 27,648.
     * vector ops = bias adds, one per output element = 12 * 8 * 8 = 768.
     * weight bytes = (12*4*3*3 + 12) * 4 = (432 + 12) * 4 = 1,776.
     * input bytes = 8*15*15 * 4 = 7,200; output bytes = 768 * 4 = 3,072.
     * </pre>
     */
    @Test
    void groupedStridedConv() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("conv")
                .input("x", ElemType.FLOAT, 1, 8, 15, 15)
                .weight("w", ElemType.FLOAT, 12, 4, 3, 3)
                .weight("b", ElemType.FLOAT, 12)
                .node("Conv", "conv", List.of("x", "w", "b"), List.of("y"),
                        OnnxWriter.attr("group", 2L), OnnxWriter.ints("strides", 2, 2),
                        OnnxWriter.ints("pads", 1, 1, 1, 1), OnnxWriter.ints("kernel_shape", 3, 3))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(11, g);
        NodeWork c = node(w, "conv");
        assertArrayEquals(new long[] {1, 12, 8, 8}, c.outputShapes().get(0));
        assertEquals(Kind.MAC, c.kind());
        assertEquals(27_648L, c.macs());
        assertEquals(64, c.gemmM());
        assertEquals(36, c.gemmK());
        assertEquals(6, c.gemmN());
        assertEquals(2, c.gemmGroups());
        assertEquals(768L, c.vectorOps());
        assertEquals(1_776L, c.weightBytes());
        assertEquals(7_200L, c.inputBytes());
        assertEquals(3_072L, c.outputBytes());
        assertEquals("fp32", c.precision());
        assertEquals("fp32", c.weightPrecision());
        assertEquals(27_648L, w.macs());
        assertEquals(1_776L, w.weightBytes());
        // Peak: x (7,200) and y (3,072) are live together while the Conv runs.
        assertEquals(10_272L, w.peakActivationBytes());
    }

    /**
     * MatMul with broadcast batch dims (ONNX operator definition: MatMul, opset 13, numpy matmul semantics).
     *
     * <pre>
     * A [2, 1, 5, 6] (runtime), B [3, 6, 4] (initializer). Batch dims [2, 1] and [3] broadcast to [2, 3].
     * Y [2, 3, 5, 4]. MACs = 2 * 3 * 5 * 6 * 4 = 720.
     * As matrix products: B holds 3 distinct matrices; each multiplies 2 * 5 = 10 rows:
     * 3 groups of 10 x 6 x 4 = 3 * 240 = 720.
     * vector ops 0 (no bias). weight bytes = 3*6*4 * 4 = 288; input bytes = 2*5*6 * 4 = 240;
     * output bytes = 2*3*5*4 * 4 = 480.
     * </pre>
     */
    @Test
    void broadcastMatMul() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("matmul")
                .input("a", ElemType.FLOAT, 2, 1, 5, 6)
                .weight("b", ElemType.FLOAT, 3, 6, 4)
                .node("MatMul", "mm", List.of("a", "b"), List.of("y"))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        NodeWork m = node(w, "mm");
        assertArrayEquals(new long[] {2, 3, 5, 4}, m.outputShapes().get(0));
        assertEquals(720L, m.macs());
        assertEquals(10, m.gemmM());
        assertEquals(6, m.gemmK());
        assertEquals(4, m.gemmN());
        assertEquals(3, m.gemmGroups());
        assertEquals(0L, m.vectorOps());
        assertEquals(288L, m.weightBytes());
        assertEquals(240L, m.inputBytes());
        assertEquals(480L, m.outputBytes());
    }

    /**
     * The same product with both operands at runtime: nothing is a weight, both operands are input bytes.
     * A [2, 1, 5, 6] x B [3, 6, 4]: input bytes = (60 + 72) * 4 = 528, weight bytes 0, MACs 720.
     */
    @Test
    void broadcastMatMulOfTwoActivations() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("matmul2")
                .input("a", ElemType.FLOAT, 2, 1, 5, 6)
                .input("b", ElemType.FLOAT, 3, 6, 4)
                .node("MatMul", "mm", List.of("a", "b"), List.of("y"))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        NodeWork m = node(w, "mm");
        assertEquals(720L, m.macs());
        assertEquals(0L, m.weightBytes());
        assertEquals(528L, m.inputBytes());
        assertNull(m.weightPrecision()); // reads no weight
        assertEquals("fp32", m.precision()); // but multiplies fp32 operands
        assertEquals(0L, w.weightBytes());
    }

    /**
     * Bidirectional LSTM (ONNX operator definition: LSTM, opset 7, the version a model importing opset 13 uses).
     *
     * <pre>
     * X [T=7, B=2, I=5], W [dirs=2, 4H=12, I=5], R [2, 12, H=3], B [2, 8H=24], hidden_size 3.
     * Y [T, dirs, B, H] = [7, 2, 2, 3]; Y_h = Y_c = [dirs, B, H] = [2, 2, 3].
     * MACs = T * B * dirs * 4 * H * (I + H) = 7 * 2 * 2 * 4 * 3 * (5 + 3) = 28 * 12 * 8 = 2,688.
     * As matrix products: per direction (T*B = 14) x (I+H = 8) x (4H = 12), 2 directions: 14*8*12*2 = 2,688.
     * vector ops = T * B * dirs * H * 36 = 7 * 2 * 2 * 3 * 36 = 3,024 (36 per hidden unit and step:
     * 8 bias adds, 4 adds of the two products, 3 sigmoids and 2 tanh at 4 each, 3 for the cell update,
     * 1 for the output product).
     * weight bytes = (2*12*5 + 2*12*3 + 2*24) * 4 = (120 + 72 + 48) * 4 = 960.
     * input bytes = 7*2*5 * 4 = 280; output bytes = (84 + 12 + 12) * 4 = 432.
     * </pre>
     */
    @Test
    void bidirectionalLstm() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("lstm")
                .input("x", ElemType.FLOAT, 7, 2, 5)
                .weight("w", ElemType.FLOAT, 2, 12, 5)
                .weight("r", ElemType.FLOAT, 2, 12, 3)
                .weight("b", ElemType.FLOAT, 2, 24)
                .node("LSTM", "lstm", List.of("x", "w", "r", "b"), List.of("y", "y_h", "y_c"),
                        OnnxWriter.attr("hidden_size", 3L), OnnxWriter.attr("direction", "bidirectional"))
                .output("y", ElemType.FLOAT)
                .output("y_h", ElemType.FLOAT)
                .output("y_c", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        NodeWork l = node(w, "lstm");
        assertArrayEquals(new long[] {7, 2, 2, 3}, l.outputShapes().get(0));
        assertArrayEquals(new long[] {2, 2, 3}, l.outputShapes().get(1));
        assertArrayEquals(new long[] {2, 2, 3}, l.outputShapes().get(2));
        assertEquals(2_688L, l.macs());
        assertEquals(14, l.gemmM());
        assertEquals(8, l.gemmK());
        assertEquals(12, l.gemmN());
        assertEquals(2, l.gemmGroups());
        assertEquals(3_024L, l.vectorOps());
        assertEquals(960L, l.weightBytes());
        assertEquals(280L, l.inputBytes());
        assertEquals(432L, l.outputBytes());
        assertEquals(960L, w.weightBytes());
    }

    /**
     * The grouped Conv in QDQ form: weights stored int8 behind DequantizeLinear (ONNX operator
     * definitions: QuantizeLinear and DequantizeLinear, opset 13).
     *
     * <pre>
     * x fp32 [1,8,15,15] -> QuantizeLinear(scale fp32 scalar, zero point int8 scalar) -> int8
     *   -> DequantizeLinear -> fp32 -> Conv(group 2, stride 2, pads 1) with
     * w int8 [12,4,3,3] -> DequantizeLinear(scale fp32 scalar, zero point int8 scalar) -> fp32, bias fp32 [12].
     * The weight DequantizeLinear reads only constants: folded, it never runs.
     * Conv weight bytes = 432 * 1 (int8) + 4 (scale) + 1 (zero point) + 12 * 4 (bias) = 485.
     * Model weight bytes = 485 + 4 + 1 (activation scale and zero point) = 490.
     * Conv MACs = 27,648 as in the float case; precision int8 (both operands come from int8 data).
     * QuantizeLinear / DequantizeLinear vector ops = 2 per element: 2 * 8*15*15 = 3,600 each.
     * </pre>
     */
    @Test
    void qdqConvCountsInt8Weights() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("qdq")
                .input("x", ElemType.FLOAT, 1, 8, 15, 15)
                .initializer(new OnnxWriter.Tensor("xs", ElemType.FLOAT).floats(0.05f))
                .initializer(new OnnxWriter.Tensor("xz", ElemType.INT8).raw(new byte[] {0}))
                .weight("w", ElemType.INT8, 12, 4, 3, 3)
                .initializer(new OnnxWriter.Tensor("ws", ElemType.FLOAT).floats(0.01f))
                .initializer(new OnnxWriter.Tensor("wz", ElemType.INT8).raw(new byte[] {0}))
                .weight("b", ElemType.FLOAT, 12)
                .node("QuantizeLinear", "q", List.of("x", "xs", "xz"), List.of("xq"))
                .node("DequantizeLinear", "dq", List.of("xq", "xs", "xz"), List.of("xd"))
                .node("DequantizeLinear", "wdq", List.of("w", "ws", "wz"), List.of("wd"))
                .node("Conv", "conv", List.of("xd", "wd", "b"), List.of("y"),
                        OnnxWriter.attr("group", 2L), OnnxWriter.ints("strides", 2, 2),
                        OnnxWriter.ints("pads", 1, 1, 1, 1))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        NodeWork c = node(w, "conv");
        assertEquals(27_648L, c.macs());
        assertEquals(485L, c.weightBytes());
        assertEquals("int8", c.weightPrecision());
        assertEquals("int8", c.precision());
        assertEquals(8, c.precisionBits());
        // Runtime inputs count at the type the graph gives them (fp32 after DequantizeLinear), as
        // docs/counting.md says: 8 * 15 * 15 * 4 = 7,200.
        assertEquals(7_200L, c.inputBytes());
        assertEquals(Kind.FOLDED, node(w, "wdq").kind());
        assertEquals(0L, node(w, "wdq").vectorOps());
        assertEquals(Kind.VECTOR, node(w, "q").kind());
        assertEquals(3_600L, node(w, "q").vectorOps());
        assertEquals(3_600L, node(w, "dq").vectorOps());
        assertEquals(490L, w.weightBytes());
        assertEquals(27_648L, w.macs());
    }

    /**
     * Weights written as Constant nodes (some exporters inline them) count as weights when they feed a
     * MAC operator; a Constant that only gives a Reshape its target shape is not a weight.
     *
     * <pre>
     * Constant w fp32 [12, 4, 3, 3] -> Conv (group 2, stride 2, pads 1) on x [1, 8, 15, 15], no bias;
     * Constant shape int64 [2] = [1, -1] -> Reshape of the Conv output to [1, 768].
     * weight bytes = 12*4*3*3 * 4 = 1,728 (the 16 bytes of the shape constant are not weights).
     * The Constant nodes are folded; the Reshape is a view. MACs = 27,648, vector ops 0 (no bias).
     * </pre>
     */
    @Test
    void constantNodeWeights() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("constw")
                .input("x", ElemType.FLOAT, 1, 8, 15, 15)
                .node("Constant", "wconst", List.of(), List.of("w"),
                        OnnxWriter.tensor("value", new OnnxWriter.Tensor("w", ElemType.FLOAT, 12, 4, 3, 3).filled()))
                .node("Constant", "sconst", List.of(), List.of("s"),
                        OnnxWriter.tensor("value", new OnnxWriter.Tensor("s", ElemType.INT64, 2).longs(1, -1)))
                .node("Conv", "conv", List.of("x", "w"), List.of("y"),
                        OnnxWriter.attr("group", 2L), OnnxWriter.ints("strides", 2, 2),
                        OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Reshape", "flat", List.of("y", "s"), List.of("z"))
                .output("z", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertEquals(1_728L, w.weightBytes());
        assertEquals(1_728L, node(w, "conv").weightBytes());
        assertEquals(0L, node(w, "conv").vectorOps());
        assertEquals(27_648L, w.macs());
        assertEquals(Kind.FOLDED, node(w, "wconst").kind());
        assertEquals(Kind.FOLDED, node(w, "sconst").kind());
        assertEquals(Kind.VIEW, node(w, "flat").kind());
        assertArrayEquals(new long[] {1, 768}, node(w, "flat").outputShapes().get(0));
    }

    /**
     * Peak activation bytes of a small chain, views sharing their input's buffer.
     *
     * <pre>
     * x [1,4,8,8] fp32 (1,024 B) -> Relu "r1" -> a (1,024 B)
     * a -> Relu "r2" -> b (1,024 B, a graph output)
     * a -> Flatten "flat" -> f [1,256] (a view: the buffer of a)
     * f -> Gemm "fc" with w [256,2] -> c [1,2] (8 B, a graph output)
     * Schedule 0 r1, 1 r2, 2 flat, 3 fc. Lifetimes (first..last step): x 0..0, a 0..3 (its view f is
     * read at 3), b 1..end, c 3..end.
     * step 0: x + a = 2,048; step 1: a + b = 2,048; step 2: a + b = 2,048; step 3: a + b + c = 2,056.
     * Peak = 2,056. Had the view its own buffer, step 2 would hold a + f + b = 3,072.
     * Vector ops: 256 per Relu, 0 for the view and for the bias-free Gemm; Gemm MACs 1*256*2 = 512.
     * </pre>
     */
    @Test
    void peakActivationOfAChainWithAView() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("chain")
                .input("x", ElemType.FLOAT, 1, 4, 8, 8)
                .weight("w", ElemType.FLOAT, 256, 2)
                .node("Relu", "r1", List.of("x"), List.of("a"))
                .node("Relu", "r2", List.of("a"), List.of("b"))
                .node("Flatten", "flat", List.of("a"), List.of("f"))
                .node("Gemm", "fc", List.of("f", "w"), List.of("c"))
                .output("b", ElemType.FLOAT)
                .output("c", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertEquals(2_056L, w.peakActivationBytes());
        NodeWork flat = node(w, "flat");
        assertEquals(Kind.VIEW, flat.kind());
        assertEquals(0L, flat.inputBytes() + flat.outputBytes() + flat.vectorOps());
        assertEquals(256L, node(w, "r1").vectorOps());
        assertEquals(1_024L, node(w, "r1").inputBytes());
        assertEquals(1_024L, node(w, "r1").outputBytes());
        assertEquals(512L, node(w, "fc").macs());
        assertEquals(0L, node(w, "fc").vectorOps());
        assertEquals(512 + 256 + 256, w.macs() + w.vectorOps());
        assertTrue(w.complete());
    }
}
