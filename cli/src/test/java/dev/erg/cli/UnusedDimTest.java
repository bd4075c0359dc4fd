package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A --dim that matches no symbolic dim of the model is reported, not silently ignored. */
class UnusedDimTest {
    @Test
    void aMistypedBindingIsNoted(@TempDir Path dir) throws Exception {
        Path model = dir.resolve("m.onnx");
        new OnnxWriter.Model(13, new OnnxWriter.Graph("g")
                .inputDims("x", ElemType.FLOAT, "batch", 4L)
                .node("Relu", "relu", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT)).write(model);
        CliRun r = CliRun.of("analyze", model.toString(), "--dim", "batch=1", "--dim", "bacth=2");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.contains("note: " + model + ": the dimension 'bacth' is bound, but no graph input has a"
                + " symbolic dim of that name; the binding is unused\n"), r.out);
        assertTrue(!r.out.contains("'batch' is bound"), r.out);
    }
}
