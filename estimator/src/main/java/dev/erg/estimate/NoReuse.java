package dev.erg.estimate;

import dev.erg.device.Engine;

/**
 * A mac-array that keeps nothing: every MAC reads its activation, weight and partial sum from SRAM and
 * writes the sum back (four accesses per MAC), with no register traffic.
 */
final class NoReuse extends DigitalArray {
    NoReuse(Engine engine) {
        super(engine);
    }

    @Override
    public void map(MacJob j, NodeEstimate e) {
        long rows = engine.rows();
        long cols = engine.columns();
        e.computeCycles = ceilDiv(j.macs, rows * cols);
        // Three operand-width reads (activation, weight, partial sum) and one write per MAC.
        e.sramReadBytes = Math.round(j.macs * (j.aB() + j.wB() + j.aB()));
        e.sramWriteBytes = Math.round(j.macs * j.aB());
        e.passes = 1;
        e.utilization = utilisation(j.macs, e.computeCycles, rows, cols);
    }
}
