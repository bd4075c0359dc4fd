package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class EstimateCommandTest {
    @TempDir
    Path dir;

    @Test
    void workedExampleOneOnTheCommandLine() throws Exception {
        // docs/method.md, worked example 1: latency 74.72 us (SRAM-bound), frame energy 146.5056 nJ,
        // at 1000 fps 71.7856 nJ x 1000 + 1 mW = 1.0718 mW.
        Path model = Fixtures.conv(dir, "example1.onnx", 16);
        Path device = Fixtures.exampleDevice(dir);
        Path json = dir.resolve("out/estimate.json");
        CliRun r = CliRun.of("estimate", model.toString(), "--device", device.toString(), "--fps", "1000", "--json",
                json.toString());
        assertEquals(0, r.code, r.toString());
        assertEquals("", r.err);
        assertTrue(r.out.startsWith(model + " on " + device + " (Worked example device, 100 MHz)\nAll 1 layer by energy"),
                r.out);
        assertTrue(r.out.matches("(?s).*\n1  conv +Conv +w8a8 +profile default +115k +100\\.0% +74\\.7 .* 0\\.147 +100\\.0% +sram\n.*"), r.out);
        assertTrue(r.out.contains("Totals: latency 0.0747 ms, max 13383 fps, 147 nJ per frame, 1.07 mW at 1000 fps\n"),
                r.out);
        assertTrue(r.out.contains("JSON written to " + json), r.out);
        JsonNode root = new ObjectMapper().readTree(json.toFile());
        assertEquals(146.5056e-9, root.at("/totals/energyPerFrameJoules").asDouble(), 1e-17);
        assertEquals(74.72e-6, root.at("/totals/latencySeconds").asDouble(), 1e-15);
        assertEquals(71.7856e-9 * 1000 + 1e-3, root.at("/totals/averagePowerWatts").asDouble(), 1e-15);
        assertEquals(66_752, root.at("/nodes/0/estimate/bytes/sramRead").asLong());
        assertEquals(device.toString(), root.at("/device/id").asText());
        assertFalse(root.has("checks"), "an estimate has no verdict");
    }

    @Test
    void presetsAndBackToBackPower() {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        CliRun r = CliRun.of("estimate", model.toString(), "--device", "preset:feeder-npu", "--top", "0");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("No layers listed (top 0 of 1)."), r.out);
        assertTrue(r.out.matches("(?s).*mW at \\d+ fps\n.*"), r.out);
    }

    @Test
    void badProfilesAndOptionsExitTwoWithOneLine() throws Exception {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        Path bad = Files.writeString(dir.resolve("bad.yaml"), "name: x\nclock-mhz: -5\n");
        String[][] cases = {
            {"estimate", model.toString(), "--device", bad.toString()},
            {"estimate", model.toString(), "--device", "preset:no-such-chip"},
            {"estimate", model.toString(), "--device", dir.resolve("missing.yaml").toString()},
            {"estimate", model.toString()},
            {"estimate", model.toString(), "--device", "preset:feeder-npu", "--fps", "0"},
            {"estimate", model.toString(), "--device", "preset:feeder-npu", "--top", "-2"},
            {"estimate", dir.resolve("none.onnx").toString(), "--device", "preset:feeder-npu"},
        };
        for (String[] args : cases) {
            CliRun r = CliRun.of(args);
            String what = String.join(" ", args) + "\n" + r;
            assertEquals(2, r.code, what);
            assertEquals(1, r.errLines().size(), what);
            assertTrue(r.err.startsWith("erg: "), what);
            assertFalse(r.err.contains("Exception") || r.err.contains("\tat "), what);
        }
        CliRun r = CliRun.of(cases[0]);
        assertTrue(r.err.contains(bad.toString()), "the line names the profile: " + r);
    }

    @Test
    void twoRunsWriteTheSameBytes() throws Exception {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        Path a = dir.resolve("a.json");
        Path b = dir.resolve("b.json");
        assertEquals(0, CliRun.of("estimate", model.toString(), "--device", "preset:feeder-npu", "--json",
                a.toString()).code);
        assertEquals(0, CliRun.of("estimate", model.toString(), "--device", "preset:feeder-npu", "--json",
                b.toString()).code);
        assertArrayEquals(Files.readAllBytes(a), Files.readAllBytes(b));
    }
}
