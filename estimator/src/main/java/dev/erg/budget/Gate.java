package dev.erg.budget;

import dev.erg.estimate.DeviceEstimate;
import dev.erg.workload.ModelWorkload;
import java.util.ArrayList;
import java.util.List;

/**
 * Evaluates one model on one device against its budget, the baseline and the policies, collecting
 * every check (passed or not) before anything fails. The limits themselves are the rows of
 * {@link BudgetRules} and {@link GrowthRules}.
 */
public final class Gate {
    /** The policy that every node of a model has a rule (the {@code modelled} policy check). */
    public static final String MODELLED = "modelled";

    private Gate() {
    }

    /** The pair's checks against the budget and, with a baseline and an allowed growth, the growth checks. */
    public static PairResult evaluatePair(String model, String device, DeviceEstimate e, Budget budget,
                                          Baseline baseline, Double maxGrowthPercent) {
        return evaluatePair(model, device, e, budget, baseline, maxGrowthPercent, false);
    }

    /**
     * As above; with {@code requireModelled}, a model with a node that has no rule (or is unresolved
     * downstream of one) fails the {@value #MODELLED} policy check, listed with the others.
     */
    public static PairResult evaluatePair(String model, String device, DeviceEstimate e, Budget budget,
                                          Baseline baseline, Double maxGrowthPercent, boolean requireModelled) {
        return evaluatePair(model, device, e, budget, baseline, maxGrowthPercent, requireModelled, false);
    }

    /**
     * As above; with {@code failWhenAtRisk}, a budget check whose limit lies inside the calibrated
     * profile's error band fails instead of passing with a warning.
     */
    public static PairResult evaluatePair(String model, String device, DeviceEstimate e, Budget budget,
                                          Baseline baseline, Double maxGrowthPercent, boolean requireModelled,
                                          boolean failWhenAtRisk) {
        String who = model + " on " + device;
        List<Check> checks = new ArrayList<>();
        if (requireModelled) {
            checks.add(modelled(who, e.workload()));
        }
        if (!e.energyKnown()) {
            for (String key : new String[] {"maxPowerMw", "maxEnergyPerFrameUj"}) {
                if (budget.limits().containsKey(key)) {
                    throw new dev.erg.error.BadInputException(who + ": the device profile gives no energies, so a "
                            + (key.equals("maxPowerMw") ? "power" : "energy-per-frame")
                            + " budget cannot be checked on it (leave the limit out for this device, or use a"
                            + " profile with energies)");
                }
            }
        }
        checks.addAll(BudgetRules.check(who, e, budget, 0, failWhenAtRisk));
        Baseline.Entry base = baseline == null ? null : baseline.entry(model, device);
        List<LayerDiff> diff = base == null ? List.of() : Baseline.diff(base, e);
        if (base != null && maxGrowthPercent != null) {
            checks.addAll(GrowthRules.check(who, e, base, maxGrowthPercent, diff));
        }
        return new PairResult(model, device, e, BudgetRules.fps(budget, e), budget, checks, diff, base != null);
    }

    /** The {@value #MODELLED} policy: every node has a rule. */
    static Check modelled(String who, ModelWorkload w) {
        if (w.complete()) {
            return Check.policy(MODELLED, true, who + ": every node is modelled");
        }
        String inc = w.incompleteness();
        String marker = "the analysis is incomplete:";
        int at = inc.indexOf(marker);
        String detail = at < 0 ? inc : inc.substring(at);
        return Check.policy(MODELLED, false, who + ": " + detail + "; the policy requires every node to be modelled");
    }

    /** The result of a run: every pair, in order. */
    public static GateResult result(List<PairResult> pairs, Budget budget, Double maxGrowthPercent,
                                    String baselineFile, boolean baselineFound, List<String> notes) {
        return new GateResult(pairs, budget, maxGrowthPercent, baselineFile, baselineFound, notes);
    }
}
