package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A model with an operator erg cannot price passes its budget only with a loud note, or fails on request. */
class IncompleteCheckTest {
    @Test
    void anIncompleteModelIsNotedAndCanBeRefused(@TempDir Path dir) {
        Path model = dir.resolve("custom.onnx");
        new OnnxWriter.Model(13, new OnnxWriter.Graph("g")
                .input("x", ElemType.FLOAT, 1, 8, 16, 16)
                .weight("w", ElemType.FLOAT, 16, 8, 3, 3)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .domainNode("com.example", "FancyAct", "fancy", List.of("y"), List.of("z"))
                .node("Relu", "relu", List.of("z"), List.of("r"))
                .output("r", ElemType.FLOAT)).write(model);
        CliRun pass = CliRun.of("check", model.toString(), "--device", "preset:feeder-npu", "--target-fps", "4");
        assertEquals(0, pass.code, pass.toString());
        assertTrue(pass.out.contains("note: " + model + ": the analysis is incomplete: no rule for com.example.FancyAct"
                + " (1 node); unresolved downstream: Relu (1 node). Those nodes are not priced"), pass.out);
        CliRun refused = CliRun.of("check", model.toString(), "--device", "preset:feeder-npu", "--target-fps", "4",
                "--fail-on-unmodelled");
        // A policy violation, listed with the budget's checks: exit 1, not bad input.
        assertEquals(1, refused.code, refused.toString());
        assertEquals("", refused.err);
        String violation = model + " on preset:feeder-npu: the analysis is incomplete: no rule for com.example.FancyAct"
                + " (1 node); unresolved downstream: Relu (1 node); the policy requires every node to be modelled";
        assertTrue(refused.out.contains("\n  FAIL " + violation + "\n"), refused.out);
        assertTrue(refused.out.contains("\nerg: 1 policy violation:\n  - " + violation + "\n"), refused.out);
        // Report-only: the same violation is listed, the exit status stays 0.
        CliRun reportOnly = CliRun.of("check", model.toString(), "--device", "preset:feeder-npu", "--target-fps", "4",
                "--fail-on-unmodelled", "--no-fail-on-violation");
        assertEquals(0, reportOnly.code, reportOnly.toString());
        assertTrue(reportOnly.out.contains("\n  FAIL " + violation + "\n"), reportOnly.out);
    }
}
