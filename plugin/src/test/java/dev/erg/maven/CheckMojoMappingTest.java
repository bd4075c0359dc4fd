package dev.erg.maven;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.Gate;
import java.io.File;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.apache.maven.api.plugin.testing.InjectMojo;
import org.apache.maven.api.plugin.testing.MojoTest;
import org.junit.jupiter.api.Test;

/**
 * The check goal's configuration elements, as the plugin's documented contract names them
 * (docs/plugin.md), reach the library with their values; defaults and skip.
 */
@MojoTest
class CheckMojoMappingTest {
    private static final String MAPPING = "src/test/resources/unit/check-mapping/pom.xml";

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void modelsWithTheirDimensions(CheckMojo mojo) throws Exception {
        AbstractErgMojo.Settings s = mojo.settings();
        Path base = mojo.basedir.toPath();
        assertEquals(2, s.models.size());
        Gate.ModelSpec first = s.models.get(0);
        assertEquals("src/main/onnx/feeder.onnx", first.label(), "the label is the path as configured");
        assertEquals(base.resolve("src/main/onnx/feeder.onnx"), first.file(), "resolved against the base directory");
        assertEquals(Map.of("batch", 1L, "frames", 49L), first.dims());
        assertEquals(Map.of("input", List.of(1L, 576L)), first.bindings().shapes());
        assertEquals(Map.of("sr", List.of("16000"), "ids", List.of("1", "2", "3")), first.bindings().values());
        Gate.ModelSpec second = s.models.get(1);
        assertEquals("models/second.onnx", second.label());
        assertEquals(Map.of(), second.dims());
        assertTrue(second.bindings().isEmpty());
    }

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void devicesInOrder(CheckMojo mojo) throws Exception {
        assertEquals(List.of("src/erg/feeder-npu.yaml", "preset:generic-45nm"), mojo.settings().devices);
    }

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void everyBudgetField(CheckMojo mojo) throws Exception {
        AbstractErgMojo.Settings s = mojo.settings();
        assertEquals(4.0, s.budget.targetFps());
        assertEquals(25.0, s.budget.maxPowerMw());
        assertEquals(900.0, s.budget.maxEnergyPerFrameUj());
        assertEquals(250.0, s.budget.maxLatencyMs());
        assertEquals(512.0, s.budget.maxWeightKib());
        assertEquals(384.0, s.budget.maxActivationKib());
    }

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void baselineGrowthFormatsAndOutput(CheckMojo mojo) throws Exception {
        AbstractErgMojo.Settings s = mojo.settings();
        Path base = mojo.basedir.toPath();
        assertEquals("src/erg/baseline.json", s.baselineLabel);
        assertEquals(base.resolve("src/erg/baseline.json"), s.baselineFile);
        assertEquals(7.5, s.maxGrowthPercent);
        assertEquals(Set.of("json", "markdown"), s.formats, "comma-separated, blanks allowed");
        assertEquals(base.resolve("target/erg-reports"), s.outputDirectory, "a File parameter, resolved by Maven");
        assertTrue(mojo.failOnUnmodelled);
        assertFalse(mojo.skip);
    }

    @Test
    @InjectMojo(goal = "check", pom = "src/test/resources/unit/defaults/pom.xml")
    void defaults(CheckMojo mojo) throws Exception {
        AbstractErgMojo.Settings s = mojo.settings();
        assertEquals(Set.of("json", "html", "markdown", "junit"), s.formats);
        assertEquals(5.0, s.maxGrowthPercent);
        assertNull(s.baselineLabel);
        assertNull(s.baselineFile);
        assertTrue(s.budget.isEmpty());
        // The harness's stub project has no build directory, so the default expression stays as the
        // descriptor declares it; the integration tests see it resolve to target/erg in a real build.
        assertEquals(new File(mojo.basedir, "${project.build.directory}/erg").toPath(), s.outputDirectory);
        assertFalse(mojo.failOnUnmodelled);
        assertFalse(mojo.skip);
    }

    @Test
    @InjectMojo(goal = "check", pom = "src/test/resources/unit/skip/pom.xml")
    void skipDoesNothing(CheckMojo mojo) throws Exception {
        assertTrue(mojo.skip);
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        File out = mojo.outputDirectory;
        mojo.execute(); // the model does not exist: only a skipped goal passes
        assertEquals(List.of("[INFO] erg: skipped"), log.lines);
        assertFalse(out.exists());
    }

    @Test
    @InjectMojo(goal = "report", pom = MAPPING)
    void reportSharesTheConfiguration(ReportMojo mojo) throws Exception {
        AbstractErgMojo.Settings s = mojo.settings();
        assertEquals(2, s.models.size());
        assertEquals(25.0, s.budget.maxPowerMw());
        assertEquals(Set.of("json", "markdown"), s.formats);
    }

    @Test
    @InjectMojo(goal = "baseline", pom = MAPPING)
    void baselineNeedsNoBudgetOrReports(BaselineMojo mojo) throws Exception {
        AbstractErgMojo.Settings s = mojo.settings();
        assertEquals(2, s.models.size());
        assertEquals("src/erg/baseline.json", s.baselineLabel);
        assertTrue(s.budget.isEmpty());
        assertEquals(Set.of(), s.formats);
    }
}
