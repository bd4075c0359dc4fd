package dev.erg.onnx;

import java.util.List;
import java.util.Map;

/**
 * A NodeProto as read. An input named by the empty string is an omitted optional input and stays
 * in the list as "" so that positions keep their meaning.
 */
public final class NodeDef {
    private final String name;
    private final String opType;
    private final String domain;
    private final List<String> inputs;
    private final List<String> outputs;
    private final Map<String, AttributeDef> attributes;
    private final boolean hasSubgraphs;

    public NodeDef(String name, String opType, String domain, List<String> inputs, List<String> outputs,
                   Map<String, AttributeDef> attributes) {
        this.name = name;
        this.opType = opType;
        this.domain = domain;
        this.inputs = List.copyOf(inputs);
        this.outputs = List.copyOf(outputs);
        this.attributes = Map.copyOf(attributes);
        boolean sub = false;
        for (AttributeDef a : this.attributes.values()) {
            sub |= a.g() != null || !a.graphs().isEmpty();
        }
        this.hasSubgraphs = sub;
    }

    /** True when some attribute holds a graph (If, Loop, Scan): worked out once, when the node is read. */
    public boolean hasSubgraphs() {
        return hasSubgraphs;
    }

    public String name() {
        return name;
    }

    public String opType() {
        return opType;
    }

    /** The operator domain; the default ONNX domain is the empty string. */
    public String domain() {
        return domain;
    }

    public List<String> inputs() {
        return inputs;
    }

    public List<String> outputs() {
        return outputs;
    }

    public Map<String, AttributeDef> attributes() {
        return attributes;
    }

    public AttributeDef attribute(String attrName) {
        return attributes.get(attrName);
    }
}
