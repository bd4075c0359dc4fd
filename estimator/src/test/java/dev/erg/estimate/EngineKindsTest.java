package dev.erg.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeployedPrecision.Origin;
import dev.erg.workload.ModelWorkload;
import org.junit.jupiter.api.Test;

/**
 * The analog-sum array and the in-memory macro on examples small enough to work by hand
 * (docs/method.md, sections 7 and 8: every number below is derived there too), and the utilisation
 * the in-memory mapping gives layers that do not fill a macro.
 */
class EngineKindsTest {
    private static final double EPS = 1e-12;

    static String macro(int rows, int columns, int macros, int bitsPerCell, String extra) {
        return "  - id: macro\n    kind: in-memory-macro\n    rows: " + rows + "\n    columns: " + columns
                + "\n    macros: " + macros + "\n    bits-per-cell: " + bitsPerCell + "\n" + extra
                + "    row-drive-energy-fj: 10\n    column-energy-fj: 20\n    conversion-energy-fj: 100\n"
                + "    converter-bits: 8\n    cell-write-energy-fj: 2\n    shift-add-energy-fj: 5\n"
                + "  - id: vector\n    kind: vector\n    lanes: 16\n    op-energy-fj: { int8: 10 }\n";
    }

    /**
     * Depthwise 3x3 (32 channels, 14 x 14, int8) on a 256-row x 64-column macro, 1 bit per cell: a channel
     * needs k = 9 rows and 8 columns (8 weight bits); 8 channels share the macro side by side (64 / 8), each in
     * its own 9 rows. 4 passes x 196 positions = 784 cycles; useful cells per cycle 8 x 9 x 8 of 256 x 64:
     * utilisation 9/256 (a column of 256 cells does 9 useful products), the check.
     */
    @Test
    void depthwiseOnA256RowMacroUsesNineOf256() {
        ModelWorkload w = Models.analyze(Models.conv(32, 14, 14, 32, 3, 32));
        DeviceProfile d = Profiles.of(macro(256, 64, 1, 1, "    input-bits-per-cycle: 8\n"));
        NodeEstimate c = Models.only(Estimator.estimate(w, d), "Conv");
        assertEquals(4, c.passes());
        assertEquals(784, c.computeCycles());
        assertEquals(9.0 / 256, c.utilization(), EPS);
    }

    /**
     * A 1x1 conv with C = 512 inputs and 64 outputs (7 x 7, int8) on 256-row x 512-column macros: the
     * reduction of 512 needs two row tiles (two passes), added digitally; 64 x 8 = 512 columns fill the
     * width, so both passes use every cell: utilisation 1. Two macros hold the two tiles and run them at
     * once (49 cycles); the partial sums of one pass are added to the other's digitally.
     */
    @Test
    void aReductionOf512On256RowsTakesTwoPasses() {
        ModelWorkload w = Models.analyze(Models.conv(512, 7, 7, 64, 1, 1));
        DeviceProfile d = Profiles.of(macro(256, 512, 2, 1, "    input-bits-per-cycle: 8\n"));
        NodeEstimate c = Models.only(Estimator.estimate(w, d), "Conv");
        assertEquals(2, c.passes());
        assertEquals(49, c.computeCycles());
        assertEquals(1.0, c.utilization(), EPS);
        // Inputs read once (49 x 512 B, each row tile reads its half); partial sums 4 B x 49 x 64 out and back.
        assertEquals(49L * 512 + 4 * 49 * 64, c.sramReadBytes());
        assertEquals(4 * 49 * 64 + 49 * 64, c.sramWriteBytes());
    }

