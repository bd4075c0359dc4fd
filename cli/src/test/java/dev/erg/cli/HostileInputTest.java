package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxReader;
import dev.erg.onnx.OnnxWriter;
import dev.erg.onnx.VoiceActivityModel;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Inputs that once hung erg or ran it out of memory: a graph of a million nodes, named pipes given as
 * the model or the device, an exhausted heap; and the input bindings from the command line. Each ends
 * in one line and exit code 2 (bad input) or 3 (internal error), as the CLI's contract says.
 */
class HostileInputTest {
    @TempDir
    Path dir;

    @Test
    void millionNodeChainStopsAtTheNodeLimitUnderA512MiBHeap() throws Exception {
        int n = 1_000_000;
        OnnxWriter.Graph g = new OnnxWriter.Graph("chain").input("v0", ElemType.FLOAT, 1, 8);
        for (int i = 0; i < n; i++) {
            g.node("Relu", "r" + i, List.of("v" + i), List.of("v" + (i + 1)));
        }
        g.output("v" + n, ElemType.FLOAT);
        Path model = dir.resolve("chain.onnx");
        new OnnxWriter.Model(13, g).write(model);
        g = null;
        List<String> cmd = new ArrayList<>(List.of(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Xmx512m", "-cp", System.getProperty("java.class.path"), Main.class.getName(), "analyze",
                model.toString()));
        Process p = new ProcessBuilder(cmd).redirectErrorStream(false).start();
        p.getOutputStream().close();
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), "erg did not finish");
        String err = new String(p.getErrorStream().readAllBytes(), StandardCharsets.UTF_8);
        assertEquals(Main.BAD_INPUT, p.exitValue(), err);
        assertTrue(err.startsWith("erg: " + model + ": the model has more than " + OnnxReader.MAX_NODES
                + " nodes, erg's limit on the node count"), err);
        assertEquals(1, err.strip().lines().count(), err);
    }

    @Test
    void outOfMemoryBecomesOneLineAboutTheHeap() {
        StringWriter err = new StringWriter();
        int code = Main.failure(new OutOfMemoryError("Java heap space"), new PrintWriter(err, true));
        assertEquals(Main.INTERNAL_ERROR, code);
        assertEquals("erg: the Java heap was too small for this model (out of memory); raise it, e.g."
                + " java -Xmx4g -jar erg.jar ..., or JAVA_TOOL_OPTIONS=-Xmx4g for the erg script\n",
                err.toString().replace(System.lineSeparator(), "\n"));
    }

    private Path fifo(String name) throws IOException, InterruptedException {
        Path f = dir.resolve(name);
        Process p;
        try {
            p = new ProcessBuilder("mkfifo", f.toString()).start();
        } catch (IOException e) {
            assumeTrue(false, "mkfifo is not available here");
            return null;
        }
        assumeTrue(p.waitFor(10, TimeUnit.SECONDS) && p.exitValue() == 0, "mkfifo failed");
        return f;
    }

    @Test
    void namedPipeAsModelIsRefusedWithoutOpeningIt() throws Exception {
        Path pipe = fifo("model.onnx");
        CliRun r = CliRun.of("analyze", pipe.toString());
        assertEquals(Main.BAD_INPUT, r.code, r.toString());
        assertEquals(List.of("erg: " + pipe + ": is a named pipe, not a model file"), r.errLines());
    }

    @Test
    void namedPipeAsDeviceIsRefusedWithoutOpeningIt() throws Exception {
        Path pipe = fifo("device.yaml");
        Path model = Fixtures.conv(dir, "m.onnx", 4);
        CliRun r = CliRun.of("estimate", model.toString(), "--device", pipe.toString());
        assertEquals(Main.BAD_INPUT, r.code, r.toString());
        assertEquals(List.of("erg: " + pipe + ": is a named pipe, not a device profile file"), r.errLines());
    }

    @Test
    void characterDeviceAsModelIsRefused() {
        Path zero = Path.of("/dev/zero");
        assumeTrue(Files.exists(zero));
        CliRun r = CliRun.of("analyze", zero.toString());
        assertEquals(Main.BAD_INPUT, r.code, r.toString());
        assertEquals(List.of("erg: /dev/zero: is a character device, not a model file"), r.errLines());
    }

    @Test
    void shapeAndValueBindTheVoiceActivityModel() {
        Path model = VoiceActivityModel.write(dir.resolve("vad.onnx"));
        CliRun r = CliRun.of("analyze", model.toString(), "--shape", "input=1x256", "--shape", "state=2x1x128",
                "--value", "sr=8000");
        assertEquals(Main.OK, r.code, r.toString());
        assertTrue(r.out.contains("inputs bound: shapes input=1x256, state=2x1x128; values sr=8000\n"), r.out);
        // LSTM T·B·4·H·(I+H) with T = 2 plus the score MatMul (docs/counting.md): 262,272 MACs.
        assertEquals(262_272, VoiceActivityModel.branchMacs(2));
        assertTrue(r.out.contains("(262,272)"), r.out);
    }

    @Test
    void withoutValueTheDroppedBranchIsNotedBesideTheTotals() {
        Path model = VoiceActivityModel.write(dir.resolve("vad.onnx"));
        CliRun r = CliRun.of("analyze", model.toString(), "--shape", "input=1x256", "--shape", "state=2x1x128");
        assertEquals(Main.OK, r.code, r.toString());
        assertTrue(r.out.contains("note: " + model + ": node 'rate_switch' (If): If condition is not known at analysis"
                + " time; its then branch cannot be shaped (node 'k16_frames' (Reshape) "), r.out);
        assertTrue(r.out.contains("bind it (--value sr=...) to price the branch that runs\n"), r.out);
        assertTrue(r.out.contains("(262,272)"), r.out); // the else branch: T = 2, as above
    }

    @Test
    void malformedShapeIsAUsageError() {
        CliRun r = CliRun.of("analyze", "m.onnx", "--shape", "input");
        assertEquals(Main.BAD_INPUT, r.code, r.toString());
        assertTrue(r.errLines().get(0).startsWith("erg: --shape 'input' is not INPUT=... (e.g. --shape input=1x576)"),
                r.toString());
    }
}
