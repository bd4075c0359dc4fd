package dev.erg.budget;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.estimate.Models;
import dev.erg.estimate.TestDevice;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * The budget rule table and the verdicts, on worked example 1 of docs/method.md (latency 74.72 µs,
 * frame energy 146.5056 nJ, static power 1 mW).
 */
class RulesTest {
    private static DeviceEstimate example() {
        return Estimator.estimate(Models.analyze(Models.conv(8, 10, 10, 16, 3, 1)), new TestDevice().build());
    }

    @Test
    void everyBudgetKeyIsOneRowAndEveryRowIsChecked() {
        assertEquals(List.of("targetFps", "maxPowerMw", "maxEnergyPerFrameUj", "maxLatencyMs", "maxWeightKib",
                "maxActivationKib"), BudgetRules.keys());
        Budget.Builder all = Budget.builder();
        for (String k : BudgetRules.keys()) {
            all.limit(k, 1e12);
        }
        List<Check> checks = BudgetRules.check("m on d", example(), all.build(), 0);
        List<Metric> metrics = new ArrayList<>();
        for (Check c : checks) {
            metrics.add(c.metric());
            assertEquals(Check.Kind.BUDGET, c.kind());
        }
        List<Metric> rows = new ArrayList<>();
        for (BudgetRule r : BudgetRules.RULES) {
            rows.add(r.metric());
        }
        assertEquals(rows, metrics, "one check per row, in table order");
        // The frame rate must reach its target; every other limit is a ceiling.
        assertFalse(checks.get(0).passed(), "13383 fps does not reach 1e12 fps");
        for (Check c : checks.subList(1, checks.size())) {
            assertTrue(c.passed(), c.message());
        }
    }

    @Test
    void budgetsStackLimitByLimit() {
        Budget run = Budget.builder().targetFps(4.0).maxPowerMw(25.0).build();
        Budget device = Budget.builder().maxPowerMw(15.0).build();
        Budget model = Budget.builder().maxLatencyMs(80.0).build();
        Budget pair = model.over(device.over(run));
        assertEquals(Map.of("targetFps", 4.0, "maxPowerMw", 15.0, "maxLatencyMs", 80.0), pair.limits());
        BadInputException e = assertThrows(BadInputException.class, () -> Budget.builder("x").limit("maxFoo", 1.0));
        assertEquals("x: unknown limit 'maxFoo' (known: targetFps, maxPowerMw, maxEnergyPerFrameUj, maxLatencyMs,"
                + " maxWeightKib, maxActivationKib)", e.getMessage());
    }

    /** A pass by less than the estimate's uncertainty is at risk: it is listed but does not fail. */
    @Test
    void atRiskIsAPassInsideTheUncertaintyBand() {
        assertEquals(Verdict.PASS, Verdict.of(90, 100, true, 0.05));
        assertEquals(Verdict.AT_RISK, Verdict.of(97, 100, true, 0.05)); // 97 x 1.05 = 101.85 > 100
        assertEquals(Verdict.FAIL, Verdict.of(101, 100, true, 0.05));
        assertEquals(Verdict.AT_RISK, Verdict.of(103, 100, false, 0.05)); // 103 x 0.95 = 97.85 < 100
        assertEquals(Verdict.PASS, Verdict.of(99.99, 100, true, 0), "no band, no risk");
        assertEquals(Verdict.FAIL, Verdict.AT_RISK.and(Verdict.FAIL));
        // On the example: latency 0.07472 ms against 0.075 ms with a 5% band.
        BudgetRule latency = BudgetRules.rule(BudgetRules.MAX_LATENCY_MS);
        assertNotNull(latency);
        Check c = BudgetRules.check(latency, "m on d", example(), 1000, 0.075, 0.05);
        assertEquals(Verdict.AT_RISK, c.verdict());
        assertTrue(c.passed(), "at risk does not fail");
        assertEquals("m on d: latency 0.0747 ms is within the limit of 0.075 ms, by less than the estimate's"
                + " uncertainty of 5.0%", c.message());
    }

    @Test
    void aPolicyViolationIsListedWithTheBudgetsOnes() {
        Check budget = BudgetRules.check("m on d", example(), Budget.builder().targetFps(1e9).build(), 0).get(0);
        Check policy = Check.policy("modelled", false, "m on d: the analysis is incomplete");
        GateResult r = new GateResult(List.of(new PairResult("m", "d", example(), 1, Budget.none(),
                List.of(policy, budget), List.of(), false)), Budget.none(), null, null, false);
        assertEquals("2 violations (1 budget, 1 policy):\n  - m on d: the analysis is incomplete\n  - "
                + budget.message(), r.failureMessage());
        assertEquals("policy.modelled", policy.key());
    }
}
