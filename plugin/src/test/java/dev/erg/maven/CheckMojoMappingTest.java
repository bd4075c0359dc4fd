package dev.erg.maven;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.Budget;
import dev.erg.budget.BudgetRules;
import dev.erg.maven.it.ItFixtures;
import dev.erg.run.DeviceSpec;
import dev.erg.run.ModelSpec;
import dev.erg.run.RunRequest;
import java.io.File;
import java.lang.reflect.Field;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import javax.xml.parsers.DocumentBuilderFactory;
import org.apache.maven.api.plugin.testing.InjectMojo;
import org.apache.maven.api.plugin.testing.MojoTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/**
 * The check goal's configuration elements, as the plugin's documented contract names them
 * (docs/plugin.md), reach the library's run request with their values; defaults and skip.
 */
@MojoTest
class CheckMojoMappingTest {
    private static final String MAPPING = "src/test/resources/unit/check-mapping/pom.xml";

    @TempDir
    Path dir;

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void modelsWithTheirDimensionsAndBudgets(CheckMojo mojo) throws Exception {
        RunRequest r = mojo.request();
        Path base = mojo.basedir.toPath();
        assertEquals(2, r.models().size());
        ModelSpec first = r.models().get(0);
        assertEquals("src/main/onnx/feeder.onnx", first.label(), "the label is the path as configured");
        assertEquals(base.resolve("src/main/onnx/feeder.onnx"), first.file(), "resolved against the base directory");
        assertEquals(Map.of("batch", 1L, "frames", 49L), first.dims());
        assertTrue(first.budget().isEmpty());
        assertEquals(Map.of("input", List.of(1L, 576L)), first.bindings().shapes());
        assertEquals(Map.of("sr", List.of("16000"), "ids", List.of("1", "2", "3")), first.bindings().values());
        assertEquals(List.of("/backbone/*@Conv=w4a8", "re:^/head/.*=w8a8"),
                first.precision().rules().stream().map(Object::toString).toList());
        ModelSpec second = r.models().get(1);
        assertEquals("models/second.onnx", second.label());
        assertEquals(Map.of(), second.dims());
        assertTrue(second.bindings().isEmpty());
        assertTrue(second.precision().isEmpty());
        assertEquals(Map.of("maxLatencyMs", 80.0), second.budget().limits());
    }

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void devicesInOrderWithTheirBudgets(CheckMojo mojo) throws Exception {
        RunRequest r = mojo.request();
        List<String> labels = new ArrayList<>();
        for (DeviceSpec d : r.devices()) {
            labels.add(d.label());
        }
        assertEquals(List.of("src/erg/feeder-npu.yaml", "preset:generic-45nm"), labels);
        assertTrue(r.devices().get(0).budget().isEmpty());
        assertEquals(Map.of("maxPowerMw", 15.0, "maxLatencyMs", 120.0), r.devices().get(1).budget().limits());
        // model over device over the plugin's budget, limit by limit
        Budget pair = r.budgetOf(r.models().get(1), r.devices().get(1));
        assertEquals(80.0, pair.maxLatencyMs(), "the model's own");
        assertEquals(15.0, pair.maxPowerMw(), "the device's");
        assertEquals(4.0, pair.targetFps(), "the plugin's");
        assertEquals(250.0, r.budgetOf(r.models().get(0), r.devices().get(0)).maxLatencyMs());
    }

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void everyBudgetField(CheckMojo mojo) throws Exception {
        Budget b = mojo.request().budget();
        assertEquals(4.0, b.targetFps());
        assertEquals(25.0, b.maxPowerMw());
        assertEquals(900.0, b.maxEnergyPerFrameUj());
        assertEquals(250.0, b.maxLatencyMs());
        assertEquals(512.0, b.maxWeightKib());
        assertEquals(384.0, b.maxActivationKib());
    }

    /** Every budget rule of the library has its element in {@code <budget>}, by the same name. */
    @Test
    void theBudgetElementHasOneFieldPerRule() {
        List<String> fields = new ArrayList<>();
        for (Field f : BudgetConfig.class.getDeclaredFields()) {
            fields.add(f.getName());
        }
        assertEquals(BudgetRules.keys(), fields);
        assertEquals(BudgetRules.keys(), new ArrayList<>(new BudgetConfig().limits().keySet()));
    }

    @Test
    @InjectMojo(goal = "check", pom = MAPPING)
    void baselineGrowthFormatsOutputAndPolicies(CheckMojo mojo) throws Exception {
        RunRequest r = mojo.request();
        Path base = mojo.basedir.toPath();
        assertEquals("src/erg/baseline.json", r.baselineLabel());
        assertEquals(base.resolve("src/erg/baseline.json"), r.baselineFile());
        assertEquals(7.5, r.maxGrowthPercent());
        assertEquals(7.5, r.growthChecked());
        assertEquals(Set.of("json", "markdown"), r.formats(), "comma-separated, blanks allowed");
        assertEquals(base.resolve("target/erg-reports"), r.reportDir(), "a File parameter, resolved by Maven");
        assertTrue(r.failOnUnmodelled());
        assertFalse(r.failOnViolation());
        assertFalse(r.writeBaseline());
        assertFalse(mojo.skip);
    }

