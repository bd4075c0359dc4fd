package dev.erg.estimate;

import dev.erg.device.Engine;

/**
 * The vector unit: lanes that run one operation each per cycle. It runs the work that is not a MAC
 * (elementwise, pooling, normalisation), and MACs too when the profile has no array, without reuse.
 */
final class VectorUnit extends DigitalArray {
    VectorUnit(Engine engine) {
        super(engine);
    }

    @Override
    public void map(MacJob j, NodeEstimate e) {
        flat(j, e, engine.units());
    }

    /** Every MAC from SRAM, one per unit per cycle (a device with no array, or a node with no matrix view). */
    static void flat(MacJob j, NodeEstimate e, long units) {
        e.computeCycles = ceilDiv(j.macs, units);
        e.utilization = e.computeCycles == 0 ? 0 : (double) j.macs / (e.computeCycles * units);
        e.sramReadBytes = Math.round(j.macs * (j.aB() + j.wB() + j.aB()));
        e.sramWriteBytes = Math.round(j.macs * j.aB());
    }

    /** Cycles of {@code ops} vector operations. */
    long cycles(long ops) {
        return ceilDiv(ops, engine.units());
    }
}
