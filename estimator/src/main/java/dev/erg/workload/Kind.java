package dev.erg.workload;

/** How a node's work is counted. */
public enum Kind {
    /** Multiply-accumulate work: convolutions, matrix products, recurrent cells. */
    MAC("mac"),
    /** Elementwise, normalisation, pooling and reduction work on vector units. */
    VECTOR("vector"),
    /** Pure data movement: costs the bytes it moves, no arithmetic. */
    MOVE("move"),
    /** A view of its input (Reshape, Squeeze, Identity...): costs nothing. */
    VIEW("view"),
    /** Worked out at analysis time from constants and static shapes: never runs on the device. */
    FOLDED("folded"),
    /** No rule for this operator: reported, never priced silently. */
    UNMODELLED("unmodelled"),
    /** Has a rule, but its input shapes are unknown because of an unmodelled node upstream. */
    UNRESOLVED("unresolved");

    public final String label;

    Kind(String label) {
        this.label = label;
    }
}
