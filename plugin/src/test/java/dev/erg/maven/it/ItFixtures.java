package dev.erg.maven.it;

import dev.erg.budget.Baseline;
import dev.erg.budget.GateResult;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.run.ModelSpec;
import dev.erg.run.RunRequest;
import dev.erg.run.Runner;
import java.io.File;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;

/**
 * Files the integration-test projects under src/it need, written before each build by its
 * prebuild.groovy (the test classes are on the scripts' class path): small CNNs of known structure,
 * written with the project's own ONNX writer, a corrupt model file, and baselines.
 */
public final class ItFixtures {
    private ItFixtures() {
    }

    /**
     * A small CNN with a symbolic batch dimension: input [batch, 3, 32, 32], conv1 (8 filters 3x3,
     * pad 1), relu1, conv2 (16 filters 3x3, pad 1), relu2. At batch 1: conv1 32*32*8*3*9 = 221,184 MACs,
     * conv2 32*32*16*8*9 = 1,179,648 MACs.
     */
    public static void smallCnn(File file) {
        write(file, cnn(16, false));
    }

    /**
     * The small CNN grown: conv2 has 32 filters and a conv3 (32 filters 3x3) follows. At batch 1:
     * conv2 2,359,296 MACs, conv3 32*32*32*32*9 = 9,437,184 MACs.
     */
    public static void grownCnn(File file) {
        write(file, cnn(32, true));
    }

    /**
     * The small CNN with one node outside the ONNX standard set between relu1 and conv2
     * ({@code com.example.Denoise}): it has no rule, so it and the nodes after it are not priced.
     */
    public static void customOpCnn(File file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("it_custom")
                .inputDims("image", ElemType.FLOAT, "batch", 3L, 32L, 32L)
                .weight("conv1.w", ElemType.FLOAT, 8, 3, 3, 3)
                .node("Conv", "conv1", List.of("image", "conv1.w"), List.of("c1"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu1", List.of("c1"), List.of("r1"))
                .domainNode("com.example", "Denoise", "denoise", List.of("r1"), List.of("d1"))
                .node("Relu", "relu2", List.of("d1"), List.of("features"));
        write(file, g.output("features", ElemType.FLOAT));
    }

    private static OnnxWriter.Graph cnn(long conv2Filters, boolean conv3) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("it_cnn")
                .inputDims("image", ElemType.FLOAT, "batch", 3L, 32L, 32L)
                .weight("conv1.w", ElemType.FLOAT, 8, 3, 3, 3)
                .weight("conv2.w", ElemType.FLOAT, conv2Filters, 8, 3, 3)
                .node("Conv", "conv1", List.of("image", "conv1.w"), List.of("c1"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu1", List.of("c1"), List.of("r1"))
                .node("Conv", "conv2", List.of("r1", "conv2.w"), List.of("c2"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu2", List.of("c2"), List.of(conv3 ? "r2" : "features"));
        if (conv3) {
            g.weight("conv3.w", ElemType.FLOAT, 32, conv2Filters, 3, 3)
                    .node("Conv", "conv3", List.of("r2", "conv3.w"), List.of("c3"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                    .node("Relu", "relu3", List.of("c3"), List.of("features"));
        }
        return g.output("features", ElemType.FLOAT);
    }

    private static void write(File file, OnnxWriter.Graph g) {
        mkdirs(file);
        new OnnxWriter.Model(13, g).write(file.toPath());
    }

    /** Bytes that are no ONNX model: a protobuf field whose length runs past the end of the file. */
    public static void corruptModel(File file) {
        mkdirs(file);
        try {
            // field 7 (graph), wire type 2, claimed length 1000, then three bytes of payload
            Files.write(file.toPath(), new byte[] {0x3a, (byte) 0xe8, 0x07, 0x0a, 0x01, 0x78});
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /**
     * Writes the baseline that the plugin's baseline goal would write for {@code label} on each device
     * when the model at {@code label} was {@code modelFile}.
     */
    public static void baseline(File basedir, String label, File modelFile, Map<String, Long> dims,
                                List<String> devices, File out) {
        RunRequest.Builder b = RunRequest.builder().model(new ModelSpec(label, modelFile.toPath(), dims))
                .deviceBase(basedir.toPath());
        for (String d : devices) {
            b.device(d);
        }
        GateResult r = Runner.run(b.build(), Runner.Progress.NONE).result();
        Baseline.of(r.pairs()).write(out.toPath());
    }

    private static void mkdirs(File file) {
        Path parent = file.toPath().toAbsolutePath().getParent();
        try {
            Files.createDirectories(parent);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
