import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Writes synthetic models of a given node count for the scale benchmark (bench/scale.sh).
 *
 * <p>Transformer-like (files scale_N.onnx): a chain of encoder blocks of 46 nodes each, the way
 * exporters write attention at opset 17:
 *
 * <pre>
 * LayerNormalization
 * Shape -> Gather(0), Gather(1) -> Unsqueeze x2 -> Concat(b, s, heads, head_dim)   (head shape)
 * Q, K, V: MatMul -> Add -> Reshape(head shape) -> Transpose                        (x3)
 * MatMul(Q, K^T) -> Div -> Add(mask) -> Softmax -> MatMul(., V) -> Transpose
 * Shape -> Gather(0), Gather(1) -> Unsqueeze x2 -> Concat(b, s, d) -> Reshape    (merge heads)
 * MatMul -> Add -> Add(residual)
 * LayerNormalization -> MatMul -> Add -> GELU -> MatMul -> Add -> Add(residual)
 * GELU as exporters write it below opset 20: Div(sqrt 2) -> Erf -> Add(1) -> Mul(x) -> Mul(0.5)
 * </pre>
 *
 * With --if (before the counts), each block's activation sits in an If with a constant condition
 * (files scale_if_N.onnx): a graph with one control-flow node per block.
 *
 * <p>Plain chain (with --chain, files chain_N.onnx): x [batch, 64] through blocks of MatMul -> Add ->
 * Relu, 3 nodes each: no shape arithmetic, no fan-out.
 *
 * <p>Blocks are chained; Relu nodes after the last block bring the count to exactly the one asked for.
 * Every block has its own weights, stored as external data (the data file is not written: erg never
 * opens it, and the python peer is told not to load it), so that a 100k-node model stays a few MB.
 * Opset 17, the newest that Debian's python3-onnx (1.12) knows, so that the peer infers every node.
 *
 * Usage: java -cp erg.jar:classes ScaleModels OUT_DIR [--if | --chain] NODES...
 */
public final class ScaleModels {
    /** Nodes per encoder block; 42 in the If variant, where the 5 GELU nodes are one If. */
    static final int NODES_PER_BLOCK = 46;
    static final int CHAIN_BLOCK = 3;
    static final long BATCH = 1;
    static final long SEQ = 32;
    static final long D = 64;
    static final long HEADS = 4;
    static final long FF = 4 * D;

    private ScaleModels() {
    }

    private static long offset;

    static void ext(OnnxWriter.Graph g, String name, long... dims) {
        OnnxWriter.Tensor t = new OnnxWriter.Tensor(name, ElemType.FLOAT, dims);
        long bytes = 4;
        for (long d : dims) {
            bytes *= d;
        }
        g.initializer(t.external("weights.bin", offset, bytes));
        offset += bytes;
    }

