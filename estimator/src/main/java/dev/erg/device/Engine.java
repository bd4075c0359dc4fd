package dev.erg.device;

import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

/**
 * A compute engine of a device: a rows x columns multiply-accumulate array, an array whose sums are
 * formed in the analog domain, an in-memory compute macro, or a vector unit with lanes. Energies are
 * per operation at a named precision ("int8", "fp16", "int1", "w4a8"...); a precision that the profile
 * does not list is derived by {@link Precisions#scale}. The kind-specific parameters sit in
 * {@link #binary()}, {@link #analog()} and {@link #macro()}.
 */
public final class Engine {
    /** What kind of engine. */
    public enum Kind {
        MAC_ARRAY("mac-array"), VECTOR("vector"), ANALOG_SUM_ARRAY("analog-sum-array"),
        IN_MEMORY_MACRO("in-memory-macro"), CPU("cpu");

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
    private Binary binary;
    private AnalogSum analog;
    private Macro macro;
    private Cpu cpu;

    /**
     * The energies of a 1-bit (+1/-1) MAC on a digital engine, in fJ: an XNOR gate per product plus the
     * product's share of the popcount (the adder tree that counts the ones).
     */
    public record Binary(double xnorFj, double popcountFj) {
    }

    /**
     * An analog accumulation array: products are formed digitally and summed as charge down a column of
     * {@code rows}; each column sum is converted once per read-out, and sums longer than a column are
     * added digitally. Energies in fJ.
     */
    public record AnalogSum(double accumulationFjPerProduct, double conversionFj, int converterBits,
                            double partialAddFj) {
    }

    /**
     * An in-memory compute macro: {@code rows x columns} cells holding {@code bitsPerCell} weight bits
     * each, {@code count} macros, {@code rowsActive} rows driven at once, {@code inputBitsPerCycle} input
     * bits applied per cycle. {@code weightBits} is the width weights are stored at when neither the model
     * nor an override says otherwise (0: follow the model). Energies in fJ.
     */
    public record Macro(int bitsPerCell, int weightBits, int count, int rowsActive, int inputBitsPerCycle,
                        double rowDriveFj, double columnFj, double conversionFj, int converterBits,
                        double cellWriteFj, double shiftAddFj, double writeCyclesPerRow) {
        /** Weight bits the macros hold in all. */
        public long capacityBits(int rows, int columns) {
            return (long) rows * columns * bitsPerCell * count;
        }
    }

    /**
     * A processor: {@code cores} cores (or threads used), each retiring {@code macsPerCycle} MACs per
     * cycle at a precision (SIMD lanes x FMA units) and {@code opsPerCycle} vector operations (elementwise
     * work on the same SIMD lanes). {@code opEnergyFj} prices a vector op; the MAC energies are the
     * engine's {@link Engine#energyFj()}. Both energy tables are empty when the profile gives none.
     */
    public record Cpu(int cores, Map<String, Double> macsPerCycle, Map<String, Double> opsPerCycle,
                      Map<String, Double> opEnergyFj) {
        public Cpu {
            macsPerCycle = Collections.unmodifiableMap(new TreeMap<>(macsPerCycle));
            opsPerCycle = Collections.unmodifiableMap(new TreeMap<>(opsPerCycle));
            opEnergyFj = Collections.unmodifiableMap(new TreeMap<>(opEnergyFj));
        }

        /** True when the profile prices this processor's MACs and vector ops. */
        public boolean energyKnown() {
            return !opEnergyFj.isEmpty();
        }

        /** MACs per cycle per core at {@code precision} ({@link #rate}). */
        public Rate macRate(String precision) {
            return rate(macsPerCycle, precision);
        }

        /** Vector ops per cycle per core at {@code precision}; the MAC rates when the profile lists none. */
        public Rate opRate(String precision) {
            return rate(opsPerCycle.isEmpty() ? macsPerCycle : opsPerCycle, precision);
        }

        /**
         * The rate at {@code precision} from a table: the listed value; else the rate of the narrowest
         * listed precision of the same family (integer or float) at least as wide, since narrower
         * operands do not make SIMD lanes narrower (int4 runs as int8); else the widest listed one of
         * the family scaled by width ratio (an int16 lane holds half as many elements as an int8 lane);
         * else the other family by the same two rules. A pair {@code wNaM} counts as its wider operand.
         * Returns null for a label with no bit width.
         */
        public static Rate rate(Map<String, Double> table, String precision) {
            Double v = table.get(precision);
            if (v != null) {
                return new Rate(v, precision);
            }
            int[] mixed = Precisions.mixedBits(precision);
            int bits = mixed != null ? Math.max(mixed[0], mixed[1]) : Precisions.bits(precision);
            if (bits == 0) {
                return null;
            }
            boolean flt = mixed == null && Precisions.isFloat(precision);
            Rate r = rate(table, bits, flt);
            return r != null ? r : rate(table, bits, !flt);
        }

        private static Rate rate(Map<String, Double> table, int bits, boolean flt) {
            String atLeast = null;
            String widest = null;
            for (String p : table.keySet()) { // sorted: ties go to the first label
                int b = Precisions.bits(p);
                if (b == 0 || Precisions.mixedBits(p) != null || Precisions.isFloat(p) != flt) {
                    continue;
                }
                if (b >= bits && (atLeast == null || b < Precisions.bits(atLeast))) {
                    atLeast = p;
                }
                if (widest == null || b > Precisions.bits(widest)) {
                    widest = p;
                }
            }
            if (atLeast != null) {
                return new Rate(table.get(atLeast), atLeast);
            }
            return widest == null ? null
                    : new Rate(table.get(widest) * Precisions.bits(widest) / bits, widest);
        }
    }

