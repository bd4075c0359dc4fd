package dev.erg.onnx;

import com.google.protobuf.CodedInputStream;
import com.google.protobuf.WireFormat;
import dev.erg.error.BadInputException;
import dev.erg.error.InputFiles;
import java.io.FileInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads an ONNX file (a serialized ModelProto) straight off the protobuf wire format, field number
 * by field number as the ONNX standard defines them. The file is streamed: a weight payload is
 * skipped with a seek, never copied, so the cost of reading does not grow with the weight bytes.
 * External data is never opened; its location is only checked to stay inside the model's folder.
 *
 * <p>Every defect ends in a {@link BadInputException} whose one-line message names the file and the
 * part of the model at fault.
 */
public final class OnnxReader {
    /** Payloads up to this many bytes are kept: shape constants, axes, scales. Larger ones are skipped. */
    public static final int KEEP_PAYLOAD_BYTES = 4096;
    /**
     * The most nodes a model may hold, its subgraphs' nodes included. Analysis keeps about a kilobyte
     * per node, so this bounds the heap a model can take (docs/limitations.md); a larger graph is
     * refused as soon as the reader passes the limit.
     */
    public static final int MAX_NODES = 500_000;
    /** The largest model file: a protobuf message is at most 2^31 - 1 bytes (2 GiB less one byte). */
    public static final long MAX_MODEL_BYTES = Integer.MAX_VALUE;
    private static final int MAX_GRAPH_DEPTH = 64;
    private static final int BUFFER = 64 * 1024;

    private final Path file;
    private final Path folder;
    private final String label;
    private final long fileSize;
    private CodedInputStream in;
    private int graphDepth;
    private int nodeCount;
    private Where where = new Where(null, "model", -1);

    private static final float[] NO_FLOATS = new float[0];
    private static final long[] NO_LONGS = new long[0];

    /** Where the reader is, for messages: built into text only when a message needs it. */
    private static final class Where {
        final Where parent;
        final String text;
        final int index;

        Where(Where parent, String text, int index) {
            this.parent = parent;
            this.text = text;
            this.index = index;
        }

        @Override
        public String toString() {
            String p = parent == null ? "" : parent.toString();
            return index < 0 ? p + text : p + text + index;
        }
    }

    private OnnxReader(Path file, long fileSize) {
        this.file = file;
        Path abs = file.toAbsolutePath().normalize();
        this.folder = abs.getParent();
        this.label = file.toString();
        this.fileSize = fileSize;
    }

    /** Reads the model in {@code file}. */
    public static OnnxModel read(Path file) {
        InputFiles.requireRegular(file, file.toString(), "model file");
        long size;
        try {
            size = Files.size(file);
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read the model file (" + e.getMessage() + ")");
        }
        if (size == 0) {
            throw new BadInputException(file + ": the file is empty, not an ONNX model");
        }
        if (size > MAX_MODEL_BYTES) {
            throw new BadInputException(file + ": the file is " + size
                    + " bytes; a protobuf ModelProto holds at most " + MAX_MODEL_BYTES + " bytes (large weights belong in external data)");
        }
        OnnxReader r = new OnnxReader(file, size);
        try (InputStream s = new FileInputStream(file.toFile())) {
            r.in = CodedInputStream.newInstance(s, BUFFER);
            r.in.setSizeLimit(Integer.MAX_VALUE);
            r.in.pushLimit((int) size);
            return r.readModel();
        } catch (IOException e) {
            throw r.bad("the file is not a valid protobuf message (" + oneLine(e.getMessage()) + ")");
        } catch (RuntimeException e) {
            if (e instanceof BadInputException) {
                throw e;
            }
            throw r.bad("cannot decode the file (" + e.getClass().getSimpleName() + ": " + oneLine(e.getMessage()) + ")");
        }
    }

    private static String oneLine(String s) {
        if (s == null) {
            return "no detail";
        }
        int nl = s.indexOf('\n');
        return nl < 0 ? s : s.substring(0, nl);
    }

    private BadInputException bad(String what) {
        long pos = in == null ? 0 : in.getTotalBytesRead();
        return new BadInputException(label + ": " + what + " [in " + where + ", byte " + pos + "]");
    }

    private BadInputException badHere(String what) {
        return new BadInputException(label + ": " + what);
    }

    // ---- wire helpers -------------------------------------------------------------------

