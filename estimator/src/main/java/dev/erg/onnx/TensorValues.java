package dev.erg.onnx;

import java.util.Arrays;

/**
 * The values of a small tensor known at analysis time: a shape constant, an axis list, a scale.
 * Integer and boolean tensors hold {@code long}s, floating-point tensors hold {@code double}s.
 * Immutable.
 */
public final class TensorValues {
    private final ElemType type;
    private final long[] dims;
    private final long[] ints;
    private final double[] reals;

    private TensorValues(ElemType type, long[] dims, long[] ints, double[] reals) {
        this.type = type;
        this.dims = dims;
        this.ints = ints;
        this.reals = reals;
    }

    public static TensorValues ofLongs(ElemType type, long[] dims, long[] values) {
        if (type.isFloat()) {
            double[] d = new double[values.length];
            for (int i = 0; i < values.length; i++) {
                d[i] = values[i];
            }
            return new TensorValues(type, dims.clone(), null, d);
        }
        return new TensorValues(type, dims.clone(), values.clone(), null);
    }

    public static TensorValues ofDoubles(ElemType type, long[] dims, double[] values) {
        if (!type.isFloat()) {
            long[] l = new long[values.length];
            for (int i = 0; i < values.length; i++) {
                l[i] = (long) values[i];
            }
            return new TensorValues(type, dims.clone(), l, null);
        }
        return new TensorValues(type, dims.clone(), null, values.clone());
    }

    /** A 1-D int64 tensor. */
    public static TensorValues vector(long... values) {
        return new TensorValues(ElemType.INT64, new long[] {values.length}, values.clone(), null);
    }

    /** A scalar of the given type. */
    public static TensorValues scalar(ElemType type, double value) {
        return ofDoubles(type, new long[0], new double[] {value});
    }

    public ElemType type() {
        return type;
    }

    public long[] dims() {
        return dims.clone();
    }

    public int rank() {
        return dims.length;
    }

    public int size() {
        return ints != null ? ints.length : reals.length;
    }

    public boolean isFloat() {
        return reals != null;
    }

    public long longAt(int i) {
        return ints != null ? ints[i] : (long) reals[i];
    }

    public double doubleAt(int i) {
        return ints != null ? ints[i] : reals[i];
    }

    /** All values as longs (floating-point values are truncated toward zero). */
    public long[] longs() {
        if (ints != null) {
            return ints.clone();
        }
        long[] l = new long[reals.length];
        for (int i = 0; i < l.length; i++) {
            l[i] = (long) reals[i];
        }
        return l;
    }

    public double[] doubles() {
        if (reals != null) {
            return reals.clone();
        }
        double[] d = new double[ints.length];
        for (int i = 0; i < d.length; i++) {
            d[i] = ints[i];
        }
        return d;
    }

    /** The same values under new dims (same element count). */
    public TensorValues reshape(long[] newDims) {
        return new TensorValues(type, newDims.clone(), ints, reals);
    }

    @Override
    public boolean equals(Object o) {
        if (!(o instanceof TensorValues)) {
            return false;
        }
        TensorValues t = (TensorValues) o;
        return type == t.type && Arrays.equals(dims, t.dims) && Arrays.equals(ints, t.ints)
                && Arrays.equals(reals, t.reals);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(dims) * 31 + (ints != null ? Arrays.hashCode(ints) : Arrays.hashCode(reals));
    }

    @Override
    public String toString() {
        return type.label + Arrays.toString(dims) + "=" + (ints != null ? Arrays.toString(ints) : Arrays.toString(reals));
    }
}
