package dev.erg.budget;

import java.util.List;

/**
 * One limit tested on one model and device: a budget limit, the allowed growth of a metric over the
 * baseline, or a policy (such as "every operator is modelled"). Passing checks are kept too, so that
 * CI reports list every limit as a test case.
 */
public final class Check {
    /** Where the limit comes from. */
    public enum Kind {
        BUDGET("budget"), GROWTH("growth"), POLICY("policy");

        /** The name in reports: the first part of a check's {@link #key()}, the JUnit failure type. */
        public final String label;

        Kind(String label) {
            this.label = label;
        }
    }

    private final Kind kind;
    private final Metric metric;
    private final String subject;
    private final double value;
    private final double limit;
    private final double baseline;
    private final Verdict verdict;
    private final List<LayerShare> topLayers;
    private final String message;

    /** A check of a metric (budget or growth). */
    public Check(Kind kind, Metric metric, double value, double limit, double baseline, Verdict verdict,
                 List<LayerShare> topLayers, String message) {
        this(kind, metric, metric.key, value, limit, baseline, verdict, topLayers, message);
    }

    /** A policy check: {@code subject} names the policy; it has no value and no limit. */
    public static Check policy(String subject, boolean held, String message) {
        return new Check(Kind.POLICY, null, subject, Double.NaN, Double.NaN, Double.NaN,
                held ? Verdict.PASS : Verdict.FAIL, List.of(), message);
    }

    private Check(Kind kind, Metric metric, String subject, double value, double limit, double baseline,
                  Verdict verdict, List<LayerShare> topLayers, String message) {
        this.kind = kind;
        this.metric = metric;
        this.subject = subject;
        this.value = value;
        this.limit = limit;
        this.baseline = baseline;
        this.verdict = verdict;
        this.topLayers = List.copyOf(topLayers);
        this.message = message;
    }

    public Kind kind() {
        return kind;
    }

    /** The metric, or null for a policy check. */
    public Metric metric() {
        return metric;
    }

    /** The metric's key, or the policy's name. */
    public String subject() {
        return subject;
    }

    /** {@code KIND.SUBJECT}, e.g. {@code budget.frameRate}, {@code growth.macs}, {@code policy.modelled}. */
    public String key() {
        return kind.label + "." + subject;
    }

    /** The metric's display unit, or "" for a policy. */
    public String unit() {
        return metric == null ? "" : metric.unit;
    }

    /** The value in the metric's display unit (fps, mW, µJ, ms, KiB, MACs); NaN for a policy. */
    public double value() {
        return value;
    }

    /** The limit in the metric's display unit; for growth, the baseline value times (1 + allowed growth). */
    public double limit() {
        return limit;
    }

    /** For growth: the baseline value in display units; NaN otherwise. */
    public double baseline() {
        return baseline;
    }

    public Verdict verdict() {
        return verdict;
    }

    /** True unless the check failed (an at-risk check passes). */
    public boolean passed() {
        return verdict != Verdict.FAIL;
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
