package dev.erg.estimate;

import dev.erg.device.Engine;

/**
 * A digital multiply-accumulate array (a mac-array of one dataflow). Each MAC is priced at the node's
 * precision from the engine's table; a 1-bit (+1/-1) MAC, when the profile gives xnor-energy-fj and
 * popcount-energy-fj, is an XNOR plus its share of the popcount. The adder share of a MAC (the
 * accumulation part of compute) is (1 - multiply-fraction) of its energy, or the popcount share.
 */
abstract class DigitalArray implements EngineModel {
    final Engine engine;

    DigitalArray(Engine engine) {
        this.engine = engine;
    }

    @Override
    public Engine engine() {
        return engine;
    }

    @Override
    public Energy price(MacJob job, NodeEstimate e, Pricing pricing) {
        return digitalMacs(engine, job, pricing, "MAC");
    }

    static Energy digitalMacs(Engine engine, MacJob job, Pricing pricing, String what) {
        Engine.Binary b = engine.binary();
        double fj;
        double addFj;
        if (b != null && job.wBits == 1 && job.aBits == 1) {
            fj = b.xnorFj() + b.popcountFj();
            addFj = b.popcountFj();
        } else {
            fj = pricing.fj(engine, job.precision, what);
            addFj = fj * (1 - engine.multiplyFraction());
        }
        double compute = job.macs * fj * Pricing.FJ;
        return new Energy(compute, 0, 0, 0, 0, 0, 0, 0, job.macs * addFj * Pricing.FJ);
    }

    /** Utilisation of a rows x columns array: MACs over (cycles x units). */
    static double utilisation(long macs, long cycles, long rows, long cols) {
        return cycles == 0 ? 0 : (double) macs / ((double) cycles * rows * cols);
    }

    static long ceilDiv(long a, long b) {
        return Placement.ceilDiv(a, b);
    }
}
