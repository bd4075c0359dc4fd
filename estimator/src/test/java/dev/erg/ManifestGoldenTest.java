package dev.erg;

import dev.erg.analysis.Analyzer;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.NodeDef;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.OnnxReader;
import dev.erg.onnx.TensorDef;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Every model of the copied manifest (src/test/resources/models/manifest.json) against its ground
 * truth. The truth is outside the project:
 * <ul>
 * <li>macs_truth: for the CNNs and the LSTM, "PyTorch forward hooks on Conv/ConvTranspose/Linear/LSTM/GRU
 * modules while running the model on the input shape"; for tiny_transformer, the analytic count
 * "emb + 4 x (QKV, QK^T, AV, out-proj, FFN) + head" that the ONNX reference shape inference agrees with
 * (the manifest's macs_truth_source field names which, and the test prints it).</li>
 * <li>weight_elements: the element count of the exported initializers; bytes follow at each
 * initializer's stored element width as the ONNX standard's TensorProto.DataType defines it.</li>
 * <li>nodes: the node count of the exported graph.</li>
 * </ul>
 */
class ManifestGoldenTest {
    private static JsonNode manifest;

    @BeforeAll
    static void load() throws IOException {
        manifest = new ObjectMapper().readTree(TestModels.model("manifest.json").toFile());
    }

    static Stream<String> presentModels() throws IOException {
        JsonNode m = new ObjectMapper().readTree(TestModels.model("manifest.json").toFile());
        List<String> names = new ArrayList<>();
        for (Iterator<String> it = m.fieldNames(); it.hasNext();) {
            String name = it.next();
            if (Files.isRegularFile(TestModels.model(name))) {
                names.add(name);
            }
        }
        return names.stream().sorted();
    }

    /** Only the two large embedded-weight files were left out; everything else must be here. */
    @Test
    void everyManifestModelExceptTheTwoLargeOnesIsPresent() {
        Set<String> missing = new HashSet<>();
        for (Iterator<String> it = manifest.fieldNames(); it.hasNext();) {
            String name = it.next();
            if (!Files.isRegularFile(TestModels.model(name))) {
                missing.add(name);
            }
        }
        assertEquals(Set.of("mnasnet0_5.onnx", "squeezenet1_1.onnx"), missing);
    }

    /** Storage width of an element type per the ONNX standard (TensorProto.DataType), in bytes. */
    static long width(ElemType t) {
        switch (t) {
            case FLOAT: case INT32: case UINT32: return 4;
            case INT8: case UINT8: case BOOL: return 1;
            case INT64: case UINT64: case DOUBLE: return 8;
            case FLOAT16: case BFLOAT16: case INT16: case UINT16: return 2;
            default: throw new AssertionError("no width in this test for " + t);
        }
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("presentModels")
    void matchesGroundTruth(String file) {
        JsonNode truth = manifest.get(file);
        Path path = TestModels.model(file);
        ModelWorkload w = Analyzer.analyze(path, Map.of());

        // MACs: exact.
        long macsTruth = truth.get("macs_truth").asLong();
        assertEquals(macsTruth, w.macs(), file + " MACs vs manifest macs_truth (" + truth.get("macs_truth_source").asText() + ")");

        // Weights: element count equals weight_elements, bytes at each initializer's stored type.
        OnnxModel model = OnnxReader.read(path);
        long elements = 0;
        long expectedBytes = 0;
        boolean allFloat = true;
        for (TensorDef t : model.graph().initializers()) {
            elements += t.elements();
            expectedBytes += t.elements() * width(t.type());
            allFloat &= t.type() == ElemType.FLOAT;
        }
        assertEquals(truth.get("weight_elements").asLong(), elements, file + " initializer elements vs weight_elements");
        assertEquals(expectedBytes, w.weightBytes(), file + " weight bytes at the stored element types");
        if (allFloat) {
            assertEquals(4 * truth.get("weight_elements").asLong(), w.weightBytes(), file + " fp32 weight bytes");
        }

        // Nodes, opset, completeness.
        assertEquals(truth.get("nodes").asInt(), w.nodes().size(), file + " node count");
        assertEquals(truth.get("opset").asLong(), model.defaultOpset(), file + " opset");
        assertTrue(w.unmodelled().isEmpty(), file + " unmodelled: " + w.unmodelled());
        assertTrue(w.unresolved().isEmpty(), file + " unresolved: " + w.unresolved());
        assertTrue(w.complete());
        for (NodeWork n : w.nodes()) {
            for (long[] s : n.outputShapes()) {
                assertTrue(s != null, file + " node " + n.name() + " has an unshaped output");
            }
        }

        System.out.printf("GOLDEN | %s | %d | %d | %d | %+d | %d | %d | %d | %s%n", file, model.defaultOpset(), macsTruth,
                w.macs(), w.macs() - macsTruth, elements, w.weightBytes(), w.nodes().size(),
                truth.get("macs_truth_source").asText().startsWith("analytic") ? "analytic" : "hooks");
    }

    /**
     * The QDQ rewrite (the shared models' tools/qdq.py, described in models/README.md) turns the weight
     * of every Conv/Gemm into int8 behind a DequantizeLinear, keeps biases fp32, and adds per MAC node an
     * fp32 scale and an int8 zero point for the activation and for the weight. So, from the float
     * model: bytes = 4 x (all float elements - MAC weight elements) + 1 x MAC weight elements
     * + (4 + 1 + 4 + 1) per Conv/Gemm node.
     */
    @Test
    void qdqWeightsAreCountedAtInt8FromTheFloatModel() {
        OnnxModel fp = OnnxReader.read(TestModels.model("mobilenet_v2.graph.onnx"));
        Map<String, TensorDef> inits = new java.util.HashMap<>();
        long floatElements = 0;
        for (TensorDef t : fp.graph().initializers()) {
            inits.put(t.name(), t);
            floatElements += t.elements();
        }
        long macWeights = 0;
        int macNodes = 0;
        for (NodeDef n : fp.graph().nodes()) {
            if (n.opType().equals("Conv") || n.opType().equals("Gemm")) {
                macNodes++;
                macWeights += inits.get(n.inputs().get(1)).elements();
            }
        }
        assertEquals(53, macNodes); // 52 Conv + 1 Gemm in torchvision's MobileNetV2
        long expected = 4 * (floatElements - macWeights) + macWeights + macNodes * (4 + 1 + 4 + 1);
        ModelWorkload q = Analyzer.analyze(TestModels.model("mobilenet_v2.qdq.graph.onnx"), Map.of());
        assertEquals(expected, q.weightBytes());
        // Every Conv/Gemm reads its weight at int8 and multiplies at int8.
        for (NodeWork n : q.nodes()) {
            if (n.kind() == Kind.MAC) {
                assertEquals("int8", n.weightPrecision(), n.name());
                assertEquals("int8", n.precision(), n.name());
            }
        }
        System.out.printf("QDQ | float elements %d | MAC weight elements %d | MAC nodes %d | expected %d | erg %d%n",
                floatElements, macWeights, macNodes, expected, q.weightBytes());
    }

    /**
     * The demo models (weights embedded). Truth from the shared models' README (demo section):
     * feeder_cnn "31,367,168 MACs and 355,512 parameters, counted while PyTorch ran it";
     * lstm_kws.onnx "the same graph as lstm_kws.graph.onnx with its weights ... 10,638,848 MACs".
     */
    @Test
    void demoLstmIsTheGraphOnlyModelWithWeights() {
        ModelWorkload w = Analyzer.analyze(TestModels.model("demo/lstm_kws.onnx"), Map.of());
        JsonNode truth = manifest.get("lstm_kws.graph.onnx");
        assertEquals(10_638_848L, w.macs());
        assertEquals(truth.get("macs_truth").asLong(), w.macs());
        assertEquals(truth.get("nodes").asInt(), w.nodes().size());
        assertEquals(4 * truth.get("weight_elements").asLong(), w.weightBytes());
        assertTrue(w.complete());
        System.out.printf("DEMO | demo/lstm_kws.onnx | 10638848 | %d | %d%n", w.macs(), w.weightBytes());
    }

    /**
     * feeder_cnn: 355,512 PyTorch parameters include a scale and a shift per BatchNorm channel
     * (2,912 channels: 16 in the stem, and in and out channels of the nine separable blocks). Export in
     * eval mode folds each BatchNorm into its Conv, leaving one bias per channel: 355,512 - 2,912 =
     * 352,600 values. The exporter stores equal tensors once and re-reads the copies through Identity
     * nodes; the Identity copies must not be counted again, so stored elements + copied elements =
     * 352,600 and weight bytes = 4 x stored elements.
     */
    @Test
    void demoFeederCnn() {
        Path p = TestModels.model("demo/feeder_cnn.onnx");
        ModelWorkload w = Analyzer.analyze(p, Map.of());
        assertEquals(31_367_168L, w.macs());
        OnnxModel m = OnnxReader.read(p);
        Map<String, Long> stored = new java.util.HashMap<>();
        long storedElements = 0;
        for (TensorDef t : m.graph().initializers()) {
            assertEquals(ElemType.FLOAT, t.type());
            stored.put(t.name(), t.elements());
            storedElements += t.elements();
        }
        long copies = 0;
        for (NodeDef n : m.graph().nodes()) {
            if (n.opType().equals("Identity") && stored.containsKey(n.inputs().get(0))) {
                copies += stored.get(n.inputs().get(0));
            }
        }
        assertEquals(355_512L - 2_912L, storedElements + copies);
        assertEquals(4 * storedElements, w.weightBytes());
        assertTrue(w.complete());
        System.out.printf("DEMO | demo/feeder_cnn.onnx | 31367168 | %d | stored %d + copies %d | %d%n", w.macs(),
                storedElements, copies, w.weightBytes());
    }
}
