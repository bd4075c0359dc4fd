package dev.erg.estimate;

import dev.erg.analysis.Analyzer;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;

/** Small models of known structure for the estimator's tests, written with the project's ONNX writer. */
public final class Models {
    private Models() {
    }

    public static ModelWorkload analyze(OnnxWriter.Graph g) {
        try {
            Path dir = Files.createTempDirectory("erg-est");
            Path file = dir.resolve(g.toString().hashCode() + ".onnx");
            new OnnxWriter.Model(13, g).write(file);
            ModelWorkload w = Analyzer.analyze(file, Map.of());
            Files.delete(file);
            Files.delete(dir);
            return w;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** One Conv: input 1 x c x h x w, weight k x (c/group) x r x r, stride 1, "same" padding. */
    public static OnnxWriter.Graph conv(long c, long h, long w, long k, long r, long group) {
        long pad = r / 2;
        return new OnnxWriter.Graph("conv")
                .input("x", ElemType.FLOAT, 1, c, h, w)
                .weight("w", ElemType.FLOAT, k, c / group, r, r)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", pad, pad, pad, pad),
                        OnnxWriter.attr("group", group))
                .output("y", ElemType.FLOAT);
    }

    /** x [m, k] times a weight [k, n]. */
    public static OnnxWriter.Graph matmul(long m, long k, long n) {
        return new OnnxWriter.Graph("matmul")
                .input("x", ElemType.FLOAT, m, k)
                .weight("w", ElemType.FLOAT, k, n)
                .node("MatMul", "matmul", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT);
    }

    /** The first node of an estimate whose operator is {@code op}. */
    public static NodeEstimate only(DeviceEstimate e, String op) {
        for (NodeEstimate n : e.nodes()) {
            if (n.work().opType().equals(op)) {
                return n;
            }
        }
        throw new AssertionError("no " + op);
    }
}
