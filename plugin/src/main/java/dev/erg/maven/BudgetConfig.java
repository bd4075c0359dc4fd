package dev.erg.maven;

import dev.erg.budget.Budget;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * A {@code <budget>} element of the plugin configuration: every limit is optional. The plugin's
 * {@code <budget>} holds for every model on every device; one inside a {@code <model>} or a
 * {@code <deviceBudget>} overrides it limit by limit. The element names are the keys of the library's
 * budget rules.
 */
public class BudgetConfig {
    /** Minimum frames per second; average power is taken at this rate. */
    private Double targetFps;
    /** Maximum average power in milliwatts at the target frame rate. */
    private Double maxPowerMw;
    /** Maximum energy per frame in microjoules. */
    private Double maxEnergyPerFrameUj;
    /** Maximum latency of one frame in milliseconds. */
    private Double maxLatencyMs;
    /** Maximum weight bytes, in KiB. */
    private Double maxWeightKib;
    /** Maximum peak activation bytes, in KiB. */
    private Double maxActivationKib;

    public Double getTargetFps() {
        return targetFps;
    }

    public void setTargetFps(Double targetFps) {
        this.targetFps = targetFps;
    }

    public Double getMaxPowerMw() {
        return maxPowerMw;
    }

    public void setMaxPowerMw(Double maxPowerMw) {
        this.maxPowerMw = maxPowerMw;
    }

    public Double getMaxEnergyPerFrameUj() {
        return maxEnergyPerFrameUj;
    }

    public void setMaxEnergyPerFrameUj(Double maxEnergyPerFrameUj) {
        this.maxEnergyPerFrameUj = maxEnergyPerFrameUj;
    }

    public Double getMaxLatencyMs() {
        return maxLatencyMs;
    }

    public void setMaxLatencyMs(Double maxLatencyMs) {
        this.maxLatencyMs = maxLatencyMs;
    }

    public Double getMaxWeightKib() {
        return maxWeightKib;
    }

    public void setMaxWeightKib(Double maxWeightKib) {
        this.maxWeightKib = maxWeightKib;
    }

    public Double getMaxActivationKib() {
        return maxActivationKib;
    }

    public void setMaxActivationKib(Double maxActivationKib) {
        this.maxActivationKib = maxActivationKib;
    }

    /** The limits by key, unset ones as null, in the order of the elements. */
    Map<String, Double> limits() {
        Map<String, Double> m = new LinkedHashMap<>();
        m.put("targetFps", targetFps);
        m.put("maxPowerMw", maxPowerMw);
        m.put("maxEnergyPerFrameUj", maxEnergyPerFrameUj);
        m.put("maxLatencyMs", maxLatencyMs);
        m.put("maxWeightKib", maxWeightKib);
        m.put("maxActivationKib", maxActivationKib);
        return m;
    }

    /** The library's budget; a bad limit is the library's one-line message naming {@code where}. */
    Budget toBudget(String where) {
        Budget.Builder b = Budget.builder(where);
        for (Map.Entry<String, Double> e : limits().entrySet()) {
            b.limit(e.getKey(), e.getValue());
        }
        return b.build();
    }
}
