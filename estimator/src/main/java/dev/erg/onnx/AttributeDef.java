package dev.erg.onnx;

import java.util.List;

/** An AttributeProto as read. Only the field that matches {@link #kind()} is meaningful. */
public final class AttributeDef {
    /** AttributeProto.AttributeType, by the standard's codes. */
    public enum Kind {
        UNDEFINED, FLOAT, INT, STRING, TENSOR, GRAPH, FLOATS, INTS, STRINGS, TENSORS, GRAPHS,
        SPARSE_TENSOR, SPARSE_TENSORS, TYPE_PROTO, TYPE_PROTOS;

        public static Kind ofCode(long code) {
            return code >= 0 && code < values().length ? values()[(int) code] : null;
        }
    }

    private final String name;
    private final Kind kind;
    private final float f;
    private final long i;
    private final String s;
    private final TensorDef t;
    private final GraphDef g;
    private final float[] floats;
    private final long[] ints;
    private final List<String> strings;
    private final List<TensorDef> tensors;
    private final List<GraphDef> graphs;

    public AttributeDef(String name, Kind kind, float f, long i, String s, TensorDef t, GraphDef g,
                        float[] floats, long[] ints, List<String> strings, List<TensorDef> tensors,
                        List<GraphDef> graphs) {
        this.name = name;
        this.kind = kind;
        this.f = f;
        this.i = i;
        this.s = s;
        this.t = t;
        this.g = g;
        this.floats = floats;
        this.ints = ints;
        this.strings = List.copyOf(strings);
        this.tensors = List.copyOf(tensors);
        this.graphs = List.copyOf(graphs);
    }

    public String name() {
        return name;
    }

    public Kind kind() {
        return kind;
    }

    public float f() {
        return f;
    }

    public long i() {
        return i;
    }

    public String s() {
        return s;
    }

    public TensorDef t() {
        return t;
    }

    public GraphDef g() {
        return g;
    }

    public float[] floats() {
        return floats.clone();
    }

    public long[] ints() {
        return ints.clone();
    }

    public List<String> strings() {
        return strings;
    }

    public List<TensorDef> tensors() {
        return tensors;
    }

    public List<GraphDef> graphs() {
        return graphs;
    }
}
