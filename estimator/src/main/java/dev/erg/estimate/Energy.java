package dev.erg.estimate;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Energy in joules, split by where it goes: compute, registers, SRAM, DRAM, static, and the
 * destinations of analog and in-memory engines (conversion, cell writes, row drive). Immutable.
 */
public final class Energy {
    public static final Energy ZERO = new Energy(0, 0, 0, 0, 0);
    /**
     * Energy that the profile does not price (a processor profile without energies): every part is NaN,
     * and so is any sum that includes it. Test with {@link #known()}.
     */
    public static final Energy UNKNOWN = new Energy(Double.NaN, Double.NaN, Double.NaN, Double.NaN, Double.NaN,
            Double.NaN, Double.NaN, Double.NaN, Double.NaN);

    /** Where energy goes, in the order reports list them. */
    public enum Destination {
        COMPUTE("compute"), REGISTERS("registers"), SRAM("sram"), DRAM("dram"), CONVERSION("conversion"),
        CELL_WRITES("cell-writes"), ROW_DRIVE("row-drive"), STATIC("static");

        /** The destination's name in reports and JSON. */
        public final String key;

        Destination(String key) {
            this.key = key;
        }
    }

    private final double compute;
    private final double registers;
    private final double sram;
    private final double dram;
    private final double leakage;
    private final double conversion;
    private final double cellWrites;
    private final double rowDrive;
    private final double accumulation;

    public Energy(double compute, double registers, double sram, double dram, double leakage) {
        this(compute, registers, sram, dram, leakage, 0, 0, 0, 0);
    }

    /**
     * @param accumulation the part of {@code compute} spent adding products (adder tree, popcount,
     *                     analog sum, digital shift-and-add); not a destination of its own
     */
    public Energy(double compute, double registers, double sram, double dram, double leakage, double conversion,
                  double cellWrites, double rowDrive, double accumulation) {
        this.compute = compute;
        this.registers = registers;
        this.sram = sram;
        this.dram = dram;
        this.leakage = leakage;
        this.conversion = conversion;
        this.cellWrites = cellWrites;
        this.rowDrive = rowDrive;
        this.accumulation = accumulation;
    }

    /** False when the profile does not price this energy (its parts are NaN; see {@link #UNKNOWN}). */
    public boolean known() {
        return !Double.isNaN(total());
    }

    /** Arithmetic: MACs and vector operations (for an in-memory macro, the column operations and shift-and-add). */
    public double compute() {
        return compute;
    }

    public double registers() {
        return registers;
    }

    public double sram() {
        return sram;
    }

    public double dram() {
        return dram;
    }

    /** Static power times time. */
    public double staticEnergy() {
        return leakage;
    }

    /** Analog-to-digital conversions of column sums (analog-sum arrays, in-memory macros). */
    public double conversion() {
        return conversion;
    }

    /** Writing weights into the cells of an in-memory macro (each frame, when they do not stay there). */
    public double cellWrites() {
        return cellWrites;
    }

    /** Driving the rows of an in-memory macro with the inputs. */
    public double rowDrive() {
        return rowDrive;
    }

    /** The part of {@link #compute()} spent summing products; already inside compute. */
    public double accumulation() {
        return accumulation;
    }

    /** The energy of one destination. */
    public double of(Destination d) {
        switch (d) {
            case COMPUTE: return compute;
            case REGISTERS: return registers;
            case SRAM: return sram;
            case DRAM: return dram;
            case CONVERSION: return conversion;
            case CELL_WRITES: return cellWrites;
            case ROW_DRIVE: return rowDrive;
            default: return leakage;
        }
    }

    /** Every destination with its energy, in report order (zeros included). */
    public Map<Destination, Double> parts() {
        Map<Destination, Double> m = new LinkedHashMap<>();
        for (Destination d : Destination.values()) {
            m.put(d, of(d));
        }
        return m;
    }

    /** The destination with the most dynamic energy (static left out); the earlier in report order on a tie. */
    public Destination dominant() {
        Destination best = Destination.COMPUTE;
        for (Destination d : Destination.values()) {
            if (d != Destination.STATIC && of(d) > of(best)) {
                best = d;
            }
        }
        return best;
    }

    /** Everything but static energy. */
    public double dynamic() {
        return compute + registers + sram + dram + conversion + cellWrites + rowDrive;
    }

    public double total() {
        return dynamic() + leakage;
    }

    /** Adds {@code e} into {@code sum} part by part, in the order of {@link #of(double[])}: as {@link #plus} would. */
    static void add(double[] sum, Energy e) {
        sum[0] += e.compute;
        sum[1] += e.registers;
        sum[2] += e.sram;
        sum[3] += e.dram;
        sum[4] += e.leakage;
        sum[5] += e.conversion;
        sum[6] += e.cellWrites;
        sum[7] += e.rowDrive;
        sum[8] += e.accumulation;
    }

    /** The energy whose parts {@link #add} summed. */
    static Energy of(double[] sum) {
        return new Energy(sum[0], sum[1], sum[2], sum[3], sum[4], sum[5], sum[6], sum[7], sum[8]);
    }

    public Energy plus(Energy o) {
        return new Energy(compute + o.compute, registers + o.registers, sram + o.sram, dram + o.dram,
                leakage + o.leakage, conversion + o.conversion, cellWrites + o.cellWrites, rowDrive + o.rowDrive,
                accumulation + o.accumulation);
    }
}
