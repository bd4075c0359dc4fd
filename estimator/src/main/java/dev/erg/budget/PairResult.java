package dev.erg.budget;

import dev.erg.estimate.DeviceEstimate;
import dev.erg.workload.ModelWorkload;
import java.util.List;

/** One model on one device: the estimate, every check, and the per-layer diff against the baseline. */
public final class PairResult {
    private final String model;
    private final String device;
    private final DeviceEstimate estimate;
    private final double fps;
    private final Budget budget;
    private final List<Check> checks;
    private final List<LayerDiff> diff;
    private final boolean hasBaseline;

    PairResult(String model, String device, DeviceEstimate estimate, double fps, Budget budget, List<Check> checks,
               List<LayerDiff> diff, boolean hasBaseline) {
        this.budget = budget;
        this.model = model;
        this.device = device;
        this.estimate = estimate;
        this.fps = fps;
        this.checks = List.copyOf(checks);
        this.diff = List.copyOf(diff);
        this.hasBaseline = hasBaseline;
    }

    /** The model as configured (its path as the user wrote it). */
    public String model() {
        return model;
    }

    /** The device as configured ("preset:ID" or the profile path). */
    public String device() {
        return device;
    }

    public DeviceEstimate estimate() {
        return estimate;
    }

    public ModelWorkload workload() {
        return estimate.workload();
    }

    /** The frame rate that power is taken at: the target, or back to back without one. */
    public double fps() {
        return fps;
    }

    /** The budget this pair was held to: its model's and device's limits over the run's. */
    public Budget budget() {
        return budget;
    }

    public List<Check> checks() {
        return checks;
    }

    /** True unless some check failed. */
    public boolean passed() {
        return checks.stream().allMatch(Check::passed);
    }

    /** The worst verdict of the checks; PASS when there is none. */
    public Verdict verdict() {
        Verdict v = Verdict.PASS;
        for (Check c : checks) {
            v = v.and(c.verdict());
        }
        return v;
    }

    /** Layers added, removed or changed since the baseline (empty without one). */
    public List<LayerDiff> diff() {
        return diff;
    }

    /** True when the baseline has an entry for this model and device. */
    public boolean hasBaseline() {
        return hasBaseline;
    }
}
