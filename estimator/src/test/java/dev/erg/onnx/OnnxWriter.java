package dev.erg.onnx;

import com.google.protobuf.CodedOutputStream;
import java.io.BufferedOutputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Writes ONNX files (ModelProto on the protobuf wire, the standard's field numbers) from a small
 * builder. Used by the tests, the benchmark and the validation models to make graphs of known
 * structure. Large payloads are streamed to the file, never held in memory.
 *
 * <pre>
 * OnnxWriter.Graph g = new OnnxWriter.Graph("tiny")
 *     .input("x", ElemType.FLOAT, 1, 3, 8, 8)
 *     .weight("w", ElemType.FLOAT, 4, 3, 3, 3)
 *     .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
 *     .output("y", ElemType.FLOAT);
 * new OnnxWriter.Model(13, g).write(path);
 * </pre>
 */
public final class OnnxWriter {
    private OnnxWriter() {
    }

    /** Something that knows its serialized size and writes itself. */
    interface Message {
        long size();

        void writeTo(CodedOutputStream out) throws IOException;
    }

    static long tagSize(int field) {
        return CodedOutputStream.computeTagSize(field);
    }

    static long bytesField(int field, long len) {
        return tagSize(field) + CodedOutputStream.computeUInt64SizeNoTag(len) + len;
    }

    static long stringField(int field, String s) {
        return bytesField(field, s.getBytes(StandardCharsets.UTF_8).length);
    }

    static long messageField(int field, Message m) {
        return bytesField(field, m.size());
    }

    static long varintField(int field, long v) {
        return tagSize(field) + CodedOutputStream.computeUInt64SizeNoTag(v);
    }

    static void writeString(CodedOutputStream out, int field, String s) throws IOException {
        byte[] b = s.getBytes(StandardCharsets.UTF_8);
        out.writeTag(field, 2);
        out.writeUInt64NoTag(b.length);
        out.writeRawBytes(b);
    }

    static void writeMessage(CodedOutputStream out, int field, Message m) throws IOException {
        out.writeTag(field, 2);
        out.writeUInt64NoTag(m.size());
        m.writeTo(out);
    }

    static void writeVarint(CodedOutputStream out, int field, long v) throws IOException {
        out.writeTag(field, 0);
        out.writeUInt64NoTag(v);
    }

    static long packedSize(long[] v) {
        long n = 0;
        for (long x : v) {
            n += CodedOutputStream.computeUInt64SizeNoTag(x);
        }
        return n;
    }

    static void writePacked(CodedOutputStream out, int field, long[] v) throws IOException {
        out.writeTag(field, 2);
        out.writeUInt64NoTag(packedSize(v));
        for (long x : v) {
            out.writeUInt64NoTag(x);
        }
    }

    // ---- tensors ---------------------------------------------------------------------------

    /** A TensorProto: dims, type, name, and a payload (explicit bytes, a streamed fill, or external). */
    public static final class Tensor implements Message {
        final String name;
        final ElemType type;
        final long[] dims;
        byte[] raw;
        long streamedBytes = -1;
        boolean claimedOnly;
        Map<String, String> external;

        public Tensor(String name, ElemType type, long... dims) {
            this.name = name;
            this.type = type;
            this.dims = dims.clone();
        }

        long elements() {
            long n = 1;
            for (long d : dims) {
                n *= d;
            }
            return n;
        }

        /** The payload as raw little-endian bytes. */
        public Tensor raw(byte[] bytes) {
            this.raw = bytes.clone();
            return this;
        }

        /** A payload of elements x width bytes, written as a pattern while streaming. */
        public Tensor filled() {
            this.streamedBytes = type.bytes(elements());
            return this;
        }

        /**
         * A raw_data field whose length claims {@code bytes} but carries no payload (for hostile-input
         * tests): the enclosing messages' lengths stay true, only this one lies.
         */
        public Tensor claimedRaw(long bytes) {
            this.streamedBytes = bytes;
            this.claimedOnly = true;
            return this;
        }

        /** External data at {@code location} (the data file is not written). */
        public Tensor external(String location, long offset, long length) {
            this.external = new LinkedHashMap<>();
            external.put("location", location);
            external.put("offset", Long.toString(offset));
            external.put("length", Long.toString(length));
            return this;
        }

        public Tensor longs(long... values) {
            ByteBuffer b = ByteBuffer.allocate(values.length * 8).order(ByteOrder.LITTLE_ENDIAN);
            for (long v : values) {
                b.putLong(v);
            }
            return raw(b.array());
        }

        public Tensor floats(float... values) {
            ByteBuffer b = ByteBuffer.allocate(values.length * 4).order(ByteOrder.LITTLE_ENDIAN);
            for (float v : values) {
                b.putFloat(v);
            }
            return raw(b.array());
        }

        long payloadLength() {
            return raw != null ? raw.length : Math.max(streamedBytes, 0);
        }

        @Override
        public long size() {
            long n = 0;
            for (long d : dims) {
                n += varintField(1, d);
            }
            n += varintField(2, type.code);
            n += stringField(8, name);
            if (external != null) {
                for (Map.Entry<String, String> e : external.entrySet()) {
                    n += bytesField(13, stringField(1, e.getKey()) + stringField(2, e.getValue()));
                }
                n += varintField(14, 1);
            } else if (claimedOnly) {
                n += tagSize(9) + CodedOutputStream.computeUInt64SizeNoTag(streamedBytes);
            } else if (raw != null || streamedBytes >= 0) {
                n += tagSize(9) + CodedOutputStream.computeUInt64SizeNoTag(payloadLength()) + payloadLength();
            }
            return n;
        }

        @Override
        public void writeTo(CodedOutputStream out) throws IOException {
            for (long d : dims) {
                writeVarint(out, 1, d);
            }
            writeVarint(out, 2, type.code);
            writeString(out, 8, name);
            if (external != null) {
                for (Map.Entry<String, String> e : external.entrySet()) {
                    out.writeTag(13, 2);
                    out.writeUInt64NoTag(stringField(1, e.getKey()) + stringField(2, e.getValue()));
                    writeString(out, 1, e.getKey());
                    writeString(out, 2, e.getValue());
                }
                writeVarint(out, 14, 1);
            } else if (claimedOnly) {
                out.writeTag(9, 2);
                out.writeUInt64NoTag(streamedBytes);
            } else if (raw != null) {
                out.writeTag(9, 2);
                out.writeUInt64NoTag(raw.length);
                out.writeRawBytes(raw);
            } else if (streamedBytes >= 0) {
                out.writeTag(9, 2);
                out.writeUInt64NoTag(streamedBytes);
                byte[] chunk = new byte[1 << 16];
                for (int i = 0; i < chunk.length; i++) {
                    chunk[i] = (byte) (i * 31 + 7);
                }
                long left = streamedBytes;
                while (left > 0) {
                    int k = (int) Math.min(chunk.length, left);
                    out.writeRawBytes(chunk, 0, k);
                    left -= k;
                }
            }
        }
    }

    // ---- attributes ------------------------------------------------------------------------

    /** An AttributeProto. */
    public static final class Attr implements Message {
        final String name;
        final AttributeDef.Kind kind;
        long i;
        float f;
        String s;
        long[] ints;
        float[] floats;
        Tensor t;
        Graph g;

        Attr(String name, AttributeDef.Kind kind) {
            this.name = name;
            this.kind = kind;
        }

        @Override
        public long size() {
            long n = stringField(1, name) + varintField(20, kind.ordinal());
            switch (kind) {
                case INT: return n + varintField(3, i);
                case FLOAT: return n + tagSize(2) + 4;
                case STRING: return n + stringField(4, s);
                case INTS: return n + bytesField(8, packedSize(ints));
                case FLOATS: return n + bytesField(7, 4L * floats.length);
                case TENSOR: return n + messageField(5, t);
                case GRAPH: return n + messageField(6, g);
                default: throw new IllegalStateException(kind.name());
            }
        }

        @Override
        public void writeTo(CodedOutputStream out) throws IOException {
            writeString(out, 1, name);
            writeVarint(out, 20, kind.ordinal());
            switch (kind) {
                case INT: writeVarint(out, 3, i); break;
                case FLOAT: out.writeTag(2, 5); out.writeFloatNoTag(f); break;
                case STRING: writeString(out, 4, s); break;
                case INTS: writePacked(out, 8, ints); break;
                case FLOATS:
                    out.writeTag(7, 2);
                    out.writeUInt64NoTag(4L * floats.length);
                    for (float x : floats) {
                        out.writeFloatNoTag(x);
                    }
                    break;
                case TENSOR: writeMessage(out, 5, t); break;
                case GRAPH: writeMessage(out, 6, g); break;
                default: throw new IllegalStateException(kind.name());
            }
        }
    }

    public static Attr attr(String name, long value) {
        Attr a = new Attr(name, AttributeDef.Kind.INT);
        a.i = value;
        return a;
    }

    public static Attr attr(String name, float value) {
        Attr a = new Attr(name, AttributeDef.Kind.FLOAT);
        a.f = value;
        return a;
    }

    public static Attr attr(String name, String value) {
        Attr a = new Attr(name, AttributeDef.Kind.STRING);
        a.s = value;
        return a;
    }

    public static Attr ints(String name, long... values) {
        Attr a = new Attr(name, AttributeDef.Kind.INTS);
        a.ints = values.clone();
        return a;
    }

    public static Attr floats(String name, float... values) {
        Attr a = new Attr(name, AttributeDef.Kind.FLOATS);
        a.floats = values.clone();
        return a;
    }

    public static Attr tensor(String name, Tensor t) {
        Attr a = new Attr(name, AttributeDef.Kind.TENSOR);
        a.t = t;
        return a;
    }

    public static Attr graph(String name, Graph g) {
        Attr a = new Attr(name, AttributeDef.Kind.GRAPH);
        a.g = g;
        return a;
    }

    // ---- nodes, values, graphs -------------------------------------------------------------

    static final class NodeMsg implements Message {
        final String op;
        final String name;
        final String domain;
        final List<String> inputs;
        final List<String> outputs;
        final List<Attr> attrs;

        NodeMsg(String op, String name, String domain, List<String> inputs, List<String> outputs, List<Attr> attrs) {
            this.op = op;
            this.name = name;
            this.domain = domain;
            this.inputs = inputs;
            this.outputs = outputs;
            this.attrs = attrs;
        }

        @Override
        public long size() {
            long n = 0;
            for (String s : inputs) {
                n += stringField(1, s);
            }
            for (String s : outputs) {
                n += stringField(2, s);
            }
            n += stringField(3, name) + stringField(4, op);
            for (Attr a : attrs) {
                n += messageField(5, a);
            }
            if (!domain.isEmpty()) {
                n += stringField(7, domain);
            }
            return n;
        }

        @Override
        public void writeTo(CodedOutputStream out) throws IOException {
            for (String s : inputs) {
                writeString(out, 1, s);
            }
            for (String s : outputs) {
                writeString(out, 2, s);
            }
            writeString(out, 3, name);
            writeString(out, 4, op);
            for (Attr a : attrs) {
                writeMessage(out, 5, a);
            }
            if (!domain.isEmpty()) {
                writeString(out, 7, domain);
            }
        }
    }

    /** A ValueInfoProto with a tensor type; dims are Longs or Strings (symbolic), or null for no shape. */
    static final class ValueMsg implements Message {
        final String name;
        final ElemType type;
        final Object[] dims;

        ValueMsg(String name, ElemType type, Object[] dims) {
            this.name = name;
            this.type = type;
            this.dims = dims;
        }

        private long dimSize(Object d) {
            if (d instanceof String) {
                return stringField(2, (String) d);
            }
            return varintField(1, ((Number) d).longValue());
        }

        private long shapeSize() {
            long n = 0;
            for (Object d : dims) {
                n += bytesField(1, dimSize(d));
            }
            return n;
        }

        private long tensorTypeSize() {
            long n = type == null ? 0 : varintField(1, type.code);
            if (dims != null) {
                n += bytesField(2, shapeSize());
            }
            return n;
        }

        @Override
        public long size() {
            return stringField(1, name) + bytesField(2, bytesField(1, tensorTypeSize()));
        }

        @Override
        public void writeTo(CodedOutputStream out) throws IOException {
            writeString(out, 1, name);
            out.writeTag(2, 2);
            out.writeUInt64NoTag(bytesField(1, tensorTypeSize()));
            out.writeTag(1, 2);
            out.writeUInt64NoTag(tensorTypeSize());
            if (type != null) {
                writeVarint(out, 1, type.code);
            }
            if (dims != null) {
                out.writeTag(2, 2);
                out.writeUInt64NoTag(shapeSize());
                for (Object d : dims) {
                    out.writeTag(1, 2);
                    out.writeUInt64NoTag(dimSize(d));
                    if (d instanceof String) {
                        writeString(out, 2, (String) d);
                    } else {
                        writeVarint(out, 1, ((Number) d).longValue());
                    }
                }
            }
        }
    }

    /** A GraphProto under construction. */
    public static final class Graph implements Message {
        final String name;
        final List<NodeMsg> nodes = new ArrayList<>();
        final List<ValueMsg> inputs = new ArrayList<>();
        final List<ValueMsg> outputs = new ArrayList<>();
        final List<Tensor> inits = new ArrayList<>();
        private int autoName;

        public Graph(String name) {
            this.name = name;
        }

        /** A graph input; each dim is a Long/Integer, or a String for a symbolic dim. */
        public Graph inputDims(String value, ElemType type, Object... dims) {
            inputs.add(new ValueMsg(value, type, dims));
            return this;
        }

        public Graph input(String value, ElemType type, long... dims) {
            Object[] o = new Object[dims.length];
            for (int i = 0; i < dims.length; i++) {
                o[i] = dims[i];
            }
            return inputDims(value, type, o);
        }

        /** A graph input with no declared shape. */
        public Graph inputNoShape(String value, ElemType type) {
            inputs.add(new ValueMsg(value, type, null));
            return this;
        }

        public Graph output(String value, ElemType type) {
            outputs.add(new ValueMsg(value, type, null));
            return this;
        }

        public Graph initializer(Tensor t) {
            inits.add(t);
            return this;
        }

        /** An initializer with dims and no payload bytes written (an empty raw_data would mismatch). */
        public Graph weight(String value, ElemType type, long... dims) {
            return initializer(new Tensor(value, type, dims).filled());
        }

        /** An int64 initializer with the given values (shapes, axes). */
        public Graph longs(String value, long... values) {
            return initializer(new Tensor(value, ElemType.INT64, values.length).longs(values));
        }

        public Graph node(String op, String nodeName, List<String> ins, List<String> outs, Attr... attrs) {
            nodes.add(new NodeMsg(op, nodeName, "", ins, outs, List.of(attrs)));
            return this;
        }

        /** A node with a generated name and one output. */
        public Graph node(String op, List<String> ins, String out, Attr... attrs) {
            return node(op, op.toLowerCase() + "_" + (autoName++), ins, List.of(out), attrs);
        }

        public Graph domainNode(String domain, String op, String nodeName, List<String> ins, List<String> outs) {
            nodes.add(new NodeMsg(op, nodeName, domain, ins, outs, List.of()));
            return this;
        }

        @Override
        public long size() {
            long n = 0;
            for (NodeMsg m : nodes) {
                n += messageField(1, m);
            }
            n += stringField(2, name);
            for (Tensor t : inits) {
                n += messageField(5, t);
            }
            for (ValueMsg v : inputs) {
                n += messageField(11, v);
            }
            for (ValueMsg v : outputs) {
                n += messageField(12, v);
            }
            return n;
        }

        @Override
        public void writeTo(CodedOutputStream out) throws IOException {
            for (NodeMsg m : nodes) {
                writeMessage(out, 1, m);
            }
            writeString(out, 2, name);
            for (Tensor t : inits) {
                writeMessage(out, 5, t);
            }
            for (ValueMsg v : inputs) {
                writeMessage(out, 11, v);
            }
            for (ValueMsg v : outputs) {
                writeMessage(out, 12, v);
            }
        }
    }

    /** A ModelProto: header, default-domain opset and the graph. */
    public static final class Model implements Message {
        final long opset;
        final Graph graph;
        long irVersion = 8;
        String producer = "erg-writer";

        public Model(long opset, Graph graph) {
            this.opset = opset;
            this.graph = graph;
        }

        public Model irVersion(long v) {
            this.irVersion = v;
            return this;
        }

        final List<Map.Entry<String, Long>> extraOpsets = new ArrayList<>();

        /** One more opset_import entry (a second domain, or the same one again for hostile-input tests). */
        public Model opsetImport(String domain, long version) {
            extraOpsets.add(Map.entry(domain, version));
            return this;
        }

        private static long opsetSize(String domain, long version) {
            return stringField(1, domain) + varintField(2, version);
        }

        @Override
        public long size() {
            long n = varintField(1, irVersion) + stringField(2, producer) + stringField(3, "0.1")
                    + messageField(7, graph) + bytesField(8, opsetSize("", opset));
            for (Map.Entry<String, Long> e : extraOpsets) {
                n += bytesField(8, opsetSize(e.getKey(), e.getValue()));
            }
            return n;
        }

        @Override
        public void writeTo(CodedOutputStream out) throws IOException {
            writeVarint(out, 1, irVersion);
            writeString(out, 2, producer);
            writeString(out, 3, "0.1");
            writeMessage(out, 7, graph);
            out.writeTag(8, 2);
            out.writeUInt64NoTag(stringField(1, "") + varintField(2, opset));
            writeString(out, 1, "");
            writeVarint(out, 2, opset);
            for (Map.Entry<String, Long> e : extraOpsets) {
                out.writeTag(8, 2);
                out.writeUInt64NoTag(opsetSize(e.getKey(), e.getValue()));
                writeString(out, 1, e.getKey());
                writeVarint(out, 2, e.getValue());
            }
        }

        public void write(Path file) {
            try (OutputStream os = new BufferedOutputStream(Files.newOutputStream(file), 1 << 16)) {
                CodedOutputStream out = CodedOutputStream.newInstance(os, 1 << 16);
                writeTo(out);
                out.flush();
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }

        public byte[] toBytes() {
            ByteArrayOutputStream bos = new ByteArrayOutputStream();
            try {
                CodedOutputStream out = CodedOutputStream.newInstance(bos);
                writeTo(out);
                out.flush();
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
            return bos.toByteArray();
        }
    }
}
