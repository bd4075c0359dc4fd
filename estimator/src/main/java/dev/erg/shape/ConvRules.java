package dev.erg.shape;

import dev.erg.onnx.ElemType;
import java.util.Arrays;

/** Convolutions and their integer and quantized forms. */
final class ConvRules {
    private ConvRules() {
    }

    static void register(RuleTable t) {
        t.add("Conv", c -> conv(c, 0, 1, c.type(0)));
        t.add("ConvInteger", c -> conv(c, 0, 1, ElemType.INT32));
        t.add("QLinearConv", c -> conv(c, 0, 3, c.type(7)));
        t.add("ConvTranspose", ConvRules::convTranspose);
        // DeformConv (opset 19): Conv's output shape (explicit pads, no auto_pad); offset [N, 2*og*prod(k), out...].
        t.add("DeformConv", c -> {
            conv(c, 0, 1, c.type(0));
            long[] y = c.node().output(0) == null ? null : c.node().output(0).dims();
            long[] off = c.dims(2);
            if (y != null && (off.length != y.length || off[0] != y[0]
                    || !Arrays.equals(Arrays.copyOfRange(off, 2, off.length), Arrays.copyOfRange(y, 2, y.length)))) {
                throw c.fail("has offset " + Arrays.toString(off) + " that does not match its output " + Arrays.toString(y));
            }
        });
        t.add("GridSample", ConvRules::gridSample);
        t.add("AffineGrid", ConvRules::affineGrid);
        t.add("Col2Im", ConvRules::col2im);
    }

    /** Spatial output size of a sliding window, as the standard defines it for Conv and the pools. */
    static long windowOut(InferContext c, String autoPad, long in, long k, long s, long dil, long padBegin,
                          long padEnd, boolean ceil) {
        long span = dil * (k - 1) + 1;
        switch (autoPad) {
            case "SAME_UPPER":
            case "SAME_LOWER":
                return Shapes.ceilDiv(in, s);
            case "VALID":
                if (in < span) {
                    throw c.fail("has a window of " + span + " over an axis of " + in);
                }
                return (in - span) / s + 1;
            case "NOTSET":
            case "":
                long num = in + padBegin + padEnd - span;
                if (num < 0) {
                    throw c.fail("has a window of " + span + " over a padded axis of " + (in + padBegin + padEnd));
                }
                long out = (ceil ? Shapes.ceilDiv(num, s) : num / s) + 1;
                if (ceil && (out - 1) * s >= in + padBegin) {
                    out--; // the last window must start inside the input or its leading padding
                }
                return out;
            default:
                throw c.fail("has the unknown auto_pad '" + autoPad + "'");
        }
    }

    static long[] attrOr(InferContext c, String name, int n, long dflt) {
        long[] v = c.attrInts(name);
        if (v == null || v.length == 0) {
            v = new long[n];
            Arrays.fill(v, dflt);
        }
        if (v.length != n && !name.equals("pads")) {
            throw c.fail("has " + name + " " + Arrays.toString(v) + " for " + n + " spatial axes");
        }
        return v;
    }

    static void conv(InferContext c, int xi, int wi, ElemType outType) {
        long[] x = c.dims(xi);
        long[] w = c.dims(wi);
        if (x.length < 3 || w.length != x.length) {
            throw c.fail("needs input and weight of the same rank >= 3 (got " + Arrays.toString(x) + " and "
                    + Arrays.toString(w) + ")");
        }
        int sp = x.length - 2;
        long group = c.attrInt("group", 1);
        if (group <= 0 || x[1] != w[1] * group) {
            throw c.fail("has " + x[1] + " input channels but its weight " + Arrays.toString(w) + " with group "
                    + group + " expects " + (w[1] * group));
        }
        if (w[0] % group != 0) {
            throw c.fail("has " + w[0] + " output channels, not a multiple of group " + group);
        }
        long[] kernel = c.attrInts("kernel_shape");
        if (kernel == null) {
            kernel = Arrays.copyOfRange(w, 2, w.length);
        } else if (!Arrays.equals(kernel, Arrays.copyOfRange(w, 2, w.length))) {
            throw c.fail("has kernel_shape " + Arrays.toString(kernel) + " but its weight " + Arrays.toString(w));
        }
        long[] strides = attrOr(c, "strides", sp, 1);
        long[] dil = attrOr(c, "dilations", sp, 1);
        long[] pads = attrOr(c, "pads", 2 * sp, 0);
        if (pads.length != 2 * sp) {
            throw c.fail("has " + pads.length + " pads for " + sp + " spatial axes");
        }
        String autoPad = c.attrString("auto_pad", "NOTSET");
        long[] out = new long[x.length];
        out[0] = x[0];
        out[1] = w[0];
        for (int i = 0; i < sp; i++) {
            out[2 + i] = windowOut(c, autoPad, x[2 + i], kernel[i], strides[i], dil[i], pads[i], pads[i + sp], false);
        }
        c.out(0, outType, out);
    }

