package dev.erg.budget;

import java.util.List;

/**
 * One limit tested on one model and device: a budget limit, or the allowed growth of a metric over
 * the baseline. Passing checks are kept too, so that CI reports list every limit as a test case.
 */
public final class Check {
    /** Where the limit comes from. */
    public enum Kind {
        BUDGET("budget"), GROWTH("baseline");

        public final String label;

        Kind(String label) {
            this.label = label;
        }
    }

    private final Kind kind;
    private final Metric metric;
    private final double value;
    private final double limit;
    private final double baseline;
    private final boolean passed;
    private final List<LayerShare> topLayers;
    private final String message;

    public Check(Kind kind, Metric metric, double value, double limit, double baseline, boolean passed,
                 List<LayerShare> topLayers, String message) {
        this.kind = kind;
        this.metric = metric;
        this.value = value;
        this.limit = limit;
        this.baseline = baseline;
        this.passed = passed;
        this.topLayers = List.copyOf(topLayers);
        this.message = message;
    }

    public Kind kind() {
        return kind;
    }

    public Metric metric() {
        return metric;
    }

    /** The value in the metric's display unit (fps, mW, µJ, ms, KiB, MACs). */
    public double value() {
        return value;
    }

    /** The limit in the metric's display unit; for growth, the baseline value times (1 + allowed growth). */
    public double limit() {
        return limit;
    }

    /** For growth: the baseline value in display units; NaN for a budget check. */
    public double baseline() {
        return baseline;
    }

    public boolean passed() {
        return passed;
    }

    /** The three layers that contribute most (for growth: that grew most). */
    public List<LayerShare> topLayers() {
        return topLayers;
    }

    /** One line that says what was tested and how it came out; produced here, shown verbatim by every front end. */
    public String message() {
        return message;
    }
}
