package dev.erg.conformance;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import ai.onnxruntime.OnnxTensor;
import ai.onnxruntime.OnnxValue;
import ai.onnxruntime.OrtEnvironment;
import ai.onnxruntime.OrtException;
import ai.onnxruntime.OrtSession;
import dev.erg.analysis.AnalysisOptions;
import dev.erg.analysis.Analyzer;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.VoiceActivityModel;
import dev.erg.workload.ModelWorkload;
import java.nio.FloatBuffer;
import java.nio.LongBuffer;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The voice-activity structure (anonymous input dims, a runtime sample-rate input choosing between two
 * If branches built for two frame sizes, an LSTM) against onnxruntime: the runtime runs the model at
 * each sample rate with the frame size that rate expects, and its actual output shapes (the LSTM's Y
 * gives the number of steps T of the branch that ran) are the truth for erg's shapes and for the MACs,
 * worked from those shapes by the LSTM formula of docs/counting.md: T·B·4·H·(I+H) plus the score MatMul
 * B·H·1, with B = 1 and I = H = 128.
 */
class VoiceActivityConformanceTest {
    @TempDir
    Path dir;

    /** onnxruntime's output shapes for one run at {@code rate} with {@code samples} samples. */
    private static Map<String, long[]> ortShapes(byte[] model, int rate, int samples) throws OrtException {
        OrtEnvironment e = OrtRun.env();
        Map<String, long[]> out = new LinkedHashMap<>();
        try (OrtSession.SessionOptions o = new OrtSession.SessionOptions()) {
            o.setIntraOpNumThreads(1);
            o.setInterOpNumThreads(1);
            try (OrtSession s = e.createSession(model, o);
                 OnnxTensor input = OnnxTensor.createTensor(e, FloatBuffer.allocate(samples), new long[] {1, samples});
                 OnnxTensor state = OnnxTensor.createTensor(e, FloatBuffer.allocate(2 * 128), new long[] {2, 1, 128});
                 OnnxTensor sr = OnnxTensor.createTensor(e, LongBuffer.wrap(new long[] {rate}), new long[0]);
                 OrtSession.Result r = s.run(Map.of("input", input, "state", state, "sr", sr))) {
                for (Map.Entry<String, OnnxValue> x : r) {
                    out.put(x.getKey(), ((OnnxTensor) x.getValue()).getInfo().getShape());
                }
            }
        }
        return out;
    }

    private static InputBindings bindings(int samples, Integer rate) {
        return InputBindings.parse(Map.of(), Map.of("input", "1x" + samples, "state", "2x1x128"),
                rate == null ? Map.of() : Map.of("sr", rate.toString()), "test");
    }

    private static long macsFromOrt(long[] seq) {
        long t = seq[0];
        long b = seq[2];
        long h = seq[3];
        return t * b * 4 * h * (128 + h) + b * h;
    }

    @Test
    void valueSelectsTheBranchOnnxruntimeRunsWithItsExactMacs() throws Exception {
        Path file = VoiceActivityModel.write(dir.resolve("vad.onnx"));
        byte[] bytes = VoiceActivityModel.model(13).toBytes();
        for (int rate : new int[] {16000, 8000}) {
            int samples = VoiceActivityModel.steps(rate) * 128;
            Map<String, long[]> ort = ortShapes(bytes, rate, samples);
            ModelWorkload w = Analyzer.analyze(file, bindings(samples, rate), AnalysisOptions.DEFAULTS);
            for (String out : List.of("prob", "state_out", "seq")) {
                assertArrayEquals(ort.get(out), w.graph().value(out).dims(), rate + " Hz, " + out);
            }
            assertEquals(macsFromOrt(ort.get("seq")), w.macs(), rate + " Hz");
        }
    }

    @Test
    void withoutValueTheBranchThatShapesIsTheOneOnnxruntimeRuns() throws Exception {
        Path file = VoiceActivityModel.write(dir.resolve("vad.onnx"));
        byte[] bytes = VoiceActivityModel.model(13).toBytes();
        // 8 kHz frames: the 16 kHz branch cannot take them, as onnxruntime shows when told 16000.
        Map<String, long[]> ort = ortShapes(bytes, 8000, 256);
        assertThrows(OrtException.class, () -> ortShapes(bytes, 16000, 256));
        ModelWorkload w = Analyzer.analyze(file, bindings(256, null), AnalysisOptions.DEFAULTS);
        assertArrayEquals(ort.get("seq"), w.graph().value("seq").dims());
        assertEquals(macsFromOrt(ort.get("seq")), w.macs());
        String note = w.graph().nodes().stream().filter(n -> n.name().equals("rate_switch")).findFirst()
                .orElseThrow().note();
        assertNotNull(note);
        assertTrue(note.contains("its then branch cannot be shaped"), note);
    }
}
