package dev.erg.shape;

import dev.erg.graph.Graph;
import dev.erg.graph.GraphBuilder;
import dev.erg.graph.Node;
import dev.erg.graph.Scope;
import dev.erg.graph.Value;
import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.GraphDef;
import dev.erg.onnx.TensorValues;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Map;

/**
 * Control flow. If with a condition known at analysis time takes that branch; Loop with a trip
 * count known at analysis time and Scan (whose trip count is a static dim) shape their body with
 * the body's formal inputs set and run it that many times.
 */
final class ControlRules {
    /**
     * A loop whose carried values change shape from one iteration to the next is shaped one
     * iteration at a time, up to this many iterations; beyond, it is reported as unmodelled.
     */
    static final long MAX_SHAPED_ITERATIONS = 1024;

    private ControlRules() {
    }

    static void register(RuleTable t) {
        t.add("If", ControlRules::ifNode);
        t.add("Loop", ControlRules::loop);
        t.add("Scan", ControlRules::scan);
    }

    /** Every value a subgraph of this node can read: the enclosing scopes' and this graph's own. */
    static Map<String, Value> scope(InferContext c) {
        return Scope.of(c.graph());
    }

    static GraphDef body(InferContext c, String attrName) {
        AttributeDef a = c.attr(attrName);
        if (a == null || a.g() == null) {
            throw c.fail("has no " + attrName + " subgraph");
        }
        return a.g();
    }

    static Graph branch(InferContext c, String attrName) {
        Graph g = GraphBuilder.buildSubgraph(c.graph().model(), body(c, attrName), scope(c));
        c.engine().infer(g);
        return g;
    }

    /** Names the first node of {@code g} (or of a nested subgraph) that is not shaped, or null. */
    static String unshaped(Graph g) {
        for (Node n : g.nodes()) {
            if (n.status() != Node.Status.SHAPED) {
                return n.label() + " is " + n.status().name().toLowerCase();
            }
        }
        return null;
    }

    static void ifNode(InferContext c) {
        TensorValues cond = c.data(0);
        Graph taken;
        if (cond != null) {
            if (cond.size() == 0) {
                throw c.fail("has an empty condition; the operator definition takes one bool");
            }
            taken = branch(c, cond.longAt(0) != 0 ? "then_branch" : "else_branch");
        } else {
            taken = eitherBranch(c);
        }
        c.node().setSubgraphs(List.of(taken), 1);
        List<Value> outs = taken.outputs();
        if (outs.size() < c.outputCount()) {
            throw c.fail("has " + c.outputCount() + " outputs but its branch gives " + outs.size());
        }
        for (int i = 0; i < c.outputCount(); i++) {
            Value v = outs.get(i);
            if (!v.hasShape()) {
                String why = unshaped(taken);
                if (why != null) {
                    c.unmodelled("its branch cannot be priced: " + why);
                    return;
                }
                throw c.fail("has a branch output '" + v.name() + "' whose shape cannot be inferred");
            }
            c.out(i, v.type(), v.dims());
            if (v.data() != null) {
                c.outData(i, v.data());
            }
        }
    }

    /** One branch shaped on its own: the graph, or why it cannot be shaped. */
    private record Attempt(String name, Graph graph, String reason) {
    }

    /**
     * Shapes one branch of an If whose condition is unknown. A branch that fails is dropped with its
     * reason, and the consumers it had added to the enclosing scopes' values are taken back, so that
     * nothing of it stays in the graph.
     */
    private static Attempt attempt(InferContext c, String attrName) {
        List<Value> outer = c.node().implicitInputs();
        int[] before = new int[outer.size()];
        for (int i = 0; i < before.length; i++) {
            before[i] = outer.get(i).consumers().size();
        }
        String name = attrName.substring(0, attrName.indexOf('_'));
        try {
            return new Attempt(name, branch(c, attrName), null);
        } catch (dev.erg.error.BadInputException e) {
            for (int i = 0; i < before.length; i++) {
                List<dev.erg.graph.Node> cons = outer.get(i).consumers();
                while (cons.size() > before[i]) {
                    cons.remove(cons.size() - 1);
                }
            }
            String msg = e.getMessage();
            String prefix = c.graph().fileLabel() + ": ";
            return new Attempt(name, null, msg.startsWith(prefix) ? msg.substring(prefix.length()) : msg);
        }
    }

