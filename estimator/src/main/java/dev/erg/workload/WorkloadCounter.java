package dev.erg.workload;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorDef;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.IdentityHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;

/** Counts every node's work over a shaped graph, and the model's totals and peak activation memory. */
public final class WorkloadCounter {
    private final WorkloadRules rules;

    public WorkloadCounter(WorkloadRules rules) {
        this.rules = rules;
    }

    public static ModelWorkload count(Graph g) {
        return new WorkloadCounter(WorkloadRules.standard()).countGraph(g);
    }

    public ModelWorkload countGraph(Graph g) {
        List<NodeWork> works = new ArrayList<>(g.nodes().size());
        Map<String, Integer> unmodelled = new TreeMap<>();
        Map<String, Integer> unresolved = new TreeMap<>();
        long macs = 0;
        long vector = 0;
        Set<TensorDef> macWeightConstants = new LinkedHashSet<>();
        for (Node n : g.nodes()) {
            NodeWork w;
            try {
                w = countNode(n, unmodelled, unresolved);
            } catch (ArithmeticException e) {
                throw overflow(g, "node " + n.label() + " has a MAC, operation or byte count that overflows 64 bits");
            }
            works.add(w);
            try {
                macs = Math.addExact(macs, w.macs());
                vector = Math.addExact(vector, w.vectorOps());
            } catch (ArithmeticException e) {
                throw overflow(g, "the model's total MACs or vector ops overflow 64 bits at node " + n.label());
            }
            if (w.kind() == Kind.MAC) {
                macWeights(n, macWeightConstants);
            }
        }
        long weights = 0;
        long peak;
        try {
            Set<TensorDef> counted = java.util.Collections.newSetFromMap(new IdentityHashMap<>());
            for (TensorDef t : g.initializers()) {
                if (counted.add(t)) {
                    weights = Math.addExact(weights, t.bytes());
                }
            }
            for (TensorDef t : macWeightConstants) {
                if (counted.add(t)) {
                    weights = Math.addExact(weights, t.bytes());
                }
            }
            for (TensorDef t : subgraphInitializers(g)) {
                if (counted.add(t)) {
                    weights = Math.addExact(weights, t.bytes());
                }
            }
            peak = peakActivation(g);
        } catch (ArithmeticException e) {
            throw overflow(g, "the model's weight or activation bytes overflow 64 bits");
        }
        return new ModelWorkload(g, works, macs, vector, weights, peak, unmodelled, unresolved);
    }

    /** Adds the stored tensors behind the weights of MAC node {@code n} (its constant inputs that are no parameters). */
    private void macWeights(Node n, Set<TensorDef> out) {
        WorkloadRules.Entry e = rules.get(n.opType());
        if (e == null) {
            return;
        }
        for (int i = 1; i < n.inputCount(); i++) {
            Value v = n.input(i);
            if (v != null && v.isConstant() && !e.isParam(i)) {
                out.addAll(v.sources());
            }
        }
    }

    /** The initializers of every subgraph that runs as part of a node of {@code g}, nested ones too. */
    private static List<TensorDef> subgraphInitializers(Graph g) {
        List<TensorDef> out = new ArrayList<>();
        List<Node> nodes = g.nodes();
        for (int i = 0, n = nodes.size(); i < n; i++) {
            List<Graph> subs = nodes.get(i).subgraphs();
            for (int k = 0; k < subs.size(); k++) { // an index, not an iterator: most nodes have none
                Graph sub = subs.get(k);
                out.addAll(sub.initializers());
                out.addAll(subgraphInitializers(sub));
            }
        }
        return out;
    }

    private static BadInputException overflow(Graph g, String what) {
        return new BadInputException(g.fileLabel() + ": " + what);
    }

