package dev.erg.shape;

import dev.erg.graph.Value;
import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.TensorValues;
import java.util.Arrays;

/**
 * Operators that make tensors or size them: Constant, Shape, Size, ConstantOfShape, Range, EyeLike,
 * Pad, Resize, Upsample and CenterCropPad.
 */
final class TensorRules {
    private TensorRules() {
    }

    static void register(RuleTable t) {
        t.add("Constant", TensorRules::constant);
        t.add("Shape", TensorRules::shape);
        t.add("Size", c -> c.outData(0, TensorValues.ofLongs(ElemType.INT64, new long[0],
                new long[] {Shapes.product(c.dims(0))})));
        t.add("ConstantOfShape", TensorRules::constantOfShape);
        t.add("Range", TensorRules::range);
        t.add("Pad", TensorRules::pad);
        t.add("Resize", TensorRules::resize);
        t.add("Upsample", TensorRules::upsample);
        t.add("CenterCropPad", TensorRules::centerCropPad);
        t.add("EyeLike", c -> {
            if (c.rank(0) != 2) {
                throw c.fail("needs a 2-D input, got " + Arrays.toString(c.dims(0)));
            }
            long dt = c.attrInt("dtype", -1);
            c.out(0, dt < 0 ? c.type(0) : ElemType.ofCode(dt), c.dims(0));
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
        start = SelectRules.clamp(start < 0 ? start + r : start, 0, r);
        end = SelectRules.clamp(end < 0 ? end + r : end, 0, r);
        long[] v = end > start ? Arrays.copyOfRange(d, (int) start, (int) end) : new long[0];
        c.outData(0, TensorValues.vector(v));
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
}
