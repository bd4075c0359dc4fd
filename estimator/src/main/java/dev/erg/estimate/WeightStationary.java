package dev.erg.estimate;

import dev.erg.device.Engine;

/**
 * Weight-stationary mac-array: the reduction on rows, output channels on columns, positions streamed
 * (docs/method.md, sections 1 and 2). Partial sums leave the array once per fold of the reduction.
 */
final class WeightStationary extends DigitalArray {
    WeightStationary(Engine engine) {
        super(engine);
    }

    @Override
    public void map(MacJob j, NodeEstimate e) {
        long rows = engine.rows();
        long cols = engine.columns();
        long foldsK = ceilDiv(j.k, rows);
        long foldsN = ceilDiv(j.n, cols);
        e.computeCycles = j.g * foldsK * foldsN * j.m;
        sramTraffic(j, e, foldsK, foldsN);
        e.registerReadBytes = Math.round(j.macs * (j.aB() + j.wB() + j.accB()));
        e.registerWriteBytes = Math.round(j.macs * j.accB());
        e.passes = j.g * foldsK * foldsN;
        e.utilization = utilisation(j.macs, e.computeCycles, rows, cols);
    }

    /**
     * SRAM bytes of a weight-stationary mapping: weights once, inputs once per column fold, partial
     * sums out and back once per row fold after the first, outputs once (unless fused through).
     */
    static void sramTraffic(MacJob j, NodeEstimate e, long foldsK, long foldsN) {
        double reads = j.wB() * j.g * j.k * j.n + j.aB() * j.g * j.m * j.k * foldsN
                + j.accB() * j.g * j.m * j.n * (foldsK - 1);
        double writes = j.accB() * j.g * j.m * j.n * (foldsK - 1) + (j.writesOut ? j.oB() * j.g * j.m * j.n : 0);
        e.sramReadBytes = Math.round(reads);
        e.sramWriteBytes = Math.round(writes);
    }
}
