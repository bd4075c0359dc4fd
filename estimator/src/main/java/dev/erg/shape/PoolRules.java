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
        t.add("MaxRoiPool", c -> {
            long[] x = c.dims(0);
            long[] p = c.attrInts("pooled_shape");
            if (p == null || p.length != 2) {
                throw c.fail("needs pooled_shape with two values");
            }
            c.out(0, c.type(0), new long[] {c.dims(1)[0], x[1], p[0], p[1]});
        });
        t.add("RoiAlign", c -> {
            long[] x = c.dims(0);
            c.out(0, c.type(0), new long[] {c.dims(1)[0], x[1], c.attrInt("output_height", 1),
                c.attrInt("output_width", 1)});
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
        c.out(1, ElemType.INT64, out);
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
