package dev.erg.graph;

import dev.erg.error.BadInputException;
import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.GraphDef;
import dev.erg.onnx.NodeDef;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.ValueDef;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.PriorityQueue;
import java.util.Set;

/**
 * Links a read graph into values and nodes, checks that every input has a source, orders the nodes
 * topologically and gives the runtime inputs their shapes (symbolic dims bound by the caller).
 */
public final class GraphBuilder {
    private final String file;
    private final Map<String, Long> opsets;
    private final InputBindings bindings;
    private final InputShapes shapes;
    private OnnxModel model;

    private GraphBuilder(String file, Map<String, Long> opsets, InputBindings bindings) {
        this.file = file;
        this.opsets = opsets;
        this.bindings = bindings;
        this.shapes = new InputShapes(file, bindings);
    }

    /** Builds the main graph of {@code model}; {@code dims} binds symbolic dim names to values. */
    public static Graph build(OnnxModel model, Map<String, Long> dims) {
        return build(model, InputBindings.ofDims(dims));
    }

    /**
     * Builds the main graph of {@code model} with the user's {@code bindings}: symbolic dims, whole
     * input shapes and constant input values. A shape or value for a name that is no graph input, or
     * a value that does not fit its input's declared type and shape, is a {@link BadInputException}.
     */
    public static Graph build(OnnxModel model, InputBindings bindings) {
        GraphBuilder b = new GraphBuilder(model.file().toString(), model.opsets(), bindings);
        return b.build(model, model.graph(), Map.of());
    }

    /**
     * Builds a subgraph (an If branch, a Loop or Scan body) that may read values of the enclosing
     * scope. Its formal inputs get no shape here: the caller sets them.
     */
    public static Graph buildSubgraph(OnnxModel model, GraphDef sub, Map<String, Value> outerScope) {
        GraphBuilder b = new GraphBuilder(model.file().toString(), model.opsets(), InputBindings.NONE);
        return b.build(model, sub, outerScope);
    }

    /** The opset the rules use for a domain: the imported one, capped at the newest erg knows. */
    private long opsetOf(String domain) {
        if (model != null) {
            return model.assumedOpset(domain);
        }
        Long opset = opsets.get(domain);
        return opset == null ? 0 : opset;
    }

    private BadInputException bad(String what) {
        return new BadInputException(file + ": " + what);
    }

    private Graph build(OnnxModel model, GraphDef g, Map<String, Value> outer) {
        this.model = model;
        boolean isMain = outer.isEmpty() && g == model.graph();
        if (isMain) {
            shapes.checkNamed(g);
        }
        Map<String, Value> values = new LinkedHashMap<>(
                (int) ((g.initializers().size() + g.inputs().size() + 2L * g.nodes().size()) / 0.75f) + 16);
        List<TensorDef> inits = g.initializers();
        for (TensorDef t : inits) {
            addInitializer(values, t);
        }
        List<Value> inputs = new ArrayList<>();
        for (ValueDef in : g.inputs()) {
            if (values.containsKey(in.name())) {
                continue; // an initializer listed as an input too: the stored value wins
            }
            Value v = new Value(in.name());
            v.markGraphInput();
            if (isMain) {
                if (in.type() == null) {
                    throw bad("graph input '" + in.name() + "' declares no tensor element type");
                }
                InputValues.bind(file, in, v, shapes.dims(in), bindings);
            }
            values.put(in.name(), v);
            inputs.add(v);
        }
        // Outputs of nodes. Each value remembers the file index of its producer while the graph is built.
        List<NodeDef> defs = g.nodes();
        int count = defs.size();
        for (int i = 0; i < count; i++) {
            addOutputs(values, defs.get(i), i);
        }
        // Link inputs; collect dependencies (deduplicated with a stamp per producer). The per-node work is
        // a method of its own, so that the JIT compiles it once rather than the whole loop on the stack.
        Linker link = new Linker(values, outer, count);
        List<Node> nodes = new ArrayList<>(count);
        for (int i = 0; i < count; i++) {
            nodes.add(link.node(defs.get(i), i));
        }
        int[][] depsOf = link.depsOf;
        boolean fileOrder = link.fileOrder;
        List<Node> order;
        if (fileOrder) {
            // Every node reads only what earlier nodes made: the file order is a topological order.
            order = nodes;
            for (int i = 0; i < count; i++) {
                nodes.get(i).setIndex(i);
            }
        } else {
            order = kahn(nodes, depsOf);
        }
        // Outputs are checked before anything is linked into the enclosing scopes' values, so that a
        // subgraph that fails to build leaves them as they were.
        List<Value> outputs = new ArrayList<>();
        for (ValueDef o : g.outputs()) {
            Value v = values.get(o.name());
            if (v == null) {
                v = outer.get(o.name());
            }
            if (v == null) {
                throw bad("graph output '" + o.name() + "' is produced by no node, input or initializer");
            }
            outputs.add(v);
        }
        for (int i = 0; i < order.size(); i++) {
            connect(order.get(i));
        }
        for (Value v : outputs) {
            v.markGraphOutput();
        }
        for (Value v : inputs) {
            if (v.type() == dev.erg.onnx.ElemType.UNDEFINED) {
                throw bad("graph input '" + v.name() + "'" + (v.consumers().isEmpty() ? ""
                        : " (read by node " + v.consumers().get(0).label() + ")")
                        + " declares the undefined element type (code 0); every tensor needs a defined type");
            }
        }
        InputBindings inEffect = isMain ? new InputBindings(shapes.used(), bindings.shapes(), bindings.values()) : InputBindings.NONE;
        return new Graph(model, order, values, inputs, outputs, inits, inEffect, outer);
    }

