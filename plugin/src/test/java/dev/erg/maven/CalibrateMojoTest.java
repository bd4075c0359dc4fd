package dev.erg.maven;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.maven.it.ItFixtures;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.apache.maven.plugin.MojoExecutionException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The calibrate goal: where it writes, and one line for each kind of bad input. */
class CalibrateMojoTest {
    @TempDir
    Path dir;

    private CalibrateMojo mojo(String csv) throws Exception {
        ItFixtures.smallCnn(dir.resolve("net.onnx").toFile());
        Files.copy(Path.of("src/it/calibrate-at-risk/src/erg/npu.yaml"), dir.resolve("npu.yaml"));
        Files.writeString(dir.resolve("board.csv"), "model,node,latency-ms\n" + csv);
        CalibrateMojo m = new CalibrateMojo();
        ModelConfig mc = new ModelConfig("net.onnx", Map.of("batch", "1"));
        mc.setMeasured("board.csv");
        m.models = List.of(mc);
        m.devices = List.of("npu.calibrated.yaml", "preset:feeder-npu");
        m.basedir = dir.toFile();
        m.setLog(new CapturingLog());
        return m;
    }

    @Test
    void writesTheCalibratedProfileFromTheOriginalNextToIt() throws Exception {
        mojo("net.onnx,,0.150\nnet.onnx,conv1,0.021\n").execute();
        String text = Files.readString(dir.resolve("npu.calibrated.yaml"));
        assertTrue(text.startsWith(Files.readString(dir.resolve("npu.yaml"))));
        assertTrue(text.contains("\ncalibration:\n"));
        assertEquals(dir.resolve("a.calibrated.yml"), CalibrateMojo.calibratedName(dir.resolve("a.yml")));
    }

    @Test
    void badInputEndsInOneLine() throws Exception {
        for (String[] c : new String[][] {{"net.onnx,conv9,0.1\n", "conv9"}, {"net.onnx,,fast\n", "board.csv:2"},
                {"net.onnx,,0\n", "every measured value"}}) {
            MojoExecutionException e = assertThrows(MojoExecutionException.class, mojo(c[0])::execute);
            assertTrue(e.getMessage().startsWith("erg: ") && e.getMessage().contains(c[1]), e.getMessage());
            assertFalse(e.getMessage().contains("\n"), e.getMessage());
            Files.delete(dir.resolve("npu.yaml"));
        }
    }
}