    /**
     * GridSample (opset 16: 4-D; opset 20: N-D): X [N, C, D1..Dr], grid [N, D1_out..Dr_out, r] ->
     * [N, C, D1_out..Dr_out].
     */
    static void gridSample(InferContext c) {
        long[] x = c.dims(0);
        long[] g = c.dims(1);
        int r = g.length - 2;
        if (x.length < 3 || g.length != x.length || g[g.length - 1] != r || g[0] != x[0]) {
            throw c.fail("needs X [N, C, spatial...] and grid [N, spatial_out..., r] of one batch (got "
                    + Arrays.toString(x) + " and " + Arrays.toString(g) + ")");
        }
        if (c.opset() < 20 && x.length != 4) {
            throw c.fail("takes a 4-D input before opset 20, got " + Arrays.toString(x));
        }
        long[] out = new long[x.length];
        out[0] = x[0];
        out[1] = x[1];
        System.arraycopy(g, 1, out, 2, r);
        c.out(0, c.type(0), out);
    }

    /** AffineGrid (opset 20): theta [N, 2, 3] or [N, 3, 4], size [N, C, H, W] or [N, C, D, H, W] -> [N, (D,) H, W, r]. */
    static void affineGrid(InferContext c) {
        long[] theta = c.dims(0);
        long[] size = c.ints(1, "size");
        int r = size.length - 2;
        if ((r != 2 && r != 3) || theta.length != 3 || theta[1] != r || theta[2] != r + 1 || theta[0] != size[0]) {
            throw c.fail("needs theta [N, r, r+1] and a size of rank r + 2 (r = 2 or 3), got " + Arrays.toString(theta)
                    + " and " + Arrays.toString(size));
        }
        long[] out = new long[r + 2];
        out[0] = size[0];
        System.arraycopy(size, 2, out, 1, r);
        out[r + 1] = r;
        c.out(0, c.type(0), out);
    }

    /** Col2Im (opset 18): [N, C * prod(block_shape), L], image_shape, block_shape -> [N, C, image_shape...]. */
    static void col2im(InferContext c) {
        long[] x = c.dims(0);
        long[] image = c.ints(1, "image_shape");
        long[] block = c.ints(2, "block_shape");
        if (x.length != 3 || image.length != block.length) {
            throw c.fail("needs a 3-D input and image_shape and block_shape of one length");
        }
        long blocks = 1;
        for (long b : block) {
            blocks = Math.multiplyExact(blocks, b);
        }
        if (blocks <= 0 || x[1] % blocks != 0) {
            throw c.fail("has " + x[1] + " input channels, not a multiple of the block size " + blocks);
        }
        long[] out = new long[2 + image.length];
        out[0] = x[0];
        out[1] = x[1] / blocks;
        System.arraycopy(image, 0, out, 2, image.length);
        c.out(0, c.type(0), out);
    }

    static void convTranspose(InferContext c) {
        long[] x = c.dims(0);
        long[] w = c.dims(1);
        if (x.length < 3 || w.length != x.length) {
            throw c.fail("needs input and weight of the same rank >= 3");
        }
        int sp = x.length - 2;
        long group = c.attrInt("group", 1);
        if (group <= 0 || x[1] != w[0]) {
            throw c.fail("has " + x[1] + " input channels but its weight " + Arrays.toString(w) + " expects " + w[0]);
        }
        long[] kernel = c.attrInts("kernel_shape");
        if (kernel == null) {
            kernel = Arrays.copyOfRange(w, 2, w.length);
        }
        long[] strides = attrOr(c, "strides", sp, 1);
        long[] dil = attrOr(c, "dilations", sp, 1);
        long[] pads = attrOr(c, "pads", 2 * sp, 0);
        long[] outPad = attrOr(c, "output_padding", sp, 0);
        long[] outShape = c.attrInts("output_shape");
        String autoPad = c.attrString("auto_pad", "NOTSET");
        long[] out = new long[x.length];
        out[0] = x[0];
        out[1] = w[1] * group;
        for (int i = 0; i < sp; i++) {
            long o;
            if (outShape != null && outShape.length > 0) {
                o = outShape[outShape.length - sp + i];
            } else if (autoPad.startsWith("SAME")) {
                o = x[2 + i] * strides[i];
            } else {
                long pb = autoPad.equals("VALID") ? 0 : pads[i];
                long pe = autoPad.equals("VALID") ? 0 : pads[i + sp];
                o = strides[i] * (x[2 + i] - 1) + outPad[i] + (kernel[i] - 1) * dil[i] + 1 - pb - pe;
            }
            if (o < 0) {
                throw c.fail("gets a negative output size on spatial axis " + i);
            }
            out[2 + i] = o;
        }
        c.out(0, c.type(0), out);
    }
}
