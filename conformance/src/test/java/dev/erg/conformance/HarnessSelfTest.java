package dev.erg.conformance;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.OnnxReader;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The comparison and the output editing can fail: checks of the harness itself. */
class HarnessSelfTest {
    private static Value value(ElemType t, long... dims) {
        Value v = new Value("v");
        v.setType(t, dims);
        return v;
    }

    private static OrtRun.Out out(ElemType t, long... dims) {
        return new OrtRun.Out(t, dims, "tensor");
    }

    @Test
    void equalShapeAndTypeAgree() {
        assertNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.FLOAT, 2, 3), out(ElemType.FLOAT, 2, 3), false));
    }

    @Test
    void anyDifferenceIsReported() {
        assertNotNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.FLOAT, 2, 3), out(ElemType.FLOAT, 3, 2), false));
        assertNotNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.FLOAT, 2, 3), out(ElemType.FLOAT, 2, 3, 1), false));
        assertNotNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.BOOL, 2, 3), out(ElemType.UINT8, 2, 3), false));
        assertNotNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.FLOAT, 2), null, false));
        assertNotNull(Harness.compare(Node.Status.UNMODELLED, null, new Value("v"), out(ElemType.FLOAT, 2), false));
    }

    @Test
    void boundsAllowSmallerRuntimeDimsOnly() {
        // NonZero of a [3,4] input: erg bounds the count by 12 elements.
        assertNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.INT64, 2, 12), out(ElemType.INT64, 2, 5), true));
        assertNotNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.INT64, 2, 12), out(ElemType.INT64, 2, 13), true));
        assertNotNull(Harness.compare(Node.Status.SHAPED, null, value(ElemType.INT64, 2, 12), out(ElemType.INT64, 5), true));
    }

    @Test
    void addedOutputsAreReadBackAndWeightsKept(@TempDir Path dir) throws Exception {
        OnnxWriter.Graph g = new OnnxWriter.Graph("g").input("x", ElemType.FLOAT, 1, 4)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, 4, 2).floats(1, 2, 3, 4, 5, 6, 7, 8))
                .node("MatMul", "mm", List.of("x", "w"), List.of("h"))
                .node("Relu", "r", List.of("h"), List.of("y"))
                .output("y", ElemType.FLOAT);
        byte[] edited = ModelEdit.addOutputs(new OnnxWriter.Model(13, g).toBytes(), List.of("h"));
        Path f = dir.resolve("m.onnx");
        Files.write(f, edited);
        OnnxModel m = OnnxReader.read(f);
        assertEquals(List.of("y", "h"), m.graph().outputs().stream().map(v -> v.name()).toList());
        assertEquals(2, m.graph().nodes().size());
        assertTrue(m.graph().initializers().get(0).values() != null, "the weight payload survives the edit");
        assertEquals(8.0, m.graph().initializers().get(0).values().doubleAt(7));
    }
}
