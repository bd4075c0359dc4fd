package dev.erg.estimate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import dev.erg.estimate.DeployedPrecision.Origin;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import dev.erg.workload.PrecisionOverrides;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Deployed precision per node: from the model (QDQ, INT4), from the profile, and from override rules. */
class PrecisionTest {
    private static NodeEstimate node(DeviceEstimate e, String name) {
        for (NodeEstimate n : e.nodes()) {
            if (n.name().equals(name)) {
                return n;
            }
        }
        throw new AssertionError("no " + name);
    }

    private static ModelWorkload analyze(Path dir, int opset, OnnxWriter.Graph g) throws Exception {
        Path f = dir.resolve("m.onnx");
        new OnnxWriter.Model(opset, g).write(f);
        ModelWorkload w = Analyzer.analyze(f, Map.of());
        Files.delete(f);
        return w;
    }

    /**
     * ONNX standard, TensorProto: INT4 and UINT4 elements are packed two per byte, so an INT4 initializer
     * of 64 x 32 elements is 1024 bytes. A QDQ model (ONNX operator definitions: QuantizeLinear and
     * DequantizeLinear, opset 21, which admit int4) with int4 weights and int8 activations deploys at
     * w4a8, from the model, and its weights take half a byte each on the device.
     */
    @Test
    void aQdqInt4ModelDeploysAtW4(@TempDir Path dir) throws Exception {
        OnnxWriter.Graph g = new OnnxWriter.Graph("qdq4")
                .input("x", ElemType.FLOAT, 16, 64)
                .initializer(new OnnxWriter.Tensor("sx", ElemType.FLOAT).filled())
                .initializer(new OnnxWriter.Tensor("zx", ElemType.INT8).filled())
                .weight("wq", ElemType.INT4, 64, 32)
                .initializer(new OnnxWriter.Tensor("sw", ElemType.FLOAT).filled())
                .node("QuantizeLinear", "qx", List.of("x", "sx", "zx"), List.of("xq"))
                .node("DequantizeLinear", "dqx", List.of("xq", "sx", "zx"), List.of("xd"))
                .node("DequantizeLinear", "dqw", List.of("wq", "sw"), List.of("wd"))
                .node("MatMul", "fc", List.of("xd", "wd"), List.of("y"))
                .output("y", ElemType.FLOAT);
        ModelWorkload w = analyze(dir, 21, g);
        NodeWork fc = w.nodes().stream().filter(n -> n.name().equals("fc")).findFirst().orElseThrow();
        assertEquals("int4", fc.weightPrecision());
        assertEquals("int8", fc.activationPrecision());
        // The int4 tensor: 64 x 32 / 2 = 1024 bytes; plus the 4-byte scale read through the dequantize.
        assertEquals(1024 + 4, fc.weightBytes());
        TestDevice d = new TestDevice();
        d.deploy = null;
        DeviceEstimate e = Estimator.estimate(w, d.build());
        NodeEstimate n = node(e, "fc");
        assertEquals("w4a8", n.deployed().label());
        assertEquals(Origin.MODEL, n.deployed().origin());
        assertEquals("int4", n.deployed().weightType());
        assertEquals(1024 + 4, n.weightBytes());
        // Priced as a 4 x 8 bit pair, derived from the listed int8 MAC (100 fJ, multiply share f = 0.2 / 0.23):
        // 100 x (f x 4 x 8 / 64 + (1 - f) x 8 / 8) = 56.52 fJ per MAC.
        assertEquals("w4a8", n.precision());
        double f = 0.2 / 0.23;
        assertEquals(16 * 64 * 32 * 100 * (f * 0.5 + (1 - f)) * 1e-15, n.energy().compute(), 1e-18);
    }

    /** Three fully connected layers named like an exported backbone, float weights, deployed at int8. */
    private static ModelWorkload threeLayers() {
        return Models.analyze(new OnnxWriter.Graph("named")
                .input("x", ElemType.FLOAT, 8, 64)
                .weight("w1", ElemType.FLOAT, 64, 64)
                .weight("w2", ElemType.FLOAT, 64, 64)
                .weight("w3", ElemType.FLOAT, 64, 10)
                .node("MatMul", "/stem/fc", List.of("x", "w1"), List.of("h1"))
                .node("MatMul", "/backbone/block1/fc", List.of("h1", "w2"), List.of("h2"))
                .node("MatMul", "/head/fc", List.of("h2", "w3"), List.of("y"))
                .output("y", ElemType.FLOAT));
    }

