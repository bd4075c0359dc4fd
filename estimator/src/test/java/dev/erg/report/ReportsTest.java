package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.budget.Budget;
import dev.erg.budget.Check;
import dev.erg.run.DeviceSpec;
import dev.erg.run.ModelSpec;
import dev.erg.run.RunRequest;
import dev.erg.run.Runner;
import dev.erg.budget.GateResult;
import dev.erg.device.DeviceLoader;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ReportsTest {
    @TempDir
    Path dir;

    private static List<String> names(List<Path> files) {
        List<String> out = new ArrayList<>();
        for (Path p : files) {
            out.add(p.getFileName().toString());
        }
        return out;
    }

    @Test
    void everyFormatPerPairInAStableOrder() throws Exception {
        Path model = Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4);
        GateResult r = Gates.run(List.of(new ModelSpec("models/tiny.onnx", model)),
                List.of(Gates.device(), DeviceLoader.load("preset:feeder-npu", null)), Gates.mixed());
        Path out = dir.resolve("target/erg");
        List<Path> files = Reports.write(r, out, Reports.parseFormats("junit, markdown,html,json"));
        assertEquals(List.of("tiny.test-device.json", "tiny.test-device.html", "tiny.test-device.md",
                "TEST-erg.tiny.test-device.xml", "tiny.feeder-npu.json", "tiny.feeder-npu.html", "tiny.feeder-npu.md",
                "TEST-erg.tiny.feeder-npu.xml", "tiny.compare.html", "tiny.compare.md"), names(files));
        for (Path f : files) {
            assertEquals(out, f.getParent());
            assertTrue(Files.size(f) > 0, f.toString());
        }
        // Written again from a fresh evaluation: the same bytes.
        GateResult again = Gates.run(List.of(new ModelSpec("models/tiny.onnx", model)),
                List.of(Gates.device(), DeviceLoader.load("preset:feeder-npu", null)), Gates.mixed());
        Path out2 = dir.resolve("again");
        List<Path> files2 = Reports.write(again, out2, Reports.FORMATS);
        assertEquals(names(files), names(files2));
        for (int i = 0; i < files.size(); i++) {
            assertArrayEquals(Files.readAllBytes(files.get(i)), Files.readAllBytes(files2.get(i)), names(files).get(i));
        }
        assertEquals(List.of("tiny.test-device.html"), names(Reports.write(r, dir.resolve("h"), Set.of("html")))
                .subList(0, 1));
    }

    @Test
    void twoModelsWithOneFileNameAreRefusedBeforeAnyModelIsRead() throws Exception {
        Path a = Gates.convRelu(Files.createDirectories(dir.resolve("a")).resolve("m.onnx"), "conv", "relu", 4);
        // b/m.onnx does not exist: the collision is found before any model is read.
        RunRequest req = RunRequest.builder().model(new ModelSpec("a/m.onnx", a))
                .model(new ModelSpec("b/m.onnx", dir.resolve("b/m.onnx"))).device(new DeviceSpec(Gates.device()))
                .reports(dir.resolve("out"), Set.of("json")).build();
        BadInputException e = assertThrows(BadInputException.class, () -> Runner.run(req, Runner.Progress.NONE));
        assertEquals("a/m.onnx on test-device and b/m.onnx on test-device would write the same report files"
                + " (m.test-device.*); give the models or device files distinct names", e.getMessage());
        assertFalse(Files.exists(dir.resolve("out")), "nothing written");
        // The writer refuses the same collision on a result made elsewhere.
        Path b = Gates.convRelu(Files.createDirectories(dir.resolve("b")).resolve("m.onnx"), "conv", "relu", 8);
        GateResult r = Gates.gate(List.of(new ModelSpec("a/m.onnx", a), new ModelSpec("b/m.onnx", b)),
                List.of(Gates.device()), Budget.none(), null, null, null);
        assertThrows(BadInputException.class, () -> Reports.write(r, dir.resolve("out"), Set.of("json")));
        assertFalse(Files.exists(dir.resolve("out")), "nothing written");
    }

    @Test
    void unknownFormatsAreOneLineErrors() {
        BadInputException e = assertThrows(BadInputException.class, () -> Reports.parseFormats("json,pdf"));
        assertEquals("formats: unknown report format 'pdf' (known: [html, json, junit, markdown])", e.getMessage());
        GateResult r = Gates.gate(Gates.single(dir.resolve("one.onnx")), Budget.none());
        assertThrows(BadInputException.class, () -> Reports.write(r, dir, Set.of("xml")));
    }

    @Test
    void anUnwritableFolderIsAOneLineError() throws Exception {
        Path blocker = Files.writeString(dir.resolve("file"), "x");
        GateResult r = Gates.gate(Gates.single(dir.resolve("one.onnx")), Budget.none());
        BadInputException e = assertThrows(BadInputException.class,
                () -> Reports.write(r, blocker.resolve("sub"), Set.of("json")));
        assertTrue(e.getMessage().startsWith(blocker.resolve("sub") + ": cannot write the report"), e.getMessage());
        assertFalse(e.getMessage().contains("\n"));
    }

    @Test
    void theConsoleListsLayersTotalsAndEveryCheckVerbatim() {
        GateResult r = Gates.gate(Gates.chain(dir.resolve("chain.onnx"), 12), Gates.mixed());
        String text = Reports.console(r);
        List<String> lines = List.of(text.split("\n"));
        assertEquals("chain.onnx on test-device (test device, 100 MHz)", lines.get(0));
        assertEquals("Top 10 of 12 layers by energy (energy in µJ)", lines.get(1));
        assertEquals(List.of("#", "layer", "op", "precision", "from", "MACs", "utilisation", "latency", "µs", "compute", "registers", "SRAM", "DRAM",
                "static", "total", "share", "bound"), List.of(lines.get(2).trim().split(" +")));
        // 10 rows, each as wide as the header once its trailing blanks are cut (right-aligned numbers).
        for (int i = 3; i < 13; i++) {
            assertTrue(lines.get(i).matches(" ?\\d+  mm\\d+ .*"), lines.get(i));
        }
        assertTrue(lines.get(13).startsWith("Totals: latency "), lines.get(13));
        for (Check c : r.pairs().get(0).checks()) {
            assertTrue(lines.contains("  " + (c.passed() ? "ok   " : "FAIL ") + c.message()), c.message());
        }
        assertTrue(lines.contains("verdict: FAIL (1 of 2 checks failed)"));
        assertTrue(text.contains("\nerg: " + r.failureMessage() + "\n"));
        assertTrue(text.endsWith(AnalysisJson.NOTICE + "\n"));
        for (String l : lines) {
            assertFalse(l.endsWith(" "), "trailing blank: " + l);
            assertFalse(l.contains("\u001b"), "no terminal colours");
        }
        // Top 0 lists no layer but keeps the totals and the checks.
        String none = Reports.console(r, 0);
        assertTrue(none.contains("No layers listed (top 0 of 12).\nTotals: "), none);
    }

    @Test
    void aPassingGateAndOneWithNothingToCheck() {
        Path model = Gates.single(dir.resolve("one.onnx"));
        String pass = Reports.console(Gates.gate(model, Budget.builder().maxLatencyMs(10.0).build()));
        assertTrue(pass.contains("\nverdict: pass (1 check)\n\nerg: all budgets hold\n"), pass);
        String nothing = Reports.console(Gates.gate(model, Budget.none()));
        assertTrue(nothing.contains("verdict: nothing checked\n\nerg: no budget and no baseline growth to check\n"),
                nothing);
    }

    @Test
    void theEstimateTableHasThePowerAtTheRequestedRate() {
        GateResult r = Gates.gate(Gates.single(dir.resolve("one.onnx")), Budget.none());
        String t = ConsoleReport.estimate(r.pairs().get(0).estimate(), 10.0, 5);
        assertTrue(t.contains(" mW at 10 fps\n"), t);
        assertTrue(t.startsWith(dir.resolve("one.onnx") + " on test-device (test device, 100 MHz)\nAll 1 layer by energy"),
                t);
    }

    @Test
    void aTerminalEscapeInANodeNameDoesNotReachTheTable() {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("e.onnx"), "conv\u001b[31mred", "relu", 4), Budget.none());
        String t = Reports.console(r);
        assertFalse(t.contains("\u001b"), t);
        assertTrue(t.contains("conv?[31mred"), t);
    }

    @Test
    void stemsAreSafeFileNames() {
        GateResult r = Gates.run(List.of(new ModelSpec("some dir/My Model (v2).onnx",
                Gates.single(dir.resolve("one.onnx")))), List.of(Gates.device()), Budget.none());
        assertEquals("My_Model__v2_.test-device", Reports.stem(r.pairs().get(0)));
    }
}
