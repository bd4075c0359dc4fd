package dev.erg.estimate;

/** Energy in joules, split by where it goes. Immutable. */
public final class Energy {
    public static final Energy ZERO = new Energy(0, 0, 0, 0, 0);

    private final double compute;
    private final double registers;
    private final double sram;
    private final double dram;
    private final double leakage;

    public Energy(double compute, double registers, double sram, double dram, double leakage) {
        this.compute = compute;
        this.registers = registers;
        this.sram = sram;
        this.dram = dram;
        this.leakage = leakage;
    }

    /** Arithmetic: MACs and vector operations. */
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

    /** Everything but static energy. */
    public double dynamic() {
        return compute + registers + sram + dram;
    }

    public double total() {
        return dynamic() + leakage;
    }

    public Energy plus(Energy o) {
        return new Energy(compute + o.compute, registers + o.registers, sram + o.sram, dram + o.dram,
                leakage + o.leakage);
    }
}