    /** The branch to price when the condition is not known: the one that shapes, or the larger of two. */
    private static Graph eitherBranch(InferContext c) {
        Attempt thenA = attempt(c, "then_branch");
        Attempt elseA = attempt(c, "else_branch");
        String hint = conditionHint(c);
        if (thenA.graph() == null && elseA.graph() == null) {
            throw c.fail("has a condition not known at analysis time, and neither branch can be shaped (then: "
                    + thenA.reason() + "; else: " + elseA.reason() + ")" + hint);
        }
        if (thenA.graph() == null || elseA.graph() == null) {
            Attempt ok = thenA.graph() != null ? thenA : elseA;
            Attempt dropped = ok == thenA ? elseA : thenA;
            c.warn("If condition is not known at analysis time; its " + dropped.name() + " branch cannot be shaped ("
                    + dropped.reason() + ") and is dropped; erg prices the " + ok.name() + " branch" + hint);
            return ok.graph();
        }
        Graph thenG = thenA.graph();
        Graph elseG = elseA.graph();
        Graph taken = thenG.nodes().size() >= elseG.nodes().size() ? thenG : elseG;
        c.note("If condition is not known at analysis time; erg prices the larger branch ("
                + (taken == thenG ? "then" : "else") + ")" + hint);
        return taken;
    }

    /**
     * A hint naming the graph inputs the condition depends on, found by walking back from it through
     * producers (and the values their subgraphs read); empty when it depends on none.
     */
    static String conditionHint(InferContext c) {
        java.util.Set<String> inputs = new java.util.TreeSet<>();
        java.util.Set<Value> seen = java.util.Collections.newSetFromMap(new java.util.IdentityHashMap<>());
        java.util.ArrayDeque<Value> todo = new java.util.ArrayDeque<>();
        todo.add(c.in(0));
        while (!todo.isEmpty()) {
            Value v = todo.poll();
            if (v == null || !seen.add(v) || v.isConstant()) {
                continue;
            }
            if (v.isGraphInput()) {
                inputs.add(v.name());
                continue;
            }
            dev.erg.graph.Node p = v.producer();
            if (p != null) {
                for (Value in : p.inputs()) {
                    if (in != null) {
                        todo.add(in);
                    }
                }
                todo.addAll(p.implicitInputs());
            }
        }
        if (inputs.isEmpty()) {
            return "";
        }
        StringBuilder b = new StringBuilder();
        for (String in : inputs) {
            b.append(b.length() == 0 ? "" : ", ").append("--value ").append(in).append("=...");
        }
        return "; the condition depends on the graph input" + (inputs.size() == 1 ? " " : "s ")
                + String.join(", ", inputs) + ": bind " + (inputs.size() == 1 ? "it" : "them") + " ("
                + b + ") to price the branch that runs";
    }

    /**
     * Builds and shapes one copy of a loop body whose formal inputs get {@code types} and
     * {@code dims} (no values: they change from one iteration to the next).
     */
    static Graph shapeBody(InferContext c, GraphDef def, ElemType[] types, long[][] dims) {
        Graph g = GraphBuilder.buildSubgraph(c.graph().model(), def, scope(c));
        List<Value> formal = g.inputs();
        if (formal.size() != types.length) {
            throw c.fail("has a body with " + formal.size() + " inputs where the operator definition gives it "
                    + types.length);
        }
        for (int i = 0; i < types.length; i++) {
            if (types[i] == null) {
                throw c.fail("has a body input " + i + " ('" + formal.get(i).name() + "') with no element type");
            }
            formal.get(i).setType(types[i], dims[i].clone());
        }
        c.engine().infer(g);
        return g;
    }