    static OnnxWriter.Graph model(int nodes, boolean withIf) {
        offset = 0;
        OnnxWriter.Graph g = new OnnxWriter.Graph("scale_" + nodes)
                .inputDims("x", ElemType.FLOAT, "batch", SEQ, D)
                .inputDims("mask", ElemType.FLOAT, "batch", 1, SEQ, SEQ)
                .initializer(new OnnxWriter.Tensor("i0", ElemType.INT64).longs(0))
                .initializer(new OnnxWriter.Tensor("i1", ElemType.INT64).longs(1))
                .longs("ax0", 0)
                .longs("heads", HEADS, D / HEADS)
                .longs("dmodel", D)
                .initializer(new OnnxWriter.Tensor("scale", ElemType.FLOAT).floats((float) Math.sqrt(D / HEADS)))
                .initializer(new OnnxWriter.Tensor("sqrt2", ElemType.FLOAT).floats((float) Math.sqrt(2)))
                .initializer(new OnnxWriter.Tensor("one", ElemType.FLOAT).floats(1f))
                .initializer(new OnnxWriter.Tensor("half", ElemType.FLOAT).floats(0.5f))
                .initializer(new OnnxWriter.Tensor("use_gelu", ElemType.BOOL).raw(new byte[] {1}));
        int perBlock = withIf ? NODES_PER_BLOCK - 4 : NODES_PER_BLOCK;
        int blocks = nodes / perBlock;
        String x = "x";
        int count = 0;
        for (int b = 0; b < blocks; b++) {
            String p = "b" + b + "/";
            ext(g, p + "ln1.g", D);
            ext(g, p + "ln1.b", D);
            g.node("LayerNormalization", p + "ln1", List.of(x, p + "ln1.g", p + "ln1.b"), List.of(p + "h"),
                    OnnxWriter.attr("axis", -1L));
            // The head shape from the runtime shape: [b, s, heads, head_dim].
            g.node("Shape", p + "shape", List.of(p + "h"), List.of(p + "sh"));
            g.node("Gather", p + "g0", List.of(p + "sh", "i0"), List.of(p + "bs"), OnnxWriter.attr("axis", 0L));
            g.node("Gather", p + "g1", List.of(p + "sh", "i1"), List.of(p + "sq"), OnnxWriter.attr("axis", 0L));
            g.node("Unsqueeze", p + "u0", List.of(p + "bs", "ax0"), List.of(p + "ubs"));
            g.node("Unsqueeze", p + "u1", List.of(p + "sq", "ax0"), List.of(p + "usq"));
            g.node("Concat", p + "hshape", List.of(p + "ubs", p + "usq", "heads"), List.of(p + "hs"),
                    OnnxWriter.attr("axis", 0L));
            count += 7;
            List<String> heads = new ArrayList<>();
            for (String k : new String[] {"q", "k", "v"}) {
                ext(g, p + k + ".w", D, D);
                ext(g, p + k + ".b", D);
                g.node("MatMul", p + k + "/mm", List.of(p + "h", p + k + ".w"), List.of(p + k + "0"));
                g.node("Add", p + k + "/add", List.of(p + k + "0", p + k + ".b"), List.of(p + k + "1"));
                g.node("Reshape", p + k + "/reshape", List.of(p + k + "1", p + "hs"), List.of(p + k + "2"));
                long[] perm = k.equals("k") ? new long[] {0, 2, 3, 1} : new long[] {0, 2, 1, 3};
                g.node("Transpose", p + k + "/tr", List.of(p + k + "2"), List.of(p + k + "3"), OnnxWriter.ints("perm", perm));
                heads.add(p + k + "3");
                count += 4;
            }
            g.node("MatMul", p + "scores", List.of(heads.get(0), heads.get(1)), List.of(p + "s0"));
            g.node("Div", p + "scale", List.of(p + "s0", "scale"), List.of(p + "s1"));
            // The attention mask, one graph input that every block reads.
            g.node("Add", p + "mask", List.of(p + "s1", "mask"), List.of(p + "s1m"));
            g.node("Softmax", p + "softmax", List.of(p + "s1m"), List.of(p + "s2"), OnnxWriter.attr("axis", -1L));
            g.node("MatMul", p + "ctx", List.of(p + "s2", heads.get(2)), List.of(p + "c0"));
            g.node("Transpose", p + "ctx/tr", List.of(p + "c0"), List.of(p + "c1"), OnnxWriter.ints("perm", 0, 2, 1, 3));
            count += 6;
            // Merge the heads back: [b, s, d] from the runtime shape again.
            g.node("Shape", p + "shape2", List.of(p + "c1"), List.of(p + "sh2"));
            g.node("Gather", p + "g2", List.of(p + "sh2", "i0"), List.of(p + "bs2"), OnnxWriter.attr("axis", 0L));
            g.node("Gather", p + "g3", List.of(p + "sh2", "i1"), List.of(p + "sq2"), OnnxWriter.attr("axis", 0L));
            g.node("Unsqueeze", p + "u2", List.of(p + "bs2", "ax0"), List.of(p + "ubs2"));
            g.node("Unsqueeze", p + "u3", List.of(p + "sq2", "ax0"), List.of(p + "usq2"));
            g.node("Concat", p + "mshape", List.of(p + "ubs2", p + "usq2", "dmodel"), List.of(p + "ms"),
                    OnnxWriter.attr("axis", 0L));
            g.node("Reshape", p + "merge", List.of(p + "c1", p + "ms"), List.of(p + "c2"));
            count += 7;
            ext(g, p + "o.w", D, D);
            ext(g, p + "o.b", D);
            g.node("MatMul", p + "o/mm", List.of(p + "c2", p + "o.w"), List.of(p + "o0"));
            g.node("Add", p + "o/add", List.of(p + "o0", p + "o.b"), List.of(p + "o1"));
            g.node("Add", p + "res1", List.of(x, p + "o1"), List.of(p + "r1"));
            count += 3;
            ext(g, p + "ln2.g", D);
            ext(g, p + "ln2.b", D);
            ext(g, p + "ff1.w", D, FF);
            ext(g, p + "ff1.b", FF);
            ext(g, p + "ff2.w", FF, D);
            ext(g, p + "ff2.b", D);
            g.node("LayerNormalization", p + "ln2", List.of(p + "r1", p + "ln2.g", p + "ln2.b"), List.of(p + "h2"),
                    OnnxWriter.attr("axis", -1L));
            g.node("MatMul", p + "ff1/mm", List.of(p + "h2", p + "ff1.w"), List.of(p + "f0"));
            g.node("Add", p + "ff1/add", List.of(p + "f0", p + "ff1.b"), List.of(p + "f1"));
            if (withIf) {
                // The activation inside an If whose condition is a constant (as some exporters write
                // a config switch): the taken branch reads f1 from the enclosing scope.
                OnnxWriter.Graph then = gelu(new OnnxWriter.Graph(p + "then"), p, p + "f1", p + "f2t")
                        .output(p + "f2t", ElemType.FLOAT);
                OnnxWriter.Graph other = new OnnxWriter.Graph(p + "else")
                        .node("Relu", p + "relu", List.of(p + "f1"), List.of(p + "f2e"))
                        .output(p + "f2e", ElemType.FLOAT);
                g.node("If", p + "act", List.of("use_gelu"), List.of(p + "f2"), OnnxWriter.graph("then_branch", then),
                        OnnxWriter.graph("else_branch", other));
            } else {
                gelu(g, p, p + "f1", p + "f2");
                count += 4;
            }
            g.node("MatMul", p + "ff2/mm", List.of(p + "f2", p + "ff2.w"), List.of(p + "f3"));
            g.node("Add", p + "ff2/add", List.of(p + "f3", p + "ff2.b"), List.of(p + "f4"));
            g.node("Add", p + "res2", List.of(p + "r1", p + "f4"), List.of(p + "y"));
            count += 7;
            x = p + "y";
        }
        if (count != blocks * perBlock) {
            throw new IllegalStateException("a block is " + (count / Math.max(blocks, 1)) + " nodes, not " + perBlock);
        }
        for (int i = 0; count < nodes; i++, count++) {
            g.node("Relu", "tail/relu" + i, List.of(x), List.of("tail/r" + i));
            x = "tail/r" + i;
        }
        return g.output(x, ElemType.FLOAT);
    }

