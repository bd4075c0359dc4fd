package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.erg.TestModels;
import dev.erg.budget.Budget;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.Energy;
import dev.erg.run.ModelSpec;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The reports of analog and in-memory engines: the energy destinations they add, each layer's deployed
 * precision and its origin, the weights reloaded every frame, and the comparison of one model on
 * several devices. The model is the project's keyword spotter (lstm_kws.graph.onnx, origin in
 * models/README.md); the devices are the packaged edge22 presets (typical 22 nm figures, from memory).
 */
class EngineReportsTest {
    private static final Path KWS = TestModels.model("lstm_kws.graph.onnx");

    @TempDir
    Path dir;

    private static DeviceProfile preset(String id) {
        return DeviceLoader.load("preset:" + id, null);
    }

    /** The in-memory preset with one macro instead of twelve: 65 536 cells, too few for the weights. */
    private DeviceProfile oneMacro() throws Exception {
        String text;
        try (InputStream in = DeviceLoader.class.getResourceAsStream("presets/edge22-in-memory.yaml")) {
            text = new String(in.readAllBytes(), StandardCharsets.UTF_8);
        }
        assertTrue(text.contains("\n    macros: 12 "), "the preset lists its macros");
        Path p = Files.writeString(dir.resolve("one-macro.yaml"), text.replace("\n    macros: 12 ", "\n    macros: 1 "));
        return DeviceLoader.load(p.toString(), null);
    }

    private static double sumOfNumbers(String split) {
        double sum = 0;
        Matcher m = Pattern.compile("(?:^|, )[a-zA-Z ]+ ([0-9.eE+-]+)").matcher(split.replaceAll(" \\(of it [^)]*\\)", ""));
        while (m.find()) {
            sum += Double.parseDouble(m.group(1));
        }
        return sum;
    }

    @Test
    void theConsoleEnergyLineNamesTheNewDestinationsAndAddsUpToTheFrame() {
        GateResult r = Gates.run(List.of(new ModelSpec("kws.onnx", KWS)), List.of(preset("edge22-in-memory")),
                Budget.none());
        String text = Reports.console(r);
        String line = text.lines().filter(l -> l.startsWith("Energy: ")).findFirst().orElseThrow();
        // The destinations of an in-memory macro (docs/method.md, section 7) beside the digital five.
        assertTrue(line.matches("Energy: compute \\S+ \\(of it accumulation \\S+\\), registers \\S+, SRAM \\S+, DRAM \\S+,"
                + " conversion \\S+, cell writes \\S+, row drive \\S+, static \\S+ µJ"), line);
        // The parts of a split add up to the whole (common practice, no single source): within the
        // rounding of eight three-digit figures.
        PairResult p = r.pairs().get(0);
        double total = p.estimate().energyPerFrameJoules() * 1e6;
        assertEquals(total, sumOfNumbers(line.substring("Energy: ".length(), line.length() - " µJ".length())),
                total * 0.01, line);
        double parts = 0;
        for (Energy.Destination d : Figures.of(p).destinations()) {
            parts += p.estimate().energy().of(d);
        }
        assertEquals(p.estimate().energy().total(), parts, 1e-12 * p.estimate().energy().total());
        // A digital profile keeps its five destinations.
        String digital = Reports.console(Gates.run(List.of(new ModelSpec("kws.onnx", KWS)), List.of(preset("edge22-reuse")),
                Budget.none()));
        assertTrue(digital.contains("\nEnergy: compute "), digital);
        assertFalse(digital.contains("conversion"), digital);
    }

