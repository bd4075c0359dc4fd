package dev.erg.device;

/**
 * One level of the memory hierarchy, with energies in fJ per byte (converted from the profile's units);
 * the energies are NaN when a processor profile gives none ({@link #energyKnown()}).
 */
public final class Memory {
    /**
     * The levels erg prices: registers, one SRAM (an accelerator's buffer) or caches (a processor's,
     * nearest first), and DRAM.
     */
    public enum Level {
        REGISTERS("registers"), SRAM("sram"), DRAM("dram"), CACHE("cache");

        public final String key;

        Level(String key) {
            this.key = key;
        }
    }

    private final String id;
    private final Level level;
    private final long capacityBytes;
    private final double readFjPerByte;
    private final double writeFjPerByte;
    private final double bytesPerCycle;
    private final double bytesPerSecond;

    /**
     * @param capacityBytes capacity, or -1 when unbounded (DRAM, registers)
     * @param readFjPerByte read energy, or NaN when unknown (likewise {@code writeFjPerByte})
     * @param bytesPerCycle bandwidth in bytes per core clock cycle, or 0 when given per second
     * @param bytesPerSecond bandwidth in bytes per second, or 0 when given per cycle
     */
    public Memory(String id, Level level, long capacityBytes, double readFjPerByte, double writeFjPerByte,
                  double bytesPerCycle, double bytesPerSecond) {
        this.id = id;
        this.level = level;
        this.capacityBytes = capacityBytes;
        this.readFjPerByte = readFjPerByte;
        this.writeFjPerByte = writeFjPerByte;
        this.bytesPerCycle = bytesPerCycle;
        this.bytesPerSecond = bytesPerSecond;
    }

    public String id() {
        return id;
    }

    public Level level() {
        return level;
    }

    public long capacityBytes() {
        return capacityBytes;
    }

    /** False when the profile gives this level no energies (a processor profile may leave them out). */
    public boolean energyKnown() {
        return !Double.isNaN(readFjPerByte) && !Double.isNaN(writeFjPerByte);
    }

    public double readFjPerByte() {
        return readFjPerByte;
    }

    public double writeFjPerByte() {
        return writeFjPerByte;
    }

    /** Bandwidth in bytes per second at the device clock; infinite when the profile gives none. */
    public double bandwidth(double clockHz) {
        if (bytesPerSecond > 0) {
            return bytesPerSecond;
        }
        if (bytesPerCycle > 0) {
            return bytesPerCycle * clockHz;
        }
        return Double.POSITIVE_INFINITY;
    }

    public double bytesPerCycle() {
        return bytesPerCycle;
    }

    public double bytesPerSecond() {
        return bytesPerSecond;
    }
}
