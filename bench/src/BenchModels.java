import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/**
 * Writes the benchmark's two models, of one structure: a convolution stem and three fully connected
 * layers (Gemm with bias, Relu between them), weights embedded as raw_data.
 *
 * <pre>
 * x[1,3,64,64] -> Conv(C,3,3,3) -> Relu -> GlobalAveragePool -> Flatten -> Gemm(C x H) -> Relu
 *              -> Gemm(H x H) -> Relu -> Gemm(H x C) -> y
 * </pre>
 *
 * BIG: C = 4096, H = 8192: the three Gemm weights hold 4096*8192 + 8192*8192 + 8192*4096 = 134,217,728
 * fp32 values, 512 MiB (536,870,912 bytes). SMALL: C = 64, H = 128, a few tens of KiB. The payloads are
 * streamed as a fill pattern (OnnxWriter.Tensor.filled), never held in memory.
 *
 * Usage: java -cp erg.jar BenchModels OUT_DIR
 */
public final class BenchModels {
    private BenchModels() {
    }

    static OnnxWriter.Graph mlp(String name, long c, long h) {
        return new OnnxWriter.Graph(name)
                .input("x", ElemType.FLOAT, 1, 3, 64, 64)
                .weight("stem.w", ElemType.FLOAT, c, 3, 3, 3)
                .weight("stem.b", ElemType.FLOAT, c)
                .node("Conv", "stem/Conv", List.of("x", "stem.w", "stem.b"), List.of("s1"),
                        OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "stem/Relu", List.of("s1"), List.of("s2"))
                .node("GlobalAveragePool", "pool", List.of("s2"), List.of("p"))
                .node("Flatten", "flatten", List.of("p"), List.of("f"))
                .weight("fc1.w", ElemType.FLOAT, c, h)
                .weight("fc1.b", ElemType.FLOAT, h)
                .node("Gemm", "fc1/Gemm", List.of("f", "fc1.w", "fc1.b"), List.of("h1"))
                .node("Relu", "fc1/Relu", List.of("h1"), List.of("a1"))
                .weight("fc2.w", ElemType.FLOAT, h, h)
                .weight("fc2.b", ElemType.FLOAT, h)
                .node("Gemm", "fc2/Gemm", List.of("a1", "fc2.w", "fc2.b"), List.of("h2"))
                .node("Relu", "fc2/Relu", List.of("h2"), List.of("a2"))
                .weight("fc3.w", ElemType.FLOAT, h, c)
                .weight("fc3.b", ElemType.FLOAT, c)
                .node("Gemm", "fc3/Gemm", List.of("a2", "fc3.w", "fc3.b"), List.of("y"))
                .output("y", ElemType.FLOAT);
    }

    public static void main(String[] args) throws Exception {
        Path out = Path.of(args.length > 0 ? args[0] : "bench/scratch");
        Files.createDirectories(out);
        new OnnxWriter.Model(13, mlp("bench_big", 4096, 8192)).write(out.resolve("big.onnx"));
        new OnnxWriter.Model(13, mlp("bench_small", 64, 128)).write(out.resolve("small.onnx"));
        System.out.println("wrote " + out.resolve("big.onnx") + " (" + Files.size(out.resolve("big.onnx")) + " bytes) and "
                + out.resolve("small.onnx") + " (" + Files.size(out.resolve("small.onnx")) + " bytes)");
    }
}