    private NodeWork countNode(Node n, Map<String, Integer> unmodelled, Map<String, Integer> unresolved) {
        NodeWork.Builder b;
        WorkloadRules.Entry e = rules.get(n.opType());
        if (n.status() == Node.Status.UNMODELLED || (e == null && n.status() == Node.Status.SHAPED)) {
            unmodelled.merge(n.domain().isEmpty() ? n.opType() : n.domain() + "." + n.opType(), 1, Integer::sum);
            b = new NodeWork.Builder(n, Kind.UNMODELLED);
        } else if (n.status() != Node.Status.SHAPED) {
            unresolved.merge(n.opType(), 1, Integer::sum);
            b = new NodeWork.Builder(n, Kind.UNRESOLVED);
        } else if (n.isFolded()) {
            b = new NodeWork.Builder(n, Kind.FOLDED);
        } else {
            b = new NodeWork.Builder(n, e.kind);
            e.rule.count(n, b);
            addSubgraphs(n, b, unmodelled, unresolved);
            bytes(n, b, e);
        }
        if (b.kind == Kind.UNMODELLED || b.kind == Kind.UNRESOLVED) {
            // What a subgraph could not model is listed with the rest, never hidden inside the node.
            for (Graph sub : n.subgraphs()) {
                ModelWorkload w = countGraph(sub);
                w.unmodelled().forEach((k, v) -> unmodelled.merge(k, v, Integer::sum));
                w.unresolved().forEach((k, v) -> unresolved.merge(k, v, Integer::sum));
            }
        }
        b.note = n.note();
        b.outputShapes = shapes(n);
        if (b.precision == null) {
            precision(n, b, e);
        }
        return new NodeWork(b);
    }

    /**
     * A taken If branch, a Loop or Scan body: its nodes' arithmetic, times the trip count, joins the
     * node's; what the subgraph could not model joins the model's lists.
     */
    private void addSubgraphs(Node n, NodeWork.Builder b, Map<String, Integer> unmodelled,
                              Map<String, Integer> unresolved) {
        for (Graph sub : n.subgraphs()) {
            ModelWorkload w = countGraph(sub);
            w.unmodelled().forEach((k, v) -> unmodelled.merge(k, v, Integer::sum));
            w.unresolved().forEach((k, v) -> unresolved.merge(k, v, Integer::sum));
            b.macs = Math.addExact(b.macs, Math.multiplyExact(w.macs(), n.repeat()));
            b.vectorOps = Math.addExact(b.vectorOps, Math.multiplyExact(w.vectorOps(), n.repeat()));
            if (w.macs() > 0 && b.kind != Kind.MAC) {
                b.kind = Kind.MAC;
                b.gemmGroups = 0;
            }
        }
    }

    private static List<long[]> shapes(Node n) {
        List<long[]> out = new ArrayList<>(n.outputs().size());
        for (Value v : n.outputs()) {
            out.add(v == null || !v.hasShape() ? null : v.dims().clone());
        }
        return out;
    }

    private static void bytes(Node n, NodeWork.Builder b, WorkloadRules.Entry e) {
        if (b.kind == Kind.VIEW) {
            return;
        }
        List<TensorDef> seen = null; // a node reads few stored tensors: a list with identity checks
        for (int i = 0; i < n.inputCount(); i++) {
            Value v = n.input(i);
            if (v == null || e.isParam(i)) {
                continue;
            }
            if (v.isConstant()) {
                if (v.sources().isEmpty()) {
                    b.weightBytes += v.bytes();
                } else {
                    if (seen == null) {
                        seen = new ArrayList<>(4);
                    }
                    for (TensorDef t : v.sources()) {
                        if (!containsIdentical(seen, t)) {
                            seen.add(t);
                            b.weightBytes += t.bytes();
                        }
                    }
                }
            } else {
                b.inputBytes += v.bytes();
            }
        }
        for (Value v : n.outputs()) {
            if (v != null) {
                b.outputBytes += v.bytes();
            }
        }
    }

    private static boolean containsIdentical(List<TensorDef> list, TensorDef t) {
        for (TensorDef x : list) {
            if (x == t) {
                return true;
            }
        }
        return false;
    }

    /** The element type a value really carries on the device: through DequantizeLinear to its integers. */
    public static ElemType effectiveType(Value v) {
        if (v == null) {
            return null;
        }
        Node p = v.producer();
        if (!v.isConstant() && (p == null || !p.opType().equals("DequantizeLinear"))) {
            return v.type();
        }
        if (v.isConstant() && !v.sources().isEmpty()) {
            TensorDef big = null;
            for (TensorDef t : v.sources()) {
                if (big == null || t.bytes() > big.bytes()) {
                    big = t;
                }
            }
            return big.type();
        }
        if (p != null && p.opType().equals("DequantizeLinear") && p.input(0) != null) {
            return effectiveType(p.input(0));
        }
        return v.type();
    }

