package dev.erg.workload;

import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.shape.EinsumEquation;
import dev.erg.shape.Shapes;
import java.util.Collections;
import java.util.Map;
import java.util.Set;
import java.util.HashMap;

/**
 * The table of workload rules: per operator, its kind, how its arithmetic is counted and which
 * inputs are parameters (shapes, axes, scales) rather than tensors that move. The conventions are
 * those of docs/counting.md.
 */
public final class WorkloadRules {
    /** Vector ops per element of a transcendental function (exp, log, tanh, erf...). */
    public static final int TRANSCENDENTAL = 4;

    static final class Entry {
        final Kind kind;
        final WorkRule rule;
        final Set<Integer> params;
        private final long paramMask;

        Entry(Kind kind, WorkRule rule, Set<Integer> params) {
            this.kind = kind;
            this.rule = rule;
            this.params = params;
            long m = 0;
            for (int i : params) {
                m |= 1L << i;
            }
            this.paramMask = m;
        }

        /** True when input {@code i} is a parameter (shape, axes, scale) rather than moved data. */
        boolean isParam(int i) {
            return i < 64 && (paramMask >>> i & 1) != 0;
        }
    }

    private final Map<String, Entry> table = new HashMap<>();

    private static final WorkloadRules STANDARD = build();

    public static WorkloadRules standard() {
        return STANDARD;
    }

    Entry get(String op) {
        return table.get(op);
    }

    /** True when input {@code index} of {@code opType} is a parameter (shape, axes, scale), not moved data. */
    public boolean isParameter(String opType, int index) {
        Entry e = table.get(opType);
        return e != null && e.isParam(index);
    }

    /** Bit i is set when input i of {@code opType} is a parameter (see {@link #isParameter}). */
    public long parameterMask(String opType) {
        Entry e = table.get(opType);
        return e == null ? 0 : e.paramMask;
    }

    /** The kind of work of {@code opType}, or null when it has no rule. */
    public Kind kindOf(String opType) {
        Entry e = table.get(opType);
        return e == null ? null : e.kind;
    }

    public Set<String> operators() {
        return Collections.unmodifiableSet(new java.util.TreeSet<>(table.keySet()));
    }

    private void add(String op, Kind kind, WorkRule rule, Integer... params) {
        if (table.put(op, new Entry(kind, rule, Set.of(params))) != null) {
            throw new IllegalStateException("two workload rules for " + op);
        }
    }

    static long outElems(Node n) {
        Value v = n.output(0);
        return v == null || !v.hasShape() ? 0 : v.elements();
    }

    static long inElems(Node n, int i) {
        Value v = n.input(i);
        return v == null || !v.hasShape() ? 0 : v.elements();
    }

    static WorkRule perOutput(int factor) {
        return (n, w) -> w.vectorOps(Math.multiplyExact(outElems(n), factor));
    }

    static WorkRule perInput(int factor) {
        return (n, w) -> w.vectorOps(Math.multiplyExact(inElems(n, 0), factor));
    }

