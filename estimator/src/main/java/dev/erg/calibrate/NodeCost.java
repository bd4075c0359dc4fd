package dev.erg.calibrate;

import dev.erg.workload.OpClass;
import dev.erg.estimate.NodeEstimate;

/**
 * What the estimator predicts for one node, split into the parts that the correction factors act on.
 * Times in seconds, energies in joules. The calibrated latency of a node is
 * {@code max(computeSeconds / efficiency[opClass], sramSeconds, dramSeconds / dramBandwidthScale)}
 * plus the per-layer overhead for each layer it launches; its dynamic energy is
 * {@code computeScale x computeJoules + onChipScale x onChipJoules + dramScale x dramJoules}.
 *
 * @param name            the node's name, as erg names it
 * @param opClass         which compute efficiency applies
 * @param computeSeconds  arithmetic time at the profile's peak
 * @param sramSeconds     on-chip memory time (kept as the profile gives it)
 * @param dramSeconds     DRAM time at the profile's bandwidth
 * @param overheadSeconds the profile's per-layer overhead charged to this node
 * @param launches        1 when the node runs as a layer of its own, 0 when it runs fused behind another
 * @param computeJoules   energy of MACs and vector operations
 * @param onChipJoules    energy of register and SRAM accesses
 * @param dramJoules      energy of DRAM accesses
 */
public record NodeCost(String name, OpClass opClass, double computeSeconds, double sramSeconds,
                       double dramSeconds, double overheadSeconds, int launches, double computeJoules,
                       double onChipJoules, double dramJoules) {
    public NodeCost {
        for (double v : new double[] {computeSeconds, sramSeconds, dramSeconds, overheadSeconds, computeJoules,
                onChipJoules, dramJoules}) {
            if (!(v >= 0) || Double.isInfinite(v)) {
                throw new IllegalArgumentException("node '" + name + "': a predicted part is " + v
                        + "; every part must be finite and 0 or more");
            }
        }
        if (launches < 0) {
            throw new IllegalArgumentException("node '" + name + "': launches " + launches + " is negative");
        }
    }

    /** The parts of a node the estimator priced; null for a node that does not run on the device. */
    public static NodeCost of(NodeEstimate e) {
        if (!e.priced()) {
            return null;
        }
        var en = e.energy();
        return new NodeCost(e.name(), OpClass.of(e.work()), e.computeSeconds(), e.sramSeconds(),
                finiteOrZero(e.dramSeconds()), e.overheadSeconds(), e.fusedInto() == null ? 1 : 0,
                finiteOrZero(en.compute() + en.conversion() + en.cellWrites() + en.rowDrive()),
                finiteOrZero(en.registers() + en.sram()), finiteOrZero(en.dram()));
    }

    private static double finiteOrZero(double v) {
        return Double.isFinite(v) ? v : 0;
    }

    /** The uncalibrated latency: as the estimator computes it. */
    public double predictedSeconds() {
        return Math.max(computeSeconds, Math.max(sramSeconds, dramSeconds)) + overheadSeconds;
    }
}
