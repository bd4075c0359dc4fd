package dev.erg.maven;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.GateResult;
import dev.erg.device.DeviceLoader;
import dev.erg.maven.it.ItFixtures;
import dev.erg.run.ModelSpec;
import dev.erg.run.RunRequest;
import dev.erg.run.Runner;
import java.io.File;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.apache.maven.api.plugin.testing.InjectMojo;
import org.apache.maven.api.plugin.testing.MojoTest;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugin.MojoFailureException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * What the goals make of the library's results: a budget breach is one MojoFailureException whose
 * message is the library's failure message; broken input or configuration is a
 * MojoExecutionException with a one-line message (the habit of well-kept Maven plugins that
 * docs/plugin.md describes). The expected messages come from the library itself.
 */
@MojoTest
class CheckMojoBehaviourTest {
    private static final String POM = "src/test/resources/unit/defaults/pom.xml";

    @TempDir
    Path dir;

    private <T extends AbstractErgMojo> T configure(T mojo, File model, String... devices) {
        mojo.models = List.of(new ModelConfig(model.getAbsolutePath(), Map.of("batch", "1")));
        mojo.devices = List.of(devices);
        mojo.basedir = dir.toFile();
        if (mojo instanceof AbstractReportingMojo) {
            ((AbstractReportingMojo) mojo).outputDirectory = dir.resolve("reports").toFile();
            ((AbstractReportingMojo) mojo).formats = "json";
        }
        return mojo;
    }

    private static BudgetConfig budget(double fps, double mw) {
        BudgetConfig b = new BudgetConfig();
        b.setTargetFps(fps);
        b.setMaxPowerMw(mw);
        return b;
    }

    private GateResult library(File model, Budget budget) {
        return libraryOutcome(model, budget).result();
    }

