package dev.erg.report;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import com.fasterxml.jackson.core.PrettyPrinter;
import dev.erg.workload.ModelInfo;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;

/**
 * Writes a {@link ModelWorkload} as JSON. The layout is a contract that scripts rely on:
 *
 * <pre>
 * { "model":  { "file", "opset", "producer", then producerVersion, irVersion, graph, opsets, dims },
 *   "totals": { "macs", "vectorOps", "weightBytes", "peakActivationBytes", "nodes",
 *               then complete, folded, views },
 *   "nodes":  [ { "name", "opType", "macs", "vectorOps", "weightBytes", "inputBytes", "outputBytes",
 *                 "precision", "outputShapes", then kind, weightPrecision, domain?, gemm?, note? } ],
 *   "unmodelled": [ { "opType", "count" } ],
 *   then "unresolved": [ { "opType", "count" } ], "notice" }
 * </pre>
 *
 * <p>Fields added later go after these. The output is deterministic: keys in a fixed order, nodes in
 * topological order, operator lists sorted by type, maps sorted by key, two-space indent, "\n" line
 * ends and a final newline, whatever the platform. Numbers are plain JSON integers.
 */
public final class AnalysisJson {
    /** Says what the figures are, in every report. */
    public static final String NOTICE = "These figures are analytical estimates, not measurements:"
            + " measure on the real silicon before making a product decision.";

    private static final JsonFactory FACTORY = JsonFactory.builder().build();

    private AnalysisJson() {
    }

    /** The JSON document as UTF-8 bytes. */
    public static byte[] toBytes(ModelWorkload w) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try {
            write(w, out);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return out.toByteArray();
    }

    /** Writes the JSON document to {@code file}, creating its parent folders. */
    public static void write(ModelWorkload w, Path file) throws IOException {
        Path parent = file.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        try (OutputStream out = Files.newOutputStream(file)) {
            write(w, out);
        }
    }

    /** Writes the JSON document (UTF-8) to {@code out}; the stream is left open. */
    public static void write(ModelWorkload w, OutputStream out) throws IOException {
        write(w, out, null);
    }

    /**
     * Fields that a richer report adds after the analysis's own, at three places: the end of
     * "totals", the end of each node, and the end of the document.
     */
    interface Extension {
        void totals(JsonGenerator g) throws IOException;

        /** Called for the node at {@code index} of the workload, inside its object, after its own fields. */
        void node(JsonGenerator g, int index, NodeWork n) throws IOException;

        void tail(JsonGenerator g) throws IOException;
    }

    /** The analysis document with the fields of {@code ext} (may be null) added after its own. */
    static void write(ModelWorkload w, OutputStream out, Extension ext) throws IOException {
        try (JsonGenerator g = FACTORY.createGenerator(out, JsonEncoding.UTF8)) {
            g.disable(JsonGenerator.Feature.AUTO_CLOSE_TARGET);
            g.setPrettyPrinter(new Printer());
            g.writeStartObject();
            model(g, w);
            totals(g, w, ext);
            nodes(g, w.nodes(), ext);
            opCounts(g, "unmodelled", w.unmodelled());
            opCounts(g, "unresolved", w.unresolved());
            g.writeStringField("notice", NOTICE);
            if (ext != null) {
                ext.tail(g);
            }
            g.writeEndObject();
            g.writeRaw('\n');
        }
    }

    private static void model(JsonGenerator g, ModelWorkload w) throws IOException {
        ModelInfo m = Format.model(w);
        g.writeObjectFieldStart("model");
        g.writeStringField("file", m.file() == null ? "" : m.file().toString());
        g.writeNumberField("opset", m.defaultOpset());
        g.writeStringField("producer", m.producer());
        g.writeStringField("producerVersion", m.producerVersion());
        g.writeNumberField("irVersion", m.irVersion());
        g.writeStringField("graph", m.graphName());
        longMap(g, "opsets", Format.opsets(m));
        longMap(g, "dims", Format.dims(w));
        bindings(g, w);
        g.writeEndObject();
    }

    /** Bound input shapes and values, each object written only when something is bound. */
    private static void bindings(JsonGenerator g, ModelWorkload w) throws IOException {
        dev.erg.graph.InputBindings b = w.graph() == null ? dev.erg.graph.InputBindings.NONE : w.graph().bindings();
        if (!b.shapes().isEmpty()) {
            g.writeObjectFieldStart("shapes");
            for (Map.Entry<String, java.util.List<Long>> e : b.shapes().entrySet()) {
                g.writeArrayFieldStart(e.getKey());
                for (long d : e.getValue()) {
                    g.writeNumber(d);
                }
                g.writeEndArray();
            }
            g.writeEndObject();
        }
        if (!b.values().isEmpty()) {
            g.writeObjectFieldStart("values");
            for (Map.Entry<String, java.util.List<String>> e : b.values().entrySet()) {
                g.writeStringField(e.getKey(), String.join(",", e.getValue()));
            }
            g.writeEndObject();
        }
    }