    @Test
    void everyTableShowsEachLayersPrecisionAndWhereItCameFrom() throws Exception {
        ModelSpec m = new ModelSpec("kws.onnx", KWS).withPrecision(List.of("/rnn/LSTM_1=w4a8", "/nowhere/*=w2"));
        GateResult r = Gates.run(List.of(m), List.of(preset("edge22-in-memory")), Budget.none());
        // The rule that matches nothing is a note of the run.
        assertTrue(r.notes().contains("kws.onnx: precision rule \"/nowhere/*=w2\" matches no node of the model; it"
                + " changes nothing"), r.notes().toString());
        String console = Reports.console(r);
        assertTrue(console.lines().anyMatch(l -> l.matches("\\d+ +/rnn/LSTM_1 +LSTM +w4a8 +override .*")), console);
        // The preset deploys float tensors at int1 (its deploy-precision).
        assertTrue(console.lines().anyMatch(l -> l.matches("\\d+ +/rnn/LSTM +LSTM +w1a1 +profile default .*")), console);
        Reports.write(r, dir, Reports.FORMATS);
        String md = Files.readString(dir.resolve("kws.edge22-in-memory.md"));
        assertTrue(md.contains("| # | layer | op | precision | from | MACs | utilisation | latency µs | compute | registers"
                + " | SRAM | DRAM | conversion | cell writes | row drive | static | total | share | bound |"), md);
        assertTrue(md.contains("| `/rnn/LSTM_1` | `LSTM` | w4a8 | override | "), md);
        String html = Files.readString(dir.resolve("kws.edge22-in-memory.html"));
        assertTrue(html.contains(">w4a8 <span class=\"muted\">override</span></td>"), "precision cell in the HTML table");
        assertTrue(html.contains("<th>conversion</th><th>cell writes</th><th>row drive</th>"), "energy columns");
        JsonNode json = new ObjectMapper().readTree(dir.resolve("kws.edge22-in-memory.json").toFile());
        JsonNode lstm1 = null;
        for (JsonNode n : json.get("nodes")) {
            if (n.get("name").asText().equals("/rnn/LSTM_1")) {
                lstm1 = n;
            }
        }
        assertEquals("w4a8", lstm1.at("/estimate/deployed/label").asText());
        assertEquals("override", lstm1.at("/estimate/deployed/origin").asText());
        assertEquals(4, lstm1.at("/estimate/deployed/weightBits").asInt());
    }

    @Test
    void theHtmlChartAndCaptionsDescribeTheInMemoryMacro() throws Exception {
        GateResult r = Gates.run(List.of(new ModelSpec("kws.onnx", KWS)), List.of(preset("edge22-in-memory")),
                Budget.none());
        Reports.write(r, dir, java.util.Set.of("html", "json"));
        String html = Files.readString(dir.resolve("kws.edge22-in-memory.html"));
        for (String d : List.of("compute", "registers", "SRAM", "DRAM", "conversion", "cell writes", "row drive", "static")) {
            assertTrue(html.contains("<span><i style=\"background:" + Palette.destination(destination(d)) + "\"></i>" + d
                    + "</span>"), "legend entry " + d);
        }
        // The roof and the device line describe the macros, not the vector unit the profile also has.
        assertTrue(html.contains("The flat roof is the peak of the 12 in-memory macros of 256×256 cells, 1 bit per cell"
                + " at w1a1 ("), html);
        assertFalse(html.contains("-lane vector unit ("), "the roofline describes the vector unit");
        assertTrue(html.contains("<li>Device: edge22 step 5"), html);
        assertTrue(html.contains(", 12 in-memory macros of 256×256 cells, 1 bit per cell,"), "device line");
        // Peak: 12 macros x 256 rows driven at once x 256 columns / (1 slice x 1 input cycle) x 500 MHz
        // (docs/method.md, section 7: one MAC per useful cell per cycle).
        JsonNode json = new ObjectMapper().readTree(dir.resolve("kws.edge22-in-memory.json").toFile());
        assertEquals(12.0 * 256 * 256 * 500e6, json.at("/device/peakMacsPerSecond").asDouble(), 1);
        // JSON: every destination, and they add up to the total.
        JsonNode e = json.at("/totals/energyJoules");
        double sum = 0;
        for (String k : List.of("compute", "registers", "sram", "dram", "conversion", "cellWrites", "rowDrive", "static")) {
            sum += e.get(k).asDouble();
        }
        assertEquals(e.get("total").asDouble(), sum, 1e-9 * e.get("total").asDouble());
        assertTrue(e.get("conversion").asDouble() > 0, "an in-memory macro converts every column sum");
        assertEquals("conversion", json.at("/totals/dominantDestination").asText());
    }

    private static Energy.Destination destination(String label) {
        for (Energy.Destination d : Energy.Destination.values()) {
            if (Figures.label(d).equals(label)) {
                return d;
            }
        }
        throw new IllegalArgumentException(label);
    }

