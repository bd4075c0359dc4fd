package dev.erg.estimate;

import dev.erg.device.Engine;

/**
 * An array whose multiplies are digital and whose sums are formed in the analog domain: the reduction
 * on rows, output channels on columns, positions streamed (the weight-stationary mapping). Each
 * column sums up to {@code rows} products as charge and is converted once per read-out; a reduction
 * longer than a column is read out once per row fold and the read-outs are added digitally.
 *
 * <pre>
 * E_compute    = MACs x multiply-energy(precision) + MACs x accumulation-energy + partial adds x partial-add-energy
 * E_conversion = read-outs x conversion-energy,   read-outs = g x m x n x ceil(k / rows)
 * partial adds = g x m x n x (ceil(k / rows) - 1)
 * </pre>
 * Register traffic is the operands only (a + w bytes per MAC): partial sums stay on the column wire.
 */
final class AnalogSumArray implements EngineModel {
    private final Engine engine;
    private final Engine.AnalogSum a;

    AnalogSumArray(Engine engine) {
        this.engine = engine;
        this.a = engine.analog();
    }

    @Override
    public Engine engine() {
        return engine;
    }

    @Override
    public void map(MacJob j, NodeEstimate e) {
        long rows = engine.rows();
        long cols = engine.columns();
        long foldsK = DigitalArray.ceilDiv(j.k, rows);
        long foldsN = DigitalArray.ceilDiv(j.n, cols);
        e.computeCycles = j.g * foldsK * foldsN * j.m;
        WeightStationary.sramTraffic(j, e, foldsK, foldsN);
        e.registerReadBytes = Math.round(j.macs * (j.aB() + j.wB()));
        e.registerWriteBytes = 0;
        e.passes = j.g * foldsK * foldsN;
        e.conversions = j.g * j.m * j.n * foldsK;
        e.partialAdds = j.g * j.m * j.n * (foldsK - 1);
        e.utilization = DigitalArray.utilisation(j.macs, e.computeCycles, rows, cols);
    }

    @Override
    public Energy price(MacJob j, NodeEstimate e, Pricing pricing) {
        double mul = pricing.fj(engine, j.precision, "multiply");
        double sum = j.macs * a.accumulationFjPerProduct() + e.partialAdds * a.partialAddFj();
        if (engine.rows() > (1L << a.converterBits())) {
            pricing.note("'" + engine.id() + "': a column sums up to " + engine.rows() + " products but its "
                    + a.converterBits() + "-bit converter resolves " + (1L << a.converterBits())
                    + " levels: the read-out is coarser than the sum");
        }
        double compute = (j.macs * mul + sum) * Pricing.FJ;
        return new Energy(compute, 0, 0, 0, 0, e.conversions * a.conversionFj() * Pricing.FJ, 0, 0, sum * Pricing.FJ);
    }
}