    private static WorkloadRules build() {
        WorkloadRules t = new WorkloadRules();
        WorkRule none = (n, w) -> { };
        // Views: no arithmetic, no movement.
        for (String op : new String[] {"Reshape", "Flatten", "Squeeze", "Unsqueeze", "Identity"}) {
            t.add(op, Kind.VIEW, none, 1);
        }
        t.add("Dropout", Kind.VIEW, WorkloadRules::dropout, 1, 2);
        // Shape readers and generators that are always folded when shapes are static.
        t.add("Constant", Kind.FOLDED, none);
        t.add("Shape", Kind.FOLDED, none);
        t.add("Size", Kind.FOLDED, none);
        t.add("ConstantOfShape", Kind.MOVE, none, 0);
        t.add("EyeLike", Kind.MOVE, none);
        t.add("Range", Kind.VECTOR, perOutput(1), 0, 1, 2);
        // Data movement: bytes moved, no arithmetic.
        for (String op : new String[] {"Transpose", "Split", "DepthToSpace", "SpaceToDepth", "Compress", "Trilu"}) {
            t.add(op, Kind.MOVE, none, 1);
        }
        t.add("Concat", Kind.MOVE, none); // variadic: every input is data
        t.add("Slice", Kind.MOVE, none, 1, 2, 3, 4);
        t.add("Gather", Kind.MOVE, none, 1);
        t.add("GatherElements", Kind.MOVE, none, 1);
        t.add("GatherND", Kind.MOVE, none, 1);
        t.add("ScatterND", Kind.MOVE, none, 1);
        t.add("ScatterElements", Kind.MOVE, none, 1);
        t.add("Scatter", Kind.MOVE, none, 1);
        t.add("Pad", Kind.MOVE, none, 1, 2, 3);
        t.add("Tile", Kind.MOVE, none, 1);
        t.add("Expand", Kind.MOVE, none, 1);
        t.add("OneHot", Kind.MOVE, none, 1, 2);
        t.add("ReverseSequence", Kind.MOVE, none, 1);
        t.add("CenterCropPad", Kind.MOVE, none, 1);
        t.add("MaxUnpool", Kind.MOVE, none, 1, 2);
        // Data-dependent outputs: sorting and suppression work, on the upper-bound sizes of the shape rules.
        t.add("NonMaxSuppression", Kind.VECTOR, WorkloadRules::nonMaxSuppression, 2, 3, 4);
        t.add("Unique", Kind.VECTOR, (n, w) -> w.vectorOps(sortCompares(inElems(n, 0))));
        // Generators: random draws and window functions.
        t.add("RandomUniform", Kind.VECTOR, perOutput(2));
        t.add("RandomUniformLike", Kind.VECTOR, perOutput(2));
        t.add("Bernoulli", Kind.VECTOR, perOutput(2));
        t.add("RandomNormal", Kind.VECTOR, perOutput(3 * TRANSCENDENTAL + 3));
        t.add("RandomNormalLike", Kind.VECTOR, perOutput(3 * TRANSCENDENTAL + 3));
        t.add("Multinomial", Kind.VECTOR, (n, w) -> w.vectorOps(Math.multiplyExact(outElems(n),
                n.input(0).dims()[1] + 1)));
        t.add("HannWindow", Kind.VECTOR, perOutput(TRANSCENDENTAL + 2), 0);
        t.add("HammingWindow", Kind.VECTOR, perOutput(TRANSCENDENTAL + 2), 0);
        t.add("BlackmanWindow", Kind.VECTOR, perOutput(2 * TRANSCENDENTAL + 4), 0);
        // Sampling and image-column operators.
        t.add("GridSample", Kind.VECTOR, WorkloadRules::gridSample);
        t.add("AffineGrid", Kind.VECTOR, (n, w) -> w.vectorOps(Math.multiplyExact(outElems(n),
                2L * (n.output(0).rank() - 2) + 1)), 1);
        t.add("Col2Im", Kind.VECTOR, perInput(1), 1, 2);
        t.add("NonZero", Kind.VECTOR, perInput(1));
        t.add("Resize", Kind.VECTOR, WorkloadRules::resize, 1, 2, 3);
        t.add("Upsample", Kind.VECTOR, WorkloadRules::resize, 1);
        // Elementwise: one op per output element, transcendental ones more.
        for (String op : new String[] {"Add", "Sub", "Mul", "Div", "Relu", "Neg", "Abs", "Sign", "Floor", "Ceil",
            "Round", "LeakyRelu", "PRelu", "ThresholdedRelu", "Shrink", "Equal", "Less", "Greater",
            "LessOrEqual", "GreaterOrEqual", "And", "Or", "Xor", "Not", "Where", "Mod", "BitShift", "BitwiseAnd",
            "BitwiseOr", "BitwiseXor", "BitwiseNot", "IsNaN", "IsInf", "Cast", "CastLike"}) {
            t.add(op, Kind.VECTOR, perOutput(1));
        }
        t.add("Clip", Kind.VECTOR, perOutput(1), 1, 2);
        t.add("Sum", Kind.VECTOR, WorkloadRules::variadic);
        t.add("Mean", Kind.VECTOR, WorkloadRules::variadic);
        t.add("Max", Kind.VECTOR, WorkloadRules::variadic);
        t.add("Min", Kind.VECTOR, WorkloadRules::variadic);
        for (String op : new String[] {"Exp", "Log", "Sigmoid", "Tanh", "Erf", "Sqrt", "Reciprocal", "Pow", "Sin",
            "Cos", "Tan", "Asin", "Acos", "Atan", "Sinh", "Cosh", "Asinh", "Acosh", "Atanh"}) {
            t.add(op, Kind.VECTOR, perOutput(TRANSCENDENTAL));
        }
        t.add("HardSigmoid", Kind.VECTOR, perOutput(2));
        t.add("HardSwish", Kind.VECTOR, perOutput(3));
        t.add("Softsign", Kind.VECTOR, perOutput(2));
        t.add("Elu", Kind.VECTOR, perOutput(TRANSCENDENTAL + 1));
        t.add("Selu", Kind.VECTOR, perOutput(TRANSCENDENTAL + 2));
        t.add("Celu", Kind.VECTOR, perOutput(TRANSCENDENTAL + 2));
        t.add("Swish", Kind.VECTOR, perOutput(TRANSCENDENTAL + 1));
        t.add("Softplus", Kind.VECTOR, perOutput(2 * TRANSCENDENTAL));
        t.add("Gelu", Kind.VECTOR, perOutput(2 * TRANSCENDENTAL));
        t.add("Mish", Kind.VECTOR, perOutput(3 * TRANSCENDENTAL));
        // Softmax: max, subtract, exp, sum, divide.
        t.add("Softmax", Kind.VECTOR, perOutput(TRANSCENDENTAL + 4));
        t.add("LogSoftmax", Kind.VECTOR, perOutput(TRANSCENDENTAL + 4));
        t.add("Hardmax", Kind.VECTOR, perOutput(2));
        t.add("LpNormalization", Kind.VECTOR, perOutput(3));
        // Normalisations: inference-mode BatchNormalization is a scale and a shift per element.
        t.add("BatchNormalization", Kind.VECTOR, (n, w) -> w.vectorOps(Math.multiplyExact(outElems(n),
                n.opset() >= 14 && n.attrInt("training_mode", 0) == 1 ? 6 : 2)));
        t.add("LayerNormalization", Kind.VECTOR, perOutput(8));
        t.add("InstanceNormalization", Kind.VECTOR, perOutput(8));
        t.add("GroupNormalization", Kind.VECTOR, perOutput(8));
        t.add("MeanVarianceNormalization", Kind.VECTOR, perOutput(8));
        t.add("LRN", Kind.VECTOR, (n, w) -> w.vectorOps(Math.multiplyExact(outElems(n), n.attrInt("size", 1) + 4)));
        // Pooling: one op per window element per output.
        t.add("MaxPool", Kind.VECTOR, WorkloadRules::pool);
        t.add("AveragePool", Kind.VECTOR, WorkloadRules::pool);
        t.add("LpPool", Kind.VECTOR, WorkloadRules::pool);
        t.add("MaxRoiPool", Kind.VECTOR, WorkloadRules::maxRoiPool);
        t.add("RoiAlign", Kind.VECTOR, WorkloadRules::roiAlign, 2);
        t.add("GlobalAveragePool", Kind.VECTOR, perInput(1));
        t.add("GlobalMaxPool", Kind.VECTOR, perInput(1));
        t.add("GlobalLpPool", Kind.VECTOR, perInput(2));
        // Reductions: one op per input element.
        for (String op : new String[] {"ReduceSum", "ReduceMean", "ReduceMax", "ReduceMin", "ReduceProd",
            "ReduceLogSum", "ArgMax", "ArgMin", "CumSum", "TopK"}) {
            t.add(op, Kind.VECTOR, perInput(1), 1);
        }
        t.add("ReduceL1", Kind.VECTOR, perInput(2), 1);
        t.add("ReduceL2", Kind.VECTOR, perInput(2), 1);
        t.add("ReduceSumSquare", Kind.VECTOR, perInput(2), 1);
        t.add("ReduceLogSumExp", Kind.VECTOR, perInput(TRANSCENDENTAL + 1), 1);
        // Quantization: a scale and a rounding per element.
        t.add("QuantizeLinear", Kind.VECTOR, perOutput(2), 1, 2);
        t.add("DequantizeLinear", Kind.VECTOR, perOutput(2), 1, 2);
        t.add("DynamicQuantizeLinear", Kind.VECTOR, perInput(4));
        // Multiply-accumulate operators.
        t.add("Conv", Kind.MAC, (n, w) -> conv(n, w, 0, 1, 2));
        t.add("ConvInteger", Kind.MAC, (n, w) -> conv(n, w, 0, 1, -1), 2, 3);
        t.add("QLinearConv", Kind.MAC, (n, w) -> conv(n, w, 0, 3, 8), 1, 2, 4, 5, 6, 7);
        t.add("ConvTranspose", Kind.MAC, WorkloadRules::convTranspose);
        t.add("DeformConv", Kind.MAC, WorkloadRules::deformConv);
        t.add("Gemm", Kind.MAC, WorkloadRules::gemm);
        t.add("MatMul", Kind.MAC, (n, w) -> matmul(n, w, 0, 1));
        t.add("MatMulInteger", Kind.MAC, (n, w) -> matmul(n, w, 0, 1), 2, 3);
        t.add("QLinearMatMul", Kind.MAC, (n, w) -> matmul(n, w, 0, 3), 1, 2, 4, 5, 6, 7);
        t.add("Einsum", Kind.MAC, WorkloadRules::einsum);
        t.add("LSTM", Kind.MAC, (n, w) -> recurrent(n, w, 4, n.input(7) != null ? 36 + 6 : 36), 4, 5, 6);
        t.add("GRU", Kind.MAC, (n, w) -> recurrent(n, w, 3, 25), 4, 5);
        t.add("RNN", Kind.MAC, (n, w) -> recurrent(n, w, 1, 7), 4, 5);
        // Control flow: the cost of the taken branch is added by the counter.
        t.add("If", Kind.VECTOR, none, 0);
        t.add("Loop", Kind.VECTOR, none, 0, 1);
        t.add("Scan", Kind.VECTOR, none);
        return t;
    }

