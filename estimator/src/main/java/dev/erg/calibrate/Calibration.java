package dev.erg.calibrate;

import java.util.Collections;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;

/**
 * The result of a fit: the correction factors, every measured value next to its prediction before
 * and after, the error of the fit, and the leave-one-model-out error when at least three models
 * were measured. The factors apply to any node through {@link #latencySeconds(NodeCost)} and
 * {@link #energyJoules(NodeCost)}.
 */
public final class Calibration {
    private final EnumMap<Factor, FactorValue> factors;
    private final List<Residual> residuals;
    private final Map<Factor.Metric, ErrorSummary> before;
    private final Map<Factor.Metric, ErrorSummary> after;
    private final Map<String, ErrorSummary> leaveOneOut;
    private final ErrorSummary leaveOneOutAll;
    private final List<String> notes;
    private final List<MeasurementFile> files;

    Calibration(EnumMap<Factor, FactorValue> factors, List<Residual> residuals,
                Map<Factor.Metric, ErrorSummary> before, Map<Factor.Metric, ErrorSummary> after,
                Map<String, ErrorSummary> leaveOneOut, ErrorSummary leaveOneOutAll, List<String> notes,
                List<MeasurementFile> files) {
        this.factors = new EnumMap<>(factors);
        this.residuals = List.copyOf(residuals);
        this.before = Collections.unmodifiableMap(new EnumMap<>(before));
        this.after = Collections.unmodifiableMap(new EnumMap<>(after));
        this.leaveOneOut = leaveOneOut == null ? null : Collections.unmodifiableMap(new java.util.TreeMap<>(leaveOneOut));
        this.leaveOneOutAll = leaveOneOutAll;
        this.notes = List.copyOf(notes);
        this.files = List.copyOf(files);
    }

    /** Every factor, fitted or kept, in the order of {@link Factor}. */
    public Map<Factor, FactorValue> factors() {
        return Collections.unmodifiableMap(factors);
    }

    public FactorValue factor(Factor f) {
        return factors.get(f);
    }

    /** Every measured value used by the fit, in file order. */
    public List<Residual> residuals() {
        return residuals;
    }

    /** The error with the profile as given, per metric (only metrics that were measured). */
    public Map<Factor.Metric, ErrorSummary> errorBefore() {
        return before;
    }

    /** The error of the fit, per metric (only metrics that were measured). */
    public Map<Factor.Metric, ErrorSummary> errorAfter() {
        return after;
    }

    /**
     * Per model, the error of its values predicted by a fit on the other models only; null when fewer
     * than three models were measured.
     */
    public Map<String, ErrorSummary> leaveOneModelOut() {
        return leaveOneOut;
    }

    /** The leave-one-model-out error over every held-out value, or null with fewer than three models. */
    public ErrorSummary leaveOneModelOutAll() {
        return leaveOneOutAll;
    }

    /** What the fit left out or kept, one sentence each. */
    public List<String> notes() {
        return notes;
    }

    /** The measurement files the fit read (with their SHA-256). */
    public List<MeasurementFile> files() {
        return files;
    }

    /** The calibrated latency of a node. */
    public double latencySeconds(NodeCost n) {
        return Calibrator.latency(n, values(), factors.get(Factor.LAYER_OVERHEAD).fitted());
    }

    /** The calibrated energy of a node, static energy over its calibrated latency included. */
    public double energyJoules(NodeCost n) {
        return Calibrator.energy(n, values(), latencySeconds(n));
    }

    double[] values() {
        double[] v = new double[Factor.values().length];
        for (FactorValue f : factors.values()) {
            v[f.factor().ordinal()] = f.value();
        }
        return v;
    }
}
