package dev.erg.fuzz;

import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.ints;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Writes the seeds of {@link ModelFuzzTest}: run {@code main} with the corpus folder
 * ({@code estimator/src/test/resources/dev/erg/fuzz/ModelFuzzTestInputs}) to rebuild them.
 */
public final class SeedCorpus {
    private SeedCorpus() {
    }

    static OnnxWriter.Graph relu() {
        return new OnnxWriter.Graph("g").input("x", ElemType.FLOAT, 1, 4)
                .node("Relu", "relu", List.of("x"), List.of("y")).output("y", ElemType.FLOAT);
    }

    /** Seed name to model bytes. */
    public static Map<String, byte[]> models() {
        Map<String, byte[]> out = new LinkedHashMap<>();
        // The structure of VoiceActivityModel, without weights: anonymous dims, a runtime int64 input
        // deciding an If, a branch that only shapes for its own frame size.
        OnnxWriter.Graph then = new OnnxWriter.Graph("then_g").longs("t4", 4, 1, 2)
                .node("Reshape", "then_frames", List.of("x", "t4"), List.of("tx"))
                .node("Relu", "then_relu", List.of("tx"), List.of("ty")).output("ty", ElemType.FLOAT);
        OnnxWriter.Graph els = new OnnxWriter.Graph("else_g").longs("t2", 2, 1, 2)
                .node("Reshape", "else_frames", List.of("x", "t2"), List.of("ex"))
                .node("Relu", "else_relu", List.of("ex"), List.of("ey")).output("ey", ElemType.FLOAT);
        OnnxWriter.Graph vad = new OnnxWriter.Graph("g").inputDims("x", ElemType.FLOAT, 1L, 4L)
                .input("sr", ElemType.INT64)
                .initializer(new OnnxWriter.Tensor("k", ElemType.INT64).longs(16000))
                .node("Equal", "is_16k", List.of("sr", "k"), List.of("c"))
                .node("If", "switch", List.of("c"), List.of("y"), OnnxWriter.graph("then_branch", then),
                        OnnxWriter.graph("else_branch", els))
                .output("y", ElemType.FLOAT);
        out.put("if-one-branch-shapes", new OnnxWriter.Model(13, vad).toBytes());
        OnnxWriter.Graph ct = new OnnxWriter.Graph("g").input("x", ElemType.FLOAT, 1, 2, 5, 5)
                .weight("w", ElemType.FLOAT, 2, 3, 3, 3)
                .node("ConvTranspose", "up", List.of("x", "w"), List.of("y"), ints("kernel_shape", 3, 3),
                        ints("pads", 1, 1, 1), ints("output_padding", 1, 1, 1), ints("strides", 2, 2))
                .output("y", ElemType.FLOAT);
        out.put("conv-transpose-bad-attrs", new OnnxWriter.Model(13, ct).toBytes());
        OnnxWriter.Graph undef = new OnnxWriter.Graph("g").input("x", ElemType.UNDEFINED, 1, 4)
                .node("Relu", "relu", List.of("x"), List.of("y")).output("y", ElemType.FLOAT);
        out.put("undefined-type", new OnnxWriter.Model(13, undef).toBytes());
        out.put("opset-0", new OnnxWriter.Model(0, relu()).toBytes());
        out.put("opset-99", new OnnxWriter.Model(99, relu()).toBytes());
        out.put("opset-twice", new OnnxWriter.Model(13, relu()).opsetImport("", 17).toBytes());
        OnnxWriter.Graph cast = new OnnxWriter.Graph("g").input("x", ElemType.FLOAT, 1, 4)
                .node("Cast", "cast", List.of("x"), List.of("y"), attr("to", 0L)).output("y", ElemType.FLOAT);
        out.put("cast-to-undefined", new OnnxWriter.Model(13, cast).toBytes());
        return out;
    }

    /** Seed name to profile text: two broken profiles (the presets are copied beside them). */
    public static Map<String, String> profiles() {
        Map<String, String> out = new LinkedHashMap<>();
        out.put("unclosed.yaml", "id: x\nengines: [\n");
        out.put("alias-bomb.yaml", "a: &a [x, x, x, x, x, x, x, x, x]\nb: &b [*a, *a, *a, *a, *a, *a, *a, *a, *a]\n"
                + "c: &c [*b, *b, *b, *b, *b, *b, *b, *b, *b]\nd: [*c, *c, *c, *c, *c, *c, *c, *c, *c]\n");
        return out;
    }

    /** Writes the seeds into the corpus folder {@code args[0]} ({@code .../ModelFuzzTestInputs}). */
    public static void main(String[] args) throws IOException {
        Path dir = Path.of(args[0]);
        Files.createDirectories(dir.resolve("analyze"));
        for (Map.Entry<String, byte[]> e : models().entrySet()) {
            Files.write(dir.resolve("analyze").resolve(e.getKey()), e.getValue());
        }
        Files.createDirectories(dir.resolve("profile"));
        for (Map.Entry<String, String> e : profiles().entrySet()) {
            Files.writeString(dir.resolve("profile").resolve(e.getKey()), e.getValue());
        }
    }
}