    private static void precision(Node n, NodeWork.Builder b, WorkloadRules.Entry e) {
        ElemType act = null;
        ElemType wt = null;
        for (int i = 0; i < n.inputCount(); i++) {
            Value v = n.input(i);
            if (v == null || (e != null && e.isParam(i))) {
                continue;
            }
            ElemType t = effectiveType(v);
            if (t == null) {
                continue;
            }
            if (v.isConstant()) {
                if (wt == null || t.bits > wt.bits) {
                    wt = t;
                }
                if (b.kind == Kind.MAC && i >= 2 && !n.opType().startsWith("QLinear")) {
                    continue; // a bias does not set the multiply precision
                }
            } else if (act == null) {
                act = t;
            }
        }
        // The second multiplicand of a MAC node sets the multiply precision whether or not it is
        // stored; it is the node's weight only when it is constant (attention's Q x K^T reads none).
        ElemType operand = wt;
        if (b.kind == Kind.MAC && n.opType().startsWith("QLinear")) {
            act = effectiveType(n.input(0));
            Value w3 = n.input(3);
            operand = effectiveType(w3);
            wt = w3 != null && w3.isConstant() ? operand : wt;
        } else if (b.kind == Kind.MAC && n.inputCount() > 1) {
            Value w1 = n.input(1);
            if (w1 != null) {
                operand = effectiveType(w1);
                wt = w1.isConstant() ? operand : wt;
            }
        }
        if (act == null && n.output(0) != null) {
            act = n.output(0).type();
        }
        ElemType p = act;
        if (b.kind == Kind.MAC && operand != null && (p == null || operand.bits > p.bits)) {
            p = operand;
        }
        b.precision = p == null ? "unknown" : p.label;
        b.precisionBits = p == null ? 0 : p.bits;
        b.weightPrecision = wt == null ? null : wt.label;
        b.activationPrecision = act == null ? null : act.label;
    }

    /**
     * Peak live activation bytes over the topological schedule. An activation lives from its producer
     * (graph inputs: from the start) to its last consumer (graph outputs: to the end); a view shares
     * its input's buffer. Constants and folded values are not activations.
     */
    static long peakActivation(Graph g) {
        List<Node> nodes = g.nodes();
        int steps = nodes.size();
        // value -> its buffer {start, end, bytes}; a view maps to its input's buffer (the same array).
        Map<Value, long[]> bufferOf = new IdentityHashMap<>(2 * (g.inputs().size() + steps));
        List<long[]> buffers = new ArrayList<>(g.inputs().size() + steps);
        for (Value v : g.inputs()) {
            long[] b = {0, 0, v.bytes()};
            bufferOf.put(v, b);
            buffers.add(b);
        }
        WorkloadRules table = WorkloadRules.standard();
        for (int i = 0; i < steps; i++) {
            liveRange(nodes.get(i), table, bufferOf, buffers);
        }
        for (Value v : g.outputs()) {
            long[] b = bufferOf.get(v);
            if (b != null) {
                b[1] = steps;
            }
        }
        long[] delta = new long[steps + 2];
        for (long[] b : buffers) {
            delta[(int) b[0]] += b[2];
            delta[(int) b[1] + 1] -= b[2];
        }
        long live = 0;
        long peak = 0;
        for (int i = 0; i <= steps; i++) {
            live = Math.addExact(live, delta[i]);
            peak = Math.max(peak, live);
        }
        return peak;
    }

    /** Extends the buffers {@code n} reads to its step and opens those it makes (a view shares its input's). */
    private static void liveRange(Node n, WorkloadRules table, Map<Value, long[]> bufferOf, List<long[]> buffers) {
        int step = n.index();
        List<Value> ins = n.inputs();
        for (int k = 0; k < ins.size(); k++) {
            Value v = ins.get(k);
            long[] b = v == null ? null : bufferOf.get(v);
            if (b != null && b[1] < step) {
                b[1] = step;
            }
        }
        List<Value> implicit = n.implicitInputs();
        for (int k = 0; k < implicit.size(); k++) {
            long[] b = bufferOf.get(implicit.get(k));
            if (b != null && b[1] < step) {
                b[1] = step;
            }
        }
        WorkloadRules.Entry e = table.get(n.opType());
        boolean view = e != null && e.kind == Kind.VIEW && !n.isFolded() && n.status() == Node.Status.SHAPED;
        for (int o = 0; o < n.outputs().size(); o++) {
            Value v = n.output(o);
            if (v == null || v.isConstant()) {
                continue;
            }
            long[] in = view && o == 0 && n.input(0) != null ? bufferOf.get(n.input(0)) : null;
            if (in != null) {
                bufferOf.put(v, in);
            } else {
                long[] b = {step, step, v.bytes()};
                bufferOf.put(v, b);
                buffers.add(b);
            }
        }
    }

    static Map<String, Integer> counts(Map<String, Integer> m) {
        return new HashMap<>(m);
    }
}
