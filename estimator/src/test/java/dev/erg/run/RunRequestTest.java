package dev.erg.run;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.Budget;
import dev.erg.error.BadInputException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The whole request is checked before the first model is read: every model file named here does not
 * exist, so a fault found by validation is found without reading anything.
 */
class RunRequestTest {
    @TempDir
    Path dir;

    private RunRequest.Builder base() {
        return RunRequest.builder().model(new ModelSpec("a.onnx", dir.resolve("a.onnx"))).device("preset:feeder-npu");
    }

    private static String fault(RunRequest.Builder b) {
        return assertThrows(BadInputException.class, () -> Runner.run(b.build(), Runner.Progress.NONE)).getMessage();
    }

    @Test
    void faultsOfTheWholeRequestComeFirst() {
        assertEquals("models[1]: a.onnx is listed twice (also as models[0])",
                fault(base().model(new ModelSpec("a.onnx", dir.resolve("a.onnx")))));
        assertEquals("devices[1]: preset:feeder-npu is listed twice", fault(base().device("preset:feeder-npu")));
        assertEquals("models[0] (b.onnx): dimensions.batch: must be a whole number of 1 or more (got '0')",
                fault(RunRequest.builder().model(new ModelSpec("b.onnx", dir.resolve("b.onnx"), Map.of("batch", 0L)))
                        .device("preset:feeder-npu")));
        assertEquals("maxGrowthPercent: must be a number of 0 or more (got -1.0)", fault(base().maxGrowthPercent(-1.0)));
        assertEquals("baseline: no baseline file configured", fault(base().writeBaseline(true)));
        assertEquals("formats: unknown report format 'pdf' (known: [html, json, junit, markdown])",
                fault(base().reports(dir, Set.of("pdf"))));
        assertEquals("a.onnx on preset:feeder-npu and x/a.onnx on preset:feeder-npu would write the same report"
                + " files (a.feeder-npu.*); give the models or device files distinct names",
                fault(base().model(new ModelSpec("x/a.onnx", dir.resolve("x/a.onnx"))).reports(dir, Set.of("json"))));
        // Only once the request is sound is a model opened.
        assertTrue(fault(base()).startsWith(dir.resolve("a.onnx").toString()), fault(base()));
    }

    @Test
    void dimsParseToOneRule() {
        assertEquals(49L, ModelSpec.parseDim("d", " 49 "));
        assertEquals("d: must be a whole number of 1 or more (got 'two')",
                assertThrows(BadInputException.class, () -> ModelSpec.parseDim("d", "two")).getMessage());
        assertEquals("d: must be a whole number of 1 or more (got '0')",
                assertThrows(BadInputException.class, () -> ModelSpec.parseDim("d", "0")).getMessage());
    }

    @Test
    void theBudgetFileStacksModelOverDeviceOverRun() throws Exception {
        Path f = Files.writeString(dir.resolve("b.yaml"), "budget:\n  targetFps: 4\n  maxPowerMw: 25\n"
                + "models:\n  a.onnx:\n    maxLatencyMs: 80\n"
                + "devices:\n  \"preset:feeder-npu\":\n    maxPowerMw: 15\n    maxLatencyMs: 100\n");
        BudgetFile file = BudgetFile.read(f);
        RunRequest.Builder b = RunRequest.builder();
        file.apply(b, Budget.builder().targetFps(10.0).build(), List.of(new ModelSpec("a.onnx", dir.resolve("a.onnx"))),
                List.of("preset:feeder-npu"));
        RunRequest r = b.build();
        Budget pair = r.budgetOf(r.models().get(0), r.devices().get(0));
        assertEquals(Map.of("targetFps", 10.0, "maxPowerMw", 15.0, "maxLatencyMs", 80.0), pair.limits(),
                "fps from the command line over the file, power from the device, latency from the model");
        // The same in JSON.
        Path j = Files.writeString(dir.resolve("b.json"), "{\"models\": {\"a.onnx\": {\"maxLatencyMs\": 80}}}");
        assertEquals(Map.of("maxLatencyMs", 80.0), BudgetFile.read(j).models().get("a.onnx").limits());
    }

    @Test
    void aBrokenBudgetFileIsOneLineNamingTheKey() throws Exception {
        Path f = dir.resolve("b.yaml");
        Files.writeString(f, "budget:\n  maxPowerMW: 25\n");
        assertTrue(msg(f).startsWith(f + ": budget: unknown limit 'maxPowerMW' (known: targetFps, "), msg(f));
        Files.writeString(f, "budget:\n  maxPowerMw: -2\n");
        assertEquals(f + ": budget maxPowerMw: must be a number greater than 0 (got -2.0)", msg(f));
        Files.writeString(f, "budget:\n  maxPowerMw: lots\n");
        assertEquals(f + ": budget maxPowerMw: must be a number greater than 0 (got 'lots')", msg(f));
        Files.writeString(f, "limits:\n  maxPowerMw: 2\n");
        assertEquals(f + ": unknown key 'limits' (known: budget, models, devices)", msg(f));
        Files.writeString(f, "models:\n  typo.onnx:\n    maxPowerMw: 2\n");
        BudgetFile file = BudgetFile.read(f);
        BadInputException e = assertThrows(BadInputException.class, () -> file.apply(RunRequest.builder(),
                Budget.none(), List.of(new ModelSpec("a.onnx", dir.resolve("a.onnx"))), List.of("preset:feeder-npu")));
        assertEquals(f + ": models.typo.onnx: not one of the models of this run", e.getMessage());
        assertFalse(msg(dir.resolve("none.yaml")).contains("\n"));
    }

    private static String msg(Path f) {
        return assertThrows(BadInputException.class, () -> BudgetFile.read(f)).getMessage();
    }
}