    // The loops over every node call small methods, so that the JIT compiles those rather than the
    // whole of build() on the stack.

    private void addInitializer(Map<String, Value> values, TensorDef t) {
        Value v = new Value(t.name());
        v.setStored(t);
        v.setType(t.type(), t.dims());
        v.setData(t.values());
        if (values.put(t.name(), v) != null) {
            throw bad("initializer '" + t.name() + "' is defined twice");
        }
    }

    /** Makes the values node {@code i} produces; each remembers its producer's file index. */
    private void addOutputs(Map<String, Value> values, NodeDef d, int i) {
        List<String> outs = d.outputs();
        for (int k = 0; k < outs.size(); k++) {
            String out = outs.get(k);
            if (out.isEmpty()) {
                continue;
            }
            Value v = new Value(out);
            v.fileProducer = i;
            if (values.putIfAbsent(out, v) != null) {
                throw bad("value '" + out + "' is produced twice (again by node " + label(d, i) + ")");
            }
        }
    }

    /** Links {@code n} to the values it reads (as a consumer, in topological order) and makes. */
    private static void connect(Node n) {
        List<Value> ins = n.inputs();
        for (int k = 0; k < ins.size(); k++) {
            Value v = ins.get(k);
            if (v != null) {
                v.consumers().add(n);
            }
        }
        for (Value v : n.implicitInputs()) {
            v.consumers().add(n);
        }
        List<Value> outs = n.outputs();
        for (int k = 0; k < outs.size(); k++) {
            Value v = outs.get(k);
            if (v != null) {
                v.setProducer(n);
            }
        }
    }

    /** Links one node at a time: its input values, the values its subgraphs read, its dependencies. */
    private final class Linker {
        final Map<String, Value> values;
        final Map<String, Value> outer;
        final int[][] depsOf;
        final int[] stamp;
        int[] buf = new int[16];
        int nd;
        boolean fileOrder = true;

        Linker(Map<String, Value> values, Map<String, Value> outer, int count) {
            this.values = values;
            this.outer = outer;
            this.depsOf = new int[count][];
            this.stamp = new int[count];
            java.util.Arrays.fill(stamp, -1);
        }

        /** The value named {@code name} in scope, recording a dependency of node {@code i} on its producer. */
        Value read(String name, int i, NodeDef d, boolean implicit) {
            Value v = values.get(name);
            int p = v == null ? -1 : v.fileProducer;
            if (v == null) {
                v = outer.get(name);
            }
            if (v == null) {
                throw bad(implicit
                        ? "a subgraph of node " + label(d, i) + " reads '" + name + "', which nothing in scope provides"
                        : "node " + label(d, i) + " reads '" + name + "', which no node, graph input or initializer provides");
            }
            if (p == i) {
                if (implicit) {
                    return v;
                }
                throw bad("graph has a cycle: node " + label(d, i) + " reads its own output '" + name + "'");
            }
            if (p >= 0 && stamp[p] != i) {
                stamp[p] = i;
                if (nd == buf.length) {
                    buf = java.util.Arrays.copyOf(buf, 2 * nd);
                }
                buf[nd++] = p;
                fileOrder &= p < i;
            }
            return v;
        }

