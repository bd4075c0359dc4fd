package dev.erg.graph;

import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.TensorDef;
import java.util.Collections;
import java.util.List;
import java.util.Map;

/** The analysed graph: values linked to their producer and consumers, nodes in topological order. */
public final class Graph {
    private final OnnxModel model;
    private final List<Node> nodes;
    private final Map<String, Value> values;
    private final List<Value> inputs;
    private final List<Value> outputs;
    private final List<TensorDef> initializers;
    private final InputBindings bindings;
    private final Map<String, Value> outerScope;

    Graph(OnnxModel model, List<Node> nodes, Map<String, Value> values, List<Value> inputs, List<Value> outputs,
          List<TensorDef> initializers, InputBindings bindings, Map<String, Value> outerScope) {
        this.outerScope = outerScope;
        this.model = model;
        this.nodes = Collections.unmodifiableList(nodes);
        this.values = Collections.unmodifiableMap(values);
        this.inputs = Collections.unmodifiableList(inputs);
        this.outputs = Collections.unmodifiableList(outputs);
        this.initializers = List.copyOf(initializers);
        this.bindings = bindings;
    }

    public OnnxModel model() {
        return model;
    }

    /** Nodes in topological order (file order wherever the file order is already valid). */
    public List<Node> nodes() {
        return nodes;
    }

    public Value value(String name) {
        return values.get(name);
    }

    public Map<String, Value> values() {
        return values;
    }

    /** Runtime inputs (graph inputs that are not initializers). */
    public List<Value> inputs() {
        return inputs;
    }

    public List<Value> outputs() {
        return outputs;
    }

    public List<TensorDef> initializers() {
        return initializers;
    }

    /**
     * The values a subgraph (an If branch, a Loop or Scan body) can read from its enclosing scopes;
     * empty for the main graph.
     */
    public Map<String, Value> outerScope() {
        return Collections.unmodifiableMap(outerScope);
    }

    /** The symbolic dims bound by the user that this graph uses. */
    public Map<String, Long> boundDims() {
        return bindings.dims();
    }

    /**
     * The bindings in effect for this analysis: the symbolic dims that some input used, and every
     * bound input shape and value. Empty for a subgraph.
     */
    public InputBindings bindings() {
        return bindings;
    }

    /** A short name for messages: the model file's name. */
    public String fileLabel() {
        return model == null ? "graph" : model.file().toString();
    }
}
