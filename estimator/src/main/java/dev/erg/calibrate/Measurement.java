package dev.erg.calibrate;

/**
 * One row of a measurement file: what was measured for one model, or one node of it.
 *
 * @param model          the model's file name, as written in the file
 * @param node           the ONNX node name, or null for the whole model
 * @param line           the row's line number in its file (1-based), for messages
 * @param latencySeconds the measured latency, or null when the row gives none
 * @param energyJoules   the measured energy per inference, or null
 * @param powerWatts     the measured average power while the model (or node) runs back to back, or null
 * @param chipOnly       true when the energy or power is of the chip alone ({@code chip-energy-uj},
 *                       {@code chip-power-mw}): DRAM energy is not in it
 */
public record Measurement(String model, String node, int line, Double latencySeconds, Double energyJoules,
                          Double powerWatts, boolean chipOnly) {
    /** A row whose energy or power, if any, includes DRAM. */
    public Measurement(String model, String node, int line, Double latencySeconds, Double energyJoules,
                       Double powerWatts) {
        this(model, node, line, latencySeconds, energyJoules, powerWatts, false);
    }

    /** True when the row is about the whole model rather than one node. */
    public boolean wholeModel() {
        return node == null;
    }

    /** "model" or "model / node", for messages and tables. */
    public String label() {
        return node == null ? model : model + " / " + node;
    }
}
