package dev.erg.budget;

import dev.erg.error.BadInputException;

/**
 * The limits one model must hold on every target device. Every limit is optional. Power is taken
 * at the target frame rate (or, without one, with frames running back to back).
 */
public final class Budget {
    private final Double targetFps;
    private final Double maxPowerMw;
    private final Double maxEnergyPerFrameUj;
    private final Double maxLatencyMs;
    private final Double maxWeightKib;
    private final Double maxActivationKib;

    private Budget(Builder b) {
        this.targetFps = b.targetFps;
        this.maxPowerMw = b.maxPowerMw;
        this.maxEnergyPerFrameUj = b.maxEnergyPerFrameUj;
        this.maxLatencyMs = b.maxLatencyMs;
        this.maxWeightKib = b.maxWeightKib;
        this.maxActivationKib = b.maxActivationKib;
    }

    public static Builder builder() {
        return new Builder();
    }

    public static Budget none() {
        return new Builder().build();
    }

    public Double targetFps() {
        return targetFps;
    }

    public Double maxPowerMw() {
        return maxPowerMw;
    }

    public Double maxEnergyPerFrameUj() {
        return maxEnergyPerFrameUj;
    }

    public Double maxLatencyMs() {
        return maxLatencyMs;
    }

    public Double maxWeightKib() {
        return maxWeightKib;
    }

    public Double maxActivationKib() {
        return maxActivationKib;
    }

    public boolean isEmpty() {
        return targetFps == null && maxPowerMw == null && maxEnergyPerFrameUj == null && maxLatencyMs == null
                && maxWeightKib == null && maxActivationKib == null;
    }

    /** Builds a budget; each limit, when set, must be a finite number greater than zero. */
    public static final class Builder {
        private Double targetFps;
        private Double maxPowerMw;
        private Double maxEnergyPerFrameUj;
        private Double maxLatencyMs;
        private Double maxWeightKib;
        private Double maxActivationKib;

        private static Double check(String key, Double v) {
            if (v != null && (!(v > 0) || v.isInfinite())) {
                throw new BadInputException("budget " + key + ": must be a number greater than 0 (got " + v + ")");
            }
            return v;
        }

        public Builder targetFps(Double v) {
            targetFps = check("targetFps", v);
            return this;
        }

        public Builder maxPowerMw(Double v) {
            maxPowerMw = check("maxPowerMw", v);
            return this;
        }

        public Builder maxEnergyPerFrameUj(Double v) {
            maxEnergyPerFrameUj = check("maxEnergyPerFrameUj", v);
            return this;
        }

        public Builder maxLatencyMs(Double v) {
            maxLatencyMs = check("maxLatencyMs", v);
            return this;
        }

        public Builder maxWeightKib(Double v) {
            maxWeightKib = check("maxWeightKib", v);
            return this;
        }

        public Builder maxActivationKib(Double v) {
            maxActivationKib = check("maxActivationKib", v);
            return this;
        }

        public Budget build() {
            return new Budget(this);
        }
    }
}
