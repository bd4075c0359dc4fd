package dev.erg.shape;

import java.util.Arrays;

/** Shape arithmetic shared by the rules. */
public final class Shapes {
    private Shapes() {
    }

    public static long product(long[] dims) {
        long n = 1;
        for (long d : dims) {
            n = Math.multiplyExact(n, d);
        }
        return n;
    }

    public static long product(long[] dims, int from, int to) {
        long n = 1;
        for (int i = from; i < to; i++) {
            n = Math.multiplyExact(n, dims[i]);
        }
        return n;
    }

    /** Multidirectional (numpy-style) broadcasting of several shapes, as the ONNX standard defines it. */
    public static long[] broadcast(InferContext c, long[]... shapes) {
        int rank = 0;
        for (long[] s : shapes) {
            rank = Math.max(rank, s.length);
        }
        long[] out = new long[rank];
        Arrays.fill(out, 1);
        for (long[] s : shapes) {
            for (int k = 0; k < s.length; k++) {
                int o = rank - s.length + k;
                long d = s[k];
                if (d == out[o] || d == 1) {
                    continue;
                }
                if (out[o] == 1) {
                    out[o] = d;
                } else {
                    StringBuilder b = new StringBuilder();
                    for (long[] x : shapes) {
                        b.append(b.length() == 0 ? "" : " and ").append(Arrays.toString(x));
                    }
                    throw c.fail("has input shapes " + b + " that do not broadcast");
                }
            }
        }
        return out;
    }

    /** Normalises axes against rank, rejecting out-of-range and repeated ones. */
    public static int[] axes(InferContext c, long[] axes, int rank) {
        int[] out = new int[axes.length];
        boolean[] seen = new boolean[Math.max(rank, 0)];
        for (int i = 0; i < axes.length; i++) {
            out[i] = c.axis(axes[i], rank);
            if (seen[out[i]]) {
                throw c.fail("names axis " + axes[i] + " twice");
            }
            seen[out[i]] = true;
        }
        return out;
    }

    public static long[] concat(long[] a, long[] b) {
        long[] out = Arrays.copyOf(a, a.length + b.length);
        System.arraycopy(b, 0, out, a.length, b.length);
        return out;
    }

    public static long ceilDiv(long a, long b) {
        return Math.floorDiv(a + b - 1, b);
    }
}