        Node node(NodeDef d, int i) {
            nd = 0;
            Value[] ins = new Value[d.inputs().size()];
            for (int k = 0; k < ins.length; k++) {
                String name = d.inputs().get(k);
                ins[k] = name.isEmpty() ? null : read(name, i, d, false);
            }
            List<Value> implicit = List.of();
            if (d.hasSubgraphs()) {
                implicit = new ArrayList<>();
                Set<String> free = new java.util.LinkedHashSet<>();
                for (AttributeDef a : d.attributes().values()) {
                    if (a.g() != null) {
                        freeNames(a.g(), free);
                    }
                    for (GraphDef sg : a.graphs()) {
                        freeNames(sg, free);
                    }
                }
                for (String name : free) {
                    implicit.add(read(name, i, d, true));
                }
            }
            depsOf[i] = nd == 0 ? NO_DEPS : java.util.Arrays.copyOf(buf, nd);
            Value[] outs = new Value[d.outputs().size()];
            for (int k = 0; k < outs.length; k++) {
                String out = d.outputs().get(k);
                outs[k] = out.isEmpty() ? null : values.get(out);
            }
            return new Node(d, i, compact(ins), compact(outs), opsetOf(d.domain()), implicit);
        }
    }

    private static final int[] NO_DEPS = new int[0];

    /** A small fixed list: one or two values without an array behind them when none is omitted (null). */
    private static List<Value> compact(Value[] a) {
        for (Value v : a) {
            if (v == null) {
                return java.util.Collections.unmodifiableList(java.util.Arrays.asList(a));
            }
        }
        return List.of(a);
    }

    /** Kahn's algorithm, smallest file index first: file order wherever it is already valid. */
    private List<Node> kahn(List<Node> nodes, int[][] depsOf) {
        int count = nodes.size();
        int[] indegree = new int[count];
        int[] dependentCount = new int[count];
        for (int i = 0; i < count; i++) {
            indegree[i] = depsOf[i].length;
            for (int p : depsOf[i]) {
                dependentCount[p]++;
            }
        }
        int[][] dependents = new int[count][];
        for (int i = 0; i < count; i++) {
            dependents[i] = new int[dependentCount[i]];
            dependentCount[i] = 0;
        }
        for (int i = 0; i < count; i++) {
            for (int p : depsOf[i]) {
                dependents[p][dependentCount[p]++] = i;
            }
        }
        PriorityQueue<Integer> ready = new PriorityQueue<>();
        for (int i = 0; i < count; i++) {
            if (indegree[i] == 0) {
                ready.add(i);
            }
        }
        List<Node> order = new ArrayList<>(count);
        while (!ready.isEmpty()) {
            int i = ready.poll();
            Node n = nodes.get(i);
            n.setIndex(order.size());
            order.add(n);
            for (int j : dependents[i]) {
                if (--indegree[j] == 0) {
                    ready.add(j);
                }
            }
        }
        if (order.size() < count) {
            throw bad("graph has a cycle through node " + nodeOnCycle(nodes, indegree, depsOf));
        }
        return order;
    }

    /** Names a subgraph reads from its enclosing scopes. */
    private static void freeNames(GraphDef g, Set<String> out) {
        Set<String> defined = new HashSet<>();
        for (TensorDef t : g.initializers()) {
            defined.add(t.name());
        }
        for (ValueDef v : g.inputs()) {
            defined.add(v.name());
        }
        for (NodeDef n : g.nodes()) {
            defined.addAll(n.outputs());
        }
        for (NodeDef n : g.nodes()) {
            for (String in : n.inputs()) {
                if (!in.isEmpty() && !defined.contains(in)) {
                    out.add(in);
                }
            }
            for (AttributeDef a : n.attributes().values()) {
                Set<String> inner = new java.util.LinkedHashSet<>();
                if (a.g() != null) {
                    freeNames(a.g(), inner);
                }
                for (GraphDef sg : a.graphs()) {
                    freeNames(sg, inner);
                }
                for (String s : inner) {
                    if (!defined.contains(s)) {
                        out.add(s);
                    }
                }
            }
        }
        for (ValueDef v : g.outputs()) {
            if (!defined.contains(v.name())) {
                out.add(v.name());
            }
        }
    }

    private static String nodeOnCycle(List<Node> nodes, int[] indegree, int[][] depsOf) {
        int start = -1;
        for (int i = 0; i < indegree.length; i++) {
            if (indegree[i] > 0) {
                start = i;
                break;
            }
        }
        // Walk back along producers that are still waiting; the walk must revisit a node on a cycle.
        Set<Integer> seen = new HashSet<>();
        int cur = start;
        while (seen.add(cur)) {
            int next = -1;
            for (int p : depsOf[cur]) {
                if (indegree[p] > 0) {
                    next = p;
                    break;
                }
            }
            if (next < 0) {
                break;
            }
            cur = next;
        }
        return nodes.get(cur).label();
    }

    private static String label(NodeDef d, int i) {
        String name = !d.name().isEmpty() ? d.name() : d.outputs().isEmpty() ? d.opType() + "#" + i : d.outputs().get(0);
        return "'" + name + "' (" + d.opType() + ")";
    }
}