    /** The body output {@code i}, failing when absent; null when it has no shape (reported by the caller). */
    static Value bodyOut(InferContext c, Graph body, int i) {
        if (i >= body.outputs().size()) {
            throw c.fail("has a body with " + body.outputs().size() + " outputs, fewer than its outputs need");
        }
        return body.outputs().get(i);
    }

    static boolean sameDims(long[] a, long[] b) {
        return Arrays.equals(a, b);
    }

    /** Loop (opsets 1 to 21): inputs M, cond, v_initial...; body (iteration_num, cond, v...) -> (cond, v..., scans...). */
    static void loop(InferContext c) {
        GraphDef def = body(c, "body");
        int carried = Math.max(c.inputCount() - 2, 0);
        int scans = c.outputCount() - carried;
        if (scans < 0) {
            throw c.fail("has " + carried + " loop-carried inputs but only " + c.outputCount() + " outputs");
        }
        // The trip count: M when known; 0 when the initial condition is a known false.
        Long trip = null;
        boolean upperBound = false;
        TensorValues cond0 = c.has(1) ? c.data(1) : null;
        TensorValues m = c.has(0) ? c.data(0) : null;
        if (cond0 != null && cond0.size() > 0 && cond0.longAt(0) == 0) {
            trip = 0L;
        } else if (m != null && m.size() > 0) {
            trip = Math.max(m.longAt(0), 0);
            upperBound = c.has(1) && cond0 == null;
        }
        ElemType[] types = new ElemType[2 + carried];
        long[][] dims = new long[2 + carried][];
        types[0] = ElemType.INT64;
        dims[0] = new long[0];
        types[1] = ElemType.BOOL;
        dims[1] = new long[0];
        for (int i = 0; i < carried; i++) {
            if (!c.has(2 + i)) {
                throw c.fail("omits loop-carried input " + (2 + i) + ", which the operator definition requires");
            }
            types[2 + i] = c.type(2 + i);
            dims[2 + i] = c.dims(2 + i);
        }
        Graph body = shapeBody(c, def, types, dims);
        if (trip != null && trip == 0) {
            // No iteration: the final values are the initial ones; scan outputs are empty along axis 0.
            for (int i = 0; i < carried; i++) {
                c.out(i, c.type(2 + i), c.dims(2 + i));
                if (c.data(2 + i) != null) {
                    c.outData(i, c.data(2 + i));
                }
            }
            for (int k = 0; k < scans; k++) {
                Value s = bodyOut(c, body, 1 + carried + k);
                if (!s.hasShape()) {
                    c.unmodelled("its body cannot be shaped: " + unshaped(body));
                    return;
                }
                c.out(carried + k, s.type(), Shapes.concat(new long[] {0}, s.dims()));
            }
            c.note("Loop runs 0 iterations (its condition is false at the start)");
            return;
        }
        // The count is exact when the body cannot end the loop early: the condition input is omitted (the
        // body's condition is then ignored), or the body's condition is a known true or passes its
        // condition input through unchanged.
        Value condOut = bodyOut(c, body, 0);
        Value condIn = body.inputs().get(1);
        boolean exact = !c.has(1)
                || condOut.data() != null && condOut.data().size() > 0 && condOut.data().longAt(0) != 0
                || condOut == condIn
                || condOut.producer() != null && condOut.producer().opType().equals("Identity")
                        && condOut.producer().input(0) == condIn;
        if (trip != null && !exact && trip > Integer.MAX_VALUE) {
            trip = null; // a while loop written with a sentinel M (e.g. INT64_MAX)
        }
        List<Graph> iterations = new ArrayList<>();
        iterations.add(body);
        Graph last = body;
        boolean stable = true;
        for (int i = 0; i < carried; i++) {
            Value v = bodyOut(c, body, 1 + i);
            if (!v.hasShape()) {
                c.node().setSubgraphs(List.of(body), 1);
                c.unmodelled("its body cannot be shaped: " + unshaped(body));
                return;
            }
            stable &= sameDims(v.dims(), dims[2 + i]);
        }
        if (trip == null) {
            c.node().setSubgraphs(List.of(body), 1);
            if (stable && scans == 0) {
                for (int i = 0; i < carried; i++) {
                    Value v = bodyOut(c, body, 1 + i);
                    c.out(i, v.type(), v.dims());
                }
            }
            c.unmodelled("its trip count is not known at analysis time (M "
                    + (c.has(0) ? "is computed at run time" : "is absent") + "); erg does not price it");
            return;
        }
        if (!stable) {
            // Carried values change shape: shape every iteration with the previous one's outputs.
            if (trip > MAX_SHAPED_ITERATIONS) {
                c.node().setSubgraphs(List.of(body), 1);
                c.unmodelled("its loop-carried values change shape over " + trip + " iterations, more than the "
                        + MAX_SHAPED_ITERATIONS + " erg shapes one by one");
                return;
            }
            for (long it = 1; it < trip; it++) {
                for (int i = 0; i < carried; i++) {
                    Value v = bodyOut(c, last, 1 + i);
                    types[2 + i] = v.type();
                    dims[2 + i] = v.dims();
                }
                last = shapeBody(c, def, types, dims);
                iterations.add(last);
                String why = unshaped(last);
                if (why != null) {
                    c.node().setSubgraphs(iterations, 1);
                    c.unmodelled("its body cannot be shaped at iteration " + it + ": " + why);
                    return;
                }
            }
            c.node().setSubgraphs(iterations, 1);
            c.note("Loop carried values change shape: each of its " + trip + " iterations is shaped and priced");
        } else {
            c.node().setSubgraphs(List.of(body), trip);
        }
        for (int i = 0; i < carried; i++) {
            Value v = bodyOut(c, last, 1 + i);
            c.out(i, v.type(), v.dims());
        }
        for (int k = 0; k < scans; k++) {
            Value s = bodyOut(c, body, 1 + carried + k);
            if (!s.hasShape()) {
                c.unmodelled("its body cannot be shaped: " + unshaped(body));
                return;
            }
            for (Graph g : iterations) {
                if (!sameDims(bodyOut(c, g, 1 + carried + k).dims(), s.dims())) {
                    c.unmodelled("its scan output " + k + " changes shape from one iteration to the next");
                    return;
                }
            }
            c.out(carried + k, s.type(), Shapes.concat(new long[] {trip}, s.dims()));
        }
        if (upperBound || !exact) {
            c.note("Loop trip count " + trip + " is an upper bound: "
                    + (upperBound ? "the initial condition is computed at run time" : "the body's condition can end it earlier")
                    + "; erg prices " + trip + " iterations");
        }
    }

