package dev.erg.onnx;

import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.graph;

import java.nio.file.Path;
import java.util.List;

/**
 * A small voice-activity detector for a hearing-aid keyword spotter, built the way some exporters
 * write such models: inputs with anonymous dims ({@code input [?, ?]}, {@code state [2, ?, 128]}), a
 * runtime int64 scalar {@code sr} (the sample rate) and an {@code If} on {@code sr == 16000} whose two
 * branches are built for two frame sizes: 512 samples at 16 kHz (4 steps of 128) and 256 samples at
 * 8 kHz (2 steps of 128). Each branch reshapes the samples to {@code [T, 1, 128]} with a fixed target,
 * runs an LSTM (hidden 128) from the state, and scores the last hidden state. The branch built for the
 * other frame size cannot be shaped: its Reshape target does not hold the samples.
 *
 * <p>The If outputs are {@code prob [1, 1, 1]}, {@code state_out [2, 1, 128]} and {@code seq} (the
 * LSTM's Y, {@code [T, 1, 1, 128]}), which shows the branch that ran.
 */
public final class VoiceActivityModel {
    /** Hidden size of the LSTM and width of a step. */
    public static final int HIDDEN = 128;

    private VoiceActivityModel() {
    }

    /** Steps of 128 samples that the branch for {@code rate} expects: 4 at 16 kHz, 2 at 8 kHz. */
    public static int steps(int rate) {
        return rate == 16000 ? 4 : 2;
    }

    private static OnnxWriter.Graph branch(String name, int steps) {
        return new OnnxWriter.Graph(name)
                .longs(name + "_target", steps, 1, HIDDEN)
                .node("Reshape", name + "_frames", List.of("input", name + "_target"), List.of(name + "_x"))
                .node("LSTM", name + "_lstm", List.of(name + "_x", "W", "R", "B", "", "h0", "c0"),
                        List.of(name + "_y", name + "_yh", name + "_yc"), attr("hidden_size", HIDDEN))
                .node("MatMul", name + "_score", List.of(name + "_yh", "Wo"), List.of(name + "_z"))
                .node("Sigmoid", name + "_prob", List.of(name + "_z"), List.of(name + "_p"))
                .node("Concat", name + "_state", List.of(name + "_yh", name + "_yc"), List.of(name + "_st"),
                        attr("axis", 0))
                .output(name + "_p", ElemType.FLOAT).output(name + "_st", ElemType.FLOAT)
                .output(name + "_y", ElemType.FLOAT);
    }

    /** The model at opset {@code opset} (11 or later). */
    public static OnnxWriter.Model model(long opset) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("vad")
                .inputDims("input", ElemType.FLOAT, "", "")
                .inputDims("state", ElemType.FLOAT, 2L, "", (long) HIDDEN)
                .input("sr", ElemType.INT64)
                .weight("W", ElemType.FLOAT, 1, 4 * HIDDEN, HIDDEN)
                .weight("R", ElemType.FLOAT, 1, 4 * HIDDEN, HIDDEN)
                .weight("B", ElemType.FLOAT, 1, 8 * HIDDEN)
                .weight("Wo", ElemType.FLOAT, HIDDEN, 1)
                .initializer(new OnnxWriter.Tensor("rate16k", ElemType.INT64).longs(16000))
                .longs("zero", 0).longs("one", 1).longs("two", 2)
                .node("Slice", "h0_slice", List.of("state", "zero", "one", "zero"), List.of("h0"))
                .node("Slice", "c0_slice", List.of("state", "one", "two", "zero"), List.of("c0"))
                .node("Equal", "is_16k", List.of("sr", "rate16k"), List.of("cond"))
                .node("If", "rate_switch", List.of("cond"), List.of("prob", "state_out", "seq"),
                        graph("then_branch", branch("k16", steps(16000))),
                        graph("else_branch", branch("k8", steps(8000))))
                .output("prob", ElemType.FLOAT).output("state_out", ElemType.FLOAT).output("seq", ElemType.FLOAT);
        return new OnnxWriter.Model(opset, g);
    }

    /** Writes the opset-13 model to {@code file}. */
    public static Path write(Path file) {
        model(13).write(file);
        return file;
    }

    /**
     * The MACs of one run of the branch with {@code steps} LSTM steps, by the formulas of the counting
     * document: LSTM T·B·4·H·(I+H) with B = 1, I = H = 128, plus the score MatMul 1·128·1.
     */
    public static long branchMacs(long steps) {
        return steps * 4L * HIDDEN * (HIDDEN + HIDDEN) + HIDDEN;
    }
}