    static void variadic(Node n, NodeWork.Builder w) {
        w.vectorOps(Math.multiplyExact(outElems(n), Math.max(n.inputCount() - 1, 1)));
    }

    static void pool(Node n, NodeWork.Builder w) {
        long[] k = n.attrInts("kernel_shape");
        long window = 1;
        if (k != null) {
            for (long x : k) {
                window = Math.multiplyExact(window, x);
            }
        }
        long factor = n.opType().equals("LpPool") ? 2 : 1;
        w.vectorOps(Math.multiplyExact(Math.multiplyExact(outElems(n), window), factor));
    }

    static void resize(Node n, NodeWork.Builder w) {
        String mode = n.attrString("mode", "nearest");
        if (mode.equals("nearest")) {
            w.kind(Kind.MOVE);
            return;
        }
        Value x = n.input(0);
        Value y = n.output(0);
        int resized = 0;
        for (int i = 0; i < x.rank(); i++) {
            if (x.dims()[i] != y.dims()[i]) {
                resized++;
            }
        }
        long taps = 1;
        for (int i = 0; i < resized; i++) {
            taps *= mode.equals("cubic") ? 4 : 2;
        }
        // Each output blends taps inputs: one multiply per tap and one add per tap after the first.
        w.vectorOps(Math.multiplyExact(outElems(n), Math.max(2 * taps - 1, 1)));
    }

