package dev.erg.report;

import dev.erg.analysis.Analyzer;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;

/** Small models of known structure for the report tests, written with {@link OnnxWriter}. */
final class ReportModels {
    private ReportModels() {
    }

    /**
     * x[batch,3,8,8] -> Conv(w[4,3,3,3], pads 1) -> Relu -> z.
     *
     * <p>Hand-worked: the ONNX Conv output side is (8 + 1 + 1 - 3) / 1 + 1 = 8, so y and z are
     * [1,4,8,8] for batch 1. Conv MACs N.K.P.Q.C.R.S = 1*4*8*8*3*3*3 = 6,912; as a matrix product
     * m = N.P.Q = 64 positions, k = C.R.S = 27, n = K = 4. Weight bytes 108 fp32 = 432; Conv input
     * 192 fp32 = 768 bytes, output 256 fp32 = 1,024 bytes. Relu: one vector op per output element,
     * 256 (common practice, no single source).
     */
    static Path convRelu(Path file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("tiny")
                .inputDims("x", ElemType.FLOAT, "batch", 3L, 8L, 8L)
                .weight("w", ElemType.FLOAT, 4, 3, 3, 3)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu", List.of("y"), List.of("z"))
                .output("z", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }

    static ModelWorkload analyzeConvRelu(Path file) {
        return Analyzer.analyze(convRelu(file), Map.of("batch", 1L));
    }

    /**
     * A model erg cannot fully model: an operator with no rule ("Zeta", then "Alpha"), an operator of
     * a foreign domain, and a Relu downstream of them whose input shape stays unknown.
     */
    static ModelWorkload incomplete(Path file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("partial")
                .input("x", ElemType.FLOAT, 1, 16)
                .node("Zeta", "zeta", List.of("x"), List.of("a"))
                .node("Alpha", "alpha", List.of("x"), List.of("b"))
                .domainNode("com.example", "Custom", "custom", List.of("x"), List.of("c"))
                .node("Relu", "relu_after_zeta", List.of("a"), List.of("d"))
                .node("Relu", "relu_of_x", List.of("x"), List.of("e"))
                .output("b", ElemType.FLOAT)
                .output("c", ElemType.FLOAT)
                .output("d", ElemType.FLOAT)
                .output("e", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return Analyzer.analyze(file, Map.of());
    }

    /**
     * {@code count} MatMuls in a chain x[1,8] . w_i[8,8], each 1*8*8 = 64 MACs, except node
     * {@code bigAt}, which reads w[8,8] from a [1,8] input too but twice over via a batch of 2 (its
     * own input x2[2,8]): 2*8*8 = 128 MACs.
     */
    static ModelWorkload chain(Path file, int count, int bigAt, String longName) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("chain")
                .input("x", ElemType.FLOAT, 1, 8)
                .input("x2", ElemType.FLOAT, 2, 8);
        String prev = "x";
        for (int i = 0; i < count; i++) {
            g.weight("w" + i, ElemType.FLOAT, 8, 8);
            String name = i == 0 && longName != null ? longName : "mm" + i;
            if (i == bigAt) {
                g.node("MatMul", name, List.of("x2", "w" + i), List.of("big"));
                g.output("big", ElemType.FLOAT);
                continue;
            }
            String out = "h" + i;
            g.node("MatMul", name, List.of(prev, "w" + i), List.of(out));
            prev = out;
        }
        g.output(prev, ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return Analyzer.analyze(file, Map.of());
    }
}