    /** The library's outcome; its failure message is the result's, then the first ways to meet the budget. */
    private dev.erg.run.RunOutcome libraryOutcome(File model, Budget budget) {
        return Runner.run(RunRequest.builder()
                .model(new ModelSpec(model.getAbsolutePath(), model.toPath(), Map.of("batch", 1L)))
                .device("preset:feeder-npu").deviceBase(dir).budget(budget).build(), Runner.Progress.NONE);
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void everyViolationInOneFailure(CheckMojo mojo) {
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        configure(mojo, model, "preset:feeder-npu").budget = budget(30000, 1);
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        MojoFailureException e = assertThrows(MojoFailureException.class, mojo::execute);
        dev.erg.run.RunOutcome outcome = libraryOutcome(model, Budget.builder().targetFps(30000.0).maxPowerMw(1.0).build());
        GateResult expected = outcome.result();
        assertEquals(2, expected.failures().size(), "frame rate and power both fail");
        assertEquals(outcome.failureMessage(), e.getMessage());
        assertTrue(e.getMessage().startsWith(expected.failureMessage() + "\nways to meet the budget, "), e.getMessage());
        assertTrue(log.lines.contains("[INFO] erg: analysing " + model.getAbsolutePath()));
        assertTrue(Files.isRegularFile(dir.resolve("reports/net.feeder-npu.json")), "reports before the failure");
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void anUnmodelledOperatorIsAViolationListedWithTheBudgets(CheckMojo mojo) {
        File model = dir.resolve("custom.onnx").toFile();
        ItFixtures.customOpCnn(model);
        configure(mojo, model, "preset:feeder-npu").budget = budget(1e9, 1e12);
        mojo.failOnUnmodelled = true;
        mojo.setLog(new CapturingLog());
        MojoFailureException e = assertThrows(MojoFailureException.class, mojo::execute);
        dev.erg.run.RunOutcome expected = Runner.run(RunRequest.builder()
                .model(new ModelSpec(model.getAbsolutePath(), model.toPath(), Map.of("batch", 1L)))
                .device("preset:feeder-npu").deviceBase(dir).failOnUnmodelled(true)
                .budget(Budget.builder().targetFps(1e9).maxPowerMw(1e12).build()).build(),
                Runner.Progress.NONE);
        assertEquals(expected.failureMessage(), e.getMessage());
        assertTrue(e.getMessage().startsWith("2 violations (1 budget, 1 policy):"), e.getMessage());
        assertTrue(e.getMessage().contains(": the analysis is incomplete: no rule for com.example.Denoise (1 node)"),
                e.getMessage());
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void reportOnlyModeLogsTheViolationsAndGoesOn(CheckMojo mojo) throws Exception {
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        configure(mojo, model, "preset:feeder-npu").budget = budget(30000, 1);
        mojo.failOnViolation = false;
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        mojo.execute();
        GateResult expected = library(model, Budget.builder().targetFps(30000.0).maxPowerMw(1.0).build());
        for (String line : ("erg: " + expected.failureMessage()).split("\n")) {
            assertTrue(log.lines.contains("[INFO] " + line), line);
        }
        assertTrue(log.lines.contains("[WARNING] erg: 2 limits do not hold; failOnViolation is false, so the build"
                + " goes on"), log.lines.toString());
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void aModelsOwnBudgetOverridesThePluginsLimitByLimit(CheckMojo mojo) throws Exception {
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        configure(mojo, model, "preset:feeder-npu").budget = budget(30000, 1);
        BudgetConfig own = new BudgetConfig();
        own.setTargetFps(1.0);
        mojo.models.get(0).setBudget(own);
        mojo.setLog(new CapturingLog());
        MojoFailureException e = assertThrows(MojoFailureException.class, mojo::execute);
        dev.erg.run.RunOutcome outcome = libraryOutcome(model, Budget.builder().targetFps(1.0).maxPowerMw(1.0).build());
        assertEquals(1, outcome.result().failures().size(), "1 fps is met; 1 mW still fails");
        assertEquals(outcome.failureMessage(), e.getMessage());
    }

    @Test
    @InjectMojo(goal = "baseline", pom = POM)
    void baselineKeepsTheEntriesOfPairsNotRun(BaselineMojo mojo) throws Exception {
        File other = dir.resolve("other.onnx").toFile();
        ItFixtures.grownCnn(other);
        Path file = dir.resolve("erg/baseline.json");
        ItFixtures.baseline(dir.toFile(), "other.onnx", other, Map.of("batch", 1L), List.of("preset:feeder-npu"),
                file.toFile());
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        configure(mojo, model, "preset:feeder-npu").baseline = "erg/baseline.json";
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        mojo.execute();
        Baseline b = Baseline.read(file);
        assertEquals(2, b.size());
        assertTrue(b.entry("other.onnx", "preset:feeder-npu") != null, "the entry of the model not run is kept");
        assertTrue(b.entry(model.getAbsolutePath(), "preset:feeder-npu") != null);
        assertEquals(List.of("[INFO] erg: analysing " + model.getAbsolutePath(),
                "[INFO] erg: estimating " + model.getAbsolutePath() + " on preset:feeder-npu",
                "[INFO] erg: baseline written: " + file + " (1 entry refreshed, 2 in all)"), log.lines);
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void brokenModelIsAnExecutionError(CheckMojo mojo) {
        File model = dir.resolve("broken.onnx").toFile();
        ItFixtures.corruptModel(model);
        configure(mojo, model, "preset:feeder-npu");
        MojoExecutionException e = assertThrows(MojoExecutionException.class, mojo::execute);
        BadInputException lib = assertThrows(BadInputException.class, () -> library(model, Budget.none()));
        assertEquals(lib.getMessage(), e.getMessage());
        assertTrue(e.getMessage().startsWith(model.getAbsolutePath() + ": "), e.getMessage());
        assertFalse(e.getMessage().contains("\n"));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void missingBaselineIsAWarning(CheckMojo mojo) throws Exception {
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        configure(mojo, model, "preset:feeder-npu").baseline = "baseline.json";
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        mojo.execute();
        assertTrue(log.lines.contains("[WARNING] erg: no baseline at baseline.json: growth is not checked; create it"
                + " with 'mvn erg:baseline' and commit it"), log.lines.toString());
        assertTrue(log.lines.contains("[INFO] erg: no budget and no baseline growth to check"), log.lines.toString());
    }

    @Test
    @InjectMojo(goal = "report", pom = POM)
    void reportNeverFailsOnABudget(ReportMojo mojo) throws Exception {
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        configure(mojo, model, "preset:feeder-npu").budget = budget(30000, 1);
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        mojo.execute();
        assertTrue(log.lines.contains("[WARNING] erg: 2 limits do not hold; the report goal does not fail the build"
                + " (the check goal does)"));
        assertTrue(Files.isRegularFile(dir.resolve("reports/net.feeder-npu.json")));
    }

    @Test
    @InjectMojo(goal = "baseline", pom = POM)
    void baselineWritesWhatTheLibraryRecords(BaselineMojo mojo) throws Exception {
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        configure(mojo, model, "preset:feeder-npu").baseline = "erg/baseline.json";
        mojo.setLog(new CapturingLog());
        mojo.execute();
        String written = new String(Files.readAllBytes(dir.resolve("erg/baseline.json")), StandardCharsets.UTF_8);
        assertEquals(Baseline.of(library(model, Budget.none()).pairs()).toJson(), written);
    }

    @Test
    @InjectMojo(goal = "baseline", pom = POM)
    void baselineWithoutAFileIsAConfigurationError(BaselineMojo mojo) {
        mojo.baseline = null;
        MojoExecutionException e = assertThrows(MojoExecutionException.class, mojo::execute);
        assertEquals("erg: baseline: no baseline file configured; add <baseline>src/erg/baseline.json</baseline>"
                + " to the plugin configuration or pass -Derg.baseline=FILE", e.getMessage());
    }

    // ---- configuration faults: each a one-line MojoExecutionException naming the element ----

    private static String fault(AbstractErgMojo mojo) {
        MojoExecutionException e = assertThrows(MojoExecutionException.class, mojo::request);
        assertFalse(e.getMessage().contains("\n"), e.getMessage());
        return e.getMessage();
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void noModels(CheckMojo mojo) {
        mojo.models = null;
        assertEquals("erg: no models configured; add <models><model><file>path/to/model.onnx</file></model></models>"
                + " to the plugin configuration", fault(mojo));
        mojo.models = new ArrayList<>();
        assertTrue(fault(mojo).startsWith("erg: no models configured"));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void modelWithoutFile(CheckMojo mojo) {
        mojo.models = List.of(new ModelConfig("a.onnx", Map.of()), new ModelConfig(null, Map.of()));
        assertEquals("erg: models[1]: no <file> given (the path of an ONNX model)", fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void malformedPrecisionRule(CheckMojo mojo) {
        ModelConfig m = new ModelConfig("a.onnx", Map.of());
        m.setPrecision(List.of("/backbone/*@Conv=w4a8", "conv=w4x8"));
        mojo.models = List.of(m);
        assertEquals("erg: models[0] (a.onnx): precision[1]: precision rule \"conv=w4x8\": write PATTERN[@OP]=wNaM,"
                + " e.g. /backbone/*@Conv=w4a8 (or wN, aM; re:EXPR for a regular expression)", fault(mojo));
        m.setPrecision(java.util.Arrays.asList("/backbone/*=w4", " "));
        assertEquals("erg: models[0] (a.onnx): precision[1]: empty; write PATTERN[@OP]=wNaM, e.g. /backbone/*@Conv=w4a8",
                fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void modelListedTwice(CheckMojo mojo) {
        mojo.models = List.of(new ModelConfig("a.onnx", Map.of()), new ModelConfig("a.onnx", Map.of()));
        assertEquals("erg: models[1]: a.onnx is listed twice (also as models[0])", fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void dimensionNotAWholeNumber(CheckMojo mojo) {
        mojo.models = List.of(new ModelConfig("a.onnx", Map.of("batch", "two")));
        assertEquals("erg: models[0] (a.onnx): dimensions.batch: must be a whole number of 1 or more (got 'two')",
                fault(mojo));
        mojo.models = List.of(new ModelConfig("a.onnx", Map.of("batch", "0")));
        assertTrue(fault(mojo).endsWith("(got '0')"));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void malformedShapeAndValueNameTheModel(CheckMojo mojo) {
        ModelConfig m = new ModelConfig("a.onnx", Map.of());
        m.setShapes(Map.of("input", "1by576"));
        mojo.models = List.of(m);
        assertEquals("erg: models[0] (a.onnx): shape of 'input' is '1by576'; write whole dims joined by x, e.g. 1x576",
                fault(mojo));
        m.setShapes(Map.of());
        m.setValues(Map.of("sr", "16k"));
        assertEquals("erg: models[0] (a.onnx): value of 'sr' has '16k', which is not a number", fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void noDevices(CheckMojo mojo) {
        mojo.devices = List.of();
        assertEquals("erg: no devices configured; add <devices><device>preset:ID</device></devices> or a device"
                + " profile file (presets: " + String.join(", ", DeviceLoader.presetIds()) + ")", fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void unknownFormat(CheckMojo mojo) {
        mojo.formats = "json,pdf";
        assertEquals("erg: formats: unknown report format 'pdf' (known: [html, json, junit, markdown])", fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void budgetLimitNotPositive(CheckMojo mojo) {
        mojo.budget = budget(4, 0);
        assertEquals("erg: budget maxPowerMw: must be a number greater than 0 (got 0.0)", fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void negativeGrowth(CheckMojo mojo) {
        mojo.maxGrowthPercent = -1.0;
        assertEquals("erg: maxGrowthPercent: must be a number of 0 or more (got -1.0)", fault(mojo));
    }

    @Test
    @InjectMojo(goal = "check", pom = POM)
    void reportsThatWouldCollide(CheckMojo mojo) {
        File a = dir.resolve("a/net.onnx").toFile();
        File b = dir.resolve("b/net.onnx").toFile();
        ItFixtures.smallCnn(a);
        ItFixtures.smallCnn(b);
        configure(mojo, a, "preset:feeder-npu");
        mojo.models = List.of(new ModelConfig("a/net.onnx", Map.of("batch", "1")),
                new ModelConfig("b/net.onnx", Map.of("batch", "1")));
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        MojoExecutionException e = assertThrows(MojoExecutionException.class, mojo::execute);
        assertEquals("erg: a/net.onnx on preset:feeder-npu and b/net.onnx on preset:feeder-npu would write the same"
                + " report files (net.feeder-npu.*); give the models or device files distinct names", e.getMessage());
        assertNull(dir.resolve("reports").toFile().list());
        assertEquals(List.of(), log.lines, "refused before the first model is read");
    }
}
