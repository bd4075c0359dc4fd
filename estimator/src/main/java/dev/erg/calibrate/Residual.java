package dev.erg.calibrate;

/**
 * One measured value next to its prediction before and after the fit.
 *
 * @param model    the model's file name
 * @param node     the node's name, or null for the whole model
 * @param metric   latency (seconds) or energy (joules)
 * @param measured the measured value
 * @param before   the prediction with the profile as given
 * @param after    the prediction with the fitted factors
 * @param chipOnly true for an energy of the chip alone (DRAM energy left out of the measured value and the predictions)
 */
public record Residual(String model, String node, Factor.Metric metric, double measured, double before, double after,
                       boolean chipOnly) {
    /** A residual of a latency, or of an energy that includes DRAM. */
    public Residual(String model, String node, Factor.Metric metric, double measured, double before, double after) {
        this(model, node, metric, measured, before, after, false);
    }

    /** (before - measured) / measured. */
    public double errorBefore() {
        return before / measured - 1;
    }

    /** (after - measured) / measured. */
    public double errorAfter() {
        return after / measured - 1;
    }
}