    /** GELU in its exact form, as exporters write it below opset 20: x * 0.5 * (1 + erf(x / sqrt 2)). */
    static OnnxWriter.Graph gelu(OnnxWriter.Graph g, String p, String x, String y) {
        return g.node("Div", p + "gelu/div", List.of(x, "sqrt2"), List.of(p + "g0"))
                .node("Erf", p + "gelu/erf", List.of(p + "g0"), List.of(p + "g1"))
                .node("Add", p + "gelu/add", List.of(p + "g1", "one"), List.of(p + "g2"))
                .node("Mul", p + "gelu/mul", List.of(x, p + "g2"), List.of(p + "g3"))
                .node("Mul", p + "gelu/half", List.of(p + "g3", "half"), List.of(y));
    }

    static OnnxWriter.Graph chain(int nodes) {
        offset = 0;
        OnnxWriter.Graph g = new OnnxWriter.Graph("chain_" + nodes).inputDims("x", ElemType.FLOAT, "batch", D);
        String x = "x";
        int blocks = nodes / CHAIN_BLOCK;
        for (int b = 0; b < blocks; b++) {
            String p = "c" + b + "/";
            ext(g, p + "w", D, D);
            ext(g, p + "b", D);
            g.node("MatMul", p + "mm", List.of(x, p + "w"), List.of(p + "m"));
            g.node("Add", p + "add", List.of(p + "m", p + "b"), List.of(p + "a"));
            g.node("Relu", p + "relu", List.of(p + "a"), List.of(p + "y"));
            x = p + "y";
        }
        for (int i = 0; i < nodes - blocks * CHAIN_BLOCK; i++) {
            g.node("Relu", "tail/relu" + i, List.of(x), List.of("tail/r" + i));
            x = "tail/r" + i;
        }
        return g.output(x, ElemType.FLOAT);
    }

    public static void main(String[] args) throws Exception {
        Path out = Path.of(args.length > 0 ? args[0] : "bench/scratch");
        Files.createDirectories(out);
        String kind = "scale";
        for (int i = 1; i < args.length; i++) {
            if (args[i].equals("--if") || args[i].equals("--chain")) {
                kind = args[i].equals("--if") ? "scale_if" : "chain";
                continue;
            }
            int n = Integer.parseInt(args[i]);
            Path f = out.resolve(kind + "_" + n + ".onnx");
            // Opset 17: LayerNormalization is a standard operator there.
            new OnnxWriter.Model(17, kind.equals("chain") ? chain(n) : model(n, kind.equals("scale_if"))).write(f);
            System.out.println("wrote " + f + " (" + n + " nodes, " + Files.size(f) + " bytes)");
        }
    }
}
