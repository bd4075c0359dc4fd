package dev.erg.device;

import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

/**
 * A compute engine of a device: a rows x columns multiply-accumulate array, or a vector unit with
 * lanes. Energies are per operation at a named precision ("int8", "fp16"...); a precision that the
 * profile does not list is derived by {@link Precisions#scale}.
 */
public final class Engine {
    /** What kind of engine. */
    public enum Kind {
        MAC_ARRAY("mac-array"), VECTOR("vector");

        public final String key;

        Kind(String key) {
            this.key = key;
        }
    }

    /**
     * Multiplier share of a MAC's energy when the profile gives none: Horowitz, "Computing's Energy
     * Problem (and what we can do about it)", ISSCC 2014, 45 nm: 8-bit multiply 0.2 pJ of a 0.23 pJ
     * multiply-add (0.2 pJ multiply + 0.03 pJ add).
     */
    public static final double DEFAULT_MAC_MULTIPLY_FRACTION = 0.2 / (0.2 + 0.03);
    /** Vector ops are priced like adds when the profile gives no multiplier share: linear in bits. */
    public static final double DEFAULT_VECTOR_MULTIPLY_FRACTION = 0;
    /** Partial-sum width when the profile gives none (32-bit accumulators: common practice). */
    public static final int DEFAULT_ACCUMULATOR_BITS = 32;

    private final String id;
    private final Kind kind;
    private final int rows;
    private final int columns;
    private final int lanes;
    private final Dataflow dataflow;
    private final Map<String, Double> energyFj;
    private final double multiplyFraction;
    private final int accumulatorBits;
    private final long layerOverheadCycles;

    public Engine(String id, Kind kind, int rows, int columns, int lanes, Dataflow dataflow,
                  Map<String, Double> energyFj, double multiplyFraction, int accumulatorBits, long layerOverheadCycles) {
        this.id = id;
        this.kind = kind;
        this.rows = rows;
        this.columns = columns;
        this.lanes = lanes;
        this.dataflow = dataflow;
        this.energyFj = Collections.unmodifiableMap(new TreeMap<>(energyFj));
        this.multiplyFraction = multiplyFraction;
        this.accumulatorBits = accumulatorBits;
        this.layerOverheadCycles = layerOverheadCycles;
    }

    public String id() {
        return id;
    }

    public Kind kind() {
        return kind;
    }

    public int rows() {
        return rows;
    }

    public int columns() {
        return columns;
    }

    /** Parallel units: rows x columns for an array, lanes for a vector unit. */
    public long units() {
        return kind == Kind.MAC_ARRAY ? (long) rows * columns : lanes;
    }

    public int lanes() {
        return lanes;
    }

    /** The dataflow of a MAC array (null for a vector unit). */
    public Dataflow dataflow() {
        return dataflow;
    }

    /** Energy per operation (a MAC for an array, an op for a vector unit) by precision, in fJ, as listed. */
    public Map<String, Double> energyFj() {
        return energyFj;
    }

    /**
     * Energy of one operation at {@code precision} in fJ: the listed value, or the bit-width rule from
     * the nearest listed precision; null when the precision has no bit width.
     */
    public Precisions.Lookup energyAt(String precision) {
        return Precisions.lookup(energyFj, precision, multiplyFraction);
    }

    /** Share of a MAC's energy spent in the multiplier, for the bit-width rule. */
    public double multiplyFraction() {
        return multiplyFraction;
    }

    /** Width of the partial sums that leave the array between reduction folds. */
    public int accumulatorBits() {
        return accumulatorBits;
    }

    /** Cycles added to every layer this engine runs (array fill and drain, set-up). */
    public long layerOverheadCycles() {
        return layerOverheadCycles;
    }
}
