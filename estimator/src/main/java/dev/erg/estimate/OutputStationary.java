package dev.erg.estimate;

import dev.erg.device.Engine;

/**
 * Output-stationary mac-array: positions on rows, output channels on columns, the reduction streamed;
 * partial sums never leave the units (docs/method.md, sections 1 and 2).
 */
final class OutputStationary extends DigitalArray {
    OutputStationary(Engine engine) {
        super(engine);
    }

    @Override
    public void map(MacJob j, NodeEstimate e) {
        long rows = engine.rows();
        long cols = engine.columns();
        long foldsM = ceilDiv(j.m, rows);
        long foldsN = ceilDiv(j.n, cols);
        e.computeCycles = j.g * foldsM * foldsN * j.k;
        double reads = j.aB() * j.g * j.m * j.k * foldsN + j.wB() * j.g * j.k * j.n * foldsM;
        double writes = j.writesOut ? j.oB() * j.g * j.m * j.n : 0;
        e.sramReadBytes = Math.round(reads);
        e.sramWriteBytes = Math.round(writes);
        e.registerReadBytes = Math.round(j.macs * (j.aB() + j.wB() + j.accB()));
        e.registerWriteBytes = Math.round(j.macs * j.accB());
        e.passes = j.g * foldsM * foldsN;
        e.utilization = utilisation(j.macs, e.computeCycles, rows, cols);
    }
}
