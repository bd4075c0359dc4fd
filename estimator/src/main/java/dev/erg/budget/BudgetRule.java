package dev.erg.budget;

import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.NodeEstimate;
import java.util.function.ToDoubleFunction;

/**
 * One budget limit as a rule: the budget key that sets it, the metric it measures and how to read the
 * metric off an estimate, which way the limit points, how layers are ranked when it breaks, and the
 * words of its message. {@link BudgetRules#RULES} holds every rule; a new metric is one more entry.
 *
 * @param key        the budget key, e.g. {@code maxPowerMw}: the plugin's element, the budget file's key
 * @param metric     what is measured, with its unit
 * @param direction  whether the value must stay at or below the limit, or reach it
 * @param value      the metric in its display unit, from the estimate and the frame rate power is taken at
 * @param blame      how layers are ranked for the message of a broken limit
 * @param blameBy    what the ranking is by, in words ("latency", "energy")
 * @param words      the verbs and the noun of the message
 * @param qualifier  text after the value (e.g. " at 30 fps"), or null
 * @param failDetail text before the ranking when the limit breaks (e.g. the static share of power), or null
 */
public record BudgetRule(String key, Metric metric, Direction direction, Value value,
                         ToDoubleFunction<NodeEstimate> blame, String blameBy, Words words, Text qualifier,
                         Text failDetail) {
    /** Which way a limit points. */
    public enum Direction {
        /** The value must not exceed the limit (power, latency, memory). */
        AT_MOST,
        /** The value must reach the limit (frame rate). */
        AT_LEAST
    }

    /** The metric's value in its display unit. */
    @FunctionalInterface
    public interface Value {
        double of(DeviceEstimate e, double fps);
    }

    /** A piece of a message. */
    @FunctionalInterface
    public interface Text {
        String of(DeviceEstimate e, double fps);
    }

    /**
     * The words of a message: "VALUE UNIT {pass|fail} the {limit} of LIMIT UNIT".
     *
     * @param pass  the verb when the limit holds ("is within", "meets", "fit")
     * @param fail  the verb when it breaks ("exceeds", "is below", "exceed")
     * @param limit what the limit is called ("limit", "target")
     */
    public record Words(String pass, String fail, String limit) {
    }

    public boolean atMost() {
        return direction == Direction.AT_MOST;
    }
}
