package dev.erg.budget;

import dev.erg.estimate.DeviceEstimate;
import java.util.function.ToDoubleFunction;

/**
 * One metric whose growth over the baseline is limited: how to read it now, how it was recorded, and
 * (where layers carry it) how much each layer grew, for the message of a broken limit.
 * {@link GrowthRules#RULES} holds every rule.
 *
 * @param metric the metric, with its display unit
 * @param now    the metric of the current estimate, in its display unit
 * @param before the metric as the baseline recorded it, in its display unit
 * @param layer  a layer's change in the display unit, or null when layers do not carry the metric
 */
public record GrowthRule(Metric metric, ToDoubleFunction<DeviceEstimate> now, ToDoubleFunction<Baseline.Entry> before,
                         ToDoubleFunction<LayerDiff> layer) {
}
