package dev.erg.shape;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorValues;
import java.util.Arrays;

/**
 * Operators that join, split or pick elements: Concat, Split, Slice, Gather and its kin, Scatter,
 * TopK, NonZero, Compress, OneHot, CumSum, Trilu and ReverseSequence.
 */
final class SelectRules {
    private SelectRules() {
    }

    static void register(RuleTable t) {
        t.add("Concat", SelectRules::concat);
        t.add("Split", SelectRules::split);
        t.add("Slice", SelectRules::slice);
        t.add("Gather", SelectRules::gather);
        t.add("GatherElements", c -> {
            if (c.rank(0) != c.rank(1) || c.rank(0) == 0) {
                throw c.fail("needs data and indices of the same rank >= 1 (got " + Arrays.toString(c.dims(0))
                        + " and " + Arrays.toString(c.dims(1)) + ")");
            }
            c.axis(c.attrInt("axis", 0), c.rank(0));
            c.out(0, c.type(0), c.dims(1));
        });
        t.add("GatherND", SelectRules::gatherNd);
        t.add("ScatterND", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("ScatterElements", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("Scatter", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("TopK", c -> {
            long k = c.opset() < 10 ? c.attrInt("k", -1) : c.ints(1, "k")[0];
            long[] d = c.dims(0).clone();
            int axis = c.axis(c.attrInt("axis", -1), d.length);
            if (k < 0 || k > d[axis]) {
                throw c.fail("asks for k = " + k + " along an axis of size " + d[axis]);
            }
            d[axis] = k;
            c.out(0, c.type(0), d);
            c.out(1, ElemType.INT64, d);
        });
        t.add("NonZero", SelectRules::nonZero);
        t.add("ReverseSequence", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("CumSum", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("Trilu", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("OneHot", c -> {
            long depth = c.ints(1, "depth")[0];
            long[] ind = c.dims(0);
            int r = ind.length + 1;
            int axis = c.axis(c.attrInt("axis", -1), r);
            long[] out = new long[r];
            for (int i = 0, j = 0; i < r; i++) {
                out[i] = i == axis ? depth : ind[j++];
            }
            c.out(0, c.type(2), out);
        });
        t.add("Compress", c -> {
            long[] d = c.dims(0);
            TensorValues cond = c.data(1);
            long kept;
            if (cond != null) {
                kept = 0;
                for (int i = 0; i < cond.size(); i++) {
                    kept += cond.longAt(i) != 0 ? 1 : 0;
                }
            } else {
                kept = -1;
            }
            if (!c.hasAttr("axis")) {
                long n = kept >= 0 ? kept : Shapes.product(d);
                c.out(0, c.type(0), new long[] {n});
            } else {
                int axis = c.axis(c.attrInt("axis", 0), d.length);
                long[] out = d.clone();
                out[axis] = kept >= 0 ? kept : Math.min(d[axis], c.dims(1)[0]);
                c.out(0, c.type(0), out);
            }
            if (kept < 0) {
                c.note("Compress keeps a data-dependent count; erg assumes every element is kept (upper bound)");
            }
        });
    }

    // ---- rules ------------------------------------------------------------------------------

    static void concat(InferContext c) {
        long[] first = c.dims(0);
        int r = first.length;
        int axis = c.axis(c.attrInt("axis", 0), Math.max(r, 1));
        if (r == 0) {
            throw c.fail("concatenates scalars");
        }
        long[] out = first.clone();
        out[axis] = 0;
        boolean allData = true;
        for (int i = 0; i < c.inputCount(); i++) {
            if (!c.has(i)) {
                continue;
            }
            long[] d = c.dims(i);
            if (d.length != r) {
                throw c.fail("concatenates inputs of ranks " + r + " and " + d.length);
            }
            for (int k = 0; k < r; k++) {
                if (k != axis && d[k] != first[k]) {
                    throw c.fail("concatenates shapes " + Arrays.toString(first) + " and " + Arrays.toString(d)
                            + " along axis " + axis);
                }
            }
            out[axis] += d[axis];
            allData &= c.data(i) != null;
        }
        c.out(0, c.type(0), out);
        if (allData && Eval.small(out)) {
            long outer = Shapes.product(out, 0, axis);
            long inner = Shapes.product(out, axis + 1, r);
            int n = (int) Shapes.product(out);
            boolean real = c.data(0).isFloat();
            long[] li = real ? null : new long[n];
            double[] di = real ? new double[n] : null;
            int pos = 0;
            for (long o = 0; o < outer; o++) {
                for (int i = 0; i < c.inputCount(); i++) {
                    if (!c.has(i)) {
                        continue;
                    }
                    TensorValues v = c.data(i);
                    long chunk = c.dims(i)[axis] * inner;
                    for (long k = 0; k < chunk; k++) {
                        int src = (int) (o * chunk + k);
                        if (real) {
                            di[pos++] = v.doubleAt(src);
                        } else {
                            li[pos++] = v.longAt(src);
                        }
                    }
                }
            }
            c.outData(0, real ? TensorValues.ofDoubles(c.type(0), out, di) : TensorValues.ofLongs(c.type(0), out, li));
        }
    }

    static void split(InferContext c) {
        long[] d = c.dims(0);
        int axis = c.axis(c.attrInt("axis", 0), d.length);
        int outs = c.outputCount();
        long[] sizes;
        if (c.opset() < 13) {
            sizes = c.attrInts("split");
            if (sizes == null && c.opset() < 2 && c.has(1)) {
                sizes = c.ints(1, "split sizes"); // Split-1 also took the sizes as an input
            }
        } else {
            sizes = c.has(1) ? c.ints(1, "split sizes") : null;
        }
        if (sizes == null || sizes.length == 0) {
            long n = c.hasAttr("num_outputs") ? c.attrInt("num_outputs", outs) : outs;
            if (n <= 0) {
                throw c.fail("splits into " + n + " outputs");
            }
            sizes = new long[(int) n];
            if (c.hasAttr("num_outputs")) {
                if (n != outs) {
                    throw c.fail("has num_outputs " + n + " but " + outs + " outputs");
                }
                // Split-18: chunks of ceil(d / n), the last one smaller when d does not divide.
                long chunk = Shapes.ceilDiv(d[axis], n);
                long last = d[axis] - chunk * (n - 1);
                if (last < 0) {
                    throw c.fail("cannot split an axis of size " + d[axis] + " into " + n + " chunks of "
                            + chunk + " (the last chunk would be " + last + ")");
                }
                Arrays.fill(sizes, chunk);
                sizes[(int) n - 1] = last;
            } else {
                if (d[axis] % n != 0) {
                    throw c.fail("splits an axis of size " + d[axis] + " into " + n + " equal parts");
                }
                Arrays.fill(sizes, d[axis] / n);
            }
        }
        long sum = 0;
        for (long s : sizes) {
            sum += s;
        }
        if (sum != d[axis]) {
            throw c.fail("has split sizes " + Arrays.toString(sizes) + " that do not add up to " + d[axis]);
        }
        for (int i = 0; i < outs; i++) {
            long[] o = d.clone();
            o[axis] = i < sizes.length ? sizes[i] : 0;
            c.out(i, c.type(0), o);
        }
    }

    static long clamp(long v, long lo, long hi) {
        return Math.max(lo, Math.min(hi, v));
    }

    static void slice(InferContext c) {
        long[] d = c.dims(0);
        int r = d.length;
        long[] starts;
        long[] ends;
        long[] axes;
        long[] steps = null;
        if (c.opset() < 10) {
            starts = c.attrInts("starts");
            ends = c.attrInts("ends");
            axes = c.attrInts("axes");
        } else {
            starts = c.ints(1, "starts");
            ends = c.ints(2, "ends");
            axes = c.has(3) ? c.ints(3, "axes") : null;
            steps = c.has(4) ? c.ints(4, "steps") : null;
        }
        if (starts == null || ends == null || starts.length != ends.length) {
            throw c.fail("needs starts and ends of the same length");
        }
        int k = starts.length;
        if (axes == null) {
            axes = new long[k];
            for (int i = 0; i < k; i++) {
                axes[i] = i;
            }
        }
        if (steps == null) {
            steps = new long[k];
            Arrays.fill(steps, 1);
        }
        if (axes.length != k || steps.length != k) {
            throw c.fail("has starts, ends, axes and steps of different lengths");
        }
        int[] ax = Shapes.axes(c, axes, r);
        long[] out = d.clone();
        long[] first = new long[r];
        long[] step = new long[r];
        Arrays.fill(step, 1);
        for (int i = 0; i < k; i++) {
            int a = ax[i];
            long dim = d[a];
            long s = steps[i];
            if (s == 0) {
                throw c.fail("has a step of 0 on axis " + a);
            }
            long st = starts[i];
            long en = ends[i];
            if (st < 0) {
                st += dim;
            }
            if (en < 0) {
                en += dim;
            }
            long len;
            if (s > 0) {
                st = clamp(st, 0, dim);
                en = clamp(en, 0, dim);
                len = en > st ? (en - st + s - 1) / s : 0;
            } else {
                st = clamp(st, 0, dim - 1);
                en = clamp(en, -1, dim - 1);
                len = st > en ? (st - en + (-s) - 1) / (-s) : 0;
            }
            out[a] = len;
            first[a] = st;
            step[a] = s;
        }
        c.out(0, c.type(0), out);
        TensorValues v = c.data(0);
        if (v != null) {
            long[] strides = LayoutRules.strides(d);
            int n = (int) Shapes.product(out);
            int[] src = new int[n];
            long[] coord = new long[r];
            for (int i = 0; i < n; i++) {
                long s = 0;
                for (int q = 0; q < r; q++) {
                    s += (first[q] + coord[q] * step[q]) * strides[q];
                }
                src[i] = (int) s;
                for (int q = r - 1; q >= 0; q--) {
                    if (++coord[q] < out[q]) {
                        break;
                    }
                    coord[q] = 0;
                }
            }
            c.outData(0, Eval.pick(v, out, src));
        }
    }

    static void gather(InferContext c) {
        long[] d = c.dims(0);
        long[] ind = c.dims(1);
        int axis = c.axis(c.attrInt("axis", 0), d.length);
        long[] out = new long[d.length - 1 + ind.length];
        int p = 0;
        for (int i = 0; i < axis; i++) {
            out[p++] = d[i];
        }
        for (long x : ind) {
            out[p++] = x;
        }
        for (int i = axis + 1; i < d.length; i++) {
            out[p++] = d[i];
        }
        c.out(0, c.type(0), out);
        TensorValues v = c.data(0);
        TensorValues idx = c.data(1);
        if (v != null && idx != null && Eval.small(out)) {
            long outer = Shapes.product(d, 0, axis);
            long inner = Shapes.product(d, axis + 1, d.length);
            int ni = idx.size();
            int[] src = new int[(int) (outer * ni * inner)];
            int q = 0;
            for (long o = 0; o < outer; o++) {
                for (int j = 0; j < ni; j++) {
                    long x = idx.longAt(j);
                    if (x < 0) {
                        x += d[axis];
                    }
                    if (x < 0 || x >= d[axis]) {
                        throw c.fail("gathers index " + idx.longAt(j) + " from an axis of size " + d[axis]);
                    }
                    for (long in = 0; in < inner; in++) {
                        src[q++] = (int) ((o * d[axis] + x) * inner + in);
                    }
                }
            }
            c.outData(0, Eval.pick(v, out, src));
        }
    }

    static void gatherNd(InferContext c) {
        long[] d = c.dims(0);
        long[] ind = c.dims(1);
        int b = (int) c.attrInt("batch_dims", 0);
        if (ind.length == 0) {
            throw c.fail("has scalar indices");
        }
        long last = ind[ind.length - 1];
        if (b + last > d.length) {
            throw c.fail("indexes " + last + " axes past batch_dims " + b + " of a rank-" + d.length + " input");
        }
        long[] out = Shapes.concat(Arrays.copyOf(ind, ind.length - 1), Arrays.copyOfRange(d, (int) (b + last), d.length));
        c.out(0, c.type(0), out);
    }

    static void nonZero(InferContext c) {
        long[] d = c.dims(0);
        TensorValues v = c.data(0);
        if (v != null) {
            long count = 0;
            for (int i = 0; i < v.size(); i++) {
                count += v.doubleAt(i) != 0 ? 1 : 0;
            }
            c.out(0, ElemType.INT64, new long[] {d.length, count});
            return;
        }
        c.out(0, ElemType.INT64, new long[] {d.length, Shapes.product(d)});
        c.note("NonZero returns a data-dependent count; erg assumes every element is non-zero (upper bound)");
    }
}
