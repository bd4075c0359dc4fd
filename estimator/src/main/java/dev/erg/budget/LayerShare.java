package dev.erg.budget;

/** One layer's part in a metric: its value and its share of the model's total (0..1). */
public final class LayerShare {
    private final String name;
    private final String opType;
    private final double value;
    private final double share;

    public LayerShare(String name, String opType, double value, double share) {
        this.name = name;
        this.opType = opType;
        this.value = value;
        this.share = share;
    }

    public String name() {
        return name;
    }

    public String opType() {
        return opType;
    }

    /** The layer's value in the metric's base unit (seconds, joules, bytes, MACs), or a delta for growth. */
    public double value() {
        return value;
    }

    public double share() {
        return share;
    }
}
