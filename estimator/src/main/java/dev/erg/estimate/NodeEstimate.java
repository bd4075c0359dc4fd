package dev.erg.estimate;

import dev.erg.workload.NodeWork;

/**
 * What one node costs on the device: its mapping (engine, cycles, utilisation), the bytes it moves
 * at every memory level, its latency with the bound that sets it, and its energy by destination.
 * Nodes that do not run on the device (views, folded constants) carry zeros.
 */
public final class NodeEstimate {
    final NodeWork work;
    String engine;
    String precision;
    long computeCycles;
    double utilization;
    long registerReadBytes;
    long registerWriteBytes;
    long sramReadBytes;
    long sramWriteBytes;
    long dramReadBytes;
    long dramWriteBytes;
    long weightBytes;
    double computeSeconds;
    double sramSeconds;
    double dramSeconds;
    double overheadSeconds;
    double latencySeconds;
    Bound bound = Bound.NONE;
    Energy energy = Energy.ZERO;
    String fusedInto;
    String onChipLevel;
    String tiling;
    boolean priced;
    DeployedPrecision deployed;
    long passes;
    long conversions;
    long partialAdds;
    long columnOps;
    long rowDrives;
    long cellWrites;
    boolean weightsReloaded;
    /** True when the weight width comes from an override or an engine default, not the tensor's type. */
    boolean weightBitsSet;
    /** The node as its engine sees it (MAC nodes), and the model that maps and prices it. */
    MacJob job;
    EngineModel macModel;

    NodeEstimate(NodeWork work) {
        this.work = work;
    }

    public NodeWork work() {
        return work;
    }

    public String name() {
        return work.name();
    }

    /** The engine that runs the node, or null when it does not run on the device. */
    public String engine() {
        return engine;
    }

    /**
     * The precision label the node's operations are priced at ("int8", "fp16", "int1", or "w4a8" when
     * integer weights and activations differ); the deployed precision when the profile or an override sets one.
     */
    public String precision() {
        return precision;
    }

    /** The deployed precision (weight and activation bits and where each came from), or null when not priced. */
    public DeployedPrecision deployed() {
        return deployed;
    }

    /**
     * Tiles the layer is folded into on its engine: row folds x column folds x groups for an array,
     * macro loads for an in-memory macro (1 x 1 conv with 512 inputs on 256 rows: 2).
     */
    public long passes() {
        return passes;
    }

    /** Analog-to-digital conversions (column read-outs) of an analog-sum array or in-memory macro. */
    public long conversions() {
        return conversions;
    }

    /** Digital additions of read-outs: partial sums of an analog array, shift-and-add of a macro. */
    public long partialAdds() {
        return partialAdds;
    }

    /** Column operations of an in-memory macro (columns read, per row group and input bit). */
    public long columnOps() {
        return columnOps;
    }

    /** Row activations of an in-memory macro (rows driven, per input bit). */
    public long rowDrives() {
        return rowDrives;
    }

    /** Cells written per frame: weights that do not stay in an in-memory macro. */
    public long cellWrites() {
        return cellWrites;
    }

    /** True when an in-memory macro rewrites this layer's weights every frame (they do not all fit). */
    public boolean weightsReloaded() {
        return weightsReloaded;
    }

    public long computeCycles() {
        return computeCycles;
    }

    /**
     * The fraction of the engine doing useful work per cycle, for a MAC node (0 otherwise): MACs over
     * (compute cycles x units) for an array, useful cells over (cycles x cells) for an in-memory macro.
     */
    public double utilization() {
        return utilization;
    }

    public long registerReadBytes() {
        return registerReadBytes;
    }

    public long registerWriteBytes() {
        return registerWriteBytes;
    }

    public long sramReadBytes() {
        return sramReadBytes;
    }

    public long sramWriteBytes() {
        return sramWriteBytes;
    }

    public long dramReadBytes() {
        return dramReadBytes;
    }

    public long dramWriteBytes() {
        return dramWriteBytes;
    }

    /** Bytes of the constants the node reads (weights, biases), at the deployed precision. */
    public long weightBytes() {
        return weightBytes;
    }

    public double computeSeconds() {
        return computeSeconds;
    }

    public double sramSeconds() {
        return sramSeconds;
    }

    public double dramSeconds() {
        return dramSeconds;
    }

    public double overheadSeconds() {
        return overheadSeconds;
    }

    /** max(compute, SRAM, DRAM time) + per-layer overhead. */
    public double latencySeconds() {
        return latencySeconds;
    }

    public Bound bound() {
        return bound;
    }

    /** Energy by destination; {@link Energy#UNKNOWN} when the profile gives no energies ({@link #energyKnown()}). */
    public Energy energy() {
        return energy;
    }

    /**
     * The id of the on-chip memory level that serves the node's traffic: the SRAM, or on a processor the
     * nearest cache level that holds its working set; null when the node does not run.
     */
    public String onChipLevel() {
        return onChipLevel;
    }

    /** False when the profile gives no energies: {@link #energy()} is then {@link Energy#UNKNOWN} (NaN parts). */
    public boolean energyKnown() {
        return energy.known();
    }

    /** The MAC node this elementwise node runs fused behind, or null. */
    public String fusedInto() {
        return fusedInto;
    }

    /** The loop order chosen for a layer whose working set exceeds the SRAM, or null when untiled. */
    public String tiling() {
        return tiling;
    }

    /** True when the node runs on the device and was priced. */
    public boolean priced() {
        return priced;
    }

    /** MACs (or vector ops when it has none) per byte of DRAM traffic; infinite with no DRAM traffic. */
    public double intensity() {
        long ops = work.macs() > 0 ? work.macs() : work.vectorOps();
        long bytes = dramReadBytes + dramWriteBytes;
        return bytes == 0 ? Double.POSITIVE_INFINITY : (double) ops / bytes;
    }

    /** Achieved operations per second: MACs (or vector ops) over latency. */
    public double opsPerSecond() {
        long ops = work.macs() > 0 ? work.macs() : work.vectorOps();
        return latencySeconds == 0 ? 0 : ops / latencySeconds;
    }
}