    private int field(int tag) {
        return WireFormat.getTagFieldNumber(tag);
    }

    private int wire(int tag) {
        return WireFormat.getTagWireType(tag);
    }

    private void expect(int tag, int wireType, String fieldName) {
        if (wire(tag) != wireType) {
            throw bad("field " + field(tag) + " (" + fieldName + ") has wire type " + wire(tag) + ", expected "
                    + wireType + ": not an ONNX model, or a corrupt one");
        }
    }

    /** Reads a length prefix and checks that it stays inside the enclosing message and the file. */
    private int length(String what) throws IOException {
        long len = in.readRawVarint64();
        long left = in.getBytesUntilLimit();
        if (left < 0) {
            // No limit pushed, or one ending exactly at 2^31 - 1, which the stream reports as "no limit" (-1).
            left = fileSize - in.getTotalBytesRead();
        }
        if (len < 0 || len > left) {
            long pos = in.getTotalBytesRead();
            if (len < 0 || pos + len > fileSize) {
                throw bad("the length field of " + what + " says " + Long.toUnsignedString(len)
                        + " bytes, past the end of the file (" + fileSize + " bytes)");
            }
            throw bad("the length field of " + what + " says " + len + " bytes, more than the "
                    + left + " bytes left in the enclosing message");
        }
        return (int) len;
    }

    private int enter(String what) throws IOException {
        int len = length(what);
        return in.pushLimit(len);
    }

    private void leave(int old) {
        in.popLimit(old);
    }

    private void skip(int tag) throws IOException {
        switch (wire(tag)) {
            case WireFormat.WIRETYPE_VARINT:
                in.readRawVarint64();
                break;
            case WireFormat.WIRETYPE_FIXED64:
                in.readRawLittleEndian64();
                break;
            case WireFormat.WIRETYPE_FIXED32:
                in.readRawLittleEndian32();
                break;
            case WireFormat.WIRETYPE_LENGTH_DELIMITED:
                in.skipRawBytes(length("field " + field(tag)));
                break;
            default:
                throw bad("field " + field(tag) + " has wire type " + wire(tag)
                        + ", which ONNX never uses: not an ONNX model, or a corrupt one");
        }
    }

