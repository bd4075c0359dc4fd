package dev.erg.graph;

import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.NodeDef;
import java.util.List;

/** A node of the analysed graph, linked to its input and output values, at its topological position. */
public final class Node {
    private final NodeDef def;
    private final int fileIndex;
    private int index;
    private final List<Value> inputs;
    private final List<Value> outputs;
    private final long opset;
    private final List<Value> implicitInputs;
    private boolean folded;
    private Status status = Status.PENDING;
    private String note;
    private String warning;
    private List<Graph> subgraphs = List.of();
    private long repeat = 1;

    /** What shape inference made of a node. */
    public enum Status {
        /** Not yet visited. */
        PENDING,
        /** Shapes and types of every output are known. */
        SHAPED,
        /** No rule exists for this operator (or its domain): it is reported, never priced silently. */
        UNMODELLED,
        /** The operator has a rule, but an input's shape is unknown because of an unmodelled node upstream. */
        UNRESOLVED
    }

    Node(NodeDef def, int fileIndex, List<Value> inputs, List<Value> outputs, long opset, List<Value> implicitInputs) {
        this.def = def;
        this.fileIndex = fileIndex;
        this.inputs = inputs;
        this.outputs = outputs;
        this.opset = opset;
        this.implicitInputs = implicitInputs;
    }

    public NodeDef def() {
        return def;
    }

    public String opType() {
        return def.opType();
    }

    public String domain() {
        return def.domain();
    }

    /** The node's name, or when the file gives none, its first output's name. */
    public String name() {
        if (!def.name().isEmpty()) {
            return def.name();
        }
        return def.outputs().isEmpty() ? def.opType() + "#" + fileIndex : def.outputs().get(0);
    }

    /** "'name' (OpType)", for messages. */
    public String label() {
        return "'" + name() + "' (" + def.opType() + ")";
    }

    /** Position in the topological order. */
    public int index() {
        return index;
    }

    void setIndex(int index) {
        this.index = index;
    }

    /** Position in the file. */
    public int fileIndex() {
        return fileIndex;
    }

    /** Inputs by position; an omitted optional input is null. */
    public List<Value> inputs() {
        return inputs;
    }

    public int inputCount() {
        return inputs.size();
    }

    /** The input at {@code i}, or null when absent or omitted. */
    public Value input(int i) {
        return i < inputs.size() ? inputs.get(i) : null;
    }

    public List<Value> outputs() {
        return outputs;
    }

    public Value output(int i) {
        return i < outputs.size() ? outputs.get(i) : null;
    }

    /** Outer-scope values that this node's subgraphs read. */
    public List<Value> implicitInputs() {
        return implicitInputs;
    }

    /** The opset version of this node's domain that the model imports. */
    public long opset() {
        return opset;
    }

    /** True when every output is constant: the node is worked out at analysis time, not on the device. */
    public boolean isFolded() {
        return folded;
    }

    public void setFolded(boolean folded) {
        this.folded = folded;
    }

    public Status status() {
        return status;
    }

    public void setStatus(Status status) {
        this.status = status;
    }

    /** An assumption or remark that inference made for this node (e.g. a data-dependent bound), or null. */
    public String note() {
        return note;
    }

    public void setNote(String note) {
        this.note = note;
    }

    /**
     * A note that every front end shows beside the totals, not only in the per-node detail: an
     * assumption that can change the result a lot (a dropped If branch), or null.
     */
    public String warning() {
        return warning;
    }

    public void setWarning(String warning) {
        this.warning = warning;
    }

    /** Analysed subgraphs whose nodes run as part of this node (a taken If branch, a Loop body). */
    public List<Graph> subgraphs() {
        return subgraphs;
    }

    /** How many times the subgraphs run per execution of this node (a Loop's trip count). */
    public long repeat() {
        return repeat;
    }

    public void setSubgraphs(List<Graph> subgraphs, long repeat) {
        this.subgraphs = List.copyOf(subgraphs);
        this.repeat = repeat;
    }

    public AttributeDef attr(String name) {
        return def.attribute(name);
    }

    public boolean hasAttr(String name) {
        return def.attribute(name) != null;
    }

    public long attrInt(String name, long dflt) {
        AttributeDef a = def.attribute(name);
        return a == null ? dflt : a.i();
    }

    public float attrFloat(String name, float dflt) {
        AttributeDef a = def.attribute(name);
        return a == null ? dflt : a.f();
    }

    public String attrString(String name, String dflt) {
        AttributeDef a = def.attribute(name);
        return a == null || a.s() == null ? dflt : a.s();
    }

    /** The ints of an INTS attribute, or null when absent. */
    public long[] attrInts(String name) {
        AttributeDef a = def.attribute(name);
        return a == null ? null : a.ints();
    }

    public float[] attrFloats(String name) {
        AttributeDef a = def.attribute(name);
        return a == null ? null : a.floats();
    }

    @Override
    public String toString() {
        return label();
    }
}
