package dev.erg.shape;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.TensorDef;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/**
 * Forward shape and constant inference over a graph in topological order. Every value gets its
 * element type and shape; small integer tensors that feed shapes get their values; nodes whose
 * outputs do not depend on the runtime inputs are marked folded (worked out at analysis time).
 */
public final class ShapeInference {
    private static final Set<String> NON_DETERMINISTIC = Set.of(
            "RandomNormal", "RandomUniform", "RandomNormalLike", "RandomUniformLike", "Multinomial", "Bernoulli");
    private static final Set<String> SHAPE_READERS = Set.of("Shape", "Size");

    private final RuleTable table;

    public ShapeInference(RuleTable table) {
        this.table = table;
    }

    /** Infers every value of {@code g} with the standard rules. */
    public static void run(Graph g) {
        new ShapeInference(RuleTable.standard()).infer(g);
    }

    public void infer(Graph g) {
        for (Node n : g.nodes()) {
            inferNode(g, n);
        }
    }

    private void inferNode(Graph g, Node n) {
        if (!n.domain().isEmpty()) {
            n.setStatus(Node.Status.UNMODELLED);
            n.setNote("operator domain '" + n.domain() + "' is outside the ONNX standard set");
            return;
        }
        ShapeRule rule = table.get(n.opType());
        if (rule == null) {
            n.setStatus(Node.Status.UNMODELLED);
            return;
        }
        for (Value v : n.inputs()) {
            if (v != null && (!v.hasShape() || v.type() == null)) {
                n.setStatus(Node.Status.UNRESOLVED);
                return;
            }
        }
        for (Value v : n.implicitInputs()) {
            if (!v.hasShape()) {
                n.setStatus(Node.Status.UNRESOLVED);
                return;
            }
        }
        InferContext c = new InferContext(g, n, this);
        try {
            rule.infer(c);
        } catch (BadInputException e) {
            throw e;
        } catch (ArithmeticException e) {
            throw c.fail("has shapes whose arithmetic overflows 64 bits");
        } catch (RuntimeException e) {
            // A rule that indexes past an input's rank or an attribute's length: the node does not fit
            // the operator definition. The sentence is about the node, never about erg's code.
            throw c.fail("cannot be shaped: its inputs (" + ranks(n) + ") or attributes do not fit the operator"
                    + " definition of " + n.opType() + " at opset " + n.opset());
        }
        if (c.unmodelledReason() != null) {
            n.setStatus(Node.Status.UNMODELLED);
            c.note(c.unmodelledReason());
            return;
        }
        for (int i = 0; i < n.outputs().size(); i++) {
            Value v = n.output(i);
            if (v != null && !v.hasShape()) {
                throw c.fail("has output " + i + " ('" + v.name() + "') that its rule does not define");
            }
        }
        n.setStatus(Node.Status.SHAPED);
        markConstant(n);
    }

    /** "ranks 4, 1" of the node's present inputs, for messages. */
    static String ranks(Node n) {
        StringBuilder b = new StringBuilder();
        for (Value v : n.inputs()) {
            b.append(b.length() == 0 ? "" : ", ").append(v == null ? "-" : v.hasShape() ? String.valueOf(v.rank()) : "?");
        }
        return b.length() == 0 ? "none" : (n.inputs().size() == 1 ? "rank " : "ranks ") + b;
    }

    /**
     * The stored tensors behind a folded node's inputs. When one input carries them all (a chain of
     * Identity, Cast, Transpose or DequantizeLinear over a weight), its set is shared rather than
     * copied, so that such chains cost nothing per node; a new set is made only where two sets meet.
     */
    private static Set<TensorDef> union(List<Value> ins, List<Value> implicit) {
        Set<TensorDef> only = null;
        boolean shared = true;
        for (int pass = 0; pass < 2 && shared; pass++) {
            for (Value v : pass == 0 ? ins : implicit) {
                if (v == null || v.sources().isEmpty() || v.sources() == only) {
                    continue;
                }
                if (only == null) {
                    only = v.sources();
                } else {
                    shared = false;
                    break;
                }
            }
        }
        if (shared) {
            return only == null ? Set.of() : only;
        }
        Set<TensorDef> out = new LinkedHashSet<>();
        for (Value v : ins) {
            if (v != null) {
                out.addAll(v.sources());
            }
        }
        for (Value v : implicit) {
            out.addAll(v.sources());
        }
        return java.util.Collections.unmodifiableSet(out);
    }

    private static void markConstant(Node n) {
        if (NON_DETERMINISTIC.contains(n.opType())) {
            return;
        }
        boolean constant;
        Set<TensorDef> sources = Set.of();
        if (SHAPE_READERS.contains(n.opType())) {
            constant = true; // static shapes: the value is known whatever the input holds
        } else if (n.opType().equals("Constant")) {
            return; // the rule marks the stored tensor itself
        } else {
            constant = true;
            int present = 0;
            List<Value> ins = n.inputs();
            for (int i = 0; i < ins.size(); i++) {
                Value v = ins.get(i);
                if (v == null) {
                    continue;
                }
                present++;
                if (!v.isConstant()) {
                    return; // most nodes: a runtime input, nothing to collect
                }
            }
            for (Value v : n.implicitInputs()) {
                if (!v.isConstant()) {
                    return;
                }
            }
            sources = union(ins, n.implicitInputs());
            if (present == 0 && n.implicitInputs().isEmpty() && !n.opType().equals("ConstantOfShape")
                    && !n.opType().equals("EyeLike")) {
                constant = n.opType().equals("Range");
            }
        }
        if (!constant) {
            return;
        }
        n.setFolded(true);
        for (Value v : n.outputs()) {
            if (v != null) {
                v.setConstant(true);
                v.setSources(sources);
            }
        }
    }
}
