package dev.erg.explore;

import dev.erg.budget.Check;
import dev.erg.budget.Verdict;
import java.util.List;
import java.util.Map;

/**
 * One value of a swept dimension: every metric of its estimate, and its budget checks.
 *
 * @param value   the dimension's value
 * @param metrics each metric's value, in {@link SweepMetric} order
 * @param checks  the budget checks at this value, in rule order
 */
public record SweepPoint(long value, Map<SweepMetric, Double> metrics, List<Check> checks) {
    public SweepPoint {
        metrics = Map.copyOf(metrics);
        checks = List.copyOf(checks);
    }

    public double metric(SweepMetric m) {
        return metrics.get(m);
    }

    /** The worst verdict of the checks (PASS without any). */
    public Verdict verdict() {
        Verdict v = Verdict.PASS;
        for (Check c : checks) {
            v = v.and(c.verdict());
        }
        return v;
    }

    public boolean passed() {
        return verdict() != Verdict.FAIL;
    }

    /** The check of a budget key ("budget." + metric key), or null. */
    public Check check(String metricKey) {
        for (Check c : checks) {
            if (c.subject().equals(metricKey)) {
                return c;
            }
        }
        return null;
    }
}
