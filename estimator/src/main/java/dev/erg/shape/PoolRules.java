package dev.erg.shape;

import dev.erg.onnx.ElemType;
import java.util.Arrays;

/** Pooling: windowed, global and region pools. */
final class PoolRules {
    private PoolRules() {
    }

    static void register(RuleTable t) {
        t.add("MaxPool", PoolRules::pool);
        t.add("AveragePool", PoolRules::pool);
        t.add("LpPool", PoolRules::pool);
        t.add("GlobalAveragePool", PoolRules::global);
        t.add("GlobalMaxPool", PoolRules::global);
        t.add("GlobalLpPool", PoolRules::global);
        t.add("MaxUnpool", PoolRules::maxUnpool);
        t.add("MaxRoiPool", c -> {
            long[] x = c.dims(0);
            long[] p = c.attrInts("pooled_shape");
            if (p == null || p.length != 2) {
                throw c.fail("needs pooled_shape with two values");
            }
            if (x.length != 4 || c.rank(1) != 2 || c.dims(1)[1] != 5) {
                throw c.fail("needs X [N, C, H, W] and rois [num_rois, 5] (got " + Arrays.toString(x) + " and "
                        + Arrays.toString(c.dims(1)) + ")");
            }
            c.out(0, c.type(0), new long[] {c.dims(1)[0], x[1], p[0], p[1]});
            c.note("MaxRoiPool windows depend on the ROI values; erg assumes each ROI covers the whole feature map"
                    + " (upper bound on the compares)");
        });
        // RoiAlign (opsets 10, 16): X [N, C, H, W], rois [num_rois, 4], batch_indices [num_rois].
        t.add("RoiAlign", c -> {
            long[] x = c.dims(0);
            long[] r = c.dims(1);
            if (x.length != 4 || r.length != 2 || r[1] != 4 || c.rank(2) != 1 || c.dims(2)[0] != r[0]) {
                throw c.fail("needs X [N, C, H, W], rois [num_rois, 4] and batch_indices [num_rois] (got "
                        + Arrays.toString(x) + ", " + Arrays.toString(r) + ", " + Arrays.toString(c.dims(2)) + ")");
            }
            c.out(0, c.type(0), new long[] {r[0], x[1], c.attrInt("output_height", 1),
                c.attrInt("output_width", 1)});
            if (c.attrInt("sampling_ratio", 0) <= 0) {
                c.note("RoiAlign with an adaptive sampling_ratio samples a data-dependent grid; erg assumes 2 x 2"
                        + " samples per bin");
            }
        });
    }

    static void pool(InferContext c) {
        long[] x = c.dims(0);
        if (x.length < 3) {
            throw c.fail("needs an input of rank >= 3, got " + Arrays.toString(x));
        }
        int sp = x.length - 2;
        long[] kernel = c.attrInts("kernel_shape");
        if (kernel == null || kernel.length != sp) {
            throw c.fail("needs kernel_shape with " + sp + " values");
        }
        long[] strides = ConvRules.attrOr(c, "strides", sp, 1);
        long[] dil = ConvRules.attrOr(c, "dilations", sp, 1);
        long[] pads = ConvRules.attrOr(c, "pads", 2 * sp, 0);
        if (pads.length != 2 * sp) {
            throw c.fail("has " + pads.length + " pads for " + sp + " spatial axes");
        }
        boolean ceil = c.attrInt("ceil_mode", 0) == 1;
        String autoPad = c.attrString("auto_pad", "NOTSET");
        long[] out = x.clone();
        for (int i = 0; i < sp; i++) {
            out[2 + i] = ConvRules.windowOut(c, autoPad, x[2 + i], kernel[i], strides[i], dil[i], pads[i],
                    pads[i + sp], ceil);
        }
        c.out(0, c.type(0), out);
        if (c.outputCount() > 1 && c.node().output(1) != null) {
            if (!c.node().opType().equals("MaxPool") || c.opset() < 8) {
                throw c.fail("has a second output, which only MaxPool from opset 8 has (Indices)");
            }
            c.out(1, ElemType.INT64, out);
        }
    }

    /**
     * MaxUnpool (opsets 9, 11): X and the indices of a MaxPool -> the output_shape input when given,
     * else per spatial axis (in - 1) * stride + kernel - pad_begin - pad_end.
     */
    static void maxUnpool(InferContext c) {
        long[] x = c.dims(0);
        if (x.length < 3) {
            throw c.fail("needs an input of rank >= 3, got " + Arrays.toString(x));
        }
        if (!Arrays.equals(x, c.dims(1))) {
            throw c.fail("has indices " + Arrays.toString(c.dims(1)) + " of another shape than X " + Arrays.toString(x));
        }
        if (c.has(2)) {
            long[] shape = c.ints(2, "output_shape");
            if (shape.length != x.length) {
                throw c.fail("has output_shape " + Arrays.toString(shape) + " for an input of rank " + x.length);
            }
            c.out(0, c.type(0), shape);
            return;
        }
        int sp = x.length - 2;
        long[] kernel = c.attrInts("kernel_shape");
        if (kernel == null || kernel.length != sp) {
            throw c.fail("needs kernel_shape with " + sp + " values");
        }
        long[] strides = ConvRules.attrOr(c, "strides", sp, 1);
        long[] pads = ConvRules.attrOr(c, "pads", 2 * sp, 0);
        if (pads.length != 2 * sp) {
            throw c.fail("has " + pads.length + " pads for " + sp + " spatial axes");
        }
        long[] out = x.clone();
        for (int i = 0; i < sp; i++) {
            out[2 + i] = (x[2 + i] - 1) * strides[i] + kernel[i] - pads[i] - pads[i + sp];
            if (out[2 + i] < 0) {
                throw c.fail("gets a negative output size on spatial axis " + i);
            }
        }
        c.out(0, c.type(0), out);
    }

    static void global(InferContext c) {
        long[] x = c.dims(0);
        if (x.length < 2) {
            throw c.fail("needs an input of rank >= 2");
        }
        long[] out = x.clone();
        for (int i = 2; i < out.length; i++) {
            out[i] = 1;
        }
        c.out(0, c.type(0), out);
    }
}