    /**
     * Worked example 7 of docs/method.md: x [4, 300] x w [300, 20] at int8 activations, on macros of
     * 128 x 64 cells with 2 bits per cell and weight-bits 4 (2 columns per output, 40 columns), 64 rows
     * driven at once and 2 input bits per cycle (4 cycles per 8-bit input).
     */
    @Test
    void workedExampleInMemoryMacro() {
        ModelWorkload w = Models.analyze(Models.matmul(4, 300, 20));
        DeviceProfile d = Profiles.of(macro(128, 64, 2, 2, "    weight-bits: 4\n    rows-active: 64\n"
                + "    input-bits-per-cycle: 2\n"));
        DeviceEstimate e = Estimator.estimate(w, d);
        NodeEstimate m = Models.only(e, "MatMul");
        assertEquals(4, m.deployed().weightBits());
        assertEquals(8, m.deployed().activationBits());
        assertEquals(Origin.PROFILE, m.deployed().weightOrigin());
        assertEquals("w4a8", m.deployed().label());
        // Row tiles of 128, 128 and 44 rows: 3 passes; 2 macros run them in ceil(3/2) = 2 rounds.
        assertEquals(3, m.passes());
        // Cycles: 2 rounds x 4 positions x 4 input cycles x ceil(128/64) = 2 row groups = 64.
        assertEquals(64, m.computeCycles());
        // Column reads: 4 positions x 4 input cycles x 40 columns x (2 + 2 + 1) row groups = 3200.
        assertEquals(3200, m.columnOps());
        assertEquals(3200, m.conversions());
        assertEquals(3200, m.partialAdds());
        // Rows driven: 4 positions x 4 input cycles x 300 rows = 4800.
        assertEquals(4800, m.rowDrives());
        // Utilisation: 24000 MACs x 2 columns x 4 cycles / (64 cycles x 128 x 64 x 2 cells) = 192000 / 1048576.
        assertEquals(192_000.0 / 1_048_576, m.utilization(), EPS);
        // SRAM: inputs 4 x 300 = 1200 B and partial sums 4 B x 4 x 20 x 2 = 640 B read; 640 + 80 outputs written.
        assertEquals(1840, m.sramReadBytes());
        assertEquals(720, m.sramWriteBytes());
        // Energy: compute 3200 x 20 + 3200 x 5 fJ = 80 pJ; conversion 3200 x 100 fJ = 320 pJ; row drive 48 pJ.
        assertEquals(80e-12, m.energy().compute(), 1e-21);
        assertEquals(320e-12, m.energy().conversion(), 1e-21);
        assertEquals(48e-12, m.energy().rowDrive(), 1e-21);
        assertEquals(0, m.energy().cellWrites());
        // 300 x 20 x 2 = 12000 cells fit 2 x 128 x 64 = 16384: the weights stay; none is read per frame.
        assertFalse(e.weightsReloadedEachFrame());
        // Of the macro's own energy, conversion is the largest; the frame's DRAM (input and output) is larger still.
        assertEquals(Energy.Destination.DRAM, m.energy().dominant());
    }

    /**
     * The same layer on one macro (8192 cells < 12000): the weights are read from DRAM (300 x 20 x 4 bits
     * = 3000 B) and written into 12000 cells every frame, taking 300 row writes; the result says so.
     */
    @Test
    void weightsBeyondTheMacrosReloadEveryFrame() {
        ModelWorkload w = Models.analyze(Models.matmul(4, 300, 20));
        DeviceProfile d = Profiles.of(macro(128, 64, 1, 2, "    weight-bits: 4\n    rows-active: 64\n"
                + "    input-bits-per-cycle: 2\n"));
        DeviceEstimate e = Estimator.estimate(w, d);
        NodeEstimate m = Models.only(e, "MatMul");
        assertTrue(e.weightsReloadedEachFrame());
        assertTrue(m.weightsReloaded());
        assertEquals(12_000, m.cellWrites());
        assertEquals(24e-12, m.energy().cellWrites(), 1e-21);
        assertEquals(3000, m.weightBytes());
        // DRAM: the weights 3000 B and the model input 4 x 300 = 1200 B read; the output 80 B written.
        assertEquals(3000 + 1200, m.dramReadBytes());
        // 3 rounds x 4 x 4 x 2 = 96 compute cycles + 300 row writes.
        assertEquals(96 + 300, m.computeCycles());
        assertTrue(e.assumptions().stream().anyMatch(a -> a.contains("written into the cells every frame")),
                e.assumptions().toString());
    }

