package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Collectors;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code erg check} on worked example 1 of docs/method.md: 1 / 74.72 us = 13,383 fps; at 1000 fps the
 * power is 71.7856 nJ x 1000 + 1 mW = 1.0718 mW (shown as 1.07 mW).
 */
class CheckCommandTest {
    @TempDir
    Path dir;

    private static List<String> files(Path d) throws Exception {
        try (Stream<Path> s = Files.list(d)) {
            return s.map(p -> p.getFileName().toString()).sorted().collect(Collectors.toList());
        }
    }

    @Test
    void withinTheBudgetExitsZeroAndWritesTheReports() throws Exception {
        Path model = Fixtures.conv(dir, "example1.onnx", 16);
        Path device = Fixtures.exampleDevice(dir);
        Path reports = dir.resolve("target/erg");
        CliRun r = CliRun.of("check", model.toString(), "--device", device.toString(), "--target-fps", "1000",
                "--max-power-mw", "2", "--report-dir", reports.toString());
        assertEquals(0, r.code, r.toString());
        assertEquals("", r.err);
        String who = model + " on " + device;
        assertTrue(r.out.contains("\n  ok   " + who + ": frame rate 13383 fps meets the target of 1000 fps\n"), r.out);
        assertTrue(r.out.contains("\n  ok   " + who + ": average power 1.07 mW at 1000 fps is within the limit of 2 mW\n"),
                r.out);
        assertTrue(r.out.contains("\nerg: all budgets hold\n"), r.out);
        assertTrue(r.out.contains("reports written to " + reports + " (4 files)"), r.out);
        assertEquals(List.of("TEST-erg.example1.example-device.xml", "example1.example-device.html",
                "example1.example-device.json", "example1.example-device.md"), files(reports));
    }

    @Test
    void overTheBudgetExitsOneWithTheViolation() throws Exception {
        Path model = Fixtures.conv(dir, "example1.onnx", 16);
        Path device = Fixtures.exampleDevice(dir);
        Path reports = dir.resolve("out");
        CliRun r = CliRun.of("check", model.toString(), "--device", device.toString(), "--target-fps", "1000",
                "--max-power-mw", "1", "--report-dir", reports.toString(), "--formats", "json,junit");
        assertEquals(1, r.code, r.toString());
        assertEquals("", r.err);
        String msg = model + " on " + device + ": average power 1.07 mW at 1000 fps exceeds the limit of 1 mW; static power is 1 mW of it"
                + " (top layers by energy: conv 100.0%)";
        assertTrue(r.out.contains("\n  FAIL " + msg + "\n"), r.out);
        assertTrue(r.out.contains("\nerg: 1 budget violation:\n  - " + msg + "\n"), r.out);
        // The pair fails, so the ways to meet its budget are written too (STEM.ways.json for the json format).
        assertEquals(List.of("TEST-erg.example1.example-device.xml", "example1.example-device.json",
                "example1.example-device.ways.json"), files(reports));
        JsonNode root = new ObjectMapper().readTree(reports.resolve("example1.example-device.json").toFile());
        assertFalse(root.get("passed").asBoolean());
        assertEquals(msg, root.at("/checks/1/message").asText());
        String xml = Files.readString(reports.resolve("TEST-erg.example1.example-device.xml"));
        assertTrue(xml.contains("<testcase name=\"budget.power\" classname=\"erg.example1.example-device\""), xml);
        assertTrue(xml.contains("failures=\"1\""), xml);
    }

