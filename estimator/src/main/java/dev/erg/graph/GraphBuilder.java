package dev.erg.graph;

import dev.erg.BadInputException;
import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.GraphDef;
import dev.erg.onnx.NodeDef;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.ValueDef;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.PriorityQueue;
import java.util.Set;
import java.util.TreeMap;

/**
 * Links a read graph into values and nodes, checks that every input has a source, orders the nodes
 * topologically and gives the runtime inputs their shapes (symbolic dims bound by the caller).
 */
public final class GraphBuilder {
    private final String file;
    private final Map<String, Long> opsets;
    private final Map<String, Long> dimBindings;
    private final Map<String, Long> used = new TreeMap<>();

    private GraphBuilder(String file, Map<String, Long> opsets, Map<String, Long> dimBindings) {
        this.file = file;
        this.opsets = opsets;
        this.dimBindings = dimBindings;
    }

    /** Builds the main graph of {@code model}; {@code dims} binds symbolic dim names to values. */
    public static Graph build(OnnxModel model, Map<String, Long> dims) {
        GraphBuilder b = new GraphBuilder(model.file().toString(), model.opsets(), dims);
        return b.build(model, model.graph(), Map.of());
    }

    /**
     * Builds a subgraph (an If branch, a Loop or Scan body) that may read values of the enclosing
     * scope. Its formal inputs get no shape here: the caller sets them.
     */
    public static Graph buildSubgraph(OnnxModel model, GraphDef sub, Map<String, Value> outerScope) {
        GraphBuilder b = new GraphBuilder(model.file().toString(), model.opsets(), Map.of());
        return b.build(model, sub, outerScope);
    }

    private BadInputException bad(String what) {
        return new BadInputException(file + ": " + what);
    }

