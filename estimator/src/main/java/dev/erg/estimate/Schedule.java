package dev.erg.estimate;

import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorDef;
import dev.erg.workload.Kind;
import dev.erg.workload.NodeWork;
import dev.erg.workload.WorkloadCounter;
import dev.erg.workload.WorkloadRules;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;

/**
 * The nodes of one estimate in topological order, with what every stage asks of them: which inputs
 * are parameters, which nodes run fused, and the deployed width of every value and stored tensor.
 */
final class Schedule {
    final List<NodeWork> works;
    /** The nodes by position, for {@link #posOf} without going through the work list. */
    private final Node[] nodes;
    private final long[] paramMask;
    private final WorkloadRules rules;
    /** Per node: its first activation input arrives fused (set by {@link Fusion}). */
    final boolean[] fusedIn;
    /** The profile's deploy-precision width for float tensors, or 0 to follow the model. */
    final int deployBits;
    /** Per node: the activation width its outputs are written at when an override sets it, else 0. */
    final int[] outputBits;
    /** Stored tensors deployed at a width other than their type's (an override or a macro's weight-bits). */
    private final Map<TensorDef, Integer> tensorBits = new IdentityHashMap<>();

    Schedule(List<NodeWork> works, WorkloadRules rules, int deployBits) {
        this.works = works;
        this.rules = rules;
        this.deployBits = deployBits;
        int n = works.size();
        this.paramMask = new long[n];
        this.nodes = new Node[n];
        String lastOp = null;
        long lastMask = 0;
        for (int i = 0; i < n; i++) {
            NodeWork w = works.get(i);
            nodes[i] = w.node();
            String op = w.opType();
            if (op != lastOp) { // the same operator type is usually one String: look the rule up once per run of it
                lastMask = rules.parameterMask(op);
                lastOp = op;
            }
            paramMask[i] = lastMask;
        }
        this.fusedIn = new boolean[works.size()];
        this.outputBits = new int[works.size()];
    }

    int size() {
        return works.size();
    }

    boolean isParam(Node node, int k) {
        int i = posOf(node);
        long mask = i >= 0 ? paramMask[i] : rules.parameterMask(node.opType());
        return k < 64 && (mask >>> k & 1) != 0;
    }

    /** The position of {@code n} in this run's nodes, or -1 when it belongs to another graph (a subgraph). */
    int posOf(Node n) {
        int i = n.index();
        return i >= 0 && i < nodes.length && nodes[i] == n ? i : -1;
    }

    static boolean runs(NodeWork w) {
        return w.kind() == Kind.MAC || w.kind() == Kind.VECTOR || w.kind() == Kind.MOVE;
    }

    /** True when {@code v} is written by its producer straight into a fused follower. */
    boolean fusedThrough(Value v) {
        if (v == null || v.consumers().size() != 1 || v.isGraphOutput() || v.producer() == null) {
            return false;
        }
        int p = posOf(v.producer());
        if (p < 0 || !(works.get(p).kind() == Kind.MAC || fusedIn[p]) || v.producer().output(0) != v) {
            return false; // only the chain's own activation passes through: a residual operand is read
        }
        int j = posOf(v.consumers().get(0));
        return j >= 0 && fusedIn[j];
    }

    // ---- deployed widths ----

    int bits(ElemType t) {
        if (t == null) {
            return 0;
        }
        return deployBits > 0 && t.isFloat() ? deployBits : t.bits;
    }

    static long bytes(long elements, int bits) {
        return Math.multiplyExact(elements, bits) / 8 + ((elements * bits) % 8 == 0 ? 0 : 1);
    }

    /** Bytes of an activation value at its deployed width: its producer's override, else its type's. */
    long actBytes(Value v) {
        if (v == null || !v.hasShape() || v.type() == null) {
            return 0;
        }
        Node p = v.producer();
        int i = p == null ? -1 : posOf(p);
        if (i >= 0 && outputBits[i] > 0) {
            return bytes(v.elements(), outputBits[i]);
        }
        return bytes(v.elements(), bits(WorkloadCounter.effectiveType(v)));
    }

    long storedBytes(TensorDef t) {
        Integer b = tensorBits.get(t);
        return bytes(t.elements(), b != null ? b : bits(t.type()));
    }

    /** Deploys the stored weight behind {@code v} (its largest source tensor) at {@code bits}. */
    void deployWeight(Value v, int bits) {
        TensorDef big = null;
        for (TensorDef t : v.sources()) {
            if (big == null || t.elements() > big.elements()) {
                big = t;
            }
        }
        if (big != null) {
            tensorBits.put(big, bits);
        }
    }

    static <T> boolean containsSame(List<T> list, T x) {
        for (int i = 0, n = list.size(); i < n; i++) {
            if (list.get(i) == x) {
                return true;
            }
        }
        return false;
    }
}
