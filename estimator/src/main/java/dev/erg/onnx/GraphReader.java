package dev.erg.onnx;

import static dev.erg.onnx.OnnxFields.*;

import com.google.protobuf.WireFormat;
import java.io.IOException;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/**
 * Reads GraphProto messages and what they hold: nodes, their attributes (subgraphs included, nested
 * up to {@link #MAX_GRAPH_DEPTH} deep), and the declared types and shapes of values.
 */
final class GraphReader {
    static final int MAX_GRAPH_DEPTH = 64;
    private static final float[] NO_FLOATS = new float[0];
    private static final long[] NO_LONGS = new long[0];

    private final WireInput w;
    private final TensorReader tensorReader;
    private int graphDepth;
    private int nodeCount;

    GraphReader(WireInput w, TensorReader tensors) {
        this.w = w;
        this.tensorReader = tensors;
    }

    GraphDef readGraph() throws IOException {
        if (++graphDepth > MAX_GRAPH_DEPTH) {
            throw w.bad("subgraphs are nested more than " + MAX_GRAPH_DEPTH + " deep");
        }
        String name = "";
        List<NodeDef> nodes = new ArrayList<>();
        List<ValueDef> inputs = new ArrayList<>();
        List<ValueDef> outputs = new ArrayList<>();
        List<TensorDef> inits = new ArrayList<>();
        List<ValueDef> info = new ArrayList<>();
        WireInput.Where outer = w.where;
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            int old;
            switch (w.field(tag)) {
                case GRAPH_NODE:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "node");
                    if (++nodeCount > OnnxReader.MAX_NODES) {
                        throw w.bad("the model has more than " + OnnxReader.MAX_NODES + " nodes, erg's limit on the node count"
                                + " (its subgraphs' nodes included)");
                    }
                    old = w.enter("node");
                    w.where = new WireInput.Where(outer, " node #", nodes.size());
                    nodes.add(readNode());
                    w.where = outer;
                    w.leave(old);
                    break;
                case GRAPH_NAME:
                    name = w.string(tag, "graph name");
                    break;
                case GRAPH_INITIALIZER:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "initializer");
                    old = w.enter("initializer");
                    w.where = new WireInput.Where(outer, " initializer #", inits.size());
                    inits.add(tensorReader.readTensor("initializer"));
                    w.where = outer;
                    w.leave(old);
                    break;
                case GRAPH_SPARSE_INITIALIZER:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "sparse_initializer");
                    old = w.enter("sparse_initializer");
                    w.where = new WireInput.Where(outer, " sparse initializer #", inits.size());
                    inits.add(tensorReader.readSparseTensor());
                    w.where = outer;
                    w.leave(old);
                    break;
                case GRAPH_INPUT: case GRAPH_OUTPUT: case GRAPH_VALUE_INFO:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "value info");
                    old = w.enter("value info");
                    ValueDef v = readValueInfo();
                    w.leave(old);
                    (w.field(tag) == GRAPH_INPUT ? inputs : w.field(tag) == GRAPH_OUTPUT ? outputs : info).add(v);
                    break;
                default:
                    w.skip(tag);
            }
        }
        graphDepth--;
        return new GraphDef(name, nodes, inputs, outputs, inits, info);
    }

    NodeDef readNode() throws IOException {
        String name = "";
        String op = "";
        String domain = "";
        List<String> inputs = new ArrayList<>();
        List<String> outputs = new ArrayList<>();
        List<AttributeDef> pending = new ArrayList<>(4);
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            switch (w.field(tag)) {
                case NODE_INPUT:
                    inputs.add(w.intern(w.string(tag, "node input")));
                    break;
                case NODE_OUTPUT:
                    outputs.add(w.intern(w.string(tag, "node output")));
                    break;
                case NODE_NAME:
                    name = w.string(tag, "node name");
                    break;
                case NODE_OP_TYPE:
                    op = w.string(tag, "op_type");
                    break;
                case NODE_DOMAIN:
                    domain = w.string(tag, "node domain");
                    break;
                case NODE_ATTRIBUTE:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute");
                    int old = w.enter("attribute");
                    pending.add(readAttribute());
                    w.leave(old);
                    break;
                default:
                    w.skip(tag);
            }
        }
        if (domain.equals("ai.onnx")) {
            domain = "";
        }
        String label = name.isEmpty() ? (outputs.isEmpty() ? op : outputs.get(0)) : name;
        if (op.isEmpty()) {
            throw w.bad("node '" + label + "' has no op_type");
        }
        // Few attributes per node: duplicates by a pairwise check, then one immutable map.
        @SuppressWarnings("unchecked")
        Map.Entry<String, AttributeDef>[] entries = new Map.Entry[pending.size()];
        for (int k = 0; k < entries.length; k++) {
            AttributeDef a = pending.get(k);
            for (int j = 0; j < k; j++) {
                if (entries[j].getKey().equals(a.name())) {
                    throw w.bad("node '" + label + "' (" + op + ") has attribute '" + a.name() + "' twice");
                }
            }
            entries[k] = Map.entry(a.name(), a);
        }
        return new NodeDef(name, w.intern(op), w.intern(domain), inputs, outputs, Map.ofEntries(entries));
    }

    AttributeDef readAttribute() throws IOException {
        String name = "";
        long type = -1;
        float f = 0;
        long i = 0;
        String s = null;
        TensorDef t = null;
        GraphDef g = null;
        // Most attributes hold one int, float or string: the lists are made only when a field needs them.
        PrimitiveLists.FloatList floats = null;
        PrimitiveLists.LongList ints = null;
        List<String> strings = List.of();
        List<TensorDef> tensors = List.of();
        List<GraphDef> graphs = List.of();
        boolean refAttr = false;
        AttributeDef.Kind seen = AttributeDef.Kind.UNDEFINED;
        WireInput.Where outer = w.where;
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            int old;
            switch (w.field(tag)) {
                case ATTR_NAME:
                    name = w.string(tag, "attribute name");
                    break;
                case ATTR_TYPE:
                    type = w.varint(tag, "attribute type");
                    break;
                case ATTR_REF_ATTR_NAME:
                    w.string(tag, "ref_attr_name");
                    refAttr = true;
                    break;
                case ATTR_F:
                    w.expect(tag, WireFormat.WIRETYPE_FIXED32, "attribute f");
                    f = w.in.readFloat();
                    seen = AttributeDef.Kind.FLOAT;
                    break;
                case ATTR_I:
                    i = w.varint(tag, "attribute i");
                    seen = AttributeDef.Kind.INT;
                    break;
                case ATTR_S:
                    s = w.string(tag, "attribute s");
                    seen = AttributeDef.Kind.STRING;
                    break;
                case ATTR_T:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute t");
                    old = w.enter("attribute t");
                    t = tensorReader.readTensor("attribute '" + name + "'");
                    w.leave(old);
                    seen = AttributeDef.Kind.TENSOR;
                    break;
                case ATTR_G:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute g");
                    old = w.enter("attribute g");
                    w.where = new WireInput.Where(outer, " subgraph '" + name + "'", -1);
                    g = readGraph();
                    w.where = outer;
                    w.leave(old);
                    seen = AttributeDef.Kind.GRAPH;
                    break;
                case ATTR_FLOATS:
                    if (floats == null) {
                        floats = new PrimitiveLists.FloatList();
                    }
                    if (w.wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
                        old = w.enter("attribute floats");
                        while (!w.in.isAtEnd()) {
                            floats.add(w.in.readFloat());
                        }
                        w.leave(old);
                    } else {
                        w.expect(tag, WireFormat.WIRETYPE_FIXED32, "attribute floats");
                        floats.add(w.in.readFloat());
                    }
                    seen = AttributeDef.Kind.FLOATS;
                    break;
                case ATTR_INTS:
                    if (ints == null) {
                        ints = new PrimitiveLists.LongList();
                    }
                    w.int64s(tag, "attribute ints", ints);
                    seen = AttributeDef.Kind.INTS;
                    break;
                case ATTR_STRINGS:
                    if (strings.isEmpty()) {
                        strings = new ArrayList<>();
                    }
                    strings.add(w.string(tag, "attribute strings"));
                    seen = AttributeDef.Kind.STRINGS;
                    break;
                case ATTR_TENSORS:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute tensors");
                    old = w.enter("attribute tensors");
                    if (tensors.isEmpty()) {
                        tensors = new ArrayList<>();
                    }
                    tensors.add(tensorReader.readTensor("attribute '" + name + "'"));
                    w.leave(old);
                    seen = AttributeDef.Kind.TENSORS;
                    break;
                case ATTR_GRAPHS:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute graphs");
                    old = w.enter("attribute graphs");
                    w.where = new WireInput.Where(outer, " subgraph '" + name + "'", -1);
                    if (graphs.isEmpty()) {
                        graphs = new ArrayList<>();
                    }
                    graphs.add(readGraph());
                    w.where = outer;
                    w.leave(old);
                    seen = AttributeDef.Kind.GRAPHS;
                    break;
                case ATTR_SPARSE_TENSOR:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "attribute sparse_tensor");
                    old = w.enter("attribute sparse_tensor");
                    t = tensorReader.readSparseTensor();
                    w.leave(old);
                    seen = AttributeDef.Kind.SPARSE_TENSOR;
                    break;
                default:
                    w.skip(tag);
            }
        }
        if (name.isEmpty()) {
            throw w.bad("an attribute has no name");
        }
        AttributeDef.Kind kind = type >= 0 ? AttributeDef.Kind.ofCode(type) : seen;
        if (kind == null) {
            throw w.bad("attribute '" + name + "' has type code " + type + ", which the standard does not define");
        }
        if (refAttr && kind == AttributeDef.Kind.UNDEFINED) {
            kind = AttributeDef.Kind.UNDEFINED;
        }
        return new AttributeDef(name, kind, f, i, s, t, g, floats == null ? NO_FLOATS : floats.toArray(),
                ints == null ? NO_LONGS : ints.toArray(), strings, tensors, graphs);
    }

    ValueDef readValueInfo() throws IOException {
        String name = "";
        ElemType type = null;
        List<ValueDef.Dim> dims = null;
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            if (w.field(tag) == VALUE_NAME) {
                name = w.string(tag, "value name");
            } else if (w.field(tag) == VALUE_TYPE) {
                w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "value type");
                int old = w.enter("value type");
                while (!w.in.isAtEnd()) {
                    int t2 = w.in.readTag();
                    if (w.field(t2) == TYPE_TENSOR_TYPE) { // tensor_type
                        w.expect(t2, WireFormat.WIRETYPE_LENGTH_DELIMITED, "tensor_type");
                        int old2 = w.enter("tensor_type");
                        while (!w.in.isAtEnd()) {
                            int t3 = w.in.readTag();
                            if (w.field(t3) == TENSOR_TYPE_ELEM_TYPE) {
                                long code = w.varint(t3, "elem_type");
                                type = ElemType.ofCode(code);
                                if (type == null) {
                                    throw w.bad("value '" + name + "' has element type code " + code
                                            + ", which the standard does not define");
                                }
                            } else if (w.field(t3) == TENSOR_TYPE_SHAPE) {
                                w.expect(t3, WireFormat.WIRETYPE_LENGTH_DELIMITED, "shape");
                                int old3 = w.enter("shape");
                                dims = new ArrayList<>();
                                while (!w.in.isAtEnd()) {
                                    int t4 = w.in.readTag();
                                    if (w.field(t4) == SHAPE_DIM) {
                                        w.expect(t4, WireFormat.WIRETYPE_LENGTH_DELIMITED, "dim");
                                        int old4 = w.enter("dim");
                                        ValueDef.Dim d = ValueDef.Dim.unknown();
                                        while (!w.in.isAtEnd()) {
                                            int t5 = w.in.readTag();
                                            if (w.field(t5) == DIM_VALUE) {
                                                long v = w.varint(t5, "dim_value");
                                                if (v < 0) {
                                                    throw w.bad("value '" + name + "' declares a negative dim " + v);
                                                }
                                                d = ValueDef.Dim.fixed(v);
                                            } else if (w.field(t5) == DIM_PARAM) {
                                                String p = w.string(t5, "dim_param");
                                                d = p.isEmpty() ? ValueDef.Dim.unknown() : ValueDef.Dim.symbolic(p);
                                            } else {
                                                w.skip(t5);
                                            }
                                        }
                                        w.leave(old4);
                                        dims.add(d);
                                    } else {
                                        w.skip(t4);
                                    }
                                }
                                w.leave(old3);
                            } else {
                                w.skip(t3);
                            }
                        }
                        w.leave(old2);
                    } else {
                        w.skip(t2);
                    }
                }
                w.leave(old);
            } else {
                w.skip(tag);
            }
        }
        return new ValueDef(name, type, dims);
    }
}