    /**
     * Rules are tried in order and the first match wins: the backbone at w4a8, everything else at w8a8.
     * Weight bytes follow the deployed width (64 x 64 x 4 bits = 2048 B), and so do the frame's totals.
     */
    @Test
    void overridesSetWeightBitsFirstMatchWins() {
        PrecisionOverrides rules = PrecisionOverrides.parse(List.of("/backbone/*@MatMul=w4a8", "*=w8a8",
                "/backbone/*=w2a2", "/nowhere/*=w2"));
        DeviceEstimate plain = Estimator.estimate(threeLayers(), new TestDevice().build());
        DeviceEstimate e = Estimator.estimate(threeLayers(), new TestDevice().build(), rules);
        NodeEstimate stem = node(e, "/stem/fc");
        NodeEstimate body = node(e, "/backbone/block1/fc");
        assertEquals("w8a8", stem.deployed().label());
        assertEquals(Origin.OVERRIDE, stem.deployed().origin());
        assertEquals("int8", stem.precision());
        assertEquals("w4a8", body.deployed().label());
        assertEquals(Origin.OVERRIDE, body.deployed().weightOrigin());
        assertEquals("w4a8", body.precision());
        assertEquals(2048, body.weightBytes());
        assertEquals(4096, node(plain, "/backbone/block1/fc").weightBytes());
        assertEquals(plain.weightBytes() - 2048, e.weightBytes());
        assertTrue(e.assumptions().contains("precision rule \"/nowhere/*=w2\" matches no node that runs on the device"),
                e.assumptions().toString());
        assertTrue(e.assumptions().contains("precision rule \"/backbone/*=w2a2\" matches no node that runs on the device"),
                "a rule shadowed by an earlier one never decides a node");
    }

    /** An activation override sets the width a node writes its outputs at: 8 x 64 outputs at 4 bits = 256 B. */
    @Test
    void activationBitsSetTheOutputWidth() {
        DeviceEstimate e = Estimator.estimate(threeLayers(), new TestDevice().build(),
                PrecisionOverrides.parse(List.of("/stem/fc=a4")));
        NodeEstimate stem = node(e, "/stem/fc");
        assertEquals("w8a4", stem.deployed().label());
        assertEquals(Origin.PROFILE, stem.deployed().weightOrigin());
        assertEquals(Origin.OVERRIDE, stem.deployed().activationOrigin());
        // Weight-stationary on 8 x 8: outputs 8 x 64 at 4 bits = 256 B; partial sums 4 B x 8 x 64 x 7 = 14336 B.
        assertEquals(256 + 14_336, stem.sramWriteBytes());
    }

    @Test
    void malformedRulesAreOneLine() {
        BadInputException a = assertThrows(BadInputException.class, () -> PrecisionOverrides.parse(List.of("conv=x4")));
        assertEquals("precision rule \"conv=x4\": write PATTERN[@OP]=wNaM, e.g. /backbone/*@Conv=w4a8 (or wN, aM; "
                + "re:EXPR for a regular expression)", a.getMessage());
        BadInputException b = assertThrows(BadInputException.class, () -> PrecisionOverrides.parse(List.of("*=w40")));
        assertEquals("precision rule \"*=w40\": give weight and/or activation bits from 1 to 32 (e.g. w4a8, w4 or a8)",
                b.getMessage());
        BadInputException c = assertThrows(BadInputException.class, () -> PrecisionOverrides.parse(List.of("re:(=w4")));
        assertTrue(c.getMessage().startsWith("precision rule \"re:(\": not a valid regular expression"), c.getMessage());
    }

    @Test
    void globsAndRegexesMatchTheWholeName() {
        PrecisionOverrides o = PrecisionOverrides.parse(List.of("re:^/head/.*$=w8a8", "/back?one/*@Conv=w4"));
        assertEquals(8, o.match("/head/fc", "MatMul").weightBits());
        assertEquals(4, o.match("/backbone/x/conv", "Conv").weightBits());
        assertEquals(0, o.match("/backbone/x/conv", "Conv").activationBits());
        assertNull(o.match("/backbone/x/conv", "MatMul"));
        assertNull(o.match("x/backbone/conv", "Conv"), "a glob matches the whole name");
    }
}