    /**
     * The defaults as the plugin descriptor declares them (the contract Maven resolves; the integration
     * tests see target/erg in a real build), and as a request built from an empty configuration holds them.
     */
    @Test
    @InjectMojo(goal = "check", pom = "src/test/resources/unit/defaults/pom.xml")
    void defaults(CheckMojo mojo) throws Exception {
        Map<String, String> declared = descriptorDefaults("check");
        assertEquals("${project.build.directory}/erg", declared.get("outputDirectory"));
        assertEquals("json,html,markdown,junit", declared.get("formats"));
        assertEquals("5", declared.get("maxGrowthPercent"));
        assertEquals("true", declared.get("failOnViolation"));
        assertEquals("false", declared.get("failOnUnmodelled"));
        assertEquals("false", declared.get("skip"));
        RunRequest r = mojo.request();
        assertEquals(Set.of("json", "html", "markdown", "junit"), r.formats());
        assertEquals(5.0, r.maxGrowthPercent());
        assertNull(r.growthChecked(), "no baseline, so no growth is checked");
        assertNull(r.baselineLabel());
        assertNull(r.baselineFile());
        assertTrue(r.budget().isEmpty());
        assertFalse(r.failOnUnmodelled());
        assertTrue(r.failOnViolation());
    }

    /** The default-value of each parameter of {@code goal} in the generated plugin descriptor. */
    private static Map<String, String> descriptorDefaults(String goal) throws Exception {
        Path xml = Path.of("target/classes/META-INF/maven/plugin.xml");
        Document d = DocumentBuilderFactory.newInstance().newDocumentBuilder().parse(xml.toFile());
        NodeList mojos = d.getElementsByTagName("mojo");
        for (int i = 0; i < mojos.getLength(); i++) {
            Element m = (Element) mojos.item(i);
            if (!goal.equals(m.getElementsByTagName("goal").item(0).getTextContent())) {
                continue;
            }
            Map<String, String> out = new java.util.HashMap<>();
            Element conf = (Element) m.getElementsByTagName("configuration").item(0);
            NodeList params = conf.getChildNodes();
            for (int j = 0; j < params.getLength(); j++) {
                if (params.item(j) instanceof Element p && p.hasAttribute("default-value")) {
                    out.put(p.getTagName(), p.getAttribute("default-value"));
                }
            }
            return out;
        }
        throw new AssertionError("no goal " + goal + " in " + xml);
    }

    @Test
    @InjectMojo(goal = "check", pom = "src/test/resources/unit/skip/pom.xml")
    void skipDoesNothing(CheckMojo mojo) throws Exception {
        assertTrue(mojo.skip);
        // A real model and a real device: without skip the goal would write reports into out.
        File model = dir.resolve("net.onnx").toFile();
        ItFixtures.smallCnn(model);
        mojo.models = List.of(new ModelConfig(model.getAbsolutePath(), Map.of("batch", "1")));
        mojo.basedir = dir.toFile();
        File out = dir.resolve("reports").toFile();
        mojo.outputDirectory = out;
        CapturingLog log = new CapturingLog();
        mojo.setLog(log);
        mojo.execute();
        assertEquals(List.of("[INFO] erg: skipped"), log.lines);
        assertFalse(out.exists(), "no report written");
        // The same configuration without skip does write them, so the line above can fail.
        mojo.skip = false;
        mojo.setLog(new CapturingLog());
        mojo.execute();
        assertTrue(Files.isRegularFile(dir.resolve("reports/net.feeder-npu.json")));
    }

    @Test
    @InjectMojo(goal = "report", pom = MAPPING)
    void reportSharesTheConfigurationButNeverFails(ReportMojo mojo) throws Exception {
        RunRequest r = mojo.request();
        assertEquals(2, r.models().size());
        assertEquals(25.0, r.budget().maxPowerMw());
        assertEquals(Set.of("json", "markdown"), r.formats());
        assertFalse(r.failOnViolation());
    }

    @Test
    @InjectMojo(goal = "baseline", pom = MAPPING)
    void baselineNeedsNoBudgetOrReports(BaselineMojo mojo) throws Exception {
        RunRequest r = mojo.request();
        assertEquals(2, r.models().size());
        assertTrue(r.models().get(1).budget().isEmpty(), "the baseline goal holds no budget, a model's own neither");
        assertEquals("src/erg/baseline.json", r.baselineLabel());
        assertTrue(r.writeBaseline());
        assertNull(r.growthChecked());
        assertTrue(r.budget().isEmpty());
        assertFalse(r.writesReports());
    }
}
