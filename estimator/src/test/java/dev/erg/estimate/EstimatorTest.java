package dev.erg.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.device.Dataflow;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import java.util.List;
import org.junit.jupiter.api.Test;

/**
 * The estimation method of docs/method.md, checked on examples small enough to work by hand. Every
 * expected number below is derived in the comment above it (and in docs/method.md).
 */
class EstimatorTest {
    private static final double EPS = 1e-12;

    /**
     * Worked example 1 of docs/method.md: Conv 1x8x10x10 * 16x8x3x3, pads 1, deployed at int8 on an
     * 8x8 weight-stationary array. m = 100 positions, k = 8*3*3 = 72, n = 16.
     * folds: ceil(72/8) = 9 on rows, ceil(16/8) = 2 on columns; cycles = 9*2*100 = 1800.
     */
    @Test
    void workedExampleWeightStationary() {
        ModelWorkload w = Models.analyze(Models.conv(8, 10, 10, 16, 3, 1));
        DeviceEstimate e = Estimator.estimate(w, new TestDevice().build());
        NodeEstimate c = Models.only(e, "Conv");
        assertEquals(115_200, c.work().macs());
        assertEquals(1800, c.computeCycles());
        assertEquals(1.0, c.utilization(), EPS);
        // SRAM reads: weights 72*16 = 1152, inputs 100*72*2 folds = 14400,
        // partial sums 4 B * 100*16 * (9-1) = 51200; total 66752.
        assertEquals(66_752, c.sramReadBytes());
        // SRAM writes: partial sums 51200 + outputs 1 B * 100*16 = 1600; total 52800.
        assertEquals(52_800, c.sramWriteBytes());
        // Registers: per MAC read 1 + 1 + 4 B, write 4 B.
        assertEquals(115_200L * 6, c.registerReadBytes());
        assertEquals(115_200L * 4, c.registerWriteBytes());
        // Weights 1152 B + peak activations 800 + 1600 B fit 64 KiB: resident; DRAM per frame is the
        // model input (800 B read) and output (1600 B written).
        assertTrue(e.weightsResident());
        assertEquals(1152, e.residentWeightBytes());
        assertEquals(800, c.dramReadBytes());
        assertEquals(1600, c.dramWriteBytes());
        // Times at 100 MHz: compute 18 us; SRAM (66752 + 52800) / 1.6 GB/s = 74.72 us; DRAM 2400 / 1 GB/s = 2.4 us.
        assertEquals(18e-6, c.computeSeconds(), 1e-15);
        assertEquals(74.72e-6, c.sramSeconds(), 1e-15);
        assertEquals(2.4e-6, c.dramSeconds(), 1e-15);
        assertEquals(Bound.SRAM, c.bound());
        assertEquals(74.72e-6, e.latencySeconds(), 1e-15);
        // Energy: compute 115200 * 100 fJ = 11.52 nJ; registers 691200*5 + 460800*5 fJ = 5.76 nJ;
        // SRAM 66752*50 + 52800*60 fJ = 6.5056 nJ; DRAM 2400 * 20 pJ = 48 nJ; static 1 mW * 74.72 us = 74.72 nJ.
        assertEquals(11.52e-9, c.energy().compute(), 1e-18);
        assertEquals(5.76e-9, c.energy().registers(), 1e-18);
        assertEquals(6.5056e-9, c.energy().sram(), 1e-18);
        assertEquals(48e-9, c.energy().dram(), 1e-18);
        assertEquals(74.72e-9, c.energy().staticEnergy(), 1e-18);
        assertEquals(146.5056e-9, e.energyPerFrameJoules(), 1e-17);
        // Average power at 1000 frames/s: 71.7856 nJ * 1000 + 1 mW = 1.0717856 mW.
        assertEquals(1.0717856e-3, e.averagePowerWatts(1000), 1e-12);
        assertEquals(1 / 74.72e-6, e.maxFps(), 1e-6);
    }

    /**
     * The convolution of worked example 1 on an 8x8 output-stationary array: positions on rows,
     * output channels on columns, the reduction streamed. folds ceil(100/8) = 13 x ceil(16/8) = 2;
     * cycles 13 * 2 * 72 = 1872; utilisation 115200 / (1872 * 64) = 0.9615...; SRAM reads: inputs
     * 100*72*2 = 14400 + weights 72*16*13 = 14976 = 29376; writes: outputs once, 1600.
     */
    @Test
    void outputStationaryCounts() {
        ModelWorkload w = Models.analyze(Models.conv(8, 10, 10, 16, 3, 1));
        TestDevice d = new TestDevice();
        d.dataflow = Dataflow.OUTPUT_STATIONARY;
        NodeEstimate c = Models.only(Estimator.estimate(w, d.build()), "Conv");
        assertEquals(1872, c.computeCycles());
        assertEquals(115_200.0 / (1872 * 64), c.utilization(), EPS);
        assertEquals(29_376, c.sramReadBytes());
        assertEquals(1_600, c.sramWriteBytes());
        assertEquals(115_200L * 6, c.registerReadBytes());
        assertEquals(115_200L * 4, c.registerWriteBytes());
    }

