package dev.erg.onnx;

import java.nio.file.Path;
import java.util.Collections;
import java.util.Map;

/** What the reader takes from a ModelProto: the header and the main graph. */
public final class OnnxModel {
    /**
     * The newest opset of the default domain whose operator definitions erg follows (ONNX 1.18, from
     * memory). A model that imports a newer one is read as this version, with a warning.
     */
    public static final long NEWEST_DEFAULT_OPSET = 23;
    /** The newest opset of the {@code ai.onnx.ml} domain (ONNX 1.18, from memory). */
    public static final long NEWEST_ML_OPSET = 5;

    private final Path file;
    private final java.util.List<String> warnings;
    private final long irVersion;
    private final String producerName;
    private final String producerVersion;
    private final Map<String, Long> opsets;
    private final GraphDef graph;

    public OnnxModel(Path file, long irVersion, String producerName, String producerVersion,
                     Map<String, Long> opsets, GraphDef graph) {
        this(file, irVersion, producerName, producerVersion, opsets, graph, java.util.List.of());
    }

    /** As above, with the reader's warnings (one sentence each, naming the file). */
    public OnnxModel(Path file, long irVersion, String producerName, String producerVersion,
                     Map<String, Long> opsets, GraphDef graph, java.util.List<String> warnings) {
        this.warnings = java.util.List.copyOf(warnings);
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

    /** What the reader accepted with a caveat, e.g. an opset newer than erg knows; sentences naming the file. */
    public java.util.List<String> warnings() {
        return warnings;
    }

    /**
     * The opset version the rules use for {@code domain}: the imported one, capped at the newest that
     * erg knows for the default domain; 0 when the domain is not imported.
     */
    public long assumedOpset(String domain) {
        Long v = opsets.get(domain);
        if (v == null) {
            return 0;
        }
        return domain.isEmpty() ? Math.min(v, NEWEST_DEFAULT_OPSET) : v;
    }

    public GraphDef graph() {
        return graph;
    }
}
