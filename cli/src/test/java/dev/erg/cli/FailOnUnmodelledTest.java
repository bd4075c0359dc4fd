package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code erg analyze --fail-on-unmodelled}: an operator outside the ONNX standard set lists as
 * unmodelled (exit 0) by default, and is a policy violation with the flag: the table is still
 * printed, one line on stderr names the operators, exit 1 (a violation, not bad input).
 */
class FailOnUnmodelledTest {
    @TempDir
    Path dir;

    /** x -> Relu -> com.example.Fancy -> Relu: one unmodelled node, one unresolved downstream. */
    private Path model() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("custom")
                .input("x", ElemType.FLOAT, 1, 4)
                .node("Relu", "r1", List.of("x"), List.of("a"))
                .domainNode("com.example", "Fancy", "fancy", List.of("a"), List.of("b"))
                .node("Relu", "r2", List.of("b"), List.of("y"))
                .output("y", ElemType.FLOAT);
        Path p = dir.resolve("custom.onnx");
        new OnnxWriter.Model(13, g).write(p);
        return p;
    }

    @Test
    void listedByDefault() {
        CliRun r = CliRun.of("analyze", model().toString());
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("com.example.Fancy"), r.toString());
    }

    @Test
    void failsWithTheFlag() {
        Path m = model();
        CliRun r = CliRun.of("analyze", m.toString(), "--fail-on-unmodelled");
        assertEquals(1, r.code, r.toString());
        assertEquals(1, r.errLines().size(), r.toString());
        String line = r.errLines().get(0);
        assertTrue(line.contains(m.toString()), line);
        assertTrue(line.contains("com.example.Fancy (1 node)"), line);
        assertTrue(line.contains("unresolved downstream: Relu (1 node)"), line);
        assertFalse(r.err.contains("\tat "), r.toString());
        assertTrue(line.startsWith("erg: 1 policy violation: " + m + ": the analysis is incomplete"), line);
        assertTrue(r.out.contains("com.example.Fancy"), "the table is printed: " + r.out);
    }
}