    /** The same convolution on wider arrays: fewer folds, fewer SRAM reads. */
    @Test
    void sramTrafficFallsAsTheArrayWidens() {
        ModelWorkload w = Models.analyze(Models.conv(8, 10, 10, 16, 3, 1));
        TestDevice d = new TestDevice();
        NodeEstimate narrow = Models.only(Estimator.estimate(w, d.build()), "Conv");
        d.columns = 16;
        NodeEstimate wide = Models.only(Estimator.estimate(w, d.build()), "Conv");
        // 8 x 16: one column fold, inputs read once: 1152 + 7200 + 51200 = 59552; writes unchanged.
        assertEquals(59_552, wide.sramReadBytes());
        assertEquals(52_800, wide.sramWriteBytes());
        d.rows = 24;
        NodeEstimate tall = Models.only(Estimator.estimate(w, d.build()), "Conv");
        // 24 x 16: ceil(72/24) = 3 row folds: partial sums 4 * 1600 * 2 = 12800 each way;
        // reads 1152 + 7200 + 12800 = 21152, writes 12800 + 1600 = 14400.
        assertEquals(21_152, tall.sramReadBytes());
        assertEquals(14_400, tall.sramWriteBytes());
        assertTrue(narrow.sramReadBytes() > wide.sramReadBytes() && wide.sramReadBytes() > tall.sramReadBytes());
        assertTrue(narrow.sramWriteBytes() > tall.sramWriteBytes());
    }

    /**
     * Depthwise 3x3 (group = channels) on a 16x16 weight-stationary array: per group k = 1*3*3 = 9
     * and n = 1, so one fold uses 9 of 256 units: utilisation 9/256 (docs/method.md, worked example 2).
     */
    @Test
    void depthwiseUtilisationIsNineOf256() {
        ModelWorkload w = Models.analyze(Models.conv(32, 14, 14, 32, 3, 32));
        TestDevice d = new TestDevice();
        d.rows = 16;
        d.columns = 16;
        NodeEstimate c = Models.only(Estimator.estimate(w, d.build()), "Conv");
        assertEquals(32L * 196 * 9, c.work().macs());
        assertEquals(32L * 196, c.computeCycles());
        assertEquals(9.0 / 256, c.utilization(), EPS);
    }

    /**
     * No reuse: three operand-width SRAM reads (activation, weight, partial sum) and one write per MAC.
     * With typical 22 nm 8-bit figures that is near 500 fJ per MAC, most of it in memory: a rule of the
     * trade (common practice, no single source); the figures here are typical values from memory:
     * 8-bit MAC 50 fJ, SRAM 110 fJ per byte read or written.
     */
    @Test
    void noReuseFourAccessesPerMac() {
        ModelWorkload w = Models.analyze(Models.matmul(16, 32, 8));
        TestDevice d = new TestDevice();
        d.dataflow = Dataflow.NO_REUSE;
        d.macFj = 50;
        d.sramRead = 110;
        d.sramWrite = 110;
        d.registers = false;
        NodeEstimate m = Models.only(Estimator.estimate(w, d.build()), "MatMul");
        long macs = 16L * 32 * 8;
        assertEquals(macs, m.work().macs());
        assertEquals(3 * macs, m.sramReadBytes());
        assertEquals(macs, m.sramWriteBytes());
        double onChipPerMac = (m.energy().compute() + m.energy().sram() + m.energy().registers()) / macs;
        assertEquals(490e-15, onChipPerMac, 1e-18);
        assertTrue(onChipPerMac > 400e-15 && onChipPerMac < 600e-15, "near 500 fJ per MAC");
        assertTrue(m.energy().sram() > 0.5 * (m.energy().sram() + m.energy().compute()), "most of it in memory");
    }

    /** A Conv followed by Relu moves the activation once, not twice (the Relu runs on the way out). */
    @Test
    void fusedReluMovesTheActivationOnce() {
        OnnxWriter.Graph g = Models.conv(8, 10, 10, 16, 3, 1);
        OnnxWriter.Graph fused = new OnnxWriter.Graph("fused")
                .input("x", ElemType.FLOAT, 1, 8, 10, 10)
                .weight("w", ElemType.FLOAT, 16, 8, 3, 3)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu", List.of("y"), List.of("z"))
                .output("z", ElemType.FLOAT);
        OnnxWriter.Graph apart = new OnnxWriter.Graph("apart")
                .input("x", ElemType.FLOAT, 1, 8, 10, 10)
                .weight("w", ElemType.FLOAT, 16, 8, 3, 3)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu", List.of("y"), List.of("z"))
                .output("y", ElemType.FLOAT)
                .output("z", ElemType.FLOAT);
        DeviceEstimate f = Estimator.estimate(Models.analyze(fused), new TestDevice().build());
        DeviceEstimate a = Estimator.estimate(Models.analyze(apart), new TestDevice().build());
        long act = 1600; // 1 x 16 x 10 x 10 at int8
        NodeEstimate fc = Models.only(f, "Conv");
        NodeEstimate fr = Models.only(f, "Relu");
        assertEquals("conv", fr.fusedInto());
        assertEquals(0, fr.sramReadBytes());
        assertEquals(act, fr.sramWriteBytes());
        assertEquals(51_200, fc.sramWriteBytes(), "partial sums only; the activation is written once, by the Relu");
        NodeEstimate ac = Models.only(a, "Conv");
        NodeEstimate ar = Models.only(a, "Relu");
        assertNull(ar.fusedInto());
        assertEquals(51_200 + act, ac.sramWriteBytes());
        assertEquals(act, ar.sramReadBytes());
        assertEquals(act, ar.sramWriteBytes());
        long fusedMoves = fc.sramWriteBytes() - 51_200 + fr.sramReadBytes() + fr.sramWriteBytes();
        long apartMoves = ac.sramWriteBytes() - 51_200 + ar.sramReadBytes() + ar.sramWriteBytes();
        assertEquals(act, fusedMoves);
        assertEquals(3 * act, apartMoves);
        assertTrue(g != null);
    }
}
