package dev.erg.budget;

import dev.erg.error.BadInputException;
import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

/**
 * The limits a model must hold on a device, by key ({@code targetFps}, {@code maxPowerMw},
 * {@code maxEnergyPerFrameUj}, {@code maxLatencyMs}, {@code maxWeightKib}, {@code maxActivationKib}:
 * the keys of {@link BudgetRules#RULES}). Every limit is optional. Power is taken at the target frame
 * rate (or, without one, with frames running back to back).
 *
 * <p>Budgets stack: {@link #over(Budget)} lets a more specific budget (one model's, one device's)
 * set some limits and take the rest from a wider one.
 */
public final class Budget {
    private static final Budget NONE = new Budget(new TreeMap<>());

    private final Map<String, Double> limits;

    private Budget(Map<String, Double> limits) {
        this.limits = Collections.unmodifiableMap(limits);
    }

    public static Builder builder() {
        return new Builder("budget");
    }

    /** A builder whose messages name {@code where} (e.g. "budget of models[1]") instead of "budget". */
    public static Builder builder(String where) {
        return new Builder(where);
    }

    public static Budget none() {
        return NONE;
    }

    /** The limit of {@code key} (a {@link BudgetRule#key()}), or null when it is not set. */
    public Double limit(String key) {
        return limits.get(key);
    }

    /** Every limit set, by key, sorted. */
    public Map<String, Double> limits() {
        return limits;
    }

    /** This budget's limits, and for each limit it does not set, the one {@code wider} sets. */
    public Budget over(Budget wider) {
        if (wider == null || wider.isEmpty()) {
            return this;
        }
        Map<String, Double> m = new TreeMap<>(wider.limits);
        m.putAll(limits);
        return new Budget(m);
    }

    public Double targetFps() {
        return limits.get(BudgetRules.TARGET_FPS);
    }

    public Double maxPowerMw() {
        return limits.get(BudgetRules.MAX_POWER_MW);
    }

    public Double maxEnergyPerFrameUj() {
        return limits.get(BudgetRules.MAX_ENERGY_PER_FRAME_UJ);
    }

    public Double maxLatencyMs() {
        return limits.get(BudgetRules.MAX_LATENCY_MS);
    }

    public Double maxWeightKib() {
        return limits.get(BudgetRules.MAX_WEIGHT_KIB);
    }

    public Double maxActivationKib() {
        return limits.get(BudgetRules.MAX_ACTIVATION_KIB);
    }

    public boolean isEmpty() {
        return limits.isEmpty();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Budget && ((Budget) o).limits.equals(limits);
    }

    @Override
    public int hashCode() {
        return limits.hashCode();
    }

    @Override
    public String toString() {
        return limits.toString();
    }

    /** Builds a budget; each limit, when set, must be a finite number greater than zero. */
    public static final class Builder {
        private final String where;
        private final Map<String, Double> limits = new TreeMap<>();

        private Builder(String where) {
            this.where = where;
        }

        /**
         * Sets the limit {@code key}; null leaves it unset. An unknown key or a value that is not a
         * finite number greater than zero is a one-line error naming both.
         */
        public Builder limit(String key, Double v) {
            if (BudgetRules.rule(key) == null) {
                throw new BadInputException(where + ": unknown limit '" + key + "' (known: "
                        + String.join(", ", BudgetRules.keys()) + ")");
            }
            if (v == null) {
                limits.remove(key);
                return this;
            }
            if (!(v > 0) || v.isInfinite()) {
                throw new BadInputException(where + " " + key + ": must be a number greater than 0 (got " + v + ")");
            }
            limits.put(key, v);
            return this;
        }

        public Builder targetFps(Double v) {
            return limit(BudgetRules.TARGET_FPS, v);
        }

        public Builder maxPowerMw(Double v) {
            return limit(BudgetRules.MAX_POWER_MW, v);
        }

        public Builder maxEnergyPerFrameUj(Double v) {
            return limit(BudgetRules.MAX_ENERGY_PER_FRAME_UJ, v);
        }

        public Builder maxLatencyMs(Double v) {
            return limit(BudgetRules.MAX_LATENCY_MS, v);
        }

        public Builder maxWeightKib(Double v) {
            return limit(BudgetRules.MAX_WEIGHT_KIB, v);
        }

        public Builder maxActivationKib(Double v) {
            return limit(BudgetRules.MAX_ACTIVATION_KIB, v);
        }

        public Budget build() {
            return limits.isEmpty() ? NONE : new Budget(new TreeMap<>(limits));
        }
    }
}
