package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.estimate.Models;
import dev.erg.onnx.OnnxWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class GateJsonTest {
    private static final ObjectMapper MAPPER = new ObjectMapper();

    @TempDir
    Path dir;

    private static List<String> names(JsonNode object) {
        List<String> out = new ArrayList<>();
        for (Iterator<String> it = object.fieldNames(); it.hasNext(); ) {
            out.add(it.next());
        }
        return out;
    }

    private static JsonNode json(GateResult r) throws Exception {
        return MAPPER.readTree(GateJson.toBytes(r, r.pairs().get(0)));
    }

    /** Worked example 1 of docs/method.md: Conv 1x8x10x10 -> 16 channels, 3x3, pads 1, on its example device. */
    private Path workedExample1() {
        Path file = dir.resolve("example1.onnx");
        new OnnxWriter.Model(13, Models.conv(8, 10, 10, 16, 3, 1)).write(file);
        return file;
    }

    @Test
    void theAnalysisFieldsComeFirstInTheirOrderThenTheEstimateAndTheGate() throws Exception {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4), Gates.mixed());
        JsonNode root = json(r);
        assertEquals(List.of("model", "totals", "nodes", "unmodelled", "unresolved", "notice", "device", "assumptions",
                "budget", "baseline", "checks", "diff", "passed"), names(root));
        assertEquals(List.of("macs", "vectorOps", "weightBytes", "peakActivationBytes", "nodes", "complete", "folded",
                "views", "latencySeconds", "maxFps", "energyPerFrameJoules", "averagePowerWatts", "fps", "energyJoules",
                "weightsResident", "residentWeightBytes", "deviceWeightBytes", "deviceActivationPeakBytes",
                "dramBytesPerFrame", "weightsReloadedEachFrame", "energyPerMacJoules", "opsPerWatt", "macUtilisation",
                "dominantDestination"), names(root.get("totals")));
        assertEquals(List.of("compute", "registers", "sram", "dram", "conversion", "cellWrites", "rowDrive", "static",
                "total", "accumulation"),
                names(root.at("/totals/energyJoules")));
        JsonNode conv = root.at("/nodes/0");
        assertEquals(List.of("name", "opType", "macs", "vectorOps", "weightBytes", "inputBytes", "outputBytes",
                "precision", "outputShapes", "kind", "weightPrecision", "gemm", "estimate"), names(conv));
        assertEquals(List.of("engine", "precision", "deployed", "weightsReloaded", "latencySeconds", "utilisation", "bound", "computeCycles", "bytes",
                "energyJoules", "seconds"), names(conv.get("estimate")));
        assertEquals(List.of("registerRead", "registerWrite", "sramRead", "sramWrite", "dramRead", "dramWrite"),
                names(conv.at("/estimate/bytes")));
        // The Relu runs fused behind the Conv.
        assertEquals("conv", root.at("/nodes/1/estimate/fusedInto").asText());
        assertEquals(List.of("id", "name", "description", "clockMhz", "staticPowerMw", "deployPrecision",
                "peakMacsPerSecond", "engines", "sram", "dram"), names(root.get("device")));
        JsonNode fps = root.at("/checks/0");
        assertEquals(List.of("kind", "metric", "unit", "value", "limit", "passed", "verdict", "message", "topLayers"), names(fps));
        Check c = r.pairs().get(0).checks().get(0);
        assertEquals("budget", fps.get("kind").asText());
        assertEquals("frameRate", fps.get("metric").asText());
        assertEquals("fps", fps.get("unit").asText());
        assertEquals(c.message(), fps.get("message").asText());
        assertFalse(fps.get("passed").asBoolean());
        assertEquals(1e9, fps.get("limit").asDouble());
        assertFalse(root.get("passed").asBoolean());
        assertEquals(AnalysisJson.NOTICE, root.get("notice").asText());
    }

    @Test
    void workedExampleOneNumberForNumber() throws Exception {
        // docs/method.md, worked example 1 (sections 2, 5 and 6): SRAM 66,752 B read and 52,800 B written,
        // registers 691,200 / 460,800 B, DRAM 800 B in and 1,600 B out, latency 74.72 us (SRAM-bound),
        // frame energy 146.5056 nJ; at 1000 fps, 71.7856 nJ x 1000 + 1 mW = 1.0718 mW.
        GateResult r = Gates.gate(workedExample1(), Budget.builder().targetFps(1000.0).build());
        JsonNode root = json(r);
        JsonNode e = root.at("/nodes/0/estimate");
        assertEquals(66_752, e.at("/bytes/sramRead").asLong());
        assertEquals(52_800, e.at("/bytes/sramWrite").asLong());
        assertEquals(691_200, e.at("/bytes/registerRead").asLong());
        assertEquals(460_800, e.at("/bytes/registerWrite").asLong());
        assertEquals(800, e.at("/bytes/dramRead").asLong());
        assertEquals(1_600, e.at("/bytes/dramWrite").asLong());
        assertEquals("sram", e.get("bound").asText());
        assertEquals(1800, e.get("computeCycles").asLong());
        assertEquals(1.0, e.get("utilisation").asDouble(), 1e-12);
        assertEquals(74.72e-6, e.get("latencySeconds").asDouble(), 1e-15);
        assertEquals(11.52e-9, e.at("/energyJoules/compute").asDouble(), 1e-18);
        assertEquals(5.76e-9, e.at("/energyJoules/registers").asDouble(), 1e-18);
        assertEquals(6.5056e-9, e.at("/energyJoules/sram").asDouble(), 1e-18);
        assertEquals(48e-9, e.at("/energyJoules/dram").asDouble(), 1e-18);
        assertEquals(74.72e-9, e.at("/energyJoules/static").asDouble(), 1e-18);
        JsonNode t = root.get("totals");
        assertEquals(146.5056e-9, t.get("energyPerFrameJoules").asDouble(), 1e-17);
        assertEquals(74.72e-6, t.get("latencySeconds").asDouble(), 1e-15);
        assertEquals(71.7856e-9 * 1000 + 1e-3, t.get("averagePowerWatts").asDouble(), 1e-15);
        assertEquals(1000.0, t.get("fps").asDouble());
        assertEquals(2_400, t.get("dramBytesPerFrame").asLong());
        assertEquals(1_152, t.get("deviceWeightBytes").asLong()); // 16*8*3*3 weights at int8
        assertTrue(t.get("weightsResident").asBoolean());
        // Peak MAC rate of the 8x8 array at 100 MHz: 64 x 1e8 = 6.4e9 MAC/s.
        assertEquals(6.4e9, root.at("/device/peakMacsPerSecond").asDouble());
        assertEquals(1e9, root.at("/device/dram/bytesPerSecond").asDouble());
        assertEquals(1.6e9, root.at("/device/sram/bytesPerSecond").asDouble()); // 16 B/cycle x 100 MHz
    }

    @Test
    void theEstimateDocumentIsTheSameWithoutTheGate() throws Exception {
        GateResult r = Gates.gate(workedExample1(), Budget.none());
        JsonNode gate = json(r);
        JsonNode est = MAPPER.readTree(EstimateJson.toBytes(r.pairs().get(0).estimate(), null));
        assertEquals(List.of("model", "totals", "nodes", "unmodelled", "unresolved", "notice", "device", "assumptions"),
                names(est));
        for (String f : names(est)) {
            if (!f.equals("device")) {
                assertEquals(gate.get(f), est.get(f), f);
            }
        }
        // The gate names the device as configured; the estimate by the profile's own id.
        assertEquals(gate.at("/device/name"), est.at("/device/name"));
    }

    @Test
    void checksAndDiffAgainstABaseline() throws Exception {
        Path before = Files.createDirectories(dir.resolve("a")).resolve("m.onnx");
        Path after = Files.createDirectories(dir.resolve("b")).resolve("m.onnx");
        GateResult base = Gates.gate(Gates.convRelu(before, "conv", "relu", 4), Budget.none());
        GateResult r = Gates.gate(Gates.convRelu(after, "conv", "act", 8), Budget.none(),
                Baseline.of(base.pairs()), "erg-baseline.json", 10.0);
        JsonNode root = json(r);
        JsonNode macs = root.at("/checks/0");
        assertEquals(List.of("kind", "metric", "unit", "value", "limit", "baseline", "passed", "verdict", "message",
                "topLayers"),
                names(macs));
        assertEquals("growth", macs.get("kind").asText());
        // 6,912 -> 13,824 MACs, allowed 10%: limit 7,603.2.
        assertEquals(6912, macs.get("baseline").asDouble());
        assertEquals(13824, macs.get("value").asDouble());
        assertEquals(7603.2, macs.get("limit").asDouble(), 1e-9);
        assertEquals("conv", macs.at("/topLayers/0/name").asText());
        JsonNode diff = root.get("diff");
        assertEquals(3, diff.size());
        assertEquals(List.of("name", "opType", "change", "macsDelta", "energyDeltaJoules", "latencyDeltaSeconds"),
                names(diff.get(0)));
        assertEquals("changed", diff.at("/0/change").asText());
        assertEquals(6912, diff.at("/0/macsDelta").asLong());
        assertEquals("added", diff.at("/1/change").asText());
        assertEquals("act", diff.at("/1/name").asText());
        assertEquals("removed", diff.at("/2/change").asText());
        assertEquals("relu", diff.at("/2/name").asText());
        assertEquals("erg-baseline.json", root.at("/baseline/file").asText());
        assertTrue(root.at("/baseline/found").asBoolean());
        assertTrue(root.at("/baseline/hasEntry").asBoolean());
        assertEquals(10.0, root.at("/baseline/maxGrowthPercent").asDouble());
    }

    @Test
    void aFrameRateWithNoFiniteValueIsNull() throws Exception {
        GateResult r = Gates.gate(Gates.viewOnly(dir.resolve("v.onnx")), Budget.none());
        JsonNode root = json(r);
        assertTrue(root.at("/totals/maxFps").isNull());
        assertEquals(0.0, root.at("/totals/latencySeconds").asDouble());
        assertFalse(root.at("/nodes/0").has("estimate"), "a view does not run on the device");
        String text = new String(GateJson.toBytes(r, r.pairs().get(0)), StandardCharsets.UTF_8);
        assertFalse(text.contains("Infinity") || text.contains("NaN"), text);
    }

    @Test
    void sameInputSameBytes() {
        Path model = Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4);
        GateResult a = Gates.gate(model, Gates.mixed());
        GateResult b = Gates.gate(model, Gates.mixed());
        byte[] first = GateJson.toBytes(a, a.pairs().get(0));
        assertArrayEquals(first, GateJson.toBytes(b, b.pairs().get(0)));
        String s = new String(first, StandardCharsets.UTF_8);
        assertFalse(s.contains("\r"));
        assertTrue(s.endsWith("}\n"));
        assertTrue(s.contains("\n      \"outputShapes\": [[1, 4, 8, 8]],\n"), "the analysis layout is kept");
    }
}
