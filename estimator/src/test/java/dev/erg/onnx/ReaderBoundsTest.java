package dev.erg.onnx;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.google.protobuf.CodedOutputStream;
import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.io.RandomAccessFile;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The reader at the edges the fuzzer found: the largest file a protobuf message can be, element types
 * the standard leaves undefined, and opset imports outside the standard's versions (ONNX standard:
 * ModelProto, OperatorSetIdProto, TensorProto.DataType; protobuf encoding: messages below 2 GiB).
 */
class ReaderBoundsTest {
    @TempDir
    Path dir;

    private static OnnxWriter.Graph relu() {
        return new OnnxWriter.Graph("g").input("x", ElemType.FLOAT, 1, 4)
                .node("Relu", "relu", List.of("x"), List.of("y")).output("y", ElemType.FLOAT);
    }

    /**
     * A valid model followed by one unknown length-delimited field (number 100, which ModelProto does
     * not use) padding the file to exactly {@code total} bytes. The padding is a hole: the file is sparse.
     */
    private Path padded(long total) throws IOException {
        byte[] model = new OnnxWriter.Model(13, relu()).toBytes();
        int tag = CodedOutputStream.computeTagSize(100);
        long len = total - model.length - tag - 5;
        assertEquals(5, CodedOutputStream.computeUInt64SizeNoTag(len), "the length takes five bytes");
        Path f = dir.resolve("padded-" + total + ".onnx");
        try (RandomAccessFile raf = new RandomAccessFile(f.toFile(), "rw")) {
            raf.write(model);
            byte[] head = new byte[tag + 5];
            CodedOutputStream out = CodedOutputStream.newInstance(head);
            out.writeTag(100, 2);
            out.writeUInt64NoTag(len);
            out.flush();
            raf.write(head);
            raf.setLength(total);
        }
        return f;
    }

    @Test
    void modelOfExactlyTheLargestMessageSizeIsRead() throws IOException {
        Path f = padded(Integer.MAX_VALUE);
        ModelWorkload w = Analyzer.analyze(f, Map.of());
        assertEquals(4, w.vectorOps()); // Relu over 1x4: one operation per element (docs/counting.md)
        Path g = padded(Integer.MAX_VALUE - 1L);
        assertEquals(4, Analyzer.analyze(g, Map.of()).vectorOps());
    }

    @Test
    void oneByteMoreIsRefusedAsTooLargeForAMessage() throws IOException {
        Path f = padded(Integer.MAX_VALUE + 1L);
        BadInputException e = assertThrows(BadInputException.class, () -> OnnxReader.read(f));
        assertEquals(f + ": the file is 2147483648 bytes; a protobuf ModelProto holds at most 2147483647 bytes"
                + " (large weights belong in external data)", e.getMessage());
    }

    @Test
    void undefinedElementTypeOfAGraphInputIsRefusedNamingValueAndNode() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("g").input("x", ElemType.UNDEFINED, 1, 4)
                .node("Relu", "relu", List.of("x"), List.of("y")).output("y", ElemType.FLOAT);
        Path f = dir.resolve("undef.onnx");
        new OnnxWriter.Model(13, g).write(f);
        BadInputException e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f, Map.of()));
        assertEquals(f + ": graph input 'x' (read by node 'relu' (Relu)) declares the undefined element type (code 0);"
                + " every tensor needs a defined type", e.getMessage());
    }

    @Test
    void castToTheUndefinedTypeIsRefusedNamingValueAndNode() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("g").input("x", ElemType.FLOAT, 1, 4)
                .node("Cast", "cast", List.of("x"), List.of("y"), OnnxWriter.attr("to", 0L))
                .output("y", ElemType.FLOAT);
        Path f = dir.resolve("cast0.onnx");
        new OnnxWriter.Model(13, g).write(f);
        BadInputException e = assertThrows(BadInputException.class, () -> Analyzer.analyze(f, Map.of()));
        assertEquals(f + ": node 'cast' (Cast) has attribute 'to' = 0, not an element type of the standard",
                e.getMessage());
    }

    @Test
    void opsetZeroIsRefused() {
        Path f = dir.resolve("opset0.onnx");
        new OnnxWriter.Model(0, relu()).write(f);
        BadInputException e = assertThrows(BadInputException.class, () -> OnnxReader.read(f));
        assertTrue(e.getMessage().startsWith(f + ": the model imports the default domain (ai.onnx) at opset 0; opset"
                + " versions start at 1"), e.getMessage());
    }

    @Test
    void theSameDomainImportedTwiceIsRefused() {
        Path f = dir.resolve("twice.onnx");
        new OnnxWriter.Model(13, relu()).opsetImport("ai.onnx", 17).write(f);
        BadInputException e = assertThrows(BadInputException.class, () -> OnnxReader.read(f));
        assertTrue(e.getMessage().startsWith(f + ": the model imports the default domain (ai.onnx) twice (opsets 13"
                + " and 17); each domain is imported once"), e.getMessage());
    }

    @Test
    void anOpsetNewerThanErgKnowsIsAWarningWithTheAssumedVersion() {
        Path f = dir.resolve("opset99.onnx");
        new OnnxWriter.Model(99, relu()).write(f);
        ModelWorkload w = Analyzer.analyze(f, Map.of());
        assertEquals(List.of(f + ": the model imports the default domain (ai.onnx) at opset 99, newer than the newest"
                + " erg knows (" + OnnxModel.NEWEST_DEFAULT_OPSET + "); erg reads its operators by the opset "
                + OnnxModel.NEWEST_DEFAULT_OPSET + " definitions"), Analyzer.unusedDimNotes(w, Map.of()));
        assertEquals(OnnxModel.NEWEST_DEFAULT_OPSET, w.graph().nodes().get(0).opset());
    }
}
