package dev.erg.shape;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorValues;

/** Evaluation of small tensors known at analysis time (the integer arithmetic that feeds shapes). */
public final class Eval {
    /** Tensors with more elements than this are shaped but not evaluated. */
    public static final long MAX_ELEMENTS = 1 << 16;

    private Eval() {
    }

    public static boolean small(long[] dims) {
        long n = 1;
        for (long d : dims) {
            n *= d;
            if (n > MAX_ELEMENTS || n < 0) {
                return false;
            }
        }
        return true;
    }

    @FunctionalInterface
    public interface LongOp {
        long apply(long a, long b);
    }

    @FunctionalInterface
    public interface RealOp {
        double apply(double a, double b);
    }

    /** Row-major strides of {@code dims}, 0 on broadcast axes when aligned to {@code outDims}. */
    static long[] broadcastStrides(long[] dims, long[] outDims) {
        long[] s = new long[outDims.length];
        long stride = 1;
        for (int k = dims.length - 1; k >= 0; k--) {
            int o = outDims.length - dims.length + k;
            s[o] = dims[k] == 1 ? 0 : stride;
            stride *= dims[k];
        }
        return s;
    }

    /** For each output position, the flat index into an input broadcast to {@code outDims}. */
    static int[] broadcastIndex(long[] dims, long[] outDims) {
        long[] strides = broadcastStrides(dims, outDims);
        int n = (int) Shapes.product(outDims);
        int[] idx = new int[n];
        int rank = outDims.length;
        long[] coord = new long[rank];
        long flat = 0;
        for (int i = 0; i < n; i++) {
            idx[i] = (int) flat;
            for (int k = rank - 1; k >= 0; k--) {
                coord[k]++;
                flat += strides[k];
                if (coord[k] < outDims[k]) {
                    break;
                }
                flat -= strides[k] * coord[k];
                coord[k] = 0;
            }
        }
        return idx;
    }

    /** Elementwise binary op with broadcasting; integer types use {@code li}, floating types {@code ri}. */
    public static TensorValues binary(ElemType outType, TensorValues a, TensorValues b, long[] outDims, LongOp li,
                                      RealOp ri) {
        int[] ia = broadcastIndex(a.dims(), outDims);
        int[] ib = broadcastIndex(b.dims(), outDims);
        int n = ia.length;
        boolean real = a.isFloat() || b.isFloat();
        if (real && ri != null) {
            double[] out = new double[n];
            for (int i = 0; i < n; i++) {
                out[i] = ri.apply(a.doubleAt(ia[i]), b.doubleAt(ib[i]));
            }
            return TensorValues.ofDoubles(outType, outDims, out);
        }
        long[] out = new long[n];
        for (int i = 0; i < n; i++) {
            out[i] = li.apply(a.longAt(ia[i]), b.longAt(ib[i]));
        }
        return TensorValues.ofLongs(outType, outDims, out);
    }

    /** Elementwise unary op. */
    public static TensorValues unary(ElemType outType, TensorValues a, java.util.function.LongUnaryOperator li,
                                     java.util.function.DoubleUnaryOperator ri) {
        int n = a.size();
        if (a.isFloat() || li == null) {
            double[] out = new double[n];
            for (int i = 0; i < n; i++) {
                out[i] = ri.applyAsDouble(a.doubleAt(i));
            }
            return TensorValues.ofDoubles(outType, a.dims(), out);
        }
        long[] out = new long[n];
        for (int i = 0; i < n; i++) {
            out[i] = li.applyAsLong(a.longAt(i));
        }
        return TensorValues.ofLongs(outType, a.dims(), out);
    }

    /** Broadcasts {@code a} to {@code outDims}. */
    public static TensorValues expand(TensorValues a, long[] outDims) {
        int[] ia = broadcastIndex(a.dims(), outDims);
        if (a.isFloat()) {
            double[] out = new double[ia.length];
            for (int i = 0; i < ia.length; i++) {
                out[i] = a.doubleAt(ia[i]);
            }
            return TensorValues.ofDoubles(a.type(), outDims, out);
        }
        long[] out = new long[ia.length];
        for (int i = 0; i < ia.length; i++) {
            out[i] = a.longAt(ia[i]);
        }
        return TensorValues.ofLongs(a.type(), outDims, out);
    }

    /** Re-types values (Cast): floats truncate toward zero into integer types, booleans become 0/1. */
    public static TensorValues cast(TensorValues a, ElemType to) {
        if (to == ElemType.BOOL) {
            long[] out = new long[a.size()];
            for (int i = 0; i < out.length; i++) {
                out[i] = a.doubleAt(i) != 0 ? 1 : 0;
            }
            return TensorValues.ofLongs(to, a.dims(), out);
        }
        if (to.isFloat()) {
            return TensorValues.ofDoubles(to, a.dims(), a.doubles());
        }
        long[] out = new long[a.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = a.isFloat() ? (long) a.doubleAt(i) : a.longAt(i);
        }
        return TensorValues.ofLongs(to, a.dims(), wrap(out, to));
    }

    private static long[] wrap(long[] v, ElemType to) {
        for (int i = 0; i < v.length; i++) {
            switch (to) {
                case INT32: v[i] = (int) v[i]; break;
                case INT16: v[i] = (short) v[i]; break;
                case INT8: v[i] = (byte) v[i]; break;
                case UINT8: v[i] = v[i] & 0xff; break;
                case UINT16: v[i] = v[i] & 0xffff; break;
                case UINT32: v[i] = v[i] & 0xffffffffL; break;
                default: break;
            }
        }
        return v;
    }

    /** Gathers values along a flat row-major copy given a source index per output. */
    public static TensorValues pick(TensorValues a, long[] outDims, int[] srcIndex) {
        if (a.isFloat()) {
            double[] out = new double[srcIndex.length];
            for (int i = 0; i < out.length; i++) {
                out[i] = a.doubleAt(srcIndex[i]);
            }
            return TensorValues.ofDoubles(a.type(), outDims, out);
        }
        long[] out = new long[srcIndex.length];
        for (int i = 0; i < out.length; i++) {
            out[i] = a.longAt(srcIndex[i]);
        }
        return TensorValues.ofLongs(a.type(), outDims, out);
    }
}
