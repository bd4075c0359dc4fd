package dev.erg.maven;

/**
 * The {@code <budget>} element of the plugin configuration: every limit is optional and holds for
 * every model on every device.
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
}
