package dev.erg.device;

/** How a multiply-accumulate array keeps operands in place while it computes. */
public enum Dataflow {
    /** Weights sit in the units: reduction on rows, output channels on columns, positions streamed. */
    WEIGHT_STATIONARY("weight-stationary"),
    /** Partial sums sit in the units: positions on rows, output channels on columns, reduction streamed. */
    OUTPUT_STATIONARY("output-stationary"),
    /** Nothing is kept: every MAC reads both operands and the partial sum from SRAM and writes the sum back. */
    NO_REUSE("no-reuse");

    public final String key;

    Dataflow(String key) {
        this.key = key;
    }

    public static Dataflow ofKey(String key) {
        for (Dataflow d : values()) {
            if (d.key.equals(key)) {
                return d;
            }
        }
        return null;
    }
}
