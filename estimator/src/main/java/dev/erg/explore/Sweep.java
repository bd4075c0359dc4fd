package dev.erg.explore;

import dev.erg.budget.Budget;
import dev.erg.format.Numbers;
import java.util.ArrayList;
import java.util.Collections;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;

/**
 * The outcome of a sweep of one model on one device: every point, the fitted polynomial of each
 * metric (absent when none of low degree is exact), the ranges where each budget limit breaks, and the
 * largest (or smallest) value that meets every limit.
 *
 * @param model      the model's label
 * @param device     the device's id
 * @param range      the swept values
 * @param budget     the limits checked at every point
 * @param points     every swept value, ascending
 * @param fits       each metric's polynomial; a metric without one is absent
 * @param breaks     one sentence per broken limit, naming the range where it breaks
 * @param best       the value found, or null (no point passes, or passing points are not one run)
 * @param bestPoint  the final estimate at {@code best} (null without one)
 * @param bestText   one sentence about {@code best}: which end, how it was found, or why there is none
 */
public record Sweep(String model, String device, SweepRange range, Budget budget, List<SweepPoint> points,
                    Map<SweepMetric, Polynomial> fits, List<String> breaks, Long best, SweepPoint bestPoint,
                    String bestText) {
    public Sweep {
        points = List.copyOf(points);
        fits = Collections.unmodifiableMap(new EnumMap<>(fits.isEmpty() ? new EnumMap<>(SweepMetric.class) : fits));
        breaks = List.copyOf(breaks);
    }

    /** True when every point meets every limit. */
    public boolean passed() {
        for (SweepPoint p : points) {
            if (!p.passed()) {
                return false;
            }
        }
        return true;
    }

    /** The fitted formula of a metric, or a sentence saying there is none. */
    public String formula(SweepMetric m) {
        Polynomial p = fits.get(m);
        return p == null ? "no polynomial of degree " + Math.min(points.size() - 2, Polynomial.MAX_DEGREE)
                + " or below is exact on the points"
                : p.formula(range.name(), m.integer);
    }

    /** The lines the console prints: heading, fits, broken ranges, the value found. */
    public List<String> lines() {
        List<String> out = new ArrayList<>();
        out.add("sweep of " + range.name() + " over " + range.from() + ".." + range.to() + " (" + points.size()
                + " points), " + model + " on " + device + ":");
        for (SweepMetric m : SweepMetric.values()) {
            Polynomial p = fits.get(m);
            out.add("  " + m.label + " (" + m.unit + ")" + (p == null ? ": " : ", degree " + p.degree() + ": ")
                    + formula(m));
        }
        for (String b : breaks) {
            out.add("  " + b);
        }
        out.add("  " + bestText);
        return out;
    }

    /** "seq = 1,536". */
    String at(long v) {
        return range.name() + " = " + Numbers.exact(v);
    }
}
