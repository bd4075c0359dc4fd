package dev.erg.maven;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.Baseline;
import dev.erg.cli.Main;
import dev.erg.maven.it.ItFixtures;
import java.io.File;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.apache.maven.api.plugin.testing.InjectMojo;
import org.apache.maven.api.plugin.testing.MojoTest;
import org.apache.maven.plugin.MojoFailureException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The CLI and the plugin on one configuration: two models on two devices, a run budget, a model's own
 * limit and a device's own limit, a baseline that also holds the entry of a model not run. Both
 * front ends fill the library's one run request, so they must write the same baseline bytes, give the
 * same verdicts and write the same report files, byte for byte. On a calibrated profile with
 * failWhenAtRisk, both fail the same check at risk.
 */
@MojoTest
class FrontEndParityTest {
    private static final String POM = "src/test/resources/unit/defaults/pom.xml";
    private static final List<String> DEVICES = List.of("preset:feeder-npu", "preset:generic-45nm");
    /** A precision rule that changes conv2 of both models (ItFixtures.smallCnn, grownCnn). */
    private static final String RULE = "conv2@Conv=w4a8";

    @TempDir
    Path dir;

    private String small;
    private String grown;

    private void models() {
        File a = dir.resolve("models/small.onnx").toFile();
        File b = dir.resolve("models/grown.onnx").toFile();
        ItFixtures.smallCnn(a);
        ItFixtures.grownCnn(b);
        small = a.getAbsolutePath();
        grown = b.getAbsolutePath();
    }

    /** A baseline that holds one entry of a model this run does not configure. */
    private Path seededBaseline(String name) {
        File old = dir.resolve("retired.onnx").toFile();
        ItFixtures.smallCnn(old);
        Path file = dir.resolve(name);
        ItFixtures.baseline(dir.toFile(), "models/retired.onnx", old, Map.of("batch", 1L), List.of("preset:feeder-npu"),
                file.toFile());
        return file;
    }

    /** The plugin's side of the configuration. */
    private <T extends AbstractErgMojo> T plugin(T mojo, Path baseline) {
        BudgetConfig own = new BudgetConfig();
        own.setMaxLatencyMs(0.01);
        ModelConfig g = new ModelConfig(grown, Map.of("batch", "1"));
        g.setBudget(own);
        g.setPrecision(List.of(RULE));
        ModelConfig s = new ModelConfig(small, Map.of("batch", "1"));
        s.setPrecision(List.of(RULE));
        mojo.models = List.of(s, g);
        mojo.devices = DEVICES;
        mojo.baseline = baseline.toString();
        mojo.basedir = dir.toFile();
        if (mojo instanceof AbstractReportingMojo r) {
            BudgetConfig run = new BudgetConfig();
            run.setTargetFps(4.0);
            run.setMaxPowerMw(25.0);
            r.budget = run;
            BudgetConfig dev = new BudgetConfig();
            dev.setMaxPowerMw(0.5);
            DeviceBudgetConfig d = new DeviceBudgetConfig();
            d.setDevice("preset:generic-45nm");
            d.setBudget(dev);
            r.deviceBudgets = List.of(d);
            r.outputDirectory = dir.resolve("plugin-reports").toFile();
        }
        mojo.setLog(new CapturingLog());
        return mojo;
    }

    /** The CLI's side: the same limits through a budget file. */
    private String[] cli(String... extra) throws Exception {
        Path budgets = Files.writeString(dir.resolve("budgets.yaml"), "budget:\n  targetFps: 4\n  maxPowerMw: 25\n"
                + "models:\n  \"" + grown + "\":\n    maxLatencyMs: 0.01\n"
                + "devices:\n  \"preset:generic-45nm\":\n    maxPowerMw: 0.5\n");
        List<String> args = new ArrayList<>(List.of("check", small, grown, "--device", DEVICES.get(0), "--device",
                DEVICES.get(1), "--dim", "batch=1", "--precision", RULE, "--budget-file", budgets.toString()));
        args.addAll(List.of(extra));
        return args.toArray(new String[0]);
    }

