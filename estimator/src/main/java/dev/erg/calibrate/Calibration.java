package dev.erg.calibrate;

import java.util.ArrayList;
import java.util.Collections;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * The result of a fit: the correction factors, every measured value next to its prediction before
 * and after, and, when at least three models were measured, every value predicted by a fit on the
 * other models only (leave one model out). The factors apply to any node through
 * {@link #latencySeconds(NodeCost)} and {@link #energyJoules(NodeCost)}.
 */
public final class Calibration {
    /** Which measured values an error summary covers. */
    public enum Scope {
        /** Whole-model values. */
        MODELS,
        /** Node values. */
        LAYERS,
        /** Both. */
        ALL;

        boolean covers(Residual r) {
            return this == ALL || (this == MODELS) == (r.node() == null);
        }
    }

    private final EnumMap<Factor, FactorValue> factors;
    private final List<Residual> residuals;
    private final List<Residual> heldOut;
    private final List<String> notes;
    private final List<MeasurementFile> files;

    Calibration(EnumMap<Factor, FactorValue> factors, List<Residual> residuals, List<Residual> heldOut,
                List<String> notes, List<MeasurementFile> files) {
        this.factors = new EnumMap<>(factors);
        this.residuals = List.copyOf(residuals);
        this.heldOut = heldOut == null ? null : List.copyOf(heldOut);
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

    /** Every measured value the fit used, in file order: measured, predicted before and after the fit. */
    public List<Residual> residuals() {
        return residuals;
    }

    /**
     * Every measured value predicted by a fit on the other models only ({@code after}), in model
     * order; null when fewer than three models were measured.
     */
    public List<Residual> heldOut() {
        return heldOut;
    }

    /** The error with the profile as given. */
    public ErrorSummary errorBefore(Factor.Metric metric, Scope scope) {
        return summary(residuals, metric, scope, false);
    }

    /** The error of the fit on the values it was fitted to. */
    public ErrorSummary errorAfter(Factor.Metric metric, Scope scope) {
        return summary(residuals, metric, scope, true);
    }

    /** The leave-one-model-out error, or null with fewer than three models. */
    public ErrorSummary leaveOneModelOut(Factor.Metric metric, Scope scope) {
        return heldOut == null ? null : summary(heldOut, metric, scope, true);
    }

    /** Per held-out model, the error of its values; null with fewer than three models. */
    public Map<String, ErrorSummary> leaveOneModelOutByModel(Factor.Metric metric, Scope scope) {
        if (heldOut == null) {
            return null;
        }
        Map<String, List<Residual>> by = new TreeMap<>();
        for (Residual r : heldOut) {
            by.computeIfAbsent(r.model(), k -> new ArrayList<>()).add(r);
        }
        Map<String, ErrorSummary> out = new TreeMap<>();
        by.forEach((k, v) -> {
            ErrorSummary s = summary(v, metric, scope, true);
            if (s.count() > 0) {
                out.put(k, s);
            }
        });
        return out;
    }

    private static ErrorSummary summary(List<Residual> rs, Factor.Metric metric, Scope scope, boolean after) {
        List<Double> e = new ArrayList<>();
        for (Residual r : rs) {
            if (r.metric() == metric && scope.covers(r)) {
                e.add(after ? r.errorAfter() : r.errorBefore());
            }
        }
        return ErrorSummary.of(e);
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
