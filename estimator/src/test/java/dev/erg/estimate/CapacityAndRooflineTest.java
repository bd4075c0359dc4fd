package dev.erg.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import java.util.List;
import org.junit.jupiter.api.Test;

/** SRAM capacity (resident weights, streamed weights, tiling) and the roofline bound. */
class CapacityAndRooflineTest {

    /** Two layers: x [64,256] -> MatMul w1 [256,256] -> Relu -> MatMul w2 [256,64] -> y, deployed at int8. */
    private static ModelWorkload twoLayers() {
        return Models.analyze(new OnnxWriter.Graph("two")
                .input("x", ElemType.FLOAT, 64, 256)
                .weight("w1", ElemType.FLOAT, 256, 256)
                .weight("w2", ElemType.FLOAT, 256, 64)
                .node("MatMul", "mm1", List.of("x", "w1"), List.of("h"))
                .node("Relu", "relu", List.of("h"), List.of("r"))
                .node("MatMul", "mm2", List.of("r", "w2"), List.of("y"))
                .output("y", ElemType.FLOAT));
    }

    private static long dram(DeviceEstimate e) {
        long b = 0;
        for (NodeEstimate n : e.nodes()) {
            b += n.dramReadBytes() + n.dramWriteBytes();
        }
        return b;
    }

    /**
     * Weights 65536 + 16384 B; activations: x 16384, h (fused into the Relu) 0, r 16384, y 4096.
     * With 128 KiB of SRAM, weights (81920) + peak activations fit: DRAM per frame is the model's
     * input (16384) and output (4096) only.
     */
    @Test
    void residentWeightsLeaveOnlyInputAndOutput() {
        TestDevice d = new TestDevice();
        d.sramBytes = 128 * 1024;
        DeviceEstimate e = Estimator.estimate(twoLayers(), d.build());
        assertTrue(e.weightsResident());
        assertEquals(81_920, e.residentWeightBytes());
        assertEquals(16_384 + 4_096, e.dramBytesPerFrame());
        assertEquals(dram(e), e.dramBytesPerFrame());
    }

    /**
     * With 48 KiB of SRAM (below the 80 KiB of weights) every layer streams its weights each frame.
     * mm1: working set x 16384 + w1 65536 > 49152, so it is tiled (tile 24576 B): weight tiles need
     * ceil(65536/24576) = 3 passes, 65536 + 3*16384 = 114688 B; input tiles need 1 pass,
     * 16384 + 65536 = 81920 B: chosen. Relu: fused behind mm1, writes r (16384 B) on chip.
     * mm2: r 16384 + y 4096 + w2 16384 = 36864 B fit: it reads w2 (16384 B) and writes y (4096 B).
     * DRAM per frame: 81920 + 16384 + 4096 = 102400 B.
     */
    @Test
    void weightsStreamWhenTheSramIsSmaller() {
        TestDevice d = new TestDevice();
        d.sramBytes = 48 * 1024;
        DeviceEstimate e = Estimator.estimate(twoLayers(), d.build());
        assertFalse(e.weightsResident());
        assertEquals(0, e.residentWeightBytes());
        NodeEstimate mm1 = e.nodes().get(0);
        NodeEstimate relu = e.nodes().get(1);
        NodeEstimate mm2 = e.nodes().get(2);
        assertEquals("input tiles x1, weights streamed per tile", mm1.tiling());
        assertEquals(81_920, mm1.dramReadBytes());
        assertEquals(0, mm1.dramWriteBytes());
        assertEquals(0, relu.dramReadBytes() + relu.dramWriteBytes());
        assertEquals(16_384, mm2.dramReadBytes());
        assertEquals(4_096, mm2.dramWriteBytes());
        assertEquals(102_400, e.dramBytesPerFrame());
    }

