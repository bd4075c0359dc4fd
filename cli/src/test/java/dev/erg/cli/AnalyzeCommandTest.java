package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AnalyzeCommandTest {
    @TempDir
    Path dir;

    /**
     * x[1,3,8,8] -> Conv(4 filters 3x3, pads 1) -> Relu. ONNX Conv output: (8 + 1 + 1 - 3) / 1 + 1 = 8,
     * so y is [1,4,8,8]; MACs N.K.P.Q.C.R.S = 1*4*8*8*3*3*3 = 6,912 (hand-worked); weights 4*3*3*3
     * fp32 = 108 * 4 = 432 bytes.
     */
    private Path tinyConv(String name) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("tiny")
                .inputDims("x", ElemType.FLOAT, "batch", 3L, 8L, 8L)
                .weight("w", ElemType.FLOAT, 4, 3, 3, 3)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu", List.of("y"), List.of("z"))
                .output("z", ElemType.FLOAT);
        Path p = dir.resolve(name);
        new OnnxWriter.Model(13, g).write(p);
        return p;
    }

    @Test
    void analyzePrintsTheTableAndWritesJson() throws Exception {
        Path model = tinyConv("tiny.onnx");
        Path json = dir.resolve("out/report.json");
        CliRun r = CliRun.of("analyze", model.toString(), "--dim", "batch=1", "--json", json.toString());
        assertEquals(0, r.code, r.toString());
        assertEquals("", r.err);
        assertTrue(r.out.contains("model: " + model), r.out);
        assertTrue(r.out.contains("6,912"), r.out);
        assertTrue(r.out.contains("dims: batch=1"), r.out);
        assertTrue(r.out.contains("JSON written to " + json), r.out);
        JsonNode root = new ObjectMapper().readTree(json.toFile());
        assertEquals(6912, root.at("/totals/macs").asLong());
        assertEquals(432, root.at("/totals/weightBytes").asLong());
        assertEquals(model.toString(), root.at("/model/file").asText());
        assertEquals(1, root.at("/model/dims/batch").asLong());
        assertEquals("[1,4,8,8]", root.at("/nodes/0/outputShapes/0").toString());
    }

    @Test
    void batchScalesTheCount() {
        Path model = tinyConv("tiny.onnx");
        // Conv MACs are linear in N: 4 x 6,912 = 27,648.
        CliRun r = CliRun.of("analyze", model.toString(), "--dim", "batch=4");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("27,648"), r.out);
    }

    @Test
    void topLimitsTheListedNodes() {
        Path model = tinyConv("tiny.onnx");
        CliRun r = CliRun.of("analyze", model.toString(), "--dim", "batch=1", "--top", "1");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("Top 1 of 2 nodes by MACs"), r.out);
        assertTrue(r.out.contains(" conv "), r.out);
        assertTrue(!r.out.contains(" relu "), r.out);
    }

    @Test
    void versionAndHelp() {
        CliRun v = CliRun.of("--version");
        assertEquals(0, v.code, v.toString());
        assertTrue(v.out.matches("erg \\d+\\.\\d+\\.\\d+.*\\R"), v.out);
        for (String[] args : new String[][] {{"--help"}, {"help"}, {"help", "analyze"}, {"analyze", "--help"}}) {
            CliRun h = CliRun.of(args);
            assertEquals(0, h.code, h.toString());
            assertTrue(h.out.contains("Usage: erg"), h.out);
            assertEquals("", h.err);
        }
        assertTrue(CliRun.of("help", "analyze").out.contains("--dim=NAME=VALUE"));
    }

    @Test
    void badOptionsExitTwoWithOneLine() {
        Path model = tinyConv("tiny.onnx");
        String m = model.toString();
        String[][] cases = {
            {"analyze", m, "--dim", "batch"},
            {"analyze", m, "--dim", "=1"},
            {"analyze", m, "--dim", "batch=one"},
            {"analyze", m, "--dim", "batch=1.5"},
            {"analyze", m, "--dim", "batch=-1"},
            {"analyze", m, "--dim", "batch=1", "--dim", "batch=2"},
            {"analyze", m, "--top", "-1"},
            {"analyze", m, "--top", "many"},
            {"analyze", m, "--unknown"},
            {"analyze"},
            {"frobnicate"},
            {},
        };
        for (String[] args : cases) {
            CliRun r = CliRun.of(args);
            String what = String.join(" ", args) + "\n" + r;
            assertEquals(2, r.code, what);
            assertEquals(1, r.errLines().size(), what);
            assertTrue(r.err.startsWith("erg: "), what);
            assertTrue(!r.err.contains("Exception") && !r.err.contains("\tat "), what);
            assertEquals("", r.out, what);
        }
    }

    @Test
    void unwritableJsonTargetIsBadInput() throws Exception {
        Path model = tinyConv("tiny.onnx");
        Path blocker = dir.resolve("file");
        Files.writeString(blocker, "x");
        CliRun r = CliRun.of("analyze", model.toString(), "--dim", "batch=1", "--json", blocker.resolve("r.json").toString());
        assertEquals(2, r.code, r.toString());
        assertEquals(1, r.errLines().size(), r.toString());
        assertTrue(r.err.contains(blocker.resolve("r.json").toString()), r.toString());
    }

    @Test
    void realModelMatchesTheManifest() throws Exception {
        // Ground truth from the shared models' manifest.json for resnet18.graph.onnx: macs_truth
        // 1,814,073,344 (PyTorch forward hooks), nodes 65, weight_elements 11,680,872 (fp32: 4 bytes each).
        Path model = Path.of(getClass().getResource("/models/resnet18.graph.onnx").toURI());
        Path json = dir.resolve("resnet18.json");
        CliRun r = CliRun.of("analyze", model.toString(), "--json", json.toString());
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("(1,814,073,344)"), r.out);
        JsonNode root = new ObjectMapper().readTree(json.toFile());
        assertEquals(1_814_073_344L, root.at("/totals/macs").asLong());
        assertEquals(65, root.at("/totals/nodes").asInt());
        assertEquals(11_680_872L * 4, root.at("/totals/weightBytes").asLong());
        assertEquals(13, root.at("/model/opset").asInt());
        assertEquals("pytorch", root.at("/model/producer").asText());
    }

    @Test
    void unknownOperatorsAreReportedNotFatal() throws Exception {
        OnnxWriter.Graph g = new OnnxWriter.Graph("partial")
                .input("x", ElemType.FLOAT, 1, 16)
                .node("NoSuchOp", "mystery", List.of("x"), List.of("a"))
                .node("Relu", "after", List.of("a"), List.of("b"))
                .output("b", ElemType.FLOAT);
        Path model = dir.resolve("partial.onnx");
        new OnnxWriter.Model(13, g).write(model);
        Path json = dir.resolve("partial.json");
        CliRun r = CliRun.of("analyze", model.toString(), "--json", json.toString());
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("Unmodelled operators: NoSuchOp x1"), r.out);
        assertTrue(r.out.contains("Unresolved operators: Relu x1"), r.out);
        JsonNode root = new ObjectMapper().readTree(json.toFile());
        assertEquals(false, root.at("/totals/complete").asBoolean());
    }

    @Test
    void twoRunsWriteTheSameBytes() throws Exception {
        Path model = tinyConv("tiny.onnx");
        Path a = dir.resolve("a.json");
        Path b = dir.resolve("b.json");
        CliRun first = CliRun.of("analyze", model.toString(), "--dim", "batch=1", "--json", a.toString());
        CliRun second = CliRun.of("analyze", model.toString(), "--dim", "batch=1", "--json", b.toString());
        assertEquals(0, first.code, first.toString());
        assertEquals(0, second.code, second.toString());
        assertArrayEquals(Files.readAllBytes(a), Files.readAllBytes(b));
        assertEquals(first.out.replace(a.toString(), "X"), second.out.replace(b.toString(), "X"));
    }

    @Test
    void internalErrorsAreOneLineWithExitThree() {
        java.io.StringWriter err = new java.io.StringWriter();
        int code = Main.failure(new IllegalStateException("broken rule\n\tat somewhere"), new java.io.PrintWriter(err, true));
        assertEquals(3, code);
        assertEquals("erg: internal error: IllegalStateException: broken rule" + System.lineSeparator(), err.toString());
        err.getBuffer().setLength(0);
        assertEquals(2, Main.failure(new dev.erg.error.BadInputException("m.onnx: bad"), new java.io.PrintWriter(err, true)));
        assertEquals("erg: m.onnx: bad" + System.lineSeparator(), err.toString());
    }
}