    /** A per-cycle rate looked up at a precision, and the listed precision it came {@code from}. */
    public record Rate(double perCycle, String from) {
    }

    /** A processor engine (kind {@code cpu}); {@code macEnergyFj} may be empty when the profile gives none. */
    public static Engine cpu(String id, Cpu cpu, Map<String, Double> macEnergyFj, double multiplyFraction,
                             long layerOverheadCycles) {
        Engine e = new Engine(id, Kind.CPU, 0, 0, 0, null, macEnergyFj, multiplyFraction, DEFAULT_ACCUMULATOR_BITS,
                layerOverheadCycles);
        e.cpu = cpu;
        return e;
    }

    /** An engine with kind-specific parameters (each may be null when the kind takes none). */
    public static Engine of(String id, Kind kind, int rows, int columns, int lanes, Dataflow dataflow,
                            Map<String, Double> energyFj, double multiplyFraction, int accumulatorBits,
                            long layerOverheadCycles, Binary binary, AnalogSum analog, Macro macro) {
        Engine e = new Engine(id, kind, rows, columns, lanes, dataflow, energyFj, multiplyFraction, accumulatorBits,
                layerOverheadCycles);
        e.binary = binary;
        e.analog = analog;
        e.macro = macro;
        return e;
    }

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

    /** This engine with another dataflow, every other parameter kept. */
    public Engine withDataflow(Dataflow d) {
        return of(id, kind, rows, columns, lanes, d, energyFj, multiplyFraction, accumulatorBits, layerOverheadCycles,
                binary, analog, macro);
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

    /**
     * Parallel units: rows x columns for an array, cells of every macro for a macro, lanes for a vector
     * unit, cores x the highest MACs per cycle for a processor.
     */
    public long units() {
        switch (kind) {
            case VECTOR:
                return lanes;
            case IN_MEMORY_MACRO:
                return (long) rows * columns * macro.count();
            case CPU: {
                double most = 0;
                for (double r : cpu.macsPerCycle().values()) {
                    most = Math.max(most, r);
                }
                return Math.max(1, (long) Math.floor(cpu.cores() * most));
            }
            default:
                return (long) rows * columns;
        }
    }

    /** True for the kinds that run MAC layers on a 2-D array (every kind but the vector unit). */
    public boolean isArray() {
        return kind != Kind.VECTOR;
    }

    /** The XNOR and popcount energies of a 1-bit MAC, or null when the profile gives none. */
    public Binary binary() {
        return binary;
    }

    /** The analog accumulation parameters of an analog-sum-array, else null. */
    public AnalogSum analog() {
        return analog;
    }

    /** The macro parameters of an in-memory-macro, else null. */
    public Macro macro() {
        return macro;
    }

    /** The processor parameters of a cpu engine, else null. */
    public Cpu cpu() {
        return cpu;
    }

    /** False for a cpu engine whose profile gives no energies; every other kind is priced. */
    public boolean energyKnown() {
        return cpu == null || cpu.energyKnown();
    }

    public int lanes() {
        return lanes;
    }

    /** The dataflow of a MAC array (null for a vector unit). */
    public Dataflow dataflow() {
        return dataflow;
    }

    /**
     * Energy per operation by precision, in fJ, as listed: a MAC for a mac-array, a multiply for an
     * analog-sum-array, an op for a vector unit; empty for an in-memory macro (priced per event).
     */
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