    private String string(int tag, String fieldName) throws IOException {
        expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, fieldName);
        int len = length(fieldName);
        return new String(in.readRawBytes(len), java.nio.charset.StandardCharsets.UTF_8);
    }

    private long varint(int tag, String fieldName) throws IOException {
        expect(tag, WireFormat.WIRETYPE_VARINT, fieldName);
        return in.readRawVarint64();
    }

    /** A repeated int64 field, packed or not, appended to {@code out}. */
    private void int64s(int tag, String fieldName, LongList out) throws IOException {
        if (wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
            int old = enter(fieldName);
            while (!in.isAtEnd()) {
                out.add(in.readRawVarint64());
            }
            leave(old);
        } else {
            out.add(varint(tag, fieldName));
        }
    }

    // ---- messages --------------------------------------------------------------------------

    private OnnxModel readModel() throws IOException {
        long ir = 0;
        String producer = "";
        String producerVersion = "";
        Map<String, Long> opsets = new LinkedHashMap<>();
        GraphDef graph = null;
        boolean sawHeader = false;
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            switch (field(tag)) {
                case 1:
                    ir = varint(tag, "ir_version");
                    sawHeader = true;
                    break;
                case 2:
                    producer = string(tag, "producer_name");
                    break;
                case 3:
                    producerVersion = string(tag, "producer_version");
                    break;
                case 7:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "graph");
                    if (graph != null) {
                        throw bad("the model holds two graphs");
                    }
                    int old = enter("graph");
                    where = new Where(null, "graph", -1);
                    graph = readGraph();
                    where = new Where(null, "model", -1);
                    leave(old);
                    break;
                case 8:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "opset_import");
                    readOpset(opsets);
                    sawHeader = true;
                    break;
                case 4: case 6:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, field(tag) == 4 ? "domain" : "doc_string");
                    skip(tag);
                    break;
                case 5:
                    varint(tag, "model_version");
                    break;
                default:
                    skip(tag);
            }
        }
        if (graph == null || !sawHeader) {
            throw badHere("not an ONNX model (or a truncated one): the file holds no "
                    + (graph == null ? "graph" : "ir_version or opset_import")
                    + " (ModelProto fields 7, 1 and 8)");
        }
        if (opsets.isEmpty()) {
            opsets.put("", 1L);
        }
        return new OnnxModel(file, ir, producer, producerVersion, opsets, graph, warnings);
    }

    private void readOpset(Map<String, Long> opsets) throws IOException {
        int old = enter("opset_import");
        String domain = "";
        long version = 0;
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            if (field(tag) == 1) {
                domain = string(tag, "opset_import.domain");
            } else if (field(tag) == 2) {
                version = varint(tag, "opset_import.version");
            } else {
                skip(tag);
            }
        }
        leave(old);
        if (domain.equals("ai.onnx")) {
            domain = "";
        }
        String shown = domain.isEmpty() ? "the default domain (ai.onnx)" : "domain '" + domain + "'";
        if (opsets.containsKey(domain)) {
            throw bad("the model imports " + shown + " twice (opsets " + opsets.get(domain) + " and " + version
                    + "); each domain is imported once");
        }
        boolean standard = domain.isEmpty() || domain.equals("ai.onnx.ml");
        if (version < 1 && standard || version < 0) {
            throw bad("the model imports " + shown + " at opset " + version + "; opset versions start at 1");
        }
        long newest = domain.isEmpty() ? OnnxModel.NEWEST_DEFAULT_OPSET
                : domain.equals("ai.onnx.ml") ? OnnxModel.NEWEST_ML_OPSET : Long.MAX_VALUE;
        if (version > newest) {
            warnings.add(label + ": the model imports " + shown + " at opset " + version + ", newer than the newest erg"
                    + " knows (" + newest + "); erg reads its operators by the opset " + newest + " definitions");
        }
        opsets.put(domain, version);
    }

    private final List<String> warnings = new ArrayList<>();

    private GraphDef readGraph() throws IOException {
        if (++graphDepth > MAX_GRAPH_DEPTH) {
            throw bad("subgraphs are nested more than " + MAX_GRAPH_DEPTH + " deep");
        }
        String name = "";
        List<NodeDef> nodes = new ArrayList<>();
        List<ValueDef> inputs = new ArrayList<>();
        List<ValueDef> outputs = new ArrayList<>();
        List<TensorDef> inits = new ArrayList<>();
        List<ValueDef> info = new ArrayList<>();
        Where outer = where;
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            int old;
            switch (field(tag)) {
                case 1:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "node");
                    if (++nodeCount > MAX_NODES) {
                        throw bad("the model has more than " + MAX_NODES + " nodes, erg's limit on the node count"
                                + " (its subgraphs' nodes included)");
                    }
                    old = enter("node");
                    where = new Where(outer, " node #", nodes.size());
                    nodes.add(readNode());
                    where = outer;
                    leave(old);
                    break;
                case 2:
                    name = string(tag, "graph name");
                    break;
                case 5:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "initializer");
                    old = enter("initializer");
                    where = new Where(outer, " initializer #", inits.size());
                    inits.add(readTensor("initializer"));
                    where = outer;
                    leave(old);
                    break;
                case 15:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "sparse_initializer");
                    old = enter("sparse_initializer");
                    where = new Where(outer, " sparse initializer #", inits.size());
                    inits.add(readSparseTensor());
                    where = outer;
                    leave(old);
                    break;
                case 11: case 12: case 13:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "value info");
                    old = enter("value info");
                    ValueDef v = readValueInfo();
                    leave(old);
                    (field(tag) == 11 ? inputs : field(tag) == 12 ? outputs : info).add(v);
                    break;
                default:
                    skip(tag);
            }
        }
        graphDepth--;
        return new GraphDef(name, nodes, inputs, outputs, inits, info);
    }

    private NodeDef readNode() throws IOException {
        String name = "";
        String op = "";
        String domain = "";
        List<String> inputs = new ArrayList<>();
        List<String> outputs = new ArrayList<>();
        List<AttributeDef> pending = new ArrayList<>(4);
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            switch (field(tag)) {
                case 1:
                    inputs.add(intern(string(tag, "node input")));
                    break;
                case 2:
                    outputs.add(intern(string(tag, "node output")));
                    break;
                case 3:
                    name = string(tag, "node name");
                    break;
                case 4:
                    op = string(tag, "op_type");
                    break;
                case 7:
                    domain = string(tag, "node domain");
                    break;
                case 5:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute");
                    int old = enter("attribute");
                    pending.add(readAttribute());
                    leave(old);
                    break;
                default:
                    skip(tag);
            }
        }
        if (domain.equals("ai.onnx")) {
            domain = "";
        }
        String label = name.isEmpty() ? (outputs.isEmpty() ? op : outputs.get(0)) : name;
        if (op.isEmpty()) {
            throw bad("node '" + label + "' has no op_type");
        }
        // Few attributes per node: duplicates by a pairwise check, then one immutable map.
        @SuppressWarnings("unchecked")
        Map.Entry<String, AttributeDef>[] entries = new Map.Entry[pending.size()];
        for (int k = 0; k < entries.length; k++) {
            AttributeDef a = pending.get(k);
            for (int j = 0; j < k; j++) {
                if (entries[j].getKey().equals(a.name())) {
                    throw bad("node '" + label + "' (" + op + ") has attribute '" + a.name() + "' twice");
                }
            }
            entries[k] = Map.entry(a.name(), a);
        }
        return new NodeDef(name, intern(op), intern(domain), inputs, outputs, Map.ofEntries(entries));
    }

    private AttributeDef readAttribute() throws IOException {
        String name = "";
        long type = -1;
        float f = 0;
        long i = 0;
        String s = null;
        TensorDef t = null;
        GraphDef g = null;
        // Most attributes hold one int, float or string: the lists are made only when a field needs them.
        FloatList floats = null;
        LongList ints = null;
        List<String> strings = List.of();
        List<TensorDef> tensors = List.of();
        List<GraphDef> graphs = List.of();
        boolean refAttr = false;
        AttributeDef.Kind seen = AttributeDef.Kind.UNDEFINED;
        Where outer = where;
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            int old;
            switch (field(tag)) {
                case 1:
                    name = string(tag, "attribute name");
                    break;
                case 20:
                    type = varint(tag, "attribute type");
                    break;
                case 21:
                    string(tag, "ref_attr_name");
                    refAttr = true;
                    break;
                case 2:
                    expect(tag, WireFormat.WIRETYPE_FIXED32, "attribute f");
                    f = in.readFloat();
                    seen = AttributeDef.Kind.FLOAT;
                    break;
                case 3:
                    i = varint(tag, "attribute i");
                    seen = AttributeDef.Kind.INT;
                    break;
                case 4:
                    s = string(tag, "attribute s");
                    seen = AttributeDef.Kind.STRING;
                    break;
                case 5:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute t");
                    old = enter("attribute t");
                    t = readTensor("attribute '" + name + "'");
                    leave(old);
                    seen = AttributeDef.Kind.TENSOR;
                    break;
                case 6:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute g");
                    old = enter("attribute g");
                    where = new Where(outer, " subgraph '" + name + "'", -1);
                    g = readGraph();
                    where = outer;
                    leave(old);
                    seen = AttributeDef.Kind.GRAPH;
                    break;
                case 7:
                    if (floats == null) {
                        floats = new FloatList();
                    }
                    if (wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
                        old = enter("attribute floats");
                        while (!in.isAtEnd()) {
                            floats.add(in.readFloat());
                        }
                        leave(old);
                    } else {
                        expect(tag, WireFormat.WIRETYPE_FIXED32, "attribute floats");
                        floats.add(in.readFloat());
                    }
                    seen = AttributeDef.Kind.FLOATS;
                    break;
                case 8:
                    if (ints == null) {
                        ints = new LongList();
                    }
                    int64s(tag, "attribute ints", ints);
                    seen = AttributeDef.Kind.INTS;
                    break;
                case 9:
                    if (strings.isEmpty()) {
                        strings = new ArrayList<>();
                    }
                    strings.add(string(tag, "attribute strings"));
                    seen = AttributeDef.Kind.STRINGS;
                    break;
                case 10:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute tensors");
                    old = enter("attribute tensors");
                    if (tensors.isEmpty()) {
                        tensors = new ArrayList<>();
                    }
                    tensors.add(readTensor("attribute '" + name + "'"));
                    leave(old);
                    seen = AttributeDef.Kind.TENSORS;
                    break;
                case 11:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute graphs");
                    old = enter("attribute graphs");
                    where = new Where(outer, " subgraph '" + name + "'", -1);
                    if (graphs.isEmpty()) {
                        graphs = new ArrayList<>();
                    }
                    graphs.add(readGraph());
                    where = outer;
                    leave(old);
                    seen = AttributeDef.Kind.GRAPHS;
                    break;
                case 22:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute sparse_tensor");
                    old = enter("attribute sparse_tensor");
                    t = readSparseTensor();
                    leave(old);
                    seen = AttributeDef.Kind.SPARSE_TENSOR;
                    break;
                default:
                    skip(tag);
            }
        }
        if (name.isEmpty()) {
            throw bad("an attribute has no name");
        }
        AttributeDef.Kind kind = type >= 0 ? AttributeDef.Kind.ofCode(type) : seen;
        if (kind == null) {
            throw bad("attribute '" + name + "' has type code " + type + ", which the standard does not define");
        }
        if (refAttr && kind == AttributeDef.Kind.UNDEFINED) {
            kind = AttributeDef.Kind.UNDEFINED;
        }
        return new AttributeDef(name, kind, f, i, s, t, g, floats == null ? NO_FLOATS : floats.toArray(),
                ints == null ? NO_LONGS : ints.toArray(), strings, tensors, graphs);
    }

    private ValueDef readValueInfo() throws IOException {
        String name = "";
        ElemType type = null;
        List<ValueDef.Dim> dims = null;
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            if (field(tag) == 1) {
                name = string(tag, "value name");
            } else if (field(tag) == 2) {
                expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "value type");
                int old = enter("value type");
                while (!in.isAtEnd()) {
                    int t2 = in.readTag();
                    if (field(t2) == 1) { // tensor_type
                        expect(t2, WireFormat.WIRETYPE_LENGTH_DELIMITED, "tensor_type");
                        int old2 = enter("tensor_type");
                        while (!in.isAtEnd()) {
                            int t3 = in.readTag();
                            if (field(t3) == 1) {
                                long code = varint(t3, "elem_type");
                                type = ElemType.ofCode(code);
                                if (type == null) {
                                    throw bad("value '" + name + "' has element type code " + code
                                            + ", which the standard does not define");
                                }
                            } else if (field(t3) == 2) {
                                expect(t3, WireFormat.WIRETYPE_LENGTH_DELIMITED, "shape");
                                int old3 = enter("shape");
                                dims = new ArrayList<>();
                                while (!in.isAtEnd()) {
                                    int t4 = in.readTag();
                                    if (field(t4) == 1) {
                                        expect(t4, WireFormat.WIRETYPE_LENGTH_DELIMITED, "dim");
                                        int old4 = enter("dim");
                                        ValueDef.Dim d = ValueDef.Dim.unknown();
                                        while (!in.isAtEnd()) {
                                            int t5 = in.readTag();
                                            if (field(t5) == 1) {
                                                long v = varint(t5, "dim_value");
                                                if (v < 0) {
                                                    throw bad("value '" + name + "' declares a negative dim " + v);
                                                }
                                                d = ValueDef.Dim.fixed(v);
                                            } else if (field(t5) == 2) {
                                                String p = string(t5, "dim_param");
                                                d = p.isEmpty() ? ValueDef.Dim.unknown() : ValueDef.Dim.symbolic(p);
                                            } else {
                                                skip(t5);
                                            }
                                        }
                                        leave(old4);
                                        dims.add(d);
                                    } else {
                                        skip(t4);
                                    }
                                }
                                leave(old3);
                            } else {
                                skip(t3);
                            }
                        }
                        leave(old2);
                    } else {
                        skip(t2);
                    }
                }
                leave(old);
            } else {
                skip(tag);
            }
        }
        return new ValueDef(name, type, dims);
    }

    private TensorDef readSparseTensor() throws IOException {
        TensorDef values = null;
        TensorDef indices = null;
        LongList dims = new LongList();
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            int old;
            switch (field(tag)) {
                case 1:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "sparse values");
                    old = enter("sparse values");
                    values = readTensor("sparse initializer");
                    leave(old);
                    break;
                case 2:
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "sparse indices");
                    old = enter("sparse indices");
                    indices = readTensor("sparse initializer");
                    leave(old);
                    break;
                case 3:
                    int64s(tag, "sparse dims", dims);
                    break;
                default:
                    skip(tag);
            }
        }
        if (values == null) {
            throw bad("a sparse tensor has no values");
        }
        long[] d = dims.toArray();
        long elements = elementCount("sparse initializer '" + values.name() + "'", d);
        // Stored size: the non-zero values plus their indices; the dense view is what the graph sees.
        String loc = values.externalLocation() != null ? values.externalLocation()
                : indices != null ? indices.externalLocation() : null;
        return new TensorDef(values.name(), values.type(), d, elements, null, loc);
    }

    private long elementCount(String what, long[] dims) {
        long n = 1;
        for (long d : dims) {
            if (d < 0) {
                throw bad(what + " has a negative dim " + d);
            }
            try {
                n = Math.multiplyExact(n, d);
            } catch (ArithmeticException e) {
                throw bad(what + " has dims whose product overflows 64 bits");
            }
        }
        return n;
    }

    private TensorDef readTensor(String role) throws IOException {
        LongList dims = new LongList();
        long typeCode = 0;
        String name = "";
        byte[] raw = null;
        long rawLength = -1;
        LongList intData = null;
        DoubleList realData = null;
        long packedCount = 0;
        int packedWidth = 0; // bytes per element of a skipped packed field, 0 when unknown
        long dataLocation = 0;
        Map<String, String> external = new LinkedHashMap<>();
        boolean hasStrings = false;
        while (!in.isAtEnd()) {
            int tag = in.readTag();
            int f = field(tag);
            switch (f) {
                case 1:
                    int64s(tag, "dims", dims);
                    break;
                case 2:
                    typeCode = varint(tag, "data_type");
                    break;
                case 8:
                    name = string(tag, "tensor name");
                    break;
                case 9: {
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "raw_data");
                    int len = length("raw_data of tensor '" + name + "'");
                    rawLength = len;
                    if (len <= KEEP_PAYLOAD_BYTES) {
                        raw = in.readRawBytes(len);
                    } else {
                        in.skipRawBytes(len);
                    }
                    break;
                }
                case 4: case 10: { // float_data (fixed32), double_data (fixed64)
                    int width = f == 4 ? 4 : 8;
                    if (realData == null) {
                        realData = new DoubleList();
                    }
                    if (wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
                        int len = length("packed data of tensor '" + name + "'");
                        if (len % width != 0) {
                            throw bad("tensor '" + name + "' has packed data of " + len + " bytes, not a multiple of " + width);
                        }
                        if (len <= KEEP_PAYLOAD_BYTES && realData != null) {
                            int old = in.pushLimit(len);
                            while (!in.isAtEnd()) {
                                realData.add(width == 4 ? in.readFloat() : in.readDouble());
                            }
                            in.popLimit(old);
                        } else {
                            in.skipRawBytes(len);
                            realData = null;
                            packedWidth = width;
                        }
                        packedCount += len / width;
                    } else {
                        expect(tag, width == 4 ? WireFormat.WIRETYPE_FIXED32 : WireFormat.WIRETYPE_FIXED64,
                                f == 4 ? "float_data" : "double_data");
                        double v = width == 4 ? in.readFloat() : in.readDouble();
                        if (realData != null && realData.size() * width < KEEP_PAYLOAD_BYTES) {
                            realData.add(v);
                        } else {
                            realData = null;
                        }
                        packedCount++;
                    }
                    break;
                }
                case 5: case 7: case 11: { // int32_data, int64_data, uint64_data (varints)
                    if (intData == null) {
                        intData = new LongList();
                    }
                    if (wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
                        int len = length("packed data of tensor '" + name + "'");
                        if (len <= KEEP_PAYLOAD_BYTES && intData != null) {
                            int old = in.pushLimit(len);
                            while (!in.isAtEnd()) {
                                intData.add(in.readRawVarint64());
                                packedCount++;
                            }
                            in.popLimit(old);
                        } else {
                            // Varints have no fixed width: count them without keeping them.
                            int old = in.pushLimit(len);
                            if (len > KEEP_PAYLOAD_BYTES) {
                                in.skipRawBytes(len);
                                packedCount = -1;
                            }
                            in.popLimit(old);
                            intData = null;
                        }
                    } else {
                        long v = varint(tag, "integer data");
                        if (intData != null && intData.size() < KEEP_PAYLOAD_BYTES / 8) {
                            intData.add(v);
                        } else {
                            intData = null;
                        }
                        if (packedCount >= 0) {
                            packedCount++;
                        }
                    }
                    break;
                }
                case 6:
                    hasStrings = true;
                    skip(tag);
                    break;
                case 13: {
                    expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "external_data");
                    int old = enter("external_data");
                    String k = "";
                    String v = "";
                    while (!in.isAtEnd()) {
                        int t2 = in.readTag();
                        if (field(t2) == 1) {
                            k = string(t2, "external_data key");
                        } else if (field(t2) == 2) {
                            v = string(t2, "external_data value");
                        } else {
                            skip(t2);
                        }
                    }
                    leave(old);
                    external.put(k, v);
                    break;
                }
                case 14:
                    dataLocation = varint(tag, "data_location");
                    break;
                default:
                    skip(tag);
            }
        }
        String what = role + " '" + name + "'";
        ElemType type = ElemType.ofCode(typeCode);
        if (type == null || type == ElemType.UNDEFINED) {
            throw bad(what + " has element type code " + typeCode + ", which the standard does not define");
        }
        long[] d = dims.toArray();
        long elements = elementCount(what, d);
        long expectedBytes;
        try {
            expectedBytes = type.bytes(elements);
        } catch (ArithmeticException e) {
            throw bad(what + " has dims whose byte size overflows 64 bits");
        }
        String location = null;
        if (dataLocation == 1 || !external.isEmpty()) {
            location = checkExternal(what, external, expectedBytes, type);
        } else if (rawLength >= 0 && type.bits > 0 && rawLength != expectedBytes) {
            throw bad(what + " has " + rawLength + " bytes of raw_data but its dims " + java.util.Arrays.toString(d)
                    + " of " + type.label + " need " + expectedBytes);
        } else if (rawLength < 0 && packedCount > 0 && packedCount != elements && !hasStrings
                && !(type.bits < 8)) {
            throw bad(what + " holds " + packedCount + " values but its dims " + java.util.Arrays.toString(d)
                    + " need " + elements);
        }
        TensorValues values = null;
        if (location == null) {
            if (raw != null) {
                values = decodeRaw(type, d, raw);
            } else if (realData != null && realData.size() == elements && elements > 0) {
                values = TensorValues.ofDoubles(type, d, realData.toArray());
            } else if (intData != null && intData.size() == elements && elements > 0) {
                values = decodeInts(type, d, intData.toArray());
            } else if (elements == 0 && type != ElemType.STRING) {
                values = TensorValues.ofLongs(type, d, new long[0]);
            }
        }
        return new TensorDef(name, type, d, elements, values, location);
    }

    private String checkExternal(String what, Map<String, String> external, long expectedBytes, ElemType type) {
        String loc = external.get("location");
        if (loc == null || loc.isEmpty()) {
            throw bad(what + " says its data is external but gives no location");
        }
        if (loc.indexOf('\0') >= 0) {
            throw bad(what + " has an external data location with a NUL character");
        }
        String norm = loc.replace('\\', '/');
        if (norm.startsWith("/") || (norm.length() >= 2 && norm.charAt(1) == ':' && isAsciiLetter(norm.charAt(0))) || norm.startsWith("~")) {
            throw bad(what + " has external data at the absolute location '" + loc
                    + "'; external data must be a relative path inside the model's folder");
        }
        for (String part : norm.split("/")) {
            if (part.equals("..")) {
                throw bad(what + " has external data at '" + loc
                        + "', which climbs out of the model's folder; it must stay inside it");
            }
        }
        Path resolved = folder.resolve(norm).normalize();
        if (!resolved.startsWith(folder)) {
            throw bad(what + " has external data at '" + loc + "', outside the model's folder");
        }
        for (String key : new String[] {"offset", "length"}) {
            String v = external.get(key);
            if (v != null) {
                long n;
                try {
                    n = Long.parseLong(v.trim());
                } catch (NumberFormatException e) {
                    throw bad(what + " has external data " + key + " '" + v + "', not a whole number");
                }
                if (n < 0) {
                    throw bad(what + " has a negative external data " + key + " " + n);
                }
                if (key.equals("length") && type.bits >= 8 && n < expectedBytes) {
                    throw bad(what + " has external data of " + n + " bytes but its dims need " + expectedBytes);
                }
            }
        }
        return loc;
    }

    /** Operator types and domains repeat over the nodes: one String each. */
    private final Map<String, String> interned = new java.util.HashMap<>();

    private String intern(String s) {
        String prev = interned.putIfAbsent(s, s);
        return prev != null ? prev : s;
    }

    private static boolean isAsciiLetter(char ch) {
        return (ch >= 'A' && ch <= 'Z') || (ch >= 'a' && ch <= 'z');
    }

    private static TensorValues decodeRaw(ElemType type, long[] dims, byte[] raw) {
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        int n = type.bits >= 8 ? raw.length / (type.bits / 8) : 0;
        switch (type) {
            case FLOAT: {
                double[] v = new double[n];
                for (int i = 0; i < n; i++) {
                    v[i] = b.getFloat();
                }
                return TensorValues.ofDoubles(type, dims, v);
            }
            case DOUBLE: {
                double[] v = new double[n];
                for (int i = 0; i < n; i++) {
                    v[i] = b.getDouble();
                }
                return TensorValues.ofDoubles(type, dims, v);
            }
            case FLOAT16: case BFLOAT16: {
                double[] v = new double[n];
                for (int i = 0; i < n; i++) {
                    int bits = b.getShort() & 0xffff;
                    v[i] = type == ElemType.FLOAT16 ? halfToFloat(bits) : Float.intBitsToFloat(bits << 16);
                }
                return TensorValues.ofDoubles(type, dims, v);
            }
            case INT64: case UINT64: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    v[i] = b.getLong();
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            case INT32: case UINT32: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    int x = b.getInt();
                    v[i] = type == ElemType.INT32 ? x : Integer.toUnsignedLong(x);
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            case INT16: case UINT16: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    short x = b.getShort();
                    v[i] = type == ElemType.INT16 ? x : (x & 0xffff);
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            case INT8: case UINT8: case BOOL: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    byte x = b.get();
                    v[i] = type == ElemType.INT8 ? x : (x & 0xff);
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            default:
                return null;
        }
    }

    private static TensorValues decodeInts(ElemType type, long[] dims, long[] v) {
        switch (type) {
            case FLOAT16: case BFLOAT16: {
                double[] d = new double[v.length];
                for (int i = 0; i < v.length; i++) {
                    int bits = (int) (v[i] & 0xffff);
                    d[i] = type == ElemType.FLOAT16 ? halfToFloat(bits) : Float.intBitsToFloat(bits << 16);
                }
                return TensorValues.ofDoubles(type, dims, d);
            }
            case INT32: case INT16: case INT8:
                for (int i = 0; i < v.length; i++) {
                    v[i] = (int) v[i];
                }
                return TensorValues.ofLongs(type, dims, v);
            case INT64: case UINT64: case UINT32: case UINT16: case UINT8: case BOOL:
                return TensorValues.ofLongs(type, dims, v);
            default:
                return null;
        }
    }

    /** IEEE 754 half precision bits to a float. */
    static float halfToFloat(int h) {
        int sign = (h >>> 15) & 1;
        int exp = (h >>> 10) & 0x1f;
        int mant = h & 0x3ff;
        float v;
        if (exp == 0) {
            v = (float) (mant * Math.pow(2, -24));
        } else if (exp == 31) {
            v = mant == 0 ? Float.POSITIVE_INFINITY : Float.NaN;
        } else {
            v = (float) ((1 + mant / 1024.0) * Math.pow(2, exp - 15));
        }
        return sign == 1 ? -v : v;
    }

    /** A growable list of longs without boxing. */
    static final class LongList {
        private long[] a = new long[8];
        private int n;

        void add(long v) {
            if (n == a.length) {
                a = java.util.Arrays.copyOf(a, n * 2);
            }
            a[n++] = v;
        }

        int size() {
            return n;
        }

        long[] toArray() {
            return java.util.Arrays.copyOf(a, n);
        }
    }

    static final class DoubleList {
        private double[] a = new double[8];
        private int n;

        void add(double v) {
            if (n == a.length) {
                a = java.util.Arrays.copyOf(a, n * 2);
            }
            a[n++] = v;
        }

        int size() {
            return n;
        }

        double[] toArray() {
            return java.util.Arrays.copyOf(a, n);
        }
    }

    static final class FloatList {
        private float[] a = new float[8];
        private int n;

        void add(float v) {
            if (n == a.length) {
                a = java.util.Arrays.copyOf(a, n * 2);
            }
            a[n++] = v;
        }

        float[] toArray() {
            return java.util.Arrays.copyOf(a, n);
        }
    }
}