    static void conv(Node n, NodeWork.Builder w, int xi, int wi, int bi) {
        Value x = n.input(xi);
        Value wt = n.input(wi);
        Value y = n.output(0);
        long[] wd = wt.dims();
        long group = n.attrInt("group", 1);
        long kernel = 1;
        for (int i = 2; i < wd.length; i++) {
            kernel = Math.multiplyExact(kernel, wd[i]);
        }
        long[] yd = y.dims();
        long positions = yd[0];
        for (int i = 2; i < yd.length; i++) {
            positions = Math.multiplyExact(positions, yd[i]);
        }
        // per group: positions x (C/g * R * S) x (K/g)
        w.gemm(positions, Math.multiplyExact(wd[1], kernel), wd[0] / group, group);
        if (bi >= 0 && n.input(bi) != null) {
            w.vectorOps(y.elements());
        }
        if (x == null) {
            throw new IllegalStateException();
        }
    }

    static void convTranspose(Node n, NodeWork.Builder w) {
        Value x = n.input(0);
        long[] wd = n.input(1).dims();
        long group = n.attrInt("group", 1);
        long kernel = 1;
        for (int i = 2; i < wd.length; i++) {
            kernel = Math.multiplyExact(kernel, wd[i]);
        }
        long[] xd = x.dims();
        long positions = xd[0];
        for (int i = 2; i < xd.length; i++) {
            positions = Math.multiplyExact(positions, xd[i]);
        }
        // Every input position scatters C/g channels into (K/g) x R x S outputs:
        // per group positions x (C/g) x (K/g * R * S).
        w.gemm(positions, wd[0] / group, Math.multiplyExact(wd[1], kernel), group);
        if (n.input(2) != null) {
            w.vectorOps(n.output(0).elements());
        }
    }

