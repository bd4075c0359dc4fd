package dev.erg.onnx;

import java.util.Arrays;

/** Growable lists of primitives, without boxing, for the values a tensor or attribute carries. */
final class PrimitiveLists {
    private PrimitiveLists() {
    }

    /** A growable list of longs without boxing. */
    static final class LongList {
        private long[] a = new long[8];
        private int n;

        void add(long v) {
            if (n == a.length) {
                a = Arrays.copyOf(a, n * 2);
            }
            a[n++] = v;
        }

        int size() {
            return n;
        }

        long[] toArray() {
            return Arrays.copyOf(a, n);
        }
    }

    static final class DoubleList {
        private double[] a = new double[8];
        private int n;

        void add(double v) {
            if (n == a.length) {
                a = Arrays.copyOf(a, n * 2);
            }
            a[n++] = v;
        }

        int size() {
            return n;
        }

        double[] toArray() {
            return Arrays.copyOf(a, n);
        }
    }

    static final class FloatList {
        private float[] a = new float[8];
        private int n;

        void add(float v) {
            if (n == a.length) {
                a = Arrays.copyOf(a, n * 2);
            }
            a[n++] = v;
        }

        float[] toArray() {
            return Arrays.copyOf(a, n);
        }
    }
}
