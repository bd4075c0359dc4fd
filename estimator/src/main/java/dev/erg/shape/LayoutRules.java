package dev.erg.shape;

import dev.erg.onnx.TensorValues;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Operators that change a tensor's layout but not its elements: Reshape, Flatten, Squeeze, Unsqueeze,
 * Transpose, Expand, Tile, DepthToSpace and SpaceToDepth.
 */
final class LayoutRules {
    private LayoutRules() {
    }

    static void register(RuleTable t) {
        t.add("Reshape", LayoutRules::reshape);
        t.add("Flatten", LayoutRules::flatten);
        t.add("Squeeze", LayoutRules::squeeze);
        t.add("Unsqueeze", LayoutRules::unsqueeze);
        t.add("Transpose", LayoutRules::transpose);
        t.add("Expand", LayoutRules::expand);
        t.add("Tile", LayoutRules::tile);
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
    }

    // ---- rules ------------------------------------------------------------------------------

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
}