    static void gemm(Node n, NodeWork.Builder w) {
        long[] a = n.input(0).dims();
        long[] b = n.input(1).dims();
        boolean ta = n.attrInt("transA", 0) == 1;
        boolean tb = n.attrInt("transB", 0) == 1;
        long m = ta ? a[1] : a[0];
        long k = ta ? a[0] : a[1];
        long nn = tb ? b[0] : b[1];
        w.gemm(m, k, nn, 1);
        if (n.input(2) != null) {
            w.vectorOps(Math.multiplyExact(m, nn));
        }
    }

    static void matmul(Node n, NodeWork.Builder w, int ai, int bi) {
        long[] a = n.input(ai).dims();
        long[] b = n.input(bi).dims();
        long[] y = n.output(0).dims();
        long k = a[a.length - 1];
        long m = a.length >= 2 ? a[a.length - 2] : 1;
        long nn = b.length >= 2 ? b[b.length - 1] : 1;
        long outBatch = 1;
        int batchRank = y.length - (a.length >= 2 ? 1 : 0) - (b.length >= 2 ? 1 : 0);
        for (int i = 0; i < batchRank; i++) {
            outBatch = Math.multiplyExact(outBatch, y[i]);
        }
        // Distinct right-hand matrices: the batch dims that B itself carries.
        long bBatch = 1;
        for (int i = 0; i < b.length - 2; i++) {
            bBatch = Math.multiplyExact(bBatch, b[i]);
        }
        long groups = Math.max(1, Math.min(bBatch, outBatch));
        w.gemm(Math.multiplyExact(m, outBatch / groups), k, nn, groups);
    }

    static void einsum(Node n, NodeWork.Builder w) {
        java.util.List<long[]> dims = new java.util.ArrayList<>();
        for (int i = 0; i < n.inputCount(); i++) {
            dims.add(n.input(i).dims());
        }
        EinsumEquation.Cost cost = EinsumEquation.parse(n.attrString("equation", ""), dims,
                IllegalStateException::new).cost();
        if (n.inputCount() == 1) {
            w.kind(Kind.VECTOR).vectorOps(cost.vectorOps);
            return;
        }
        if (cost.groups > 0) {
            w.gemm(cost.m, cost.k, cost.n, cost.groups);
        } else {
            w.macs(cost.macs); // three or more operands: pairwise products, no single matrix-product view
        }
        w.vectorOps(cost.vectorOps);
    }

    static void dropout(Node n, NodeWork.Builder w) {
        Value mode = n.input(2);
        if (n.opset() >= 12 && mode != null && mode.data() != null && mode.data().size() > 0
                && mode.data().longAt(0) != 0) {
            // Training mode: a random draw, a compare and a scale per element.
            w.kind(Kind.VECTOR).vectorOps(Math.multiplyExact(outElems(n), 3));
        }
    }

    /** Comparisons of a comparison sort of {@code n} items: n * ceil(log2 n). */
    static long sortCompares(long n) {
        if (n < 2) {
            return n;
        }
        return Math.multiplyExact(n, 64 - Long.numberOfLeadingZeros(n - 1));
    }