    @Test
    void weightsThatDoNotFitTheMacrosAreFlaggedAsReloadedEveryFrame() throws Exception {
        GateResult r = Gates.run(List.of(new ModelSpec("kws.onnx", KWS)), List.of(oneMacro()), Budget.none());
        PairResult p = r.pairs().get(0);
        assertTrue(p.estimate().weightsReloadedEachFrame());
        String console = Reports.console(r);
        assertTrue(console.contains("reloaded into the in-memory macros every frame"), console);
        assertTrue(console.lines().anyMatch(l -> l.matches("\\d+ +/rnn/LSTM_1 .* reloaded")), console);
        Reports.write(r, dir, Reports.FORMATS);
        String md = Files.readString(dir.resolve("kws.one-macro.md"));
        assertTrue(md.contains(" | bound | weights |\n"), md);
        assertTrue(md.contains("| weights | 26.9 KiB | reloaded every frame: the in-memory macros cannot hold them"), md);
        String html = Files.readString(dir.resolve("kws.one-macro.html"));
        assertTrue(html.contains("<p class=\"warn\" id=\"reloaded\">Weights reloaded every frame"), "warning");
        assertTrue(html.contains("\">reloaded</span>"), "layer tag");
        JsonNode json = new ObjectMapper().readTree(dir.resolve("kws.one-macro.json").toFile());
        assertTrue(json.at("/totals/weightsReloadedEachFrame").asBoolean());
        assertTrue(json.at("/totals/energyJoules/cellWrites").asDouble() > 0, "cells are written every frame");
    }

    @Test
    void aModelOnSeveralDevicesGetsASideBySideComparison() throws Exception {
        GateResult r = Gates.run(List.of(new ModelSpec("models/kws.onnx", KWS)),
                List.of(preset("edge22-in-memory"), preset("edge22-reuse")),
                Budget.builder().targetFps(4.0).build());
        List<Path> files = Reports.write(r, dir, Reports.FORMATS);
        List<String> names = new ArrayList<>();
        for (Path f : files) {
            names.add(f.getFileName().toString());
        }
        assertEquals(List.of("kws.compare.html", "kws.compare.md"), names.subList(names.size() - 2, names.size()));
        String md = Files.readString(dir.resolve("kws.compare.md"));
        List<String> rows = md.lines().filter(l -> l.startsWith("| `preset:")).toList();
        assertEquals(4, rows.size(), md);
        String[] inMemory = rows.get(0).split(" \\| ");
        String[] digital = rows.get(1).split(" \\| ");
        assertEquals("in-memory-macro", inMemory[1]);
        assertEquals("mac-array", digital[1]);
        // The dominant destinations of the energy ladder (docs/method.md, section 9): conversion for the
        // in-memory macro, compute once weight-stationary reuse removes most memory traffic.
        assertEquals("conversion", inMemory[5]);
        assertEquals("compute", digital[5]);
        // TOPS/W counts two operations per MAC, so TOPS/W x pJ per MAC = 2 (the trade's convention,
        // common practice, no single source); within the rounding of two three-digit figures.
        for (String[] row : List.of(inMemory, digital)) {
            double fj = Double.parseDouble(row[2].replace(" fJ", ""));
            double tops = Double.parseDouble(row[3]);
            assertEquals(2.0, tops * fj / 1000, 0.02, String.join(" | ", row));
        }
        for (PairResult p : r.pairs()) {
            assertTrue(md.contains(Format.sig(p.estimate().energyPerMacJoules() * 1e15) + " fJ | "
                    + Format.sig(p.estimate().opsPerWatt() / 1e12) + " | " + Format.percent(p.estimate().macUtilization())),
                    md);
        }
        String html = Files.readString(dir.resolve("kws.compare.html"));
        assertTrue(html.contains("<svg id=\"chart-compare\""), "destination chart");
        assertTrue(html.contains("<th class=\"l\">dominant</th>"), "column");
        // The comparison and the pair pages link to each other (they are written side by side).
        assertTrue(html.contains("<a href=\"kws.edge22-in-memory.html\">preset:edge22-in-memory</a>"), "pair link");
        assertTrue(Files.readString(dir.resolve("kws.edge22-reuse.html")).contains(
                "<a href=\"kws.compare.html\" id=\"compare-link\">this model on all 2 devices</a>"), "comparison link");
        String console = Reports.console(r);
        assertTrue(console.contains("\nmodels/kws.onnx on 2 devices\n"), console);
        // One device: no comparison.
        GateResult one = Gates.run(List.of(new ModelSpec("models/kws.onnx", KWS)), List.of(preset("edge22-reuse")),
                Budget.none());
        assertFalse(Reports.console(one).contains("on 2 devices"));
        Reports.write(one, dir.resolve("one"), java.util.Set.of("html"));
        assertFalse(Files.readString(dir.resolve("one/kws.edge22-reuse.html")).contains("compare-link"));
    }
}
