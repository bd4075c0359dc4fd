package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.erg.analysis.Analyzer;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AnalysisJsonTest {
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

    /** The contract's fields come first, in the contract's order; more may follow. */
    private static void assertStartsWith(List<String> expected, JsonNode object) {
        List<String> actual = names(object);
        assertTrue(actual.size() >= expected.size(), actual.toString());
        assertEquals(expected, actual.subList(0, expected.size()));
    }

    @Test
    void sameFileGivesSameBytes() throws IOException {
        Path model = ReportModels.convRelu(dir.resolve("tiny.onnx"));
        byte[] first = AnalysisJson.toBytes(Analyzer.analyze(model, Map.of("batch", 1L)));
        byte[] second = AnalysisJson.toBytes(Analyzer.analyze(model, Map.of("batch", 1L)));
        assertArrayEquals(first, second);
        Path written = dir.resolve("deep/folder/report.json");
        AnalysisJson.write(Analyzer.analyze(model, Map.of("batch", 1L)), written);
        assertArrayEquals(first, Files.readAllBytes(written));
        // A second file with the same content analyses to the same bytes but for its own name.
        Files.copy(model, dir.resolve("copy.onnx"));
        String copy = new String(AnalysisJson.toBytes(Analyzer.analyze(dir.resolve("copy.onnx"),
                Map.of("batch", 1L))), StandardCharsets.UTF_8);
        assertEquals(new String(first, StandardCharsets.UTF_8), copy.replace("copy.onnx", "tiny.onnx"));
    }

    @Test
    void layoutIsTwoSpaceIndentWithNewlines() {
        ModelWorkload w = ReportModels.analyzeConvRelu(dir.resolve("tiny.onnx"));
        String json = new String(AnalysisJson.toBytes(w), StandardCharsets.UTF_8);
        assertFalse(json.contains("\r"));
        assertTrue(json.startsWith("{\n  \"model\": {\n    \"file\": "), json);
        assertTrue(json.endsWith("\n}\n"), json);
        for (String line : json.split("\n")) {
            int lead = line.length() - line.stripLeading().length();
            assertEquals(0, lead % 2, line);
            assertFalse(line.endsWith(" "), line);
        }
        assertTrue(json.contains("\"outputShapes\": [[1, 4, 8, 8]]"), json);
    }

    @Test
    void contractFieldsInOrder() throws IOException {
        ModelWorkload w = ReportModels.analyzeConvRelu(dir.resolve("tiny.onnx"));
        JsonNode root = MAPPER.readTree(AnalysisJson.toBytes(w));
        assertStartsWith(List.of("model", "totals", "nodes", "unmodelled"), root);
        assertStartsWith(List.of("file", "opset", "producer"), root.get("model"));
        assertStartsWith(List.of("macs", "vectorOps", "weightBytes", "peakActivationBytes", "nodes"), root.get("totals"));
        for (JsonNode n : root.get("nodes")) {
            assertStartsWith(List.of("name", "opType", "macs", "vectorOps", "weightBytes", "inputBytes",
                    "outputBytes", "precision", "outputShapes"), n);
        }
        assertTrue(root.get("notice").asText().contains("measure"));
        assertTrue(root.get("unmodelled").isArray());
        assertTrue(root.get("unresolved").isArray());
    }

    @Test
    void valuesOfTheHandWorkedModel() throws IOException {
        ModelWorkload w = ReportModels.analyzeConvRelu(dir.resolve("tiny.onnx"));
        JsonNode root = MAPPER.readTree(AnalysisJson.toBytes(w));
        JsonNode m = root.get("model");
        assertEquals(dir.resolve("tiny.onnx").toString(), m.get("file").asText());
        assertEquals(13, m.get("opset").asLong());
        assertEquals("erg-writer", m.get("producer").asText());
        assertEquals("0.1", m.get("producerVersion").asText());
        assertEquals(8, m.get("irVersion").asLong());
        assertEquals("{\"ai.onnx\":13}", m.get("opsets").toString());
        assertEquals("{\"batch\":1}", m.get("dims").toString());

        JsonNode t = root.get("totals");
        assertTrue(t.get("macs").isIntegralNumber());
        assertEquals(6912, t.get("macs").asLong());
        assertEquals(256, t.get("vectorOps").asLong());
        assertEquals(432, t.get("weightBytes").asLong());
        // x (768 B) and y (1,024 B) live at the Conv; y and z (1,024 B each) at the Relu: 2,048 B.
        assertEquals(2048, t.get("peakActivationBytes").asLong());
        assertEquals(2, t.get("nodes").asLong());
        assertTrue(t.get("complete").asBoolean());

        JsonNode conv = root.get("nodes").get(0);
        assertEquals("conv", conv.get("name").asText());
        assertEquals("Conv", conv.get("opType").asText());
        assertEquals(6912, conv.get("macs").asLong());
        assertEquals(432, conv.get("weightBytes").asLong());
        assertEquals(768, conv.get("inputBytes").asLong());
        assertEquals(1024, conv.get("outputBytes").asLong());
        assertEquals("fp32", conv.get("precision").asText());
        assertEquals("fp32", conv.get("weightPrecision").asText());
        assertEquals("mac", conv.get("kind").asText());
        assertEquals("{\"m\":64,\"k\":27,\"n\":4,\"groups\":1}", conv.get("gemm").toString());
        assertFalse(conv.has("note"));

        JsonNode relu = root.get("nodes").get(1);
        assertEquals("relu", relu.get("name").asText());
        assertEquals("vector", relu.get("kind").asText());
        assertEquals(256, relu.get("vectorOps").asLong());
        assertTrue(relu.get("weightPrecision").isNull());
        assertFalse(relu.has("gemm"));
        assertEquals(0, root.get("unmodelled").size());
    }

    @Test
    void fileIsThePathAsGiven() throws IOException {
        Path rel = Path.of("target", "report-test", "relative.onnx");
        Files.createDirectories(rel.getParent());
        ReportModels.convRelu(rel);
        JsonNode root = MAPPER.readTree(AnalysisJson.toBytes(Analyzer.analyze(rel, Map.of("batch", 1L))));
        assertEquals(rel.toString(), root.at("/model/file").asText());
    }

    @Test
    void unmodelledAndUnresolvedAreSortedAndCounted() throws IOException {
        ModelWorkload w = ReportModels.incomplete(dir.resolve("partial.onnx"));
        JsonNode root = MAPPER.readTree(AnalysisJson.toBytes(w));
        assertEquals("[{\"opType\":\"Alpha\",\"count\":1},{\"opType\":\"Zeta\",\"count\":1},"
                + "{\"opType\":\"com.example.Custom\",\"count\":1}]", root.get("unmodelled").toString());
        assertEquals("[{\"opType\":\"Relu\",\"count\":1}]", root.get("unresolved").toString());
        assertFalse(root.at("/totals/complete").asBoolean());
        for (JsonNode n : root.get("nodes")) {
            String name = n.get("name").asText();
            if (name.equals("custom")) {
                assertEquals("com.example", n.get("domain").asText());
                assertTrue(n.get("note").asText().contains("com.example"), n.toString());
            } else {
                assertFalse(n.has("domain"), n.toString());
            }
            if (name.equals("relu_after_zeta")) {
                assertEquals("unresolved", n.get("kind").asText());
                assertEquals("[null]", n.get("outputShapes").toString());
            }
        }
        // Nodes in topological order, which is the file order here.
        List<String> order = new ArrayList<>();
        root.get("nodes").forEach(n -> order.add(n.get("name").asText()));
        assertEquals(List.of("zeta", "alpha", "custom", "relu_after_zeta", "relu_of_x"), order);
    }
}
