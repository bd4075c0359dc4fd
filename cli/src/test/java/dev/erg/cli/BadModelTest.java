package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.google.protobuf.CodedOutputStream;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Broken, corrupt and hostile model files: each must end in exit code 2 and exactly one stderr line
 * that names the file, never a stack trace (the project's bad-input rule).
 */
class BadModelTest {
    @TempDir
    Path dir;

    private Path write(String name, byte[] bytes) throws IOException {
        Path p = dir.resolve(name);
        Files.write(p, bytes);
        return p;
    }

    private Path write(String name, OnnxWriter.Graph g) {
        Path p = dir.resolve(name);
        new OnnxWriter.Model(13, g).write(p);
        return p;
    }

    /** Runs {@code erg analyze file} and checks the bad-input contract; returns the stderr line. */
    private String assertBadInput(Path file, String... extra) {
        String[] args = new String[2 + extra.length];
        args[0] = "analyze";
        args[1] = file.toString();
        System.arraycopy(extra, 0, args, 2, extra.length);
        CliRun r = CliRun.of(args);
        assertEquals(2, r.code, r.toString());
        assertEquals(1, r.errLines().size(), r.toString());
        String line = r.errLines().get(0);
        assertTrue(line.startsWith("erg: "), r.toString());
        assertTrue(line.contains(file.toString()), "the line must name the file: " + r);
        assertFalse(line.contains("Exception"), r.toString());
        assertFalse(r.err.contains("\tat "), r.toString());
        return line;
    }

    /** A valid model: x -> Conv(w) -> Relu -> z. */
    private static OnnxWriter.Graph convRelu() {
        return new OnnxWriter.Graph("ok")
                .input("x", ElemType.FLOAT, 1, 3, 8, 8)
                .weight("w", ElemType.FLOAT, 4, 3, 3, 3)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", "relu", List.of("y"), List.of("z"))
                .output("z", ElemType.FLOAT);
    }

    @Test
    void missingFileAndFolder() {
        assertBadInput(dir.resolve("nope.onnx"));
        assertBadInput(dir);
    }

    @Test
    void emptyFile() throws IOException {
        assertBadInput(write("empty.onnx", new byte[0]));
    }

    @Test
    void truncatedAtSeveralOffsets() throws IOException {
        byte[] whole = new OnnxWriter.Model(13, convRelu()).toBytes();
        // Every cut lands inside a length-delimited field (the graph, or the last opset_import), so no
        // cut leaves a shorter but complete message behind.
        int[] cuts = {1, 2, 3, 7, 20, whole.length / 4, whole.length / 2, 3 * whole.length / 4, whole.length - 3,
            whole.length - 1};
        for (int cut : cuts) {
            assertBadInput(write("cut" + cut + ".onnx", Arrays.copyOf(whole, cut)));
        }
    }

    @Test
    void randomBytes() throws IOException {
        Random rnd = new Random(20240601L); // a fixed start value: the same bytes on every run
        for (int i = 0; i < 20; i++) {
            byte[] b = new byte[1 + rnd.nextInt(4096)];
            rnd.nextBytes(b);
            assertBadInput(write("random" + i + ".onnx", b));
        }
    }

    @Test
    void validProtobufThatIsNotAModel() throws IOException {
        // A TensorProto on its own: field 2 is data_type (a varint) where ModelProto has producer_name.
        ByteArrayOutputStream bos = new ByteArrayOutputStream();
        CodedOutputStream out = CodedOutputStream.newInstance(bos);
        new OnnxWriter.Tensor("t", ElemType.FLOAT, 2, 2).floats(1, 2, 3, 4).writeTo(out);
        out.flush();
        assertBadInput(write("tensor.onnx", bos.toByteArray()));
        // Only fields that ModelProto does not define: a well-formed message with no graph in it.
        bos.reset();
        out = CodedOutputStream.newInstance(bos);
        out.writeString(100, "hello");
        out.writeUInt64(101, 7);
        out.flush();
        assertBadInput(write("unknown-fields.onnx", bos.toByteArray()));
    }

    @Test
    void cycle() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("cycle")
                .input("x", ElemType.FLOAT, 1, 4)
                .node("Add", "a", List.of("x", "b_out"), List.of("a_out"))
                .node("Relu", "b", List.of("a_out"), List.of("b_out"))
                .output("b_out", ElemType.FLOAT);
        assertTrue(assertBadInput(write("cycle.onnx", g)).contains("cycle"));
    }

    @Test
    void inputThatNothingProduces() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("dangling")
                .input("x", ElemType.FLOAT, 1, 4)
                .node("Add", "add", List.of("x", "ghost"), List.of("y"))
                .output("y", ElemType.FLOAT);
        assertTrue(assertBadInput(write("dangling.onnx", g)).contains("ghost"));
    }

    private OnnxWriter.Graph externalWeight(String location) {
        return new OnnxWriter.Graph("ext")
                .input("x", ElemType.FLOAT, 1, 4)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, 4, 4).external(location, 0, 64))
                .node("MatMul", "mm", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT);
    }

    @Test
    void externalDataOutsideTheModelFolder() {
        for (String loc : new String[] {"/etc/passwd", "../x.bin", "data/../../x.bin", "C:\\weights.bin",
            "..\\x.bin"}) {
            assertBadInput(write("ext.onnx", externalWeight(loc)));
        }
    }

    @Test
    void externalDataInsideTheFolderIsFine() {
        // The data file is never opened, so it need not exist.
        CliRun r = CliRun.of("analyze", write("ext.onnx", externalWeight("weights/w.bin")).toString());
        assertEquals(0, r.code, r.toString());
    }

    @Test
    void dimProductOverflows() {
        long big = 1L << 32; // 2^32 * 2^32 = 2^64 does not fit a signed 64-bit count
        assertBadInput(write("init-overflow.onnx", new OnnxWriter.Graph("o")
                .input("x", ElemType.FLOAT, 1, 4)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, big, big))
                .node("MatMul", "mm", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT)));
        assertBadInput(write("input-overflow.onnx", new OnnxWriter.Graph("o")
                .input("x", ElemType.FLOAT, big, big)
                .node("Relu", "r", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT)));
    }

    @Test
    void byteCountOverflows() {
        // 2^31 * 2^31 = 2^62 elements fit, but 2^62 fp32 elements are 2^64 bytes, which does not.
        long d = 1L << 31;
        assertBadInput(write("bytes-overflow.onnx", new OnnxWriter.Graph("o")
                .input("x", ElemType.FLOAT, d, d)
                .node("Relu", "r", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT)));
    }

    @Test
    void macCountOverflows() {
        // [2^20 x 2^22] . [2^22 x 2^22]: every shape and byte count fits, but the MACs are 2^64.
        assertBadInput(write("macs-overflow.onnx", new OnnxWriter.Graph("o")
                .input("x", ElemType.INT8, 1L << 20, 1L << 22)
                .initializer(new OnnxWriter.Tensor("w", ElemType.INT8, 1L << 22, 1L << 22))
                .node("MatMul", "mm", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.INT8)));
    }

    @Test
    void negativeDim() {
        assertBadInput(write("neg-init.onnx", new OnnxWriter.Graph("n")
                .input("x", ElemType.FLOAT, 1, 4)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, -4, 4))
                .node("MatMul", "mm", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT)));
        assertBadInput(write("neg-input.onnx", new OnnxWriter.Graph("n")
                .input("x", ElemType.FLOAT, 1, -3)
                .node("Relu", "r", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT)));
    }

    @Test
    void rawDataLongerThanTheFile() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("claim")
                .input("x", ElemType.FLOAT, 1, 4)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, 4, 4).claimedRaw(1L << 40))
                .node("MatMul", "mm", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT);
        String line = assertBadInput(write("claim.onnx", g));
        assertTrue(line.contains("raw_data"), line);
    }

    @Test
    void unboundSymbolicDim() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("sym")
                .inputDims("x", ElemType.FLOAT, "batch", 4L)
                .node("Relu", "r", List.of("x"), List.of("y"))
                .output("y", ElemType.FLOAT);
        Path p = write("sym.onnx", g);
        String line = assertBadInput(p);
        assertTrue(line.contains("batch"), line);
        assertBadInput(p, "--dim", "seq=8"); // binding another name does not help
        assertEquals(0, CliRun.of("analyze", p.toString(), "--dim", "batch=2").code);
    }
}