    private static void totals(JsonGenerator g, ModelWorkload w, Extension ext) throws IOException {
        g.writeObjectFieldStart("totals");
        g.writeNumberField("macs", w.macs());
        g.writeNumberField("vectorOps", w.vectorOps());
        g.writeNumberField("weightBytes", w.weightBytes());
        g.writeNumberField("peakActivationBytes", w.peakActivationBytes());
        g.writeNumberField("nodes", w.nodes().size());
        g.writeBooleanField("complete", w.complete());
        g.writeNumberField("folded", Format.countKind(w, Kind.FOLDED));
        g.writeNumberField("views", Format.countKind(w, Kind.VIEW));
        if (ext != null) {
            ext.totals(g);
        }
        g.writeEndObject();
    }

    private static void nodes(JsonGenerator g, List<NodeWork> nodes, Extension ext) throws IOException {
        g.writeArrayFieldStart("nodes");
        for (int i = 0; i < nodes.size(); i++) {
            NodeWork n = nodes.get(i);
            g.writeStartObject();
            g.writeStringField("name", n.name());
            g.writeStringField("opType", n.opType());
            g.writeNumberField("macs", n.macs());
            g.writeNumberField("vectorOps", n.vectorOps());
            g.writeNumberField("weightBytes", n.weightBytes());
            g.writeNumberField("inputBytes", n.inputBytes());
            g.writeNumberField("outputBytes", n.outputBytes());
            g.writeStringField("precision", n.precision());
            g.writeFieldName("outputShapes");
            g.writeRawValue(shapes(n.outputShapes())); // on one line: [[1, 64, 56, 56]]
            g.writeStringField("kind", n.kind().label);
            if (n.weightPrecision() == null) {
                g.writeNullField("weightPrecision");
            } else {
                g.writeStringField("weightPrecision", n.weightPrecision());
            }
            String domain = n.domain();
            if (!domain.isEmpty()) {
                g.writeStringField("domain", domain);
            }
            if (n.kind() == Kind.MAC && n.gemmGroups() > 0) {
                g.writeObjectFieldStart("gemm");
                g.writeNumberField("m", n.gemmM());
                g.writeNumberField("k", n.gemmK());
                g.writeNumberField("n", n.gemmN());
                g.writeNumberField("groups", n.gemmGroups());
                g.writeEndObject();
            }
            if (n.note() != null) {
                g.writeStringField("note", n.note());
            }
            if (ext != null) {
                ext.node(g, i, n);
            }
            g.writeEndObject();
        }
        g.writeEndArray();
    }

    private static void opCounts(JsonGenerator g, String field, Map<String, Integer> sorted) throws IOException {
        g.writeArrayFieldStart(field);
        for (Map.Entry<String, Integer> e : sorted.entrySet()) {
            g.writeStartObject();
            g.writeStringField("opType", e.getKey());
            g.writeNumberField("count", e.getValue());
            g.writeEndObject();
        }
        g.writeEndArray();
    }

    private static void longMap(JsonGenerator g, String field, Map<String, Long> sorted) throws IOException {
        g.writeObjectFieldStart(field);
        for (Map.Entry<String, Long> e : sorted.entrySet()) {
            g.writeNumberField(e.getKey(), e.getValue());
        }
        g.writeEndObject();
    }

    /** Output shapes as one line of JSON: an unknown shape is null. */
    static String shapes(List<long[]> shapes) {
        StringBuilder b = new StringBuilder("[");
        for (int i = 0; i < shapes.size(); i++) {
            b.append(i == 0 ? "" : ", ");
            long[] s = shapes.get(i);
            if (s == null) {
                b.append("null");
                continue;
            }
            b.append('[');
            for (int k = 0; k < s.length; k++) {
                b.append(k == 0 ? "" : ", ").append(s[k]);
            }
            b.append(']');
        }
        return b.append(']').toString();
    }

    /** Two-space indent, "key": value, "\n" line ends on every platform, empty containers as {} and []. */
    static final class Printer implements PrettyPrinter {
        private int depth;

        private void newline(JsonGenerator g) throws IOException {
            g.writeRaw('\n');
            for (int i = 0; i < depth; i++) {
                g.writeRaw("  ");
            }
        }

        @Override
        public void writeRootValueSeparator(JsonGenerator g) throws IOException {
            g.writeRaw('\n');
        }

        @Override
        public void writeStartObject(JsonGenerator g) throws IOException {
            g.writeRaw('{');
            depth++;
        }

        @Override
        public void beforeObjectEntries(JsonGenerator g) throws IOException {
            newline(g);
        }

        @Override
        public void writeObjectFieldValueSeparator(JsonGenerator g) throws IOException {
            g.writeRaw(": ");
        }

        @Override
        public void writeObjectEntrySeparator(JsonGenerator g) throws IOException {
            g.writeRaw(',');
            newline(g);
        }

        @Override
        public void writeEndObject(JsonGenerator g, int entries) throws IOException {
            depth--;
            if (entries > 0) {
                newline(g);
            }
            g.writeRaw('}');
        }

        @Override
        public void writeStartArray(JsonGenerator g) throws IOException {
            g.writeRaw('[');
            depth++;
        }

        @Override
        public void beforeArrayValues(JsonGenerator g) throws IOException {
            newline(g);
        }

        @Override
        public void writeArrayValueSeparator(JsonGenerator g) throws IOException {
            g.writeRaw(',');
            newline(g);
        }

        @Override
        public void writeEndArray(JsonGenerator g, int values) throws IOException {
            depth--;
            if (values > 0) {
                newline(g);
            }
            g.writeRaw(']');
        }
    }
}
