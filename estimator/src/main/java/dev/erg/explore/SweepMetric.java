package dev.erg.explore;

import dev.erg.budget.Budget;
import dev.erg.budget.BudgetRules;
import dev.erg.estimate.DeviceEstimate;

/** A metric a sweep records at every point and fits a polynomial to. */
public enum SweepMetric {
    MACS("macs", "MACs", "MACs", true),
    WEIGHT_BYTES("weightBytes", "weight bytes", "B", true),
    ACTIVATION_BYTES("activationBytes", "peak activation bytes", "B", true),
    LATENCY("latencyMs", "latency", "ms", false),
    ENERGY_PER_FRAME("energyPerFrameUj", "energy per frame", "µJ", false),
    POWER("powerMw", "average power", "mW", false);

    /** The key in JSON. */
    public final String key;
    public final String label;
    public final String unit;
    /** Whether the metric is a whole number (fitted exactly) or a floating one (fitted within a tolerance). */
    public final boolean integer;

    SweepMetric(String key, String label, String unit, boolean integer) {
        this.key = key;
        this.label = label;
        this.unit = unit;
        this.integer = integer;
    }

    /** The metric of an estimate; power at the budget's target frame rate (without one, back to back). */
    public double of(DeviceEstimate e, Budget budget) {
        switch (this) {
            case MACS:
                return e.workload().macs();
            case WEIGHT_BYTES:
                return e.weightBytes();
            case ACTIVATION_BYTES:
                return e.activationPeakBytes();
            case LATENCY:
                return e.latencySeconds() * 1e3;
            case ENERGY_PER_FRAME:
                return e.energyPerFrameJoules() * 1e6;
            default:
                return e.averagePowerWatts(BudgetRules.fps(budget, e)) * 1e3;
        }
    }

    /** The metric a budget limit is computed from (frame rate from latency), or null for an unknown key. */
    public static SweepMetric forLimit(String key) {
        switch (key) {
            case BudgetRules.TARGET_FPS:
            case BudgetRules.MAX_LATENCY_MS:
                return LATENCY;
            case BudgetRules.MAX_POWER_MW:
                return POWER;
            case BudgetRules.MAX_ENERGY_PER_FRAME_UJ:
                return ENERGY_PER_FRAME;
            case BudgetRules.MAX_WEIGHT_KIB:
                return WEIGHT_BYTES;
            case BudgetRules.MAX_ACTIVATION_KIB:
                return ACTIVATION_BYTES;
            default:
                return null;
        }
    }

    /** A limit's value in its display unit from this metric's value (fps from ms, KiB from bytes). */
    public static double limitValue(String key, double metric) {
        switch (key) {
            case BudgetRules.TARGET_FPS:
                return metric == 0 ? Double.POSITIVE_INFINITY : 1e3 / metric;
            case BudgetRules.MAX_WEIGHT_KIB:
            case BudgetRules.MAX_ACTIVATION_KIB:
                return metric / 1024.0;
            default:
                return metric;
        }
    }
}
