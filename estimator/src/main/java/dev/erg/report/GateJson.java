package dev.erg.report;

import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;

/**
 * The JSON report of one model x device pair: the {@link EstimateJson} document (the analysis,
 * extended with the estimate per node and in the totals, the device and the assumptions), then the
 * gate's fields:
 *
 * <pre>
 *   "budget":   { "targetFps", "maxPowerMw", "maxEnergyPerFrameUj", "maxLatencyMs", "maxWeightKib",
 *                 "maxActivationKib" }                       (null when not set)
 *   "baseline": { "file", "found", "hasEntry", "maxGrowthPercent" }
 *   "checks":   [ { "kind", "metric", "unit", "value", "limit", "baseline" (growth only), "passed",
 *                   "message", "topLayers": [ { "name", "opType", "value", "share" } ] } ]
 *   "diff":     [ { "name", "opType", "change", "macsDelta", "energyDeltaJoules", "latencyDeltaSeconds" } ]
 *   "passed":   true | false
 * </pre>
 *
 * <p>Check values and limits are in the metric's display unit ({@code unit}: fps, mW, µJ, ms, KiB,
 * MACs), as in the check's message; everything else is in SI units.
 */
public final class GateJson {
    private GateJson() {
    }

    public static byte[] toBytes(GateResult result, PairResult p) {
        return EstimateJson.bytes(Figures.of(p), result);
    }
}
