package dev.erg.estimate;

import dev.erg.device.Engine;
import java.util.List;

/**
 * An in-memory compute macro: weights live in the cells of {@code count} macros of rows x columns
 * cells, {@code bitsPerCell} weight bits each (docs/method.md, section 7).
 *
 * <ul>
 *   <li>The reduction k = C·R·S goes down the rows; output channels x weight columns across the
 *       columns, with {@code ceil(wBits / bits-per-cell)} columns per output channel (bit-sliced).</li>
 *   <li>A group that fits one macro shares it with other groups block-diagonally (depthwise layers):
 *       {@code min(g, floor(rows / k), floor(columns / (n x slices)))} groups per tile.</li>
 *   <li>A layer larger than a macro is folded into tiles (passes): {@code ceil(k / rows)} row tiles x
 *       {@code ceil(n x slices / columns)} column tiles per group; row tiles are added digitally.</li>
 *   <li>{@code rows-active} rows are driven at once; inputs are applied {@code input-bits-per-cycle} bits
 *       per cycle, so a tile takes {@code ceil(rows used / rows-active) x ceil(aBits / input-bits-per-cycle)}
 *       cycles per output position. Macros run tiles in parallel.</li>
 *   <li>Every driven row costs row-drive energy; every column read costs column energy and one
 *       conversion; every conversion result is shifted and added digitally.</li>
 *   <li>When the weights of every layer fit the macros they are written once and stay; otherwise every
 *       layer's weights are read from DRAM and written into the cells every frame ({@link #settle}).</li>
 * </ul>
 */
final class InMemoryMacro implements EngineModel {
    private final Engine engine;
    private final Engine.Macro mc;

    InMemoryMacro(Engine engine) {
        this.engine = engine;
        this.mc = engine.macro();
    }

    @Override
    public Engine engine() {
        return engine;
    }

    @Override
    public boolean holdsWeights() {
        return true;
    }

    /** Weight columns per output channel: the weight bits sliced over cells. */
    long slices(MacJob j) {
        return Math.max(1, DigitalArray.ceilDiv(j.wBits, mc.bitsPerCell()));
    }

    /** Cells that hold the node's weights. */
    long cells(MacJob j) {
        return j.g * j.k * j.n * slices(j);
    }

    @Override
    public void map(MacJob j, NodeEstimate e) {
        if (j.macs == 0) {
            return; // an empty product: no tile, no cycle
        }
        long rows = engine.rows();
        long cols = engine.columns();
        long active = mc.rowsActive();
        long inCycles = DigitalArray.ceilDiv(Math.max(1, j.aBits), mc.inputBitsPerCycle());
        long colsNeed = j.n * slices(j);
        long rowTiles = DigitalArray.ceilDiv(j.k, rows);
        long colTiles = DigitalArray.ceilDiv(colsNeed, cols);
        long perTile = rowTiles == 1 && colTiles == 1 ? Math.max(1, Math.min(j.g, Math.min(rows / j.k, cols / colsNeed)))
                : 1;
        long groupTiles = DigitalArray.ceilDiv(j.g, perTile);
        long tiles = groupTiles * rowTiles * colTiles;
        // Row groups per position per input cycle, summed over the tiles that a column set goes through.
        long columnReads;
        long rowGroupsMax;
        if (perTile > 1) {
            long full = j.g / perTile;
            long last = j.g - full * perTile;
            rowGroupsMax = DigitalArray.ceilDiv(perTile * j.k, active);
            columnReads = full * perTile * colsNeed * rowGroupsMax
                    + (last > 0 ? last * colsNeed * DigitalArray.ceilDiv(last * j.k, active) : 0);
        } else {
            long sumGroups = 0;
            for (long r = 0; r < rowTiles; r++) {
                sumGroups += DigitalArray.ceilDiv(Math.min(rows, j.k - r * rows), active);
            }
            rowGroupsMax = DigitalArray.ceilDiv(Math.min(rows, j.k), active);
            columnReads = j.g * colsNeed * sumGroups;
        }
        long rounds = DigitalArray.ceilDiv(tiles, mc.count());
        e.computeCycles = rounds * j.m * inCycles * rowGroupsMax;
        e.passes = tiles;
        e.columnOps = j.m * inCycles * columnReads;
        e.conversions = e.columnOps;
        e.partialAdds = e.conversions;
        e.rowDrives = j.m * inCycles * j.g * j.k * colTiles;
        double useful = (double) j.macs * slices(j) * inCycles;
        double cells = (double) e.computeCycles * rows * cols * mc.count();
        e.utilization = cells == 0 ? 0 : useful / cells;
        // Inputs: each tile reads its rows' inputs per position; partial sums of row tiles go out and back.
        double reads = j.aB() * j.m * j.g * j.k * colTiles + j.accB() * j.g * j.m * j.n * (rowTiles - 1);
        double writes = j.accB() * j.g * j.m * j.n * (rowTiles - 1) + (j.writesOut ? j.oB() * j.g * j.m * j.n : 0);
        e.sramReadBytes = Math.round(reads);
        e.sramWriteBytes = Math.round(writes);
        e.registerReadBytes = 0;
        e.registerWriteBytes = 0;
    }

    /**
     * Weight capacity: when the cells every layer needs exceed the macros' cells, each layer's weights
     * are read from DRAM and written into the cells every frame, and that takes write cycles. A weight
     * operand computed at run time (a product of two activations) is written from SRAM every time.
     */
    @Override
    public void settle(List<MacJob> jobs, List<NodeEstimate> estimates, Pricing pricing) {
        long need = 0;
        for (MacJob j : jobs) {
            if (j.constantWeights) {
                need += cells(j);
            }
        }
        long have = (long) engine.rows() * engine.columns() * mc.count();
        boolean reload = need > have;
        if (reload) {
            pricing.note("the weights need " + need + " cells but the in-memory macros of '" + engine.id() + "' hold "
                    + have + ": every layer's weights are read from DRAM and written into the cells every frame");
        }
        for (int q = 0; q < jobs.size(); q++) {
            MacJob j = jobs.get(q);
            NodeEstimate e = estimates.get(q);
            if (j.constantWeights && !reload) {
                continue;
            }
            e.weightsReloaded = true;
            e.cellWrites = cells(j);
            long rowsWritten = j.g * j.k * DigitalArray.ceilDiv(j.n * slices(j), engine.columns());
            e.computeCycles += (long) Math.ceil(rowsWritten * mc.writeCyclesPerRow() / mc.count());
            if (j.constantWeights) {
                e.dramReadBytes += e.weightBytes;
            } else {
                e.sramReadBytes += Math.round(j.wB() * j.g * j.k * j.n);
                pricing.note("'" + e.name() + "' multiplies two run-time values on the in-memory macro: its second "
                        + "operand is written into the cells every time");
            }
        }
    }

    @Override
    public Energy price(MacJob j, NodeEstimate e, Pricing pricing) {
        if (mc.rowsActive() > (1L << mc.converterBits())) {
            pricing.note("'" + engine.id() + "': " + mc.rowsActive() + " rows driven at once exceed the "
                    + (1L << mc.converterBits()) + " levels of its " + mc.converterBits() + "-bit converter");
        }
        double sum = e.columnOps * mc.columnFj() + e.partialAdds * mc.shiftAddFj();
        return new Energy(sum * Pricing.FJ, 0, 0, 0, 0, e.conversions * mc.conversionFj() * Pricing.FJ,
                e.cellWrites * mc.cellWriteFj() * Pricing.FJ, e.rowDrives * mc.rowDriveFj() * Pricing.FJ,
                sum * Pricing.FJ);
    }
}
