package dev.erg.measure;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.calibrate.MeasurementFile;
import dev.erg.error.BadInputException;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * One run of a small model in onnxruntime: which nodes the runtime's profile names and how they are
 * matched to erg's names. Nothing here is timed or compared with a time; only names and counts are
 * checked, against onnxruntime's own profile.
 */
class RunnerTest {
    @TempDir
    Path dir;

    @Test
    void aModelWithoutItsWeightsEndsInOneLine() throws IOException {
        Path model = dir.resolve("stripped.onnx");
        new OnnxWriter.Model(13, new OnnxWriter.Graph("g")
                .input("x", ElemType.FLOAT, 1, 4, 8, 8)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, 4, 4, 3, 3).external("stripped.bin", 0, 576))
                .node("Conv", "conv", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT))
                .write(model);
        String e = assertThrows(BadInputException.class, () -> ModelRunner.measure(model, Map.of(), 1, 0, 1, 1))
                .getMessage();
        assertTrue(e.startsWith(model + ": onnxruntime cannot run the model: "), e);
        assertFalse(e.contains("\n"), e);
    }

    @Test
    void namelessNodesAreMatchedByTheRuntimesGeneratedName() throws IOException {
        // onnxruntime names a nameless node OpType_INDEX, the index counting nodes without the Constant
        // nodes it folds into initializers (observed with onnxruntime 1.23.2, CPU).
        Path model = dir.resolve("kws.onnx");
        new OnnxWriter.Model(13, new OnnxWriter.Graph("g")
                .input("x", ElemType.FLOAT, 1, 4, 8, 8)
                .node("Constant", "", List.of(), List.of("k"),
                        OnnxWriter.tensor("value", new OnnxWriter.Tensor("kv", ElemType.FLOAT, 1).floats(2f)))
                .node("Sigmoid", "", List.of("x"), List.of("s"))
                .node("Mul", "Mul_7", List.of("s", "k"), List.of("m"))
                .node("Relu", "", List.of("m"), List.of("r"))
                .node("Mul", "", List.of("r", "k"), List.of("y"))
                .output("y", ElemType.FLOAT))
                .write(model);
        ModelTiming t = ModelRunner.measure(model, Map.of(), 1, 0, 1, 7);
        assertEquals(List.of("s", "Mul_7", "r", "y"), t.nodes().stream().map(NodeTiming::name).toList());
        assertEquals(List.of("k (Constant)"), t.notRun());
    }

    @Test
    void profileNodesMatchErgNamesAndTheCsvReadsBack() throws IOException {
        Path model = dir.resolve("helmet.onnx");
        new OnnxWriter.Model(13, new OnnxWriter.Graph("g")
                .input("x", ElemType.FLOAT, 1, 4, 8, 8)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, 4, 4, 3, 3).floats(new float[144]))
                .node("Conv", "conv", List.of("x", "w"), List.of("c"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "", List.of("c"), List.of("r"))
                .node("Add", "add", List.of("r", "x"), List.of("y"))
                .output("y", ElemType.FLOAT))
                .write(model);
        ModelTiming t = ModelRunner.measure(model, Map.of(), 1, 1, 2, 7);
        assertEquals("helmet.onnx", t.model());
        assertEquals(2, t.runMs().length);
        assertEquals(List.of("x: fp32[1, 4, 8, 8]"), t.inputs());
        // onnxruntime's profile names a node by its ONNX name; erg names the nameless Relu by its output.
        assertEquals(List.of("conv", "r", "add"), t.nodes().stream().map(NodeTiming::name).toList());
        assertEquals(List.of("Conv", "Relu", "Add"), t.nodes().stream().map(NodeTiming::opType).toList());
        assertTrue(t.nodes().stream().allMatch(n -> n.samples() == 2), t.nodes().toString());
        assertEquals(List.of(), t.notRun());

        Path csv = dir.resolve("helmet.csv");
        TimingFiles.writeCsv(List.of(t), csv);
        MeasurementFile f = MeasurementFile.read(csv);
        assertEquals(4, f.rows().size());
        f.checkNames(Map.of("helmet.onnx", List.of("conv", "r", "add")));
        assertTrue(f.notes().isEmpty(), f.notes().toString());
        assertTrue(Files.readString(csv).startsWith("# helmet.onnx: erg measure, onnxruntime "));
    }
}