    /**
     * Worked example 8 of docs/method.md: x [10, 100] x w [100, 8] at int8 on a 32 x 4 analog-sum array:
     * ceil(100/32) = 4 row folds, ceil(8/4) = 2 column folds; 4 x 2 x 10 = 80 cycles; utilisation
     * 8000 / (80 x 128) = 0.78125. Read-outs 10 x 8 x 4 = 320, of which 10 x 8 x 3 = 240 are added digitally.
     */
    @Test
    void workedExampleAnalogSumArray() {
        ModelWorkload w = Models.analyze(Models.matmul(10, 100, 8));
        DeviceProfile d = Profiles.of("  - id: analog\n    kind: analog-sum-array\n    rows: 32\n    columns: 4\n"
                + "    multiply-energy-fj: { int8: 40 }\n    accumulation-energy-fj: 4\n    conversion-energy-fj: 200\n"
                + "    converter-bits: 8\n    partial-add-energy-fj: 10\n");
        NodeEstimate m = Models.only(Estimator.estimate(w, d), "MatMul");
        assertEquals(80, m.computeCycles());
        assertEquals(0.78125, m.utilization(), EPS);
        assertEquals(320, m.conversions());
        assertEquals(240, m.partialAdds());
        // compute 8000 x 40 + 8000 x 4 + 240 x 10 = 354400 fJ, of which accumulation 34400 fJ; conversion 64000 fJ.
        assertEquals(354.4e-12, m.energy().compute(), 1e-21);
        assertEquals(34.4e-12, m.energy().accumulation(), 1e-21);
        assertEquals(64e-12, m.energy().conversion(), 1e-21);
        // SRAM (weight-stationary mapping): weights 800 + inputs 10 x 100 x 2 = 2000 + partial sums 4 x 80 x 3 = 960.
        assertEquals(3760, m.sramReadBytes());
        assertEquals(960 + 80, m.sramWriteBytes());
        // Registers: the two operands per MAC only; sums stay on the column.
        assertEquals(16_000, m.registerReadBytes());
        assertEquals(0, m.registerWriteBytes());
    }

    /**
     * A 1-bit (+1/-1) MAC on a digital array with xnor-energy-fj and popcount-energy-fj is an XNOR plus the
     * popcount share: x [16, 64] x w [64, 8] deployed at int1: 8192 x (0.1 + 1) fJ, of which 8192 x 1 fJ adds.
     */
    @Test
    void aOneBitMacIsAnXnorAndAPopcountShare() {
        ModelWorkload w = Models.analyze(Models.matmul(16, 64, 8));
        DeviceProfile d = Profiles.load("name: t\nclock-mhz: 100\ndeploy-precision: int1\nengines:\n"
                + "  - id: mac-array\n    kind: mac-array\n    rows: 8\n    columns: 8\n    dataflow: weight-stationary\n"
                + "    mac-energy-fj: { int8: 50 }\n    xnor-energy-fj: 0.1\n    popcount-energy-fj: 1\n"
                + "  - id: vector\n    kind: vector\n    lanes: 16\n    op-energy-fj: { int8: 10 }\n" + Profiles.MEMORIES);
        NodeEstimate m = Models.only(Estimator.estimate(w, d), "MatMul");
        assertEquals("int1", m.precision());
        assertEquals("w1a1", m.deployed().label());
        assertEquals(8192 * 1.1e-15, m.energy().compute(), 1e-24);
        assertEquals(8192 * 1e-15, m.energy().accumulation(), 1e-24);
        // Weights at 1 bit: 64 x 8 / 8 = 64 B.
        assertEquals(64, m.weightBytes());
    }
}
