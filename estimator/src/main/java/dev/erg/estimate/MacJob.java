package dev.erg.estimate;

import dev.erg.workload.NodeWork;

/**
 * A MAC node as an engine sees it: the matrix product per group ({@code m} output positions x
 * {@code k} reduction x {@code n} output channels, {@code g} groups), the deployed operand widths and
 * whether its output leaves the engine (it does not when a fused follower takes it).
 */
public final class MacJob {
    final NodeWork work;
    final long m;
    final long k;
    final long n;
    final long g;
    final long macs;
    /** Deployed bits of activations, weights, outputs and the partial sums that leave the array. */
    final int aBits;
    final int wBits;
    final int oBits;
    final int accBits;
    /** The precision label energies are looked up at ("int8", "fp16", "int1", "w4a8"...). */
    final String precision;
    /** False when a fused follower takes the output on its way out (it is not written to SRAM). */
    final boolean writesOut;
    /** True when the weight operand is stored in the model (not an activation computed at run time). */
    final boolean constantWeights;

    MacJob(NodeWork work, int aBits, int wBits, int oBits, int accBits, String precision, boolean writesOut,
           boolean constantWeights) {
        this.work = work;
        this.m = work.gemmM();
        this.k = work.gemmK();
        this.n = work.gemmN();
        this.g = work.gemmGroups();
        this.macs = work.macs();
        this.aBits = aBits;
        this.wBits = wBits;
        this.oBits = oBits;
        this.accBits = accBits;
        this.precision = precision;
        this.writesOut = writesOut;
        this.constantWeights = constantWeights;
    }

    public NodeWork work() {
        return work;
    }

    public long m() {
        return m;
    }

    public long k() {
        return k;
    }

    public long n() {
        return n;
    }

    public long groups() {
        return g;
    }

    public long macs() {
        return macs;
    }

    public int activationBits() {
        return aBits;
    }

    public int weightBits() {
        return wBits;
    }

    public int outputBits() {
        return oBits;
    }

    public int accumulatorBits() {
        return accBits;
    }

    public String precision() {
        return precision;
    }

    public boolean writesOutput() {
        return writesOut;
    }

    double aB() {
        return aBits / 8.0;
    }

    double wB() {
        return wBits / 8.0;
    }

    double oB() {
        return oBits / 8.0;
    }

    double accB() {
        return accBits / 8.0;
    }
}
