package dev.erg.measure;

import java.util.Arrays;

/** Order statistics of timing samples. */
final class Stats {
    private Stats() {
    }

    /** The median (the mean of the two middle values for an even count); NaN when empty. */
    static double median(double[] xs) {
        if (xs.length == 0) {
            return Double.NaN;
        }
        double[] s = xs.clone();
        Arrays.sort(s);
        int n = s.length;
        return n % 2 == 1 ? s[n / 2] : (s[n / 2 - 1] + s[n / 2]) / 2;
    }

    /**
     * The {@code q} quantile by the nearest-rank method: the smallest sample with at least {@code q}
     * of the samples at or below it. NaN when empty.
     */
    static double quantile(double[] xs, double q) {
        if (xs.length == 0) {
            return Double.NaN;
        }
        double[] s = xs.clone();
        Arrays.sort(s);
        int rank = (int) Math.ceil(q * s.length);
        return s[Math.max(0, Math.min(s.length - 1, rank - 1))];
    }
}
