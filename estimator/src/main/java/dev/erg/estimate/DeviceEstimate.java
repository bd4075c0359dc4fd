package dev.erg.estimate;

import dev.erg.device.DeviceProfile;
import dev.erg.workload.ModelWorkload;
import java.util.List;

/** The estimate of one model on one device: every node, and the frame totals. */
public final class DeviceEstimate {
    private final ModelWorkload workload;
    private final DeviceProfile device;
    private final List<NodeEstimate> nodes;
    private final Energy energy;
    private final double latencySeconds;
    private final boolean weightsResident;
    private final long residentWeightBytes;
    private final long weightBytes;
    private final long activationPeakBytes;
    private final long dramBytesPerFrame;
    private final List<String> assumptions;
    private final boolean weightsReloadedEachFrame;

    DeviceEstimate(ModelWorkload workload, DeviceProfile device, List<NodeEstimate> nodes, Energy energy,
                   double latencySeconds, boolean weightsResident, long residentWeightBytes, long weightBytes,
                   long activationPeakBytes,
                   long dramBytesPerFrame, List<String> assumptions, boolean weightsReloadedEachFrame) {
        this.workload = workload;
        this.device = device;
        this.nodes = List.copyOf(nodes);
        this.energy = energy;
        this.latencySeconds = latencySeconds;
        this.weightsResident = weightsResident;
        this.residentWeightBytes = residentWeightBytes;
        this.weightBytes = weightBytes;
        this.activationPeakBytes = activationPeakBytes;
        this.dramBytesPerFrame = dramBytesPerFrame;
        this.assumptions = List.copyOf(assumptions);
        this.weightsReloadedEachFrame = weightsReloadedEachFrame;
    }

    /**
     * True when an in-memory macro cannot hold every layer's weights, so they are read from DRAM and
     * written into its cells every frame (each such node says so in {@link NodeEstimate#weightsReloaded()}).
     */
    public boolean weightsReloadedEachFrame() {
        return weightsReloadedEachFrame;
    }

    /** Energy per MAC of the frame in joules (total energy over MACs); 0 for a model without MACs. */
    public double energyPerMacJoules() {
        long macs = workload.macs();
        return !energyKnown() ? Double.NaN : macs == 0 ? 0 : energy.total() / macs;
    }

    /**
     * Operations per second per watt over the frame, counting two operations (multiply and add) per MAC,
     * as the trade quotes TOPS/W: 2 x MACs / frame energy.
     */
    public double opsPerWatt() {
        double j = energy.total();
        return !energyKnown() ? Double.NaN : j == 0 ? 0 : 2.0 * workload.macs() / j;
    }

    /** MAC-weighted utilisation of the MAC nodes: total MACs over the sum of MACs / utilisation. */
    public double macUtilization() {
        double busy = 0;
        long macs = 0;
        for (NodeEstimate n : nodes) {
            if (n.work().macs() > 0 && n.utilization() > 0) {
                busy += n.work().macs() / n.utilization();
                macs += n.work().macs();
            }
        }
        return busy == 0 ? 0 : macs / busy;
    }

    public ModelWorkload workload() {
        return workload;
    }

    public DeviceProfile device() {
        return device;
    }

    /** One estimate per node of the workload, in the same (topological) order. */
    public List<NodeEstimate> nodes() {
        return nodes;
    }

    /**
     * True when the profile prices energy. A processor profile may give no energies (a host profile
     * measured by erg has none): then {@link #energy()} is {@link Energy#UNKNOWN}, and every energy and
     * power figure ({@link #energyPerFrameJoules()}, {@link #averagePowerWatts}, {@link #opsPerWatt()},
     * {@link #energyPerMacJoules()}) is NaN. Writers test this and leave energy out.
     */
    public boolean energyKnown() {
        return device.energyKnown();
    }

    /** Energy of one frame by destination, static energy over the frame latency included; see {@link #energyKnown()}. */
    public Energy energy() {
        return energy;
    }

    public double energyPerFrameJoules() {
        return energy.total();
    }

    public double latencySeconds() {
        return latencySeconds;
    }

    /** Frames per second when frames run back to back. */
    public double maxFps() {
        return latencySeconds == 0 ? Double.POSITIVE_INFINITY : 1 / latencySeconds;
    }

    /**
     * Average power at {@code fps} frames per second: the dynamic energy of each frame times the
     * frame rate, plus static power, which is drawn all the time.
     */
    public double averagePowerWatts(double fps) {
        if (!energyKnown()) {
            return Double.NaN;
        }
        double dynamic = energy.dynamic();
        // A frame that costs no dynamic energy adds none at any rate, even an unbounded one (0 x inf is NaN).
        return (dynamic == 0 ? 0 : dynamic * fps) + device.staticPowerMw() * 1e-3;
    }

    /** True when weights and peak activations fit the SRAM together: weights are loaded once, not per frame. */
    public boolean weightsResident() {
        return weightsResident;
    }

    /** Bytes loaded into SRAM once when the weights are resident (0 when they stream every frame). */
    public long residentWeightBytes() {
        return residentWeightBytes;
    }

    /** Bytes of the weights the device reads, at the deployed precision (resident or streamed). */
    public long weightBytes() {
        return weightBytes;
    }

    /** Peak live activation bytes on the device, at the deployed precision. */
    public long activationPeakBytes() {
        return activationPeakBytes;
    }

    public long dramBytesPerFrame() {
        return dramBytesPerFrame;
    }

    /** Assumptions the estimate made (derived precisions, unpriced nodes, unlimited bandwidths...). */
    public List<String> assumptions() {
        return assumptions;
    }

    /** True when every node that should run was priced (no unmodelled or unresolved nodes). */
    public boolean complete() {
        return workload.complete();
    }
}