    /**
     * NonMaxSuppression: per batch and class, sort the N scores (N * ceil(log2 N) compares) and test each
     * selected box against the N boxes (IOU_OPS per test), with the selected count of the shape rule.
     */
    static void nonMaxSuppression(Node n, NodeWork.Builder w) {
        long[] boxes = n.input(0).dims();
        long[] scores = n.input(1).dims();
        long pairs = Math.multiplyExact(scores[0], scores[1]);
        long nb = boxes[1];
        long selected = pairs == 0 ? 0 : outElems(n) / 3 / pairs;
        long perPair = Math.addExact(sortCompares(nb), Math.multiplyExact(Math.multiplyExact(selected, nb), IOU_OPS));
        w.vectorOps(Math.multiplyExact(pairs, perPair));
    }

    /** Ops of one intersection-over-union test of two boxes against a threshold. */
    static final long IOU_OPS = 12;

    /**
     * MaxRoiPool: every ROI's bins together cover at most the whole feature map, so each ROI costs at most
     * one compare per input element of one image: rois x C x H x W (upper bound).
     */
    static void maxRoiPool(Node n, NodeWork.Builder w) {
        long[] x = n.input(0).dims();
        long rois = n.input(1).dims()[0];
        w.vectorOps(Math.multiplyExact(rois, Shapes.product(x, 1, x.length)));
    }

    /**
     * RoiAlign: per output element, sampling_ratio^2 bilinear samples (4 multiplies and 3 adds each) and
     * one accumulate per sample; an adaptive sampling_ratio (0) is taken as 2.
     */
    static void roiAlign(Node n, NodeWork.Builder w) {
        long sr = n.attrInt("sampling_ratio", 0);
        long samples = sr > 0 ? sr * sr : 4;
        w.vectorOps(Math.multiplyExact(outElems(n), Math.multiplyExact(samples, 8)));
    }

    /**
     * GridSample: per output element one blend of taps inputs (2 * taps - 1 ops), taps = 2^r (linear)
     * or 4^r (cubic) over the r spatial axes; nearest is a gather (a move).
     */
    static void gridSample(Node n, NodeWork.Builder w) {
        String mode = n.attrString("mode", n.opset() >= 20 ? "linear" : "bilinear");
        if (mode.equals("nearest")) {
            w.kind(Kind.MOVE);
            return;
        }
        int r = n.output(0).rank() - 2;
        long taps = 1;
        for (int i = 0; i < r; i++) {
            taps *= mode.contains("cubic") ? 4 : 2;
        }
        w.vectorOps(Math.multiplyExact(outElems(n), 2 * taps - 1));
    }

    /**
     * DeformConv: Conv's MACs over the sampled values; each sampled value (N x C x output positions x
     * kernel points) is a bilinear sample (7 ops), times the mask (1 op) when there is one; a bias adds
     * one op per output element.
     */
    static void deformConv(Node n, NodeWork.Builder w) {
        conv(n, w, 0, 1, 3);
        long bias = n.input(3) != null ? outElems(n) : 0;
        long[] x = n.input(0).dims();
        long[] wd = n.input(1).dims();
        long[] y = n.output(0).dims();
        long samples = Math.multiplyExact(Math.multiplyExact(x[0], x[1]),
                Math.multiplyExact(Shapes.product(y, 2, y.length), Shapes.product(wd, 2, wd.length)));
        long per = n.input(4) != null ? 8 : 7;
        w.vectorOps(Math.addExact(bias, Math.multiplyExact(samples, per)));
    }

    static void recurrent(Node n, NodeWork.Builder w, int gates, int vectorPerHidden) {
        long[] x = n.input(0).dims();
        long[] wt = n.input(1).dims();
        boolean batchFirst = n.attrInt("layout", 0) == 1;
        long seq = batchFirst ? x[1] : x[0];
        long batch = batchFirst ? x[0] : x[1];
        long input = x[2];
        long dirs = wt[0];
        long hidden = wt[1] / gates;
        // Per direction: (T*B) positions x (I+H) reduction x (gates*H) outputs.
        w.gemm(Math.multiplyExact(seq, batch), input + hidden, gates * hidden, dirs);
        w.vectorOps(Math.multiplyExact(Math.multiplyExact(Math.multiplyExact(seq, batch), dirs),
                hidden * vectorPerHidden));
    }
}
