package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.BudgetRules;
import dev.erg.budget.Metric;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.analysis.Analyzer;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code erg calibrate} and the error band in {@code erg check}. The measured latencies are synthetic
 * (chosen so that no two factors fit three models exactly, which leaves an error band); what is checked
 * is the plumbing: the written profile loads, its band reaches the verdict, a limit inside the band is at
 * risk, {@code --fail-when-at-risk} fails it, and bad input ends in one line.
 */
class CalibrateCommandTest {
    @TempDir
    Path dir;

    private Path[] models() {
        return new Path[] {Fixtures.conv(dir, "c16.onnx", 16), Fixtures.conv(dir, "c32.onnx", 32),
                Fixtures.conv(dir, "c64.onnx", 64)};
    }

    private Path measurements(String body) throws Exception {
        return Files.writeString(dir.resolve("board.csv"), "model,node,latency-ms\n" + body);
    }

    @Test
    void calibratesAndTheBandReachesTheVerdict() throws Exception {
        Path[] m = models();
        Path device = Fixtures.exampleDevice(dir);
        Path csv = measurements("c16.onnx,,0.100\nc32.onnx,,0.120\nc64.onnx,conv,0.390\n");
        Path out = dir.resolve("example-device.calibrated.yaml");
        CliRun r = CliRun.of("calibrate", m[0].toString(), m[1].toString(), m[2].toString(), "--device",
                device.toString(), "--measured", csv.toString(), "--out", out.toString());
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("compute-efficiency-dense-conv"), r.out);
        assertTrue(r.out.contains("calibrated profile written to " + out), r.out);
        String text = Files.readString(out);
        assertTrue(text.startsWith(Files.readString(device)), "the input profile is kept as written");
        assertTrue(text.contains("sha256: "), text);
        assertTrue(text.contains("band-from: leave-one-model-out"), text);

        DeviceProfile cal = DeviceLoader.load(out.toString(), null);
        assertNotNull(cal.calibration());
        DeviceEstimate e = Estimator.estimate(Analyzer.analyze(m[0], Map.of()), cal);
        double[] band = BudgetRules.band(Metric.FRAME_RATE, cal.calibration());
        assertTrue(band[0] < 0 && band[1] > 0, band[0] + " " + band[1]);
        // a target below the estimate but inside the band: passes with a warning
        String target = String.format(Locale.ROOT, "%.6f", e.maxFps() * (1 + band[0] / 2));
        CliRun risk = CliRun.of("check", m[0].toString(), "--device", out.toString(), "--target-fps", target);
        assertEquals(0, risk.code, risk.toString());
        assertTrue(risk.out.contains("RISK ") && risk.out.contains("after calibration on 1 layer of 3 models)")
                && risk.out.contains("lies inside the error band: at risk"), risk.out);
        CliRun fail = CliRun.of("check", m[0].toString(), "--device", out.toString(), "--target-fps", target,
                "--fail-when-at-risk");
        assertEquals(1, fail.code, fail.toString());
        assertTrue(fail.out.contains("checks at risk fail this run"), fail.out);

        // an uncalibrated profile says that its error is unknown
        CliRun plain = CliRun.of("check", m[0].toString(), "--device", device.toString(), "--target-fps", "1");
        assertTrue(plain.out.contains("the profile is not calibrated: the error of these estimates is unknown"), plain.out);
    }

    @Test
    void unknownNodeNamesEndInOneLineWithSuggestions() throws Exception {
        Path[] m = models();
        Path csv = measurements("c16.onnx,cnv,0.100\n");
        CliRun r = CliRun.of("calibrate", m[0].toString(), "--device", Fixtures.exampleDevice(dir).toString(),
                "--measured", csv.toString(), "--out", dir.resolve("o.yaml").toString());
        assertEquals(2, r.code, r.toString());
        assertEquals(1, r.errLines().size(), r.err);
        assertTrue(r.err.contains("cnv") && r.err.contains("conv"), r.err);
    }

    @Test
    void badNumbersAndAllZeroEndInOneLine() throws Exception {
        Path[] m = models();
        Path device = Fixtures.exampleDevice(dir);
        CliRun bad = CliRun.of("calibrate", m[0].toString(), "--device", device.toString(), "--measured",
                measurements("c16.onnx,,fast\n").toString(), "--out", dir.resolve("o.yaml").toString());
        assertEquals(2, bad.code, bad.toString());
        assertEquals(1, bad.errLines().size(), bad.err);
        assertTrue(bad.err.contains("board.csv:2"), bad.err);
        CliRun zero = CliRun.of("calibrate", m[0].toString(), "--device", device.toString(), "--measured",
                measurements("c16.onnx,,0\n").toString(), "--out", dir.resolve("o.yaml").toString());
        assertEquals(2, zero.code, zero.toString());
        assertEquals(1, zero.errLines().size(), zero.err);
        assertTrue(zero.err.contains("every measured value"), zero.err);
    }

    @Test
    void aPresetIsCalibratedFromItsPackagedText() throws Exception {
        Path[] m = models();
        Path out = dir.resolve("npu.calibrated.yaml");
        CliRun r = CliRun.of("calibrate", m[0].toString(), "--device", "preset:feeder-npu", "--measured",
                measurements("c16.onnx,conv,0.100\n").toString(), "--out", out.toString());
        assertEquals(0, r.code, r.toString());
        String text = Files.readString(out);
        assertTrue(text.startsWith(DeviceLoader.presetText("preset:feeder-npu")), "the preset's text, comments and all");
        assertNotNull(DeviceLoader.load(out.toString(), null).calibration());
        CliRun none = CliRun.of("calibrate", m[0].toString(), "--device", "preset:no-such-chip", "--measured",
                measurements("c16.onnx,conv,0.100\n").toString(), "--out", out.toString());
        assertEquals(2, none.code, none.toString());
        assertEquals(1, none.errLines().size(), none.err);
        assertTrue(none.err.contains("preset:no-such-chip: no such preset"), none.err);
        CliRun json = CliRun.of("calibrate", m[0].toString(), "--device", dir.resolve("p.json").toString(),
                "--measured", measurements("c16.onnx,conv,0.100\n").toString(), "--out", out.toString());
        assertEquals(2, json.code, json.toString());
        assertTrue(json.err.contains("a calibration extends a YAML profile (.yaml or .yml) or a preset (preset:ID)"),
                json.err);
    }
}