    /**
     * Spill, worked by hand (deployed at int8, 40 KiB of SRAM, no weights). x (16 KiB) -> Relu a ->
     * Relu b -> Relu c (a graph output), and a ReduceSum of a at the end (the other output, 1 byte).
     * Live bytes per step: 32, 32, 48 and 16 KiB; the peak 48 KiB exceeds the SRAM, so nothing is
     * resident. At step 2 (the third Relu) a is idle until step 3: it is evicted, written to DRAM
     * (16384 B), and read back by the ReduceSum (16384 B). DRAM per frame: x read 16384 at step 0,
     * a written and c written at step 2 (32768), a read and s written at step 3 (16384 + 1).
     */
    @Test
    void anIdleActivationSpillsAndComesBack() {
        ModelWorkload w = Models.analyze(new OnnxWriter.Graph("spill")
                .input("x", ElemType.FLOAT, 16384)
                .node("Relu", "r0", List.of("x"), List.of("a"))
                .node("Relu", "r1", List.of("a"), List.of("b"))
                .node("Relu", "r2", List.of("b"), List.of("c"))
                .node("ReduceSum", "sum", List.of("a"), List.of("s"), OnnxWriter.attr("keepdims", 0L))
                .output("c", ElemType.FLOAT)
                .output("s", ElemType.FLOAT));
        TestDevice d = new TestDevice();
        d.sramBytes = 40 * 1024;
        DeviceEstimate e = Estimator.estimate(w, d.build());
        assertFalse(e.weightsResident());
        assertEquals(48 * 1024, e.activationPeakBytes());
        List<NodeEstimate> n = e.nodes();
        assertEquals(16_384, n.get(0).dramReadBytes());
        assertEquals(0, n.get(0).dramWriteBytes());
        assertEquals(0, n.get(1).dramReadBytes() + n.get(1).dramWriteBytes());
        assertEquals(0, n.get(2).dramReadBytes());
        assertEquals(32_768, n.get(2).dramWriteBytes(), "a spilled, c written out");
        assertEquals(16_384, n.get(3).dramReadBytes(), "a read back");
        assertEquals(1, n.get(3).dramWriteBytes());
        assertEquals(65_537, e.dramBytesPerFrame());
    }

    /**
     * One layer larger than the SRAM: x [64,1024] (64 KiB at int8) times w [1024,256] (256 KiB) into
     * y [64,256] (16 KiB), with 128 KiB of SRAM. A tile may take half: 64 KiB.
     * Keep weight tiles: ceil(256/64) = 4 passes, 256 + 4 * 64 = 512 KiB read.
     * Keep input tiles: ceil(64/64) = 1 pass, 64 + 1 * 256 = 320 KiB read: cheaper, chosen.
     * Plus the 16 KiB output written: 327680 read + 16384 written.
     */
    @Test
    void aLayerLargerThanTheSramIsTiledByTheCheaperLoopOrder() {
        TestDevice d = new TestDevice();
        d.sramBytes = 128 * 1024;
        DeviceEstimate e = Estimator.estimate(Models.analyze(Models.matmul(64, 1024, 256)), d.build());
        NodeEstimate m = e.nodes().get(0);
        assertFalse(e.weightsResident());
        assertEquals("input tiles x1, weights streamed per tile", m.tiling());
        assertEquals(327_680, m.dramReadBytes());
        assertEquals(16_384, m.dramWriteBytes());
    }

    /**
     * Roofline (Williams, Waterman, Patterson, CACM 52(4), 2009): attainable = min(peak, bandwidth x
     * operational intensity). A 1x1 convolution 64 -> 64 channels on 8x8 positions, int8, with a narrow
     * DRAM (10 MB/s) is DRAM-bound; a 3x3 convolution with reuse on a wide DRAM is compute-bound. With
     * utilisation 1 and no per-layer overhead each achieved rate equals the roofline exactly.
     */
    @Test
    void rooflineBounds() {
        TestDevice d = new TestDevice();
        d.dramBytesPerSecond = 10e6;
        d.sramBytesPerCycle = 1e6;
        DeviceEstimate narrow = Estimator.estimate(Models.analyze(Models.conv(64, 8, 8, 64, 1, 1)), d.build());
        NodeEstimate pw = narrow.nodes().get(0);
        assertEquals(1.0, pw.utilization(), 1e-12);
        assertEquals(Bound.DRAM, pw.bound());
        double peak = 64 * d.clockMhz * 1e6; // 8 x 8 units, one MAC each per cycle
        double attainable = Roofline.attainable(peak, d.dramBytesPerSecond, pw.intensity());
        assertEquals(d.dramBytesPerSecond * pw.intensity(), attainable, 1e-6);
        assertEquals(attainable, pw.opsPerSecond(), attainable * 1e-12);

        d.dramBytesPerSecond = 100e9;
        DeviceEstimate wide = Estimator.estimate(Models.analyze(Models.conv(64, 8, 8, 64, 3, 1)), d.build());
        NodeEstimate c3 = wide.nodes().get(0);
        assertEquals(1.0, c3.utilization(), 1e-12);
        assertEquals(Bound.COMPUTE, c3.bound());
        double attainable3 = Roofline.attainable(peak, d.dramBytesPerSecond, c3.intensity());
        assertEquals(peak, attainable3, 1e-6);
        assertEquals(attainable3, c3.opsPerSecond(), attainable3 * 1e-12);
    }

    /** The roofline formula itself, on numbers worked by hand: min(100, 10 x 4) = 40, min(100, 10 x 20) = 100. */
    @Test
    void rooflineFormula() {
        assertEquals(40.0, Roofline.attainable(100, 10, 4), 0);
        assertEquals(100.0, Roofline.attainable(100, 10, 20), 0);
    }
}