    /** Inserts {@code d} into {@code dims} at {@code axis}. */
    static long[] insert(long[] dims, int axis, long d) {
        long[] out = new long[dims.length + 1];
        for (int i = 0, j = 0; i < out.length; i++) {
            out[i] = i == axis ? d : dims[j++];
        }
        return out;
    }

    /** Removes axis {@code axis} of {@code dims}. */
    static long[] remove(long[] dims, int axis) {
        long[] out = new long[dims.length - 1];
        for (int i = 0, j = 0; i < dims.length; i++) {
            if (i != axis) {
                out[j++] = dims[i];
            }
        }
        return out;
    }

    /**
     * Scan. Opset 9 and later: inputs are N initial states then M scan inputs
     * ({@code num_scan_inputs}), sliced along {@code scan_input_axes}; the body maps (states, slices)
     * to (states, scan output slices), stacked along {@code scan_output_axes}. Opset 8: a leading
     * optional sequence_lens input, batch axis 0 on every input and the scan axis 1.
     */
    static void scan(InferContext c) {
        GraphDef def = body(c, "body");
        long mAttr = c.attrInt("num_scan_inputs", -1);
        boolean v8 = c.opset() < 9;
        int first = v8 ? 1 : 0;
        int total = c.inputCount() - first;
        if (mAttr <= 0 || mAttr > total) {
            throw c.fail("has num_scan_inputs " + mAttr + " for " + total + " state and scan inputs");
        }
        int scanIn = (int) mAttr;
        int states = total - scanIn;
        int scanOut = c.outputCount() - states;
        if (scanOut < 0) {
            throw c.fail("has " + states + " states but only " + c.outputCount() + " outputs");
        }
        long[] inAxes = c.attrInts("scan_input_axes");
        long[] outAxes = c.attrInts("scan_output_axes");
        if (v8 && (inAxes != null || outAxes != null)) {
            throw c.fail("has scan axes, which Scan only takes from opset 9");
        }
        if (inAxes != null && inAxes.length != scanIn) {
            throw c.fail("has " + inAxes.length + " scan_input_axes for " + scanIn + " scan inputs");
        }
        if (outAxes != null && outAxes.length != scanOut) {
            throw c.fail("has " + outAxes.length + " scan_output_axes for " + scanOut + " scan outputs");
        }
        ElemType[] types = new ElemType[states + scanIn];
        long[][] dims = new long[states + scanIn][];
        long batch = 1;
        long trip = -1;
        for (int i = 0; i < states + scanIn; i++) {
            int in = first + i;
            if (!c.has(in)) {
                throw c.fail("omits input " + in + ", which the operator definition requires");
            }
            long[] d = c.dims(in);
            types[i] = c.type(in);
            if (v8) {
                int lead = i < states ? 1 : 2;
                if (d.length < lead) {
                    throw c.fail("has input " + in + " of rank " + d.length + " without its batch"
                            + (lead == 2 ? " and sequence axes" : " axis"));
                }
                if (i == 0 || (i == states && states == 0)) {
                    batch = d[0];
                } else if (d[0] != batch) {
                    throw c.fail("has inputs with batch sizes " + batch + " and " + d[0]);
                }
                dims[i] = Arrays.copyOfRange(d, lead, d.length);
                if (i >= states) {
                    trip = checkTrip(c, trip, d[1]);
                }
            } else if (i < states) {
                dims[i] = d;
            } else {
                int axis = c.axis(inAxes == null ? 0 : inAxes[i - states], d.length);
                trip = checkTrip(c, trip, d[axis]);
                dims[i] = remove(d, axis);
            }
        }
        long[][] stateDims = Arrays.copyOf(dims, states);
        Graph body = shapeBody(c, def, types, dims);
        String why = unshaped(body);
        if (why != null) {
            c.node().setSubgraphs(List.of(body), 1);
            c.unmodelled("its body cannot be shaped: " + why);
            return;
        }
        for (int i = 0; i < states; i++) {
            Value v = bodyOut(c, body, i);
            if (!sameDims(v.dims(), stateDims[i])) {
                throw c.fail("has a body that changes state " + i + " from " + Arrays.toString(stateDims[i]) + " to "
                        + Arrays.toString(v.dims()) + "; the operator definition keeps state shapes");
            }
            c.out(i, v.type(), v8 ? Shapes.concat(new long[] {batch}, v.dims()) : v.dims());
        }
        for (int k = 0; k < scanOut; k++) {
            Value s = bodyOut(c, body, states + k);
            long[] out;
            if (v8) {
                out = Shapes.concat(new long[] {batch, trip}, s.dims());
            } else {
                int axis = c.axis(outAxes == null ? 0 : outAxes[k], s.dims().length + 1);
                out = insert(s.dims(), axis, trip);
            }
            c.out(states + k, s.type(), out);
        }
        c.node().setSubgraphs(List.of(body), Math.multiplyExact(batch, trip));
    }

    static long checkTrip(InferContext c, long trip, long len) {
        if (trip >= 0 && trip != len) {
            throw c.fail("has scan inputs of lengths " + trip + " and " + len + " along their scan axes");
        }
        return len;
    }
}