    private Graph build(OnnxModel model, GraphDef g, Map<String, Value> outer) {
        boolean isMain = outer.isEmpty() && g == model.graph();
        Map<String, Value> values = new LinkedHashMap<>();
        List<TensorDef> inits = g.initializers();
        for (TensorDef t : inits) {
            Value v = new Value(t.name());
            v.setStored(t);
            v.setType(t.type(), t.dims());
            v.setData(t.values());
            if (values.put(t.name(), v) != null) {
                throw bad("initializer '" + t.name() + "' is defined twice");
            }
        }
        List<Value> inputs = new ArrayList<>();
        for (ValueDef in : g.inputs()) {
            if (values.containsKey(in.name())) {
                continue; // an initializer listed as an input too: the stored value wins
            }
            Value v = new Value(in.name());
            v.markGraphInput();
            if (isMain) {
                v.setType(in.type(), inputDims(in));
                if (in.type() == null) {
                    throw bad("graph input '" + in.name() + "' declares no tensor element type");
                }
            }
            values.put(in.name(), v);
            inputs.add(v);
        }
        // Outputs of nodes.
        List<NodeDef> defs = g.nodes();
        Map<String, Integer> producerOf = new HashMap<>();
        for (int i = 0; i < defs.size(); i++) {
            NodeDef d = defs.get(i);
            for (String out : d.outputs()) {
                if (out.isEmpty()) {
                    continue;
                }
                if (values.containsKey(out) || producerOf.containsKey(out)) {
                    throw bad("value '" + out + "' is produced twice (again by node " + label(d, i) + ")");
                }
                producerOf.put(out, i);
                values.put(out, new Value(out));
            }
        }
        // Link inputs; collect dependencies.
        List<Node> nodes = new ArrayList<>(defs.size());
        int[] indegree = new int[defs.size()];
        List<List<Integer>> dependents = new ArrayList<>(defs.size());
        for (int i = 0; i < defs.size(); i++) {
            dependents.add(new ArrayList<>(2));
        }
        for (int i = 0; i < defs.size(); i++) {
            NodeDef d = defs.get(i);
            List<Value> ins = new ArrayList<>(d.inputs().size());
            Set<Integer> deps = new HashSet<>();
            for (String name : d.inputs()) {
                if (name.isEmpty()) {
                    ins.add(null);
                    continue;
                }
                Value v = values.get(name);
                if (v == null) {
                    v = outer.get(name);
                }
                if (v == null) {
                    throw bad("node " + label(d, i) + " reads '" + name
                            + "', which no node, graph input or initializer provides");
                }
                ins.add(v);
                Integer p = producerOf.get(name);
                if (p != null) {
                    deps.add(p);
                }
            }
            List<Value> implicit = new ArrayList<>();
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
                Value v = values.get(name);
                if (v == null) {
                    v = outer.get(name);
                }
                if (v == null) {
                    throw bad("a subgraph of node " + label(d, i) + " reads '" + name
                            + "', which nothing in scope provides");
                }
                implicit.add(v);
                Integer p = producerOf.get(name);
                if (p != null) {
                    deps.add(p);
                }
            }
            deps.remove(i);
            for (String name : d.inputs()) {
                Integer p = producerOf.get(name);
                if (p != null && p == i) {
                    throw bad("graph has a cycle: node " + label(d, i) + " reads its own output '" + name + "'");
                }
            }
            indegree[i] = deps.size();
            for (int p : deps) {
                dependents.get(p).add(i);
            }
            List<Value> outs = new ArrayList<>(d.outputs().size());
            for (String out : d.outputs()) {
                outs.add(out.isEmpty() ? null : values.get(out));
            }
            Long opset = opsets.get(d.domain());
            Node n = new Node(d, i, ins, outs, opset == null ? 0 : opset, implicit);
            nodes.add(n);
        }
        // Kahn's algorithm, smallest file index first: file order whenever it is already valid.
        PriorityQueue<Integer> ready = new PriorityQueue<>();
        for (int i = 0; i < indegree.length; i++) {
            if (indegree[i] == 0) {
                ready.add(i);
            }
        }
        List<Node> order = new ArrayList<>(nodes.size());
        while (!ready.isEmpty()) {
            int i = ready.poll();
            Node n = nodes.get(i);
            n.setIndex(order.size());
            order.add(n);
            for (int j : dependents.get(i)) {
                if (--indegree[j] == 0) {
                    ready.add(j);
                }
            }
        }
        if (order.size() < nodes.size()) {
            throw bad("graph has a cycle through node " + nodeOnCycle(nodes, indegree, producerOf));
        }
        for (Node n : order) {
            for (Value v : n.inputs()) {
                if (v != null) {
                    v.consumers().add(n);
                }
            }
            for (Value v : n.implicitInputs()) {
                v.consumers().add(n);
            }
            for (Value v : n.outputs()) {
                if (v != null) {
                    v.setProducer(n);
                }
            }
        }
        List<Value> outputs = new ArrayList<>();
        for (ValueDef o : g.outputs()) {
            Value v = values.get(o.name());
            if (v == null) {
                v = outer.get(o.name());
            }
            if (v == null) {
                throw bad("graph output '" + o.name() + "' is produced by no node, input or initializer");
            }
            v.markGraphOutput();
            outputs.add(v);
        }
        return new Graph(model, order, values, inputs, outputs, inits, used, outer);
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

    private static String nodeOnCycle(List<Node> nodes, int[] indegree, Map<String, Integer> producerOf) {
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
            for (String in : nodes.get(cur).def().inputs()) {
                Integer p = producerOf.get(in);
                if (p != null && indegree[p] > 0) {
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

    private long[] inputDims(ValueDef in) {
        if (in.dims() == null) {
            throw bad("graph input '" + in.name() + "' declares no shape; erg needs the input shape");
        }
        long[] dims = new long[in.dims().size()];
        for (int k = 0; k < dims.length; k++) {
            ValueDef.Dim d = in.dims().get(k);
            if (d.isFixed()) {
                dims[k] = d.value();
            } else if (d.param() != null) {
                Long bound = dimBindings.get(d.param());
                if (bound == null) {
                    throw bad("graph input '" + in.name() + "' has the symbolic dim '" + d.param()
                            + "' (axis " + k + ") with no value; bind it with --dim " + d.param() + "=N");
                }
                if (bound < 0) {
                    throw bad("symbolic dim '" + d.param() + "' is bound to the negative value " + bound);
                }
                dims[k] = bound;
                used.put(d.param(), bound);
            } else {
                throw bad("graph input '" + in.name() + "' has axis " + k + " with neither a value nor a name");
            }
        }
        long n = 1;
        for (long d : dims) {
            try {
                n = Math.multiplyExact(n, d);
            } catch (ArithmeticException e) {
                throw bad("graph input '" + in.name() + "' has dims whose product overflows 64 bits");
            }
        }
        return dims;
    }
}
