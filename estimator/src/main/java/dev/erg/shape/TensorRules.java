package dev.erg.shape;

import dev.erg.graph.Value;
import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.TensorValues;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Operators that make, view or move tensors: Constant, Shape, Reshape and its kin, Transpose,
 * Concat, Split, Slice, Gather, Expand, Tile, Pad, Resize, ConstantOfShape, Range and friends.
 */
final class TensorRules {
    private TensorRules() {
    }

    static void register(RuleTable t) {
        t.add("Constant", TensorRules::constant);
        t.add("Shape", TensorRules::shape);
        t.add("Size", c -> c.outData(0, TensorValues.ofLongs(ElemType.INT64, new long[0],
                new long[] {Shapes.product(c.dims(0))})));
        t.add("Reshape", TensorRules::reshape);
        t.add("Flatten", TensorRules::flatten);
        t.add("Squeeze", TensorRules::squeeze);
        t.add("Unsqueeze", TensorRules::unsqueeze);
        t.add("Transpose", TensorRules::transpose);
        t.add("Concat", TensorRules::concat);
        t.add("Split", TensorRules::split);
        t.add("Slice", TensorRules::slice);
        t.add("Gather", TensorRules::gather);
        t.add("GatherElements", c -> {
            if (c.rank(0) != c.rank(1) || c.rank(0) == 0) {
                throw c.fail("needs data and indices of the same rank >= 1 (got " + Arrays.toString(c.dims(0))
                        + " and " + Arrays.toString(c.dims(1)) + ")");
            }
            c.axis(c.attrInt("axis", 0), c.rank(0));
            c.out(0, c.type(0), c.dims(1));
        });
        t.add("GatherND", TensorRules::gatherNd);
        t.add("ScatterND", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("ScatterElements", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("Scatter", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("Expand", TensorRules::expand);
        t.add("Tile", TensorRules::tile);
        t.add("ConstantOfShape", TensorRules::constantOfShape);
        t.add("Range", TensorRules::range);
        t.add("Pad", TensorRules::pad);
        t.add("Resize", TensorRules::resize);
        t.add("Upsample", TensorRules::upsample);
        t.add("DepthToSpace", c -> {
            long b = c.attrInt("blocksize", 0);
            long[] d = c.dims(0);
            if (d.length != 4 || b <= 0 || d[1] % (b * b) != 0) {
                throw c.fail("needs a 4-D input whose channels divide by blocksize^2 (got " + Arrays.toString(d)
                        + ", blocksize " + b + ")");
            }
            c.out(0, c.type(0), new long[] {d[0], d[1] / (b * b), d[2] * b, d[3] * b});
        });
        t.add("SpaceToDepth", c -> {
            long b = c.attrInt("blocksize", 0);
            long[] d = c.dims(0);
            if (d.length != 4 || b <= 0 || d[2] % b != 0 || d[3] % b != 0) {
                throw c.fail("needs a 4-D input whose height and width divide by blocksize (got " + Arrays.toString(d)
                        + ", blocksize " + b + ")");
            }
            c.out(0, c.type(0), new long[] {d[0], d[1] * b * b, d[2] / b, d[3] / b});
        });
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
        t.add("NonZero", TensorRules::nonZero);
        t.add("ReverseSequence", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("CenterCropPad", TensorRules::centerCropPad);
        t.add("CumSum", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("Trilu", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("EyeLike", c -> {
            if (c.rank(0) != 2) {
                throw c.fail("needs a 2-D input, got " + Arrays.toString(c.dims(0)));
            }
            long dt = c.attrInt("dtype", -1);
            c.out(0, dt < 0 ? c.type(0) : ElemType.ofCode(dt), c.dims(0));
        });
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

    static void constant(InferContext c) {
        Value out = c.node().output(0);
        TensorDef t;
        String name = out == null ? c.node().name() : out.name();
        AttributeDef a;
        if ((a = c.attr("value")) != null && a.t() != null) {
            t = a.t();
        } else if ((a = c.attr("sparse_value")) != null && a.t() != null) {
            t = a.t();
        } else if ((a = c.attr("value_float")) != null) {
            t = new TensorDef(name, ElemType.FLOAT, new long[0], 1,
                    TensorValues.scalar(ElemType.FLOAT, a.f()), null);
        } else if ((a = c.attr("value_floats")) != null) {
            float[] f = a.floats();
            double[] d = new double[f.length];
            for (int i = 0; i < f.length; i++) {
                d[i] = f[i];
            }
            t = new TensorDef(name, ElemType.FLOAT, new long[] {f.length}, f.length,
                    TensorValues.ofDoubles(ElemType.FLOAT, new long[] {f.length}, d), null);
        } else if ((a = c.attr("value_int")) != null) {
            t = new TensorDef(name, ElemType.INT64, new long[0], 1,
                    TensorValues.ofLongs(ElemType.INT64, new long[0], new long[] {a.i()}), null);
        } else if ((a = c.attr("value_ints")) != null) {
            long[] v = a.ints();
            t = new TensorDef(name, ElemType.INT64, new long[] {v.length}, v.length,
                    TensorValues.ofLongs(ElemType.INT64, new long[] {v.length}, v), null);
        } else if ((a = c.attr("value_string")) != null) {
            t = new TensorDef(name, ElemType.STRING, new long[0], 1, null, null);
        } else if ((a = c.attr("value_strings")) != null) {
            int n = a.strings().size();
            t = new TensorDef(name, ElemType.STRING, new long[] {n}, n, null, null);
        } else {
            throw c.fail("has none of the value attributes (value, value_float(s), value_int(s), value_string(s), sparse_value)");
        }
        c.out(0, t.type(), t.dims());
        if (out != null) {
            out.setStored(t);
            out.setData(t.values());
        }
        c.node().setFolded(true);
    }

    static void shape(InferContext c) {
        long[] d = c.dims(0);
        int r = d.length;
        long start = c.attrInt("start", 0);
        long end = c.attrInt("end", r);
        start = clamp(start < 0 ? start + r : start, 0, r);
        end = clamp(end < 0 ? end + r : end, 0, r);
        long[] v = end > start ? Arrays.copyOfRange(d, (int) start, (int) end) : new long[0];
        c.outData(0, TensorValues.vector(v));
    }

    static void reshape(InferContext c) {
        long[] in = c.dims(0);
        long[] shape = c.opset() < 5 ? c.attrInts("shape") : c.ints(1, "target shape");
        if (shape == null) {
            throw c.fail("has no target shape");
        }
        boolean allowZero = c.attrInt("allowzero", 0) == 1;
        long[] out = new long[shape.length];
        int infer = -1;
        long known = 1;
        for (int i = 0; i < shape.length; i++) {
            long s = shape[i];
            if (s == 0 && !allowZero) {
                if (i >= in.length) {
                    throw c.fail("copies axis " + i + " (a 0 in the target shape) from an input of rank " + in.length);
                }
                s = in[i];
            }
            if (s == -1) {
                if (infer >= 0) {
                    throw c.fail("has more than one -1 in its target shape " + Arrays.toString(shape));
                }
                infer = i;
                continue;
            }
            if (s < 0) {
                throw c.fail("has the invalid dim " + s + " in its target shape " + Arrays.toString(shape));
            }
            out[i] = s;
            known = Math.multiplyExact(known, s);
        }
        long total = Shapes.product(in);
        if (infer >= 0) {
            if (known == 0 || total % known != 0) {
                throw c.fail("cannot reshape " + Arrays.toString(in) + " to " + Arrays.toString(shape));
            }
            out[infer] = total / known;
        } else if (known != total) {
            throw c.fail("cannot reshape " + Arrays.toString(in) + " (" + total + " elements) to "
                    + Arrays.toString(out) + " (" + known + " elements)");
        }
        c.out(0, c.type(0), out);
        if (c.data(0) != null) {
            c.outData(0, c.data(0).reshape(out));
        }
    }

    static void flatten(InferContext c) {
        long[] d = c.dims(0);
        long axis = c.attrInt("axis", 1);
        if (axis < 0) {
            axis += d.length;
        }
        if (axis < 0 || axis > d.length) {
            throw c.fail("has axis " + c.attrInt("axis", 1) + " outside [-r, r] for rank " + d.length);
        }
        long[] out = {Shapes.product(d, 0, (int) axis), Shapes.product(d, (int) axis, d.length)};
        c.out(0, c.type(0), out);
        if (c.data(0) != null) {
            c.outData(0, c.data(0).reshape(out));
        }
    }

    static long[] axesOf(InferContext c, int inputIndex) {
        if (c.opset() < 13 || (c.node().opType().startsWith("Reduce") && c.opset() < 18
                && !c.node().opType().equals("ReduceSum"))) {
            return c.attrInts("axes");
        }
        if (!c.has(inputIndex)) {
            return null;
        }
        TensorValues v = c.data(inputIndex);
        if (v == null) {
            throw c.fail("has axes (input " + inputIndex + ") that are not known at analysis time");
        }
        return v.longs();
    }

    static void squeeze(InferContext c) {
        long[] d = c.dims(0);
        long[] axes = axesOf(c, 1);
        boolean[] drop = new boolean[d.length];
        if (axes == null || axes.length == 0) {
            for (int i = 0; i < d.length; i++) {
                drop[i] = d[i] == 1;
            }
        } else {
            for (int a : Shapes.axes(c, axes, d.length)) {
                if (d[a] != 1) {
                    throw c.fail("squeezes axis " + a + " of size " + d[a] + " (shape " + Arrays.toString(d) + ")");
                }
                drop[a] = true;
            }
        }
        List<Long> out = new ArrayList<>();
        for (int i = 0; i < d.length; i++) {
            if (!drop[i]) {
                out.add(d[i]);
            }
        }
        long[] o = out.stream().mapToLong(Long::longValue).toArray();
        c.out(0, c.type(0), o);
        if (c.data(0) != null) {
            c.outData(0, c.data(0).reshape(o));
        }
    }

    static void unsqueeze(InferContext c) {
        long[] d = c.dims(0);
        long[] axes = axesOf(c, 1);
        if (axes == null) {
            throw c.fail("has no axes");
        }
        int r = d.length + axes.length;
        boolean[] ins = new boolean[r];
        for (int a : Shapes.axes(c, axes, r)) {
            ins[a] = true;
        }
        long[] out = new long[r];
        for (int i = 0, j = 0; i < r; i++) {
            out[i] = ins[i] ? 1 : d[j++];
        }
        c.out(0, c.type(0), out);
        if (c.data(0) != null) {
            c.outData(0, c.data(0).reshape(out));
        }
    }

    static void transpose(InferContext c) {
        long[] d = c.dims(0);
        long[] perm = c.attrInts("perm");
        int r = d.length;
        if (perm == null) {
            perm = new long[r];
            for (int i = 0; i < r; i++) {
                perm[i] = r - 1 - i;
            }
        }
        if (perm.length != r) {
            throw c.fail("has perm " + Arrays.toString(perm) + " for an input of rank " + r);
        }
        int[] p = Shapes.axes(c, perm, r);
        long[] out = new long[r];
        for (int i = 0; i < r; i++) {
            out[i] = d[p[i]];
        }
        c.out(0, c.type(0), out);
        TensorValues v = c.data(0);
        if (v != null) {
            long[] inStrides = strides(d);
            int n = v.size();
            int[] src = new int[n];
            long[] coord = new long[r];
            for (int i = 0; i < n; i++) {
                long s = 0;
                for (int k = 0; k < r; k++) {
                    s += coord[k] * inStrides[p[k]];
                }
                src[i] = (int) s;
                for (int k = r - 1; k >= 0; k--) {
                    if (++coord[k] < out[k]) {
                        break;
                    }
                    coord[k] = 0;
                }
            }
            c.outData(0, Eval.pick(v, out, src));
        }
    }

    static long[] strides(long[] d) {
        long[] s = new long[d.length];
        long x = 1;
        for (int k = d.length - 1; k >= 0; k--) {
            s[k] = x;
            x *= d[k];
        }
        return s;
    }

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
            long[] strides = strides(d);
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

    static void expand(InferContext c) {
        long[] shape = c.ints(1, "shape");
        long[] out = Shapes.broadcast(c, c.dims(0), shape);
        c.out(0, c.type(0), out);
        if (c.data(0) != null && Eval.small(out)) {
            c.outData(0, Eval.expand(c.data(0), out));
        }
    }

    static void tile(InferContext c) {
        long[] d = c.dims(0);
        long[] rep = c.ints(1, "repeats");
        if (rep.length != d.length) {
            throw c.fail("has " + rep.length + " repeats for an input of rank " + d.length);
        }
        long[] out = new long[d.length];
        for (int i = 0; i < d.length; i++) {
            if (rep[i] < 0) {
                throw c.fail("has a negative repeat " + rep[i]);
            }
            out[i] = Math.multiplyExact(d[i], rep[i]);
        }
        c.out(0, c.type(0), out);
        TensorValues v = c.data(0);
        if (v != null && Eval.small(out)) {
            long[] st = strides(d);
            int n = (int) Shapes.product(out);
            int[] src = new int[n];
            long[] coord = new long[d.length];
            for (int i = 0; i < n; i++) {
                long s = 0;
                for (int q = 0; q < d.length; q++) {
                    s += (coord[q] % d[q]) * st[q];
                }
                src[i] = (int) s;
                for (int q = d.length - 1; q >= 0; q--) {
                    if (++coord[q] < out[q]) {
                        break;
                    }
                    coord[q] = 0;
                }
            }
            c.outData(0, Eval.pick(v, out, src));
        }
    }

    static void constantOfShape(InferContext c) {
        long[] shape = c.ints(0, "shape");
        for (long s : shape) {
            if (s < 0) {
                throw c.fail("makes a tensor with the negative dim " + s);
            }
        }
        AttributeDef a = c.attr("value");
        ElemType type = ElemType.FLOAT;
        double fill = 0;
        if (a != null && a.t() != null) {
            type = a.t().type();
            if (a.t().values() != null && a.t().values().size() > 0) {
                fill = a.t().values().doubleAt(0);
            }
        }
        c.out(0, type, shape);
        if (Eval.small(shape)) {
            int n = (int) Shapes.product(shape);
            double[] v = new double[n];
            Arrays.fill(v, fill);
            c.outData(0, TensorValues.ofDoubles(type, shape, v));
        }
    }

    static void range(InferContext c) {
        double start = c.reals(0, "start")[0];
        double limit = c.reals(1, "limit")[0];
        double delta = c.reals(2, "delta")[0];
        if (delta == 0) {
            throw c.fail("has a delta of 0");
        }
        long n = Math.max((long) Math.ceil((limit - start) / delta), 0);
        long[] dims = {n};
        c.out(0, c.type(0), dims);
        if (Eval.small(dims)) {
            double[] v = new double[(int) n];
            for (int i = 0; i < n; i++) {
                v[i] = start + i * delta;
            }
            c.outData(0, TensorValues.ofDoubles(c.type(0), dims, v));
        }
    }

    static void pad(InferContext c) {
        long[] d = c.dims(0);
        int r = d.length;
        // Pad-1 named the attribute 'paddings'; Pad-2 'pads'; from Pad-11 the pads are an input.
        long[] pads = c.opset() < 2 ? c.attrInts("paddings") : c.opset() < 11 ? c.attrInts("pads") : c.ints(1, "pads");
        if (pads == null) {
            throw c.fail("has no pads");
        }
        int[] axes;
        if (c.opset() >= 18 && c.has(3)) {
            axes = Shapes.axes(c, c.ints(3, "axes"), r);
        } else {
            axes = new int[r];
            for (int i = 0; i < r; i++) {
                axes[i] = i;
            }
        }
        if (pads.length != 2 * axes.length) {
            throw c.fail("has " + pads.length + " pads for " + axes.length + " axes");
        }
        long[] out = d.clone();
        for (int i = 0; i < axes.length; i++) {
            out[axes[i]] = d[axes[i]] + pads[i] + pads[i + axes.length];
            if (out[axes[i]] < 0) {
                throw c.fail("pads axis " + axes[i] + " to a negative size");
            }
        }
        c.out(0, c.type(0), out);
    }

    static TensorValues present(InferContext c, int i) {
        if (!c.has(i)) {
            return null;
        }
        TensorValues v = c.data(i);
        if (v == null) {
            if (Shapes.product(c.dims(i)) == 0) {
                return null;
            }
            throw c.fail("has input " + i + " ('" + c.in(i).name() + "') that is not known at analysis time");
        }
        return v.size() == 0 ? null : v;
    }

    static void resize(InferContext c) {
        long[] d = c.dims(0);
        int r = d.length;
        TensorValues scales;
        TensorValues sizes = null;
        if (c.opset() < 11) {
            scales = present(c, 1);
        } else {
            scales = present(c, 2);
            sizes = present(c, 3);
        }
        int[] axes;
        long[] axesAttr = c.attrInts("axes");
        if (axesAttr != null && c.opset() >= 18) {
            axes = Shapes.axes(c, axesAttr, r);
        } else {
            axes = new int[r];
            for (int i = 0; i < r; i++) {
                axes[i] = i;
            }
        }
        long[] out = d.clone();
        if (sizes != null) {
            if (sizes.size() != axes.length) {
                throw c.fail("has " + sizes.size() + " sizes for " + axes.length + " axes");
            }
            String policy = c.attrString("keep_aspect_ratio_policy", "stretch");
            if (policy.equals("stretch")) {
                for (int i = 0; i < axes.length; i++) {
                    out[axes[i]] = sizes.longAt(i);
                }
            } else {
                double scale = policy.equals("not_larger") ? Double.MAX_VALUE : 0;
                for (int i = 0; i < axes.length; i++) {
                    double s = (double) sizes.longAt(i) / d[axes[i]];
                    scale = policy.equals("not_larger") ? Math.min(scale, s) : Math.max(scale, s);
                }
                for (int i = 0; i < axes.length; i++) {
                    out[axes[i]] = (long) Math.floor(d[axes[i]] * scale + 0.5);
                }
            }
        } else if (scales != null) {
            if (scales.size() != axes.length) {
                throw c.fail("has " + scales.size() + " scales for " + axes.length + " axes");
            }
            for (int i = 0; i < axes.length; i++) {
                out[axes[i]] = (long) Math.floor(d[axes[i]] * scales.doubleAt(i));
            }
        } else {
            throw c.fail("has neither scales nor sizes");
        }
        c.out(0, c.type(0), out);
    }

    static void upsample(InferContext c) {
        long[] d = c.dims(0);
        double[] scales;
        if (c.opset() < 9) {
            float[] f = c.attrFloats("scales");
            if (f == null) {
                throw c.fail("has no scales");
            }
            scales = new double[f.length];
            for (int i = 0; i < f.length; i++) {
                scales[i] = f[i];
            }
        } else {
            scales = c.reals(1, "scales");
        }
        if (scales.length != d.length) {
            throw c.fail("has " + scales.length + " scales for an input of rank " + d.length);
        }
        long[] out = new long[d.length];
        for (int i = 0; i < d.length; i++) {
            out[i] = (long) Math.floor(d[i] * scales[i]);
        }
        c.out(0, c.type(0), out);
    }

    /** CenterCropPad (opset 18): the axes (attribute, default all) take the sizes of the shape input. */
    static void centerCropPad(InferContext c) {
        long[] d = c.dims(0);
        long[] shape = c.ints(1, "shape");
        long[] axesAttr = c.attrInts("axes");
        int[] axes;
        if (axesAttr == null) {
            axes = new int[d.length];
            for (int i = 0; i < d.length; i++) {
                axes[i] = i;
            }
        } else {
            axes = Shapes.axes(c, axesAttr, d.length);
        }
        if (shape.length != axes.length) {
            throw c.fail("has " + shape.length + " sizes for " + axes.length + " axes");
        }
        long[] out = d.clone();
        for (int i = 0; i < axes.length; i++) {
            if (shape[i] < 0) {
                throw c.fail("crops or pads axis " + axes[i] + " to the negative size " + shape[i]);
            }
            out[axes[i]] = shape[i];
        }
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