    private static String[] run(String[] args, int expectedExit) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.execute(args, new PrintWriter(out), new PrintWriter(err));
        assertEquals(expectedExit, code, out + "\n" + err);
        return new String[] {out.toString(), err.toString()};
    }

    @Test
    @InjectMojo(goal = "baseline", pom = POM)
    void sameBaselineContentsKeepingTheEntriesOfPairsNotRun(BaselineMojo mojo) throws Exception {
        models();
        Path fromPlugin = seededBaseline("plugin-baseline.json");
        Path fromCli = seededBaseline("cli-baseline.json");
        plugin(mojo, fromPlugin).execute();
        // The CLI's check also holds the budgets while it writes (grown.onnx breaks its own latency limit).
        run(cli("--baseline", fromCli.toString(), "--write-baseline"), Main.VIOLATION);
        assertArrayEquals(Files.readAllBytes(fromPlugin), Files.readAllBytes(fromCli));
        Baseline b = Baseline.read(fromPlugin);
        assertEquals(5, b.size(), "4 pairs run and the entry of the retired model");
        assertNotNull(b.entry("models/retired.onnx", "preset:feeder-npu"));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void sameVerdictsAndSameReportFiles(CheckMojo mojo) throws Exception {
        models();
        Path baseline = dir.resolve("baseline.json");
        ItFixtures.baseline(dir.toFile(), small, new File(small), Map.of("batch", 1L), DEVICES, baseline.toFile());
        MojoFailureException e = assertThrows(MojoFailureException.class, plugin(mojo, baseline)::execute);
        String[] cli = run(cli("--baseline", baseline.toString(), "--max-growth-percent", "5", "--report-dir",
                dir.resolve("cli-reports").toString()), Main.VIOLATION);
        // The same violations, in the same words and order.
        // The goal's message is the gate's, then the first ways to meet a failed budget; the CLI prints the
        // gate's message in its verdict and the same ways after it.
        String[] parts = e.getMessage().split("\n(?=ways to meet the budget, )", 2);
        assertTrue(cli[0].contains("\nerg: " + parts[0] + "\n"), cli[0] + "\n---\n" + e.getMessage());
        if (parts.length > 1) {
            assertTrue(cli[0].contains("\n" + parts[1] + "\n"), cli[0] + "\n---\n" + e.getMessage());
        }
        assertTrue(e.getMessage().contains(grown + " on preset:feeder-npu: latency "), e.getMessage());
        assertTrue(e.getMessage().contains(grown + " on preset:generic-45nm: average power "), e.getMessage());
        assertTrue(cli[0].contains("  ok   " + small + " on preset:generic-45nm: MACs changed +0.0% over the baseline"),
                cli[0]);
        // The same files, byte for byte.
        List<String> pluginFiles = names(dir.resolve("plugin-reports"));
        assertEquals(names(dir.resolve("cli-reports")), pluginFiles);
        assertEquals(16 + 4, pluginFiles.stream().filter(f -> !f.contains(".ways.")).count(),
                "4 pairs x 4 formats, and each model's comparison in 2 formats");
        // The precision rule reached the estimate in both front ends.
        String md = Files.readString(dir.resolve("cli-reports/small.feeder-npu.md"));
        assertTrue(md.contains("| `conv2` | `Conv` | w4a8 | override | "), md);
        assertTrue(pluginFiles.contains("small.compare.md"), pluginFiles.toString());
        // A pair whose budget fails also gets the ways to meet it, in json, html and markdown.
        assertEquals(0, pluginFiles.stream().filter(f -> f.contains(".ways.")).count() % 3, pluginFiles.toString());
        for (String f : pluginFiles) {
            assertArrayEquals(Files.readAllBytes(dir.resolve("plugin-reports").resolve(f)),
                    Files.readAllBytes(dir.resolve("cli-reports").resolve(f)), f);
        }
    }

    private static List<String> names(Path d) throws Exception {
        try (Stream<Path> s = Files.list(d)) {
            return s.map(p -> p.getFileName().toString()).sorted().toList();
        }
    }
    /**
     * A calibrated profile and {@code failWhenAtRisk}: both front ends fail the same check, in the same
     * words. The board figures are invented for the test (those of the calibrate-at-risk IT).
     */
    @Test
    @InjectMojo(goal = "check", pom = POM)
    void sameAtRiskFailureOnACalibratedProfile(CheckMojo mojo) throws Exception {
        models();
        Path profile = Files.copy(Path.of("src/it/calibrate-at-risk/src/erg/npu.yaml"), dir.resolve("npu.yaml"));
        Path board = Files.writeString(dir.resolve("board.csv"), "model,node,latency-ms\nsmall.onnx,,0.150\n"
                + "small.onnx,conv1,0.021\nsmall.onnx,conv2,0.112\nsmall.onnx,relu2,0.009\n");
        Path calibrated = dir.resolve("npu.calibrated.yaml");
        dev.erg.calibrate.CalibrationRun.run(List.of(Path.of(small)),
                dev.erg.graph.InputBindings.parse(Map.of("batch", 1L), Map.of(), Map.of(), "test"), profile,
                List.of(board), calibrated);
        mojo.models = List.of(new ModelConfig(small, Map.of("batch", "1")));
        mojo.devices = List.of(calibrated.toString());
        mojo.basedir = dir.toFile();
        BudgetConfig run = new BudgetConfig();
        run.setTargetFps(7000.0);
        mojo.budget = run;
        mojo.outputDirectory = dir.resolve("plugin-reports").toFile();
        mojo.failWhenAtRisk = true;
        mojo.setLog(new CapturingLog());
        MojoFailureException e = assertThrows(MojoFailureException.class, mojo::execute);
        String[] cli = run(new String[] {"check", small, "--device", calibrated.toString(), "--dim", "batch=1",
                "--target-fps", "7000", "--fail-when-at-risk"}, Main.VIOLATION);
        String[] parts = e.getMessage().split("\n(?=ways to meet the budget, )", 2);
        assertTrue(cli[0].contains("\nerg: " + parts[0] + "\n"), cli[0] + "\n---\n" + e.getMessage());
        if (parts.length > 1) { // the ways to meet the budget: after the verdict in the CLI, in the message in Maven
            assertTrue(cli[0].contains("\n" + parts[1] + "\n"), cli[0] + "\n---\n" + e.getMessage());
        }
        assertTrue(e.getMessage().contains("after calibration on 3 layers of 1 model) meets the target of 7000 fps, but"
                + " the target lies inside the error band: at risk (checks at risk fail this run)"), e.getMessage());
        // without failWhenAtRisk, the CLI passes with the warning
        String[] pass = run(new String[] {"check", small, "--device", calibrated.toString(), "--dim", "batch=1",
                "--target-fps", "7000"}, Main.OK);
        assertTrue(pass[0].contains("erg: warning: 1 check is at risk"), pass[0]);
    }

}
