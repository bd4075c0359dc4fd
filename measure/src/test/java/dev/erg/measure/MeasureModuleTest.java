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

    @Test
    void addChainComputesTheChainInOnnxruntime() throws OrtException {
        // onnxruntime runs the chain of 5 Adds over 4 elements: y = a + 5 b (the ONNX Add definition, link by link).
        byte[] bytes = TinyModel.addChain(4, 5);
        OrtEnvironment env = Host.runtime();
        try (OrtSession.SessionOptions o = new OrtSession.SessionOptions(); OrtSession s = env.createSession(bytes, o);
             ai.onnxruntime.OnnxTensor a = ai.onnxruntime.OnnxTensor.createTensor(env, new float[] {1, 2, 3, 4});
             ai.onnxruntime.OnnxTensor b = ai.onnxruntime.OnnxTensor.createTensor(env, new float[] {0.5f, 1, 0, -1});
             OrtSession.Result r = s.run(Map.of("a", a, "b", b))) {
            float[] y = (float[]) r.get(0).getValue();
            assertEquals(List.of(3.5f, 7f, 3f, -1f), List.of(y[0], y[1], y[2], y[3]));
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
        HostMeasurements m = new HostMeasurements("Example CPU", 2, 1, 2.5e10, 9.6e9, Map.of(2, 7.5e10), Map.of(
                HostMeasurements.PEAK_KEY, "a MatMul", HostMeasurements.BANDWIDTH_KEY, "an \"Add\""));
        JsonNode y = new ObjectMapper(new YAMLFactory()).readTree(m.toYaml()).get("host-measurements");
        assertEquals(2.5e10, y.get(HostMeasurements.PEAK_KEY).asDouble());
        assertEquals(9.6, y.get(HostMeasurements.BANDWIDTH_KEY).asDouble());
        assertEquals(75, y.get("l2-gbytes-per-second").asDouble());
        assertEquals("an \"Add\"", y.get("sources").get(HostMeasurements.BANDWIDTH_KEY).asText());
        assertEquals("a MatMul", y.get("sources").get(HostMeasurements.PEAK_KEY).asText());
    }

    /**
     * The profile host-profile writes loads like any profile: the recording host's figures (23.4 GMAC/s
     * fp32 at 1 thread, 9.6 GB/s, as measured on 2026-12-03, docs/validation.md) at 2.6 GHz give
     * 23.4e9 / (2.6e9 x 1) = 9 MACs per cycle per core.
     */
    @Test
    void hostProfileIsALoadableCpuProfileWithASourcePerNumber(@org.junit.jupiter.api.io.TempDir java.nio.file.Path dir)
            throws IOException {
        // Cache figures as a chain of Adds might read them: the L1 one lower than the L2 one (dispatch-bound).
        HostMeasurements m = new HostMeasurements("Example CPU", 2, 1, 23.4e9, 9.6e9,
                Map.of(1, 3.0e10, 2, 7.8e10, 3, 5.2e10), Map.of(
                HostMeasurements.PEAK_KEY, "a MatMul", HostMeasurements.BANDWIDTH_KEY, "an Add",
                HostMeasurements.cacheKey(2), "an L2 chain", HostMeasurements.cacheKey(3), "an L3 chain"));
        String text = HostProfileWriter.profile(m, 2600, "given", java.util.List.of(
                new HostProfileWriter.Cache(1, 32 * 1024, false), new HostProfileWriter.Cache(2, 1024 * 1024, false),
                new HostProfileWriter.Cache(3, 32L * 1024 * 1024, true)));
        java.nio.file.Path f = java.nio.file.Files.writeString(dir.resolve("host.yaml"), text);
        dev.erg.device.DeviceProfile p = dev.erg.device.DeviceLoader.load(f.toString(), null);
        assertEquals(9.0, p.engines().get(0).cpu().macRate("fp32").perCycle(), 1e-9);
        assertEquals(1, p.engines().get(0).cpu().cores());
        assertEquals(3, p.caches().size());
        assertEquals(32L * 1024 * 1024, p.caches().get(2).capacityBytes());
        assertEquals(9.6e9, p.dram().bandwidth(p.clockHz()), 1);
        // bytes per cycle = bytes per second / clock; the L1 takes the L2's figure (a nearer level is never slower)
        assertEquals(7.8e10, p.caches().get(0).bandwidth(p.clockHz()), 7.8e10 * 1e-3);
        assertEquals(7.8e10, p.caches().get(1).bandwidth(p.clockHz()), 7.8e10 * 1e-3);
        assertEquals(5.2e10, p.caches().get(2).bandwidth(p.clockHz()), 5.2e10 * 1e-3);
        assertTrue(p.sources().get("memories[0].bytes-per-cycle").contains("the level 2 figure"),
                p.sources().get("memories[0].bytes-per-cycle"));
        assertEquals(false, p.energyKnown());
        for (String key : new String[] {"clock-mhz", "engines[0].cores", "engines[0].macs-per-cycle-per-core.fp32",
                "memories[0].capacity-bytes", "memories[2].bytes-per-cycle", "memories[3].gbytes-per-second"}) {
            assertEquals(true, p.sources().containsKey(key), key + " in " + p.sources());
        }
        assertEquals(1024 * 1024, HostProfileWriter.size("1024K"));
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
