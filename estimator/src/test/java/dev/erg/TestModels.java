package dev.erg;

import dev.erg.graph.Graph;
import dev.erg.graph.GraphBuilder;
import dev.erg.graph.Value;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.OnnxReader;
import dev.erg.onnx.OnnxWriter;
import dev.erg.shape.ShapeInference;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import dev.erg.workload.WorkloadCounter;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URISyntaxException;
import java.net.URL;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

/**
 * Test support: the model files under src/test/resources/models, and small models built with
 * {@link OnnxWriter} and run through the real pipeline (written to a file, read back, linked, shaped,
 * counted).
 */
public final class TestModels {
    private TestModels() {
    }

    /** The folder of the copied reference models (on the test classpath). */
    public static Path modelsDir() {
        URL u = TestModels.class.getResource("/models/manifest.json");
        if (u == null) {
            throw new IllegalStateException("test resource models/manifest.json is missing");
        }
        try {
            return Path.of(u.toURI()).getParent();
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    public static Path model(String relative) {
        return modelsDir().resolve(relative);
    }

    /** Writes {@code m} to a temporary file, reads it back with the real reader, then deletes the file. */
    public static OnnxModel roundTrip(OnnxWriter.Model m) {
        try {
            Path f = Files.createTempFile("erg-test-", ".onnx");
            try {
                m.write(f);
                return OnnxReader.read(f);
            } finally {
                Files.deleteIfExists(f);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Reads, links and shapes the model; returns the shaped graph. */
    public static Graph shaped(long opset, OnnxWriter.Graph g) {
        Graph graph = GraphBuilder.build(roundTrip(new OnnxWriter.Model(opset, g)), Map.of());
        ShapeInference.run(graph);
        return graph;
    }

    /** The whole analysis of a built model. */
    public static ModelWorkload analyze(long opset, OnnxWriter.Graph g) {
        return WorkloadCounter.count(shaped(opset, g));
    }

    public static long[] dims(Graph g, String value) {
        Value v = g.value(value);
        if (v == null) {
            throw new IllegalArgumentException("no value '" + value + "'");
        }
        return v.dims();
    }

    /** The values inference computed for {@code value} (it must have been evaluated). */
    public static long[] data(Graph g, String value) {
        Value v = g.value(value);
        if (v == null || v.data() == null) {
            throw new AssertionError("value '" + value + "' was not evaluated at analysis time");
        }
        return v.data().longs();
    }

    /** The work of the node with this name. */
    public static NodeWork node(ModelWorkload w, String name) {
        for (NodeWork n : w.nodes()) {
            if (n.name().equals(name)) {
                return n;
            }
        }
        throw new IllegalArgumentException("no node '" + name + "'");
    }
}
