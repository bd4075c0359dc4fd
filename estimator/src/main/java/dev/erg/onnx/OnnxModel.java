package dev.erg.onnx;

import java.nio.file.Path;
import java.util.Collections;
import java.util.Map;

/** What the reader takes from a ModelProto: the header and the main graph. */
public final class OnnxModel {
    private final Path file;
    private final long irVersion;
    private final String producerName;
    private final String producerVersion;
    private final Map<String, Long> opsets;
    private final GraphDef graph;

    public OnnxModel(Path file, long irVersion, String producerName, String producerVersion,
                     Map<String, Long> opsets, GraphDef graph) {
        this.file = file;
        this.irVersion = irVersion;
        this.producerName = producerName;
        this.producerVersion = producerVersion;
        this.opsets = Collections.unmodifiableMap(opsets);
        this.graph = graph;
    }

    public Path file() {
        return file;
    }

    public long irVersion() {
        return irVersion;
    }

    public String producerName() {
        return producerName;
    }

    public String producerVersion() {
        return producerVersion;
    }

    /** Opset version per domain; the default domain is the empty string. */
    public Map<String, Long> opsets() {
        return opsets;
    }

    /** The default-domain opset, or 0 when the model imports none. */
    public long defaultOpset() {
        Long v = opsets.get("");
        if (v == null) {
            v = opsets.get("ai.onnx");
        }
        return v == null ? 0 : v;
    }

    public GraphDef graph() {
        return graph;
    }
}