    @Test
    void aMissingBaselinePrintsTheNoteAndPasses() {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        Path base = dir.resolve("erg/baseline.json");
        CliRun r = CliRun.of("check", model.toString(), "--device", "preset:feeder-npu", "--baseline", base.toString(),
                "--max-growth-percent", "5");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.startsWith("note: no baseline at " + base + ": growth is not checked;"), r.out);
        assertFalse(Files.exists(base));
    }

    @Test
    void writeTheBaselineThenCatchTheGrowth() throws Exception {
        Path small = Fixtures.conv(dir, "m.onnx", 16);
        Path base = dir.resolve("erg/baseline.json");
        CliRun w = CliRun.of("check", small.toString(), "--device", "preset:feeder-npu", "--baseline", base.toString(),
                "--write-baseline");
        assertEquals(0, w.code, w.toString());
        assertFalse(w.out.contains("note:"), w.out);
        assertTrue(w.out.contains("baseline written: " + base + " (1 entry refreshed, 1 in all)"), w.out);
        assertTrue(Files.exists(base));
        CliRun same = CliRun.of("check", small.toString(), "--device", "preset:feeder-npu", "--baseline",
                base.toString(), "--max-growth-percent", "5");
        assertEquals(0, same.code, same.toString());
        // The same file name and layer, now with 24 filters instead of 16: MACs grow by 50%
        // (100 positions x 72 x 24 = 172,800 against 115,200).
        Files.delete(small);
        Path grown = Fixtures.conv(dir, "m.onnx", 24);
        CliRun r = CliRun.of("check", grown.toString(), "--device", "preset:feeder-npu", "--baseline", base.toString(),
                "--max-growth-percent", "5");
        assertEquals(1, r.code, r.toString());
        assertTrue(r.out.contains("  FAIL " + grown + " on preset:feeder-npu: MACs changed +50.0% over the baseline"
                + " (115200 -> 172800 MACs), more than the allowed 5% (layers that grew most: conv +57600 MACs)\n"), r.out);
    }

    @Test
    void everyModelOnEveryDevice() {
        Path a = Fixtures.conv(dir, "a.onnx", 16);
        Path b = Fixtures.conv(dir, "b.onnx", 8);
        Path device = Fixtures.exampleDevice(dir);
        CliRun r = CliRun.of("check", a.toString(), b.toString(), "--device", device.toString(), "--device",
                "preset:feeder-npu", "--max-latency-ms", "100");
        assertEquals(0, r.code, r.toString());
        for (String pair : new String[] {a + " on " + device, a + " on preset:feeder-npu", b + " on " + device,
                b + " on preset:feeder-npu"}) {
            assertTrue(r.out.contains("\n  ok   " + pair + ": latency "), pair + "\n" + r.out);
        }
    }

    @Test
    void badInputExitsTwoWithOneLine() throws Exception {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        String m = model.toString();
        Path bad = Files.writeString(dir.resolve("bad.yaml"), "name: x\nclock-mhz: fast\n");
        Path badBase = Files.writeString(dir.resolve("b.json"), "{ not json");
        String[][] cases = {
            {"check", m, "--device", bad.toString()},
            {"check", m, "--device", "preset:feeder-npu", "--target-fps", "0"},
            {"check", m, "--device", "preset:feeder-npu", "--max-power-mw", "-3"},
            {"check", m, "--device", "preset:feeder-npu", "--max-growth-percent", "5"},
            {"check", m, "--device", "preset:feeder-npu", "--write-baseline"},
            {"check", m, "--device", "preset:feeder-npu", "--baseline", badBase.toString()},
            {"check", m, "--device", "preset:feeder-npu", "--formats", "json,pdf"},
            {"check", m},
            {"check", "--device", "preset:feeder-npu"},
        };
        for (String[] args : cases) {
            CliRun r = CliRun.of(args);
            String what = String.join(" ", args) + "\n" + r;
            assertEquals(2, r.code, what);
            assertEquals(1, r.errLines().size(), what);
            assertTrue(r.err.startsWith("erg: "), what);
            assertFalse(r.err.contains("Exception") || r.err.contains("\tat "), what);
        }
        assertTrue(CliRun.of(cases[0]).err.contains(bad.toString()));
        assertTrue(CliRun.of(cases[5]).err.contains(badBase.toString()));
    }
}
