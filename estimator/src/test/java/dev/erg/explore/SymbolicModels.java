package dev.erg.explore;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Path;
import java.util.List;

/** Models with a symbolic dim, written for the sweep tests. */
public final class SymbolicModels {
    public static final int D = 128;
    public static final int HEADS = 4;
    public static final int FFN = 512;
    public static final int LAYERS = 4;
    public static final int FEATURES = 32;
    public static final int CLASSES = 5;

    private SymbolicModels() {
    }

    /**
     * The shared tiny transformer's structure (4 encoder layers, width 128, 4 heads of 32, FFN 512, 32
     * input features, 5 classes, mean over tokens before the head) with a symbolic sequence length
     * {@code seq}: x[1,seq,32] → embedding → 4 × (Q, K, V projections, heads split by Reshape and
     * Transpose, QKᵀ, Softmax, AV, heads merged, output projection, residual Add, FFN with Relu,
     * residual Add) → ReduceMean over tokens → head. Layer norms are left out: they carry no MACs.
     * The hand count of its MACs is in docs/method.md ("Sweeps").
     */
    public static Path transformer(Path file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("tiny_transformer_seq")
                .inputDims("x", ElemType.FLOAT, 1L, "seq", (long) FEATURES)
                .weight("emb", ElemType.FLOAT, FEATURES, D)
                .longs("split", 0, -1, HEADS, D / HEADS)
                .longs("merge", 0, -1, D)
                .node("MatMul", "embed", List.of("x", "emb"), List.of("h0"));
        String h = "h0";
        for (int l = 0; l < LAYERS; l++) {
            String p = "l" + l + "_";
            for (String w : List.of("wq", "wk", "wv", "wo")) {
                g.weight(p + w, ElemType.FLOAT, D, D);
            }
            g.weight(p + "w1", ElemType.FLOAT, D, FFN).weight(p + "w2", ElemType.FLOAT, FFN, D);
            for (String t : List.of("q", "k", "v")) {
                g.node("MatMul", p + t, List.of(h, p + "w" + t), List.of(p + t + "p"));
                g.node("Reshape", p + t + "_split", List.of(p + t + "p", "split"), List.of(p + t + "s"));
            }
            g.node("Transpose", p + "q_heads", List.of(p + "qs"), List.of(p + "qh"), OnnxWriter.ints("perm", 0, 2, 1, 3));
            g.node("Transpose", p + "k_heads", List.of(p + "ks"), List.of(p + "kt"), OnnxWriter.ints("perm", 0, 2, 3, 1));
            g.node("Transpose", p + "v_heads", List.of(p + "vs"), List.of(p + "vh"), OnnxWriter.ints("perm", 0, 2, 1, 3));
            g.node("MatMul", p + "scores", List.of(p + "qh", p + "kt"), List.of(p + "s"));
            g.node("Softmax", p + "softmax", List.of(p + "s"), List.of(p + "a"), OnnxWriter.attr("axis", -1L));
            g.node("MatMul", p + "mix", List.of(p + "a", p + "vh"), List.of(p + "o"));
            g.node("Transpose", p + "o_tokens", List.of(p + "o"), List.of(p + "ot"), OnnxWriter.ints("perm", 0, 2, 1, 3));
            g.node("Reshape", p + "o_merge", List.of(p + "ot", "merge"), List.of(p + "om"));
            g.node("MatMul", p + "out", List.of(p + "om", p + "wo"), List.of(p + "op"));
            g.node("Add", p + "res1", List.of(h, p + "op"), List.of(p + "r1"));
            g.node("MatMul", p + "ffn1", List.of(p + "r1", p + "w1"), List.of(p + "f1"));
            g.node("Relu", p + "relu", List.of(p + "f1"), List.of(p + "f1r"));
            g.node("MatMul", p + "ffn2", List.of(p + "f1r", p + "w2"), List.of(p + "f2"));
            g.node("Add", p + "res2", List.of(p + "r1", p + "f2"), List.of(p + "r2"));
            h = p + "r2";
        }
        g.node("ReduceMean", "pool", List.of(h), List.of("pooled"), OnnxWriter.ints("axes", 1),
                OnnxWriter.attr("keepdims", 0L));
        g.weight("head_w", ElemType.FLOAT, D, CLASSES);
        g.node("MatMul", "head", List.of("pooled", "head_w"), List.of("y"));
        g.output("y", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }

    /**
     * A small CNN with symbolic spatial dims: x[1,3,h,w] → Conv 3→16 3×3 pad 1 → Relu → Conv 16→32
     * 3×3 pad 1 → Relu → GlobalAveragePool → Flatten → Gemm 32→10. Hand count (ONNX Conv output side
     * (h + 2 − 3)/1 + 1 = h): h·w·16·27 + h·w·32·144 + 320 = 5,040·h·w + 320 MACs.
     */
    public static Path cnn(Path file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("cnn_hw")
                .inputDims("x", ElemType.FLOAT, 1L, 3L, "h", "w")
                .weight("c1", ElemType.FLOAT, 16, 3, 3, 3)
                .weight("c2", ElemType.FLOAT, 32, 16, 3, 3)
                .weight("fc", ElemType.FLOAT, 10, 32)
                .node("Conv", "conv1", List.of("x", "c1"), List.of("a"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu1", List.of("a"), List.of("ar"))
                .node("Conv", "conv2", List.of("ar", "c2"), List.of("b"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu2", List.of("b"), List.of("br"))
                .node("GlobalAveragePool", "gap", List.of("br"), List.of("g"))
                .node("Flatten", "flat", List.of("g"), List.of("f"))
                .node("Gemm", "fc", List.of("f", "fc"), List.of("y"), OnnxWriter.attr("transB", 1L))
                .output("y", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }

    /**
     * The sample project's camera model at any picture size ({@code sample-project/src/main/onnx/
     * feeder-any-size.onnx} is this model as written here): x[1,3,side,side] → Conv 3→16 3×3 stride 2
     * pad 1 → Relu → Conv 16→32 3×3 stride 2 pad 1 → Relu → GlobalAveragePool → Flatten → Gemm
     * 32→24 species. For a side divisible by 4 the ONNX Conv output sides are side/2 and side/4, so
     * MACs = (side/2)²·16·27 + (side/4)²·32·144 + 32·24 = 396·side² + 768.
     */
    public static Path feederAnySize(Path file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("feeder_any_size")
                .inputDims("image", ElemType.FLOAT, 1L, 3L, "side", "side")
                .weight("c1", ElemType.FLOAT, 16, 3, 3, 3)
                .weight("c2", ElemType.FLOAT, 32, 16, 3, 3)
                .weight("fc", ElemType.FLOAT, 24, 32)
                .node("Conv", "stem", List.of("image", "c1"), List.of("a"), OnnxWriter.ints("pads", 1, 1, 1, 1),
                        OnnxWriter.ints("strides", 2, 2))
                .node("Relu", "stem_relu", List.of("a"), List.of("ar"))
                .node("Conv", "block", List.of("ar", "c2"), List.of("b"), OnnxWriter.ints("pads", 1, 1, 1, 1),
                        OnnxWriter.ints("strides", 2, 2))
                .node("Relu", "block_relu", List.of("b"), List.of("br"))
                .node("GlobalAveragePool", "pool", List.of("br"), List.of("g"))
                .node("Flatten", "flat", List.of("g"), List.of("f"))
                .node("Gemm", "species", List.of("f", "fc"), List.of("logits"), OnnxWriter.attr("transB", 1L))
                .output("logits", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }
}
