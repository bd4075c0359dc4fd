package dev.erg.estimate;

import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.workload.Kind;
import dev.erg.workload.NodeWork;
import java.util.Set;

/**
 * Fusion (docs/method.md, section 4): an elementwise node that consumes a MAC node's only output runs
 * on its way out, so the activation moves once. Independent of the engine kind.
 */
final class Fusion {
    /** Elementwise operators that can run on the way out of a MAC node. */
    static final Set<String> FUSABLE = Set.of("Relu", "Clip", "LeakyRelu", "PRelu", "Sigmoid", "Tanh",
            "HardSigmoid", "HardSwish", "Gelu", "Swish", "Mish", "Elu", "Selu", "Softplus", "Add", "Sub", "Mul",
            "Div", "QuantizeLinear", "DequantizeLinear", "BatchNormalization");

    private Fusion() {
    }

    /**
     * Marks elementwise followers of MAC nodes as fused ({@link Schedule#fusedIn}): their first
     * activation input arrives fused (not read from SRAM), and a fused-through output is not written.
     */
    static void mark(Schedule s, NodeEstimate[] est) {
        for (int i = 0; i < s.size(); i++) {
            if (s.works.get(i).kind() == Kind.MAC) {
                markChain(s, est, i);
            }
        }
    }

    /** Marks the followers of MAC node {@code i}, in a method of its own so that the JIT compiles it early. */
    private static void markChain(Schedule s, NodeEstimate[] est, int i) {
        boolean[] fusedIn = s.fusedIn;
        NodeWork head = s.works.get(i);
        Node cur = head.node();
        while (true) {
            Value out = cur.output(0);
            if (out == null || out.isGraphOutput() || out.consumers().size() != 1) {
                break;
            }
            Node next = out.consumers().get(0);
            int j = s.posOf(next);
            if (j < 0 || next.isFolded() || !FUSABLE.contains(next.opType())
                    || s.works.get(j).kind() != Kind.VECTOR || fusedIn[j]) {
                break;
            }
            if (next.input(0) != out && !(next.inputCount() > 1 && next.input(1) == out)) {
                break;
            }
            fusedIn[j] = true;
            est[j].fusedInto = head.name();
            cur = next;
        }
    }

    /** The activation input of a fused follower that arrives from its producer, or null. */
    static Value fusedInput(Node node) {
        for (int vi = 0; vi < node.inputs().size(); vi++) {
            Value v = node.inputs().get(vi);
            if (v != null && v.producer() != null && !v.isConstant()) {
                Node p = v.producer();
                if (p.output(0) == v && v.consumers().size() == 1) {
                    return v;
                }
            }
        }
        return null;
    }
}
