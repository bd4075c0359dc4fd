package dev.erg.calibrate;

import java.util.Arrays;
import java.util.List;

/**
 * The spread of relative errors (predicted / measured - 1) over a set of values.
 *
 * @param count  how many values
 * @param median the median of the absolute relative errors
 * @param worst  the largest absolute relative error
 * @param low    the most negative relative error (0 when none is negative)
 * @param high   the most positive relative error (0 when none is positive)
 */
public record ErrorSummary(int count, double median, double worst, double low, double high) {
    public static final ErrorSummary NONE = new ErrorSummary(0, Double.NaN, Double.NaN, 0, 0);

    /** The summary of {@code errors}, relative errors with their sign. */
    public static ErrorSummary of(List<Double> errors) {
        if (errors.isEmpty()) {
            return NONE;
        }
        double[] abs = new double[errors.size()];
        double low = 0;
        double high = 0;
        for (int i = 0; i < abs.length; i++) {
            double e = errors.get(i);
            abs[i] = Math.abs(e);
            low = Math.min(low, e);
            high = Math.max(high, e);
        }
        Arrays.sort(abs);
        int n = abs.length;
        double median = n % 2 == 1 ? abs[n / 2] : (abs[n / 2 - 1] + abs[n / 2]) / 2;
        return new ErrorSummary(n, median, abs[n - 1], low, high);
    }
}
