package dev.erg.onnx;

import java.util.List;

/** A GraphProto as read: nodes in file order, graph inputs and outputs, initializers, value_info. */
public final class GraphDef {
    private final String name;
    private final List<NodeDef> nodes;
    private final List<ValueDef> inputs;
    private final List<ValueDef> outputs;
    private final List<TensorDef> initializers;
    private final List<ValueDef> valueInfo;

    public GraphDef(String name, List<NodeDef> nodes, List<ValueDef> inputs, List<ValueDef> outputs,
                    List<TensorDef> initializers, List<ValueDef> valueInfo) {
        this.name = name;
        this.nodes = List.copyOf(nodes);
        this.inputs = List.copyOf(inputs);
        this.outputs = List.copyOf(outputs);
        this.initializers = List.copyOf(initializers);
        this.valueInfo = List.copyOf(valueInfo);
    }

    public String name() {
        return name;
    }

    public List<NodeDef> nodes() {
        return nodes;
    }

    public List<ValueDef> inputs() {
        return inputs;
    }

    public List<ValueDef> outputs() {
        return outputs;
    }

    public List<TensorDef> initializers() {
        return initializers;
    }

    public List<ValueDef> valueInfo() {
        return valueInfo;
    }
}
