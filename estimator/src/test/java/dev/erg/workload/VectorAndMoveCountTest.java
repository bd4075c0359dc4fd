package dev.erg.workload;

import static dev.erg.TestModels.analyze;
import static dev.erg.TestModels.node;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * Vector-op factors and bytes moved of non-MAC nodes, per the conventions of docs/counting.md (the
 * factors are erg's own: common practice, no single source). Shapes follow the ONNX operator
 * definitions at opset 13.
 */
class VectorAndMoveCountTest {

    /**
     * Concat moves all of its inputs: [2, 3] and [2, 5] fp32 -> [2, 8]:
     * input bytes (6 + 10) * 4 = 64, output bytes 16 * 4 = 64, no arithmetic.
     */
    @Test
    void concatMovesEveryInput() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("cat")
                .input("a", ElemType.FLOAT, 2, 3)
                .input("b", ElemType.FLOAT, 2, 5)
                .node("Concat", "cat", List.of("a", "b"), List.of("y"), OnnxWriter.attr("axis", 1L))
                .output("y", ElemType.FLOAT);
        NodeWork c = node(analyze(13, g), "cat");
        assertEquals(Kind.MOVE, c.kind());
        assertEquals(64L, c.inputBytes());
        assertEquals(64L, c.outputBytes());
        assertEquals(0L, c.vectorOps());
    }

    /** Split moves its input once; the split sizes are a parameter: [3, 6] -> [3, 2] + [3, 4]: 72 in, 72 out. */
    @Test
    void splitMovesItsInput() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("split")
                .input("x", ElemType.FLOAT, 3, 6)
                .longs("parts", 2, 4)
                .node("Split", "sp", List.of("x", "parts"), List.of("a", "b"), OnnxWriter.attr("axis", 1L))
                .output("a", ElemType.FLOAT)
                .output("b", ElemType.FLOAT);
        NodeWork s = node(analyze(13, g), "sp");
        assertEquals(72L, s.inputBytes());
        assertEquals(72L, s.outputBytes());
        assertEquals(0L, s.weightBytes());
    }

    /**
     * Variadic elementwise ops need (inputs - 1) ops per output element: three inputs of [4, 5] -> 2 * 20 = 40
     * for Sum, Max and Min alike; two inputs -> 20.
     */
    @Test
    void variadicOpsCountOneOpPerPair() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("var")
                .input("a", ElemType.FLOAT, 4, 5)
                .input("b", ElemType.FLOAT, 4, 5)
                .input("c", ElemType.FLOAT, 4, 5)
                .node("Sum", "sum", List.of("a", "b", "c"), List.of("s"))
                .node("Max", "max", List.of("a", "b", "c"), List.of("m"))
                .node("Min", "min", List.of("a", "b", "c"), List.of("n"))
                .node("Max", "max2", List.of("a", "b"), List.of("m2"))
                .output("s", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertEquals(40L, node(w, "sum").vectorOps());
        assertEquals(40L, node(w, "max").vectorOps());
        assertEquals(40L, node(w, "min").vectorOps());
        assertEquals(20L, node(w, "max2").vectorOps());
        assertEquals(3 * 80L, node(w, "max").inputBytes());
    }

    /**
     * Pooling and the rest of a CNN head:
     * MaxPool 3x3 stride 2 pads 1 on [1, 4, 8, 8] -> [1, 4, 4, 4]: 64 outputs x 9 = 576 ops;
     * GlobalAveragePool: 1 per input element, 4 * 4 * 4 = 64; Softmax over [1, 10]: 8 per element = 80;
     * Clip (ReLU6, min and max as inputs, a parameter): 1 per element, reads 256 bytes.
     */
    @Test
    void poolingSoftmaxClip() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("head")
                .input("x", ElemType.FLOAT, 1, 4, 8, 8)
                .input("logits", ElemType.FLOAT, 1, 10)
                .initializer(new OnnxWriter.Tensor("lo", ElemType.FLOAT).floats(0f))
                .initializer(new OnnxWriter.Tensor("hi", ElemType.FLOAT).floats(6f))
                .node("Clip", "relu6", List.of("x", "lo", "hi"), List.of("c"))
                .node("MaxPool", "pool", List.of("c"), List.of("p"), OnnxWriter.ints("kernel_shape", 3, 3),
                        OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("GlobalAveragePool", "gap", List.of("p"), List.of("v"))
                .node("Softmax", "sm", List.of("logits"), List.of("prob"))
                .output("v", ElemType.FLOAT)
                .output("prob", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertEquals(576L, node(w, "pool").vectorOps());
        assertEquals(64L, node(w, "gap").vectorOps());
        assertEquals(80L, node(w, "sm").vectorOps());
        assertEquals(256L, node(w, "relu6").vectorOps());
        assertEquals(1_024L, node(w, "relu6").inputBytes());
        assertEquals(0L, node(w, "relu6").weightBytes());
    }

    /**
     * Resize: bilinear over two axes blends 2 x 2 = 4 taps, 2 * 4 - 1 = 7 ops per output:
     * [1, 2, 4, 4] x2 -> [1, 2, 8, 8] = 128 outputs, 896 ops. Nearest only moves data.
     */
    @Test
    void resizeModes() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("rs")
                .input("x", ElemType.FLOAT, 1, 2, 4, 4)
                .initializer(new OnnxWriter.Tensor("roi", ElemType.FLOAT, 0).raw(new byte[0]))
                .initializer(new OnnxWriter.Tensor("sc", ElemType.FLOAT, 4).floats(1, 1, 2, 2))
                .node("Resize", "lin", List.of("x", "roi", "sc"), List.of("y"), OnnxWriter.attr("mode", "linear"))
                .node("Resize", "near", List.of("x", "roi", "sc"), List.of("z"))
                .output("y", ElemType.FLOAT)
                .output("z", ElemType.FLOAT);
        ModelWorkload w = analyze(13, g);
        assertEquals(896L, node(w, "lin").vectorOps());
        assertEquals(Kind.VECTOR, node(w, "lin").kind());
        assertEquals(Kind.MOVE, node(w, "near").kind());
        assertEquals(0L, node(w, "near").vectorOps());
        assertEquals(128L, node(w, "near").inputBytes());
        assertEquals(512L, node(w, "near").outputBytes());
    }
}
