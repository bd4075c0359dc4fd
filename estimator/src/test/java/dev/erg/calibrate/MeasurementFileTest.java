package dev.erg.calibrate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The measurement file format (docs/calibration.md): header row, model, node, measured columns. */
class MeasurementFileTest {
    @TempDir
    Path dir;

    private Path write(String text) throws IOException {
        Path p = dir.resolve("board.csv");
        Files.writeString(p, text, StandardCharsets.UTF_8);
        return p;
    }

    private String error(String text) throws IOException {
        Path p = write(text);
        return assertThrows(BadInputException.class, () -> MeasurementFile.read(p)).getMessage();
    }

    @Test
    void readsRowsInSiUnits() throws IOException {
        MeasurementFile f = MeasurementFile.read(write("# measured on the feeder board\n"
                + "model,node,latency-ms,energy-uj,power-mw\n"
                + "feeder.onnx,,12.5,300,24\n"
                + "feeder.onnx,conv1,0.25,,\n"
                + "\"feeder.onnx\",\"odd,name\",1e-1,,\n"));
        assertEquals(3, f.rows().size());
        Measurement whole = f.rows().get(0);
        assertNull(whole.node());
        assertEquals(3, whole.line());
        // 12.5 ms = 0.0125 s, 300 uJ = 3e-4 J, 24 mW = 0.024 W (SI prefixes).
        assertEquals(0.0125, whole.latencySeconds(), 1e-15);
        assertEquals(3e-4, whole.energyJoules(), 1e-15);
        assertEquals(0.024, whole.powerWatts(), 1e-15);
        assertEquals("conv1", f.rows().get(1).node());
        assertNull(f.rows().get(1).energyJoules());
        assertEquals("odd,name", f.rows().get(2).node());
        assertEquals(64, f.sha256().length());
        assertTrue(f.notes().isEmpty());
    }

    @Test
    void unknownColumnsAreIgnoredWithANote() throws IOException {
        MeasurementFile f = MeasurementFile.read(write("model,latency-ms,board,temperature-c\nm.onnx,3,rev-b,41\n"));
        assertEquals(1, f.rows().size());
        assertEquals(1, f.notes().size());
        assertTrue(f.notes().get(0).contains("ignored columns 'board', 'temperature-c'"), f.notes().get(0));
    }

    @Test
    void badNumbersNameFileLineAndColumn() throws IOException {
        String e = error("model,node,latency-ms\nm.onnx,a,1.5\nm.onnx,b,fast\n");
        assertEquals(dir.resolve("board.csv") + ":3: latency-ms: 'fast' is not a number (write e.g. 12.5, with a dot for decimals)", e);
        e = error("model,node,energy-uj\nm.onnx,a,-4\n");
        assertEquals(dir.resolve("board.csv") + ":2: energy-uj: -4 is negative; a measurement is 0 or more", e);
        e = error("model,node,power-mw\nm.onnx,a,1,5\n");
        assertTrue(e.endsWith(":2: the row has 4 cells but the header has 3"), e);
        e = error("model,node,latency-ms\nm.onnx,a,5e999\n");
        assertTrue(e.endsWith(":2: latency-ms: '5e999' is too large"), e);
        e = error("model,node,latency-ms\nm.onnx,a,1\nm.onnx,a,2\n");
        assertTrue(e.endsWith(":3: node 'a' of 'm.onnx' was already measured on line 2;"
                + " give one row per model and node (put repeated runs' median in it)"), e);
        e = error("model,node,latency-ms\nm.onnx,a,\n");
        assertTrue(e.endsWith(":2: the row gives no value: fill at least one of latency-ms"), e);
        e = error("model,node,latency-ms\n,a,2\n");
        assertTrue(e.endsWith(":2: model: empty; every row names its model file"), e);
        e = error("model,node,latency-ms\nm.onnx,\"a,2\n");
        assertTrue(e.endsWith(":2: column 2: a quote is not closed"), e);
    }

    @Test
    void headerFaults() throws IOException {
        assertTrue(error("").endsWith(": the measurement file is empty: it needs a header row (model,node,latency-ms) and at least one row"));
        assertTrue(error("node,latency-ms\na,1\n").endsWith(":1: the header has no 'model' column;"
                + " the first row must name the columns, e.g. model,node,latency-ms"));
        assertTrue(error("model,node\nm.onnx,a\n").endsWith(":1: the header has no measured column:"
                + " give at least one of latency-ms, energy-uj, power-mw (or chip-energy-uj, chip-power-mw for the chip alone)"));
        assertTrue(error("model,latency-ms\n").endsWith(": the measurement file has a header but no rows"));
        assertTrue(error("model,latency-ms,Latency-ms\nm,1,2\n").endsWith(":1: latency-ms: the column appears twice in the header"));
        String missing = assertThrows(BadInputException.class,
                () -> MeasurementFile.read(dir.resolve("none.csv"))).getMessage();
        assertEquals(dir.resolve("none.csv") + ": no such measurement file", missing);
    }

    @Test
    void unknownNodesAreListedTogetherWithTheClosestNames() throws IOException {
        MeasurementFile f = MeasurementFile.read(write("model,node,latency-ms\n"
                + "net.onnx,/features/conv1/Conv,1\nnet.onnx,/features/conv9/Conv,1\nnet.onnx,/head/Gem,2\n"
                + "net.onnx,zzzzzzzzzzzzzzzzzz,2\n"));
        Map<String, List<String>> names = Map.of("net.onnx",
                List.of("/features/conv1/Conv", "/features/conv2/Conv", "/features/conv3/Conv", "/head/Gemm"));
        String e = assertThrows(BadInputException.class, () -> f.checkNames(names)).getMessage();
        assertEquals(dir.resolve("board.csv") + ": 3 node names are not in the model:"
                + " line 3 '/features/conv9/Conv' in net.onnx (closest: /features/conv1/Conv, /features/conv2/Conv, /features/conv3/Conv);"
                + " line 4 '/head/Gem' in net.onnx (closest: /head/Gemm);"
                + " line 5 'zzzzzzzzzzzzzzzzzz' in net.onnx", e);
        String m = assertThrows(BadInputException.class, () -> f.checkNames(Map.of("other.onnx", List.of()))).getMessage();
        assertEquals(dir.resolve("board.csv") + ": model 'net.onnx' (line 2) is not among the models given (other.onnx);"
                + " the model column holds the model's file name", m);
    }

    @Test
    void editDistance() {
        // Levenshtein's textbook example (common practice, no single source): kitten -> sitting is 3.
        assertEquals(3, Names.distance("kitten", "sitting"));
        assertEquals(0, Names.distance("", ""));
        assertEquals(4, Names.distance("", "conv"));
    }
}
