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
 * unmodelled (exit 0) by default, and turns the run into a bad-input failure (exit 2, one line) with
 * the flag.
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
        assertEquals(2, r.code, r.toString());
        assertEquals(1, r.errLines().size(), r.toString());
        String line = r.errLines().get(0);
        assertTrue(line.contains(m.toString()), line);
        assertTrue(line.contains("com.example.Fancy (1 node)"), line);
        assertTrue(line.contains("unresolved downstream: Relu (1 node)"), line);
        assertFalse(r.err.contains("\tat "), r.toString());
        assertEquals("", r.out, "nothing on stdout when the run fails");
    }
}
