package dev.erg.shape;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorValues;

/** Reductions (every ReduceX form, by attribute or by input) and ArgMax / ArgMin. */
final class ReduceRules {
    private ReduceRules() {
    }

    static void register(RuleTable t) {
        t.add("ReduceSum", c -> reduce(c, 0, (a, b) -> a + b));
        t.add("ReduceMean", c -> reduce(c, 0, null));
        t.add("ReduceMax", c -> reduce(c, Double.NEGATIVE_INFINITY, Math::max));
        t.add("ReduceMin", c -> reduce(c, Double.POSITIVE_INFINITY, Math::min));
        t.add("ReduceProd", c -> reduce(c, 1, (a, b) -> a * b));
        for (String op : new String[] {"ReduceL1", "ReduceL2", "ReduceLogSum", "ReduceLogSumExp", "ReduceSumSquare"}) {
            t.add(op, c -> reduce(c, 0, null));
        }
        t.add("ArgMax", ReduceRules::arg);
        t.add("ArgMin", ReduceRules::arg);
    }

    /** The reduced axes of a ReduceX node, in ascending order; all axes when none are given. */
    static boolean[] reducedAxes(InferContext c) {
        long[] d = c.dims(0);
        long[] axes = LayoutRules.axesOf(c, 1);
        boolean[] red = new boolean[d.length];
        if (axes == null || axes.length == 0) {
            boolean noop = c.attrInt("noop_with_empty_axes", 0) == 1;
            if (!noop) {
                java.util.Arrays.fill(red, true);
            }
        } else {
            for (int a : Shapes.axes(c, axes, d.length)) {
                red[a] = true;
            }
        }
        return red;
    }

    static void reduce(InferContext c, double init, Eval.RealOp op) {
        long[] d = c.dims(0);
        boolean[] red = reducedAxes(c);
        boolean keep = c.attrInt("keepdims", 1) == 1;
        long[] kept = d.clone();
        int r = 0;
        for (int i = 0; i < d.length; i++) {
            if (red[i]) {
                kept[i] = 1;
            } else {
                r++;
            }
        }
        long[] out;
        if (keep) {
            out = kept;
        } else {
            out = new long[r];
            for (int i = 0, j = 0; i < d.length; i++) {
                if (!red[i]) {
                    out[j++] = d[i];
                }
            }
        }
        c.out(0, c.type(0), out);
        TensorValues v = c.data(0);
        if (v != null && op != null) {
            int n = (int) Shapes.product(kept);
            double[] acc = new double[n];
            java.util.Arrays.fill(acc, init);
            int[] dst = Eval.broadcastIndex(kept, d);
            // broadcastIndex maps each input position to its reduced slot
            for (int i = 0; i < v.size(); i++) {
                acc[dst[i]] = op.apply(acc[dst[i]], v.doubleAt(i));
            }
            c.outData(0, TensorValues.ofDoubles(c.type(0), out, acc));
        }
    }

    static void arg(InferContext c) {
        long[] d = c.dims(0);
        int axis = c.axis(c.attrInt("axis", 0), d.length);
        boolean keep = c.attrInt("keepdims", 1) == 1;
        long[] out;
        if (keep) {
            out = d.clone();
            out[axis] = 1;
        } else {
            out = new long[d.length - 1];
            for (int i = 0, j = 0; i < d.length; i++) {
                if (i != axis) {
                    out[j++] = d[i];
                }
            }
        }
        c.out(0, ElemType.INT64, out);
    }
}
