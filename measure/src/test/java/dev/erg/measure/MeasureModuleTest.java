package dev.erg.measure;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import ai.onnxruntime.NodeInfo;
import ai.onnxruntime.OrtEnvironment;
import ai.onnxruntime.OrtException;
import ai.onnxruntime.OrtSession;
import ai.onnxruntime.TensorInfo;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import dev.erg.cli.Main;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** The parts of the measure module that need no timing: model bytes, profile parsing, output formats. */
class MeasureModuleTest {
    @Test
    void tinyModelLoadsInOnnxruntime() throws OrtException {
        // onnxruntime reads the hand-encoded ModelProto and reports the declared inputs and output.
        byte[] bytes = TinyModel.binary("MatMul", new long[] {4, 8}, new long[] {8, 3}, new long[] {4, 3});
        OrtEnvironment env = Host.runtime();
        try (OrtSession.SessionOptions o = new OrtSession.SessionOptions(); OrtSession s = env.createSession(bytes, o)) {
            Map<String, NodeInfo> in = s.getInputInfo();
            assertEquals(List.of("a", "b"), List.copyOf(in.keySet()));
            assertEquals(List.of(4L, 8L), List.of(box(((TensorInfo) in.get("a").getInfo()).getShape())));
            assertEquals(List.of(4L, 3L), List.of(box(((TensorInfo) s.getOutputInfo().get("y").getInfo()).getShape())));
        }
    }

    private static Long[] box(long[] v) {
        Long[] b = new Long[v.length];
        for (int i = 0; i < v.length; i++) {
            b[i] = v[i];
        }
        return b;
    }

    @Test
    void profileEventsOfARecordedProfile() throws IOException {
        // An excerpt of a profile written by onnxruntime 1.23.2 (CPU) for a two-node model, three runs.
        ProfileEvents p = ProfileEvents.read(Path.of("src/test/resources/profiles/two-nodes.json"));
        assertEquals(3, p.runs);
        assertEquals(List.of("conv", "Relu_1"), List.copyOf(p.durations.keySet()));
        assertEquals(List.of(132.0, 14.0, 5.0), p.durations.get("conv"));
        assertEquals(List.of(11.0, 3.0, 1.0), p.durations.get("Relu_1"));
        assertEquals("Relu", p.opTypes.get("Relu_1"));
    }

    @Test
    void statistics() {
        // Median and nearest-rank percentile (common practice, no single source).
        assertEquals(2.5, Stats.median(new double[] {4, 1, 3, 2}));
        assertEquals(3, Stats.median(new double[] {5, 1, 3}));
        assertEquals(9, Stats.quantile(new double[] {1, 2, 3, 4, 5, 6, 7, 8, 9, 10}, 0.9));
        assertEquals(10, Stats.quantile(new double[] {1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11}, 0.9));
    }

    @Test
    void hostFiguresAreYamlWithASourcePerFigure() throws IOException {
        HostMeasurements m = new HostMeasurements("Example CPU", 2, 1, 2.5e10, 9.6e9, Map.of(
                HostMeasurements.PEAK_KEY, "a MatMul", HostMeasurements.BANDWIDTH_KEY, "an \"Add\""));
        JsonNode y = new ObjectMapper(new YAMLFactory()).readTree(m.toYaml()).get("host-measurements");
        assertEquals(2.5e10, y.get(HostMeasurements.PEAK_KEY).asDouble());
        assertEquals(9.6, y.get(HostMeasurements.BANDWIDTH_KEY).asDouble());
        assertEquals("an \"Add\"", y.get("sources").get(HostMeasurements.BANDWIDTH_KEY).asText());
        assertEquals("a MatMul", y.get("sources").get(HostMeasurements.PEAK_KEY).asText());
    }

    @Test
    void theErgCommandListsMeasureWhenThisJarIsThere() {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.execute(new String[] {"measure", "--help"}, new PrintWriter(out, true), new PrintWriter(err, true));
        assertEquals(0, code, err.toString());
        assertTrue(out.toString().contains("--threads=T"), out.toString());
        out.getBuffer().setLength(0);
        code = Main.execute(new String[] {"measure", "m.onnx", "--runs", "0"}, new PrintWriter(out, true),
                new PrintWriter(err, true));
        assertEquals(Main.BAD_INPUT, code);
        assertTrue(err.toString().startsWith("erg: --runs must be from 1 to 100000, not 0"), err.toString());
    }
}
