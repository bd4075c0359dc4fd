package dev.erg.shape;

import dev.erg.graph.Graph;
import dev.erg.graph.GraphBuilder;
import dev.erg.graph.Value;
import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.GraphDef;
import dev.erg.onnx.TensorValues;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/** Control flow. If with a condition known at analysis time takes that branch. */
final class ControlRules {
    private ControlRules() {
    }

    static void register(RuleTable t) {
        t.add("If", ControlRules::ifNode);
    }

    static Map<String, Value> scope(InferContext c) {
        Map<String, Value> scope = new HashMap<>(c.graph().values());
        return scope;
    }

    static Graph branch(InferContext c, String attrName) {
        AttributeDef a = c.attr(attrName);
        if (a == null || a.g() == null) {
            throw c.fail("has no " + attrName + " subgraph");
        }
        GraphDef def = a.g();
        Graph g = GraphBuilder.buildSubgraph(c.graph().model(), def, scope(c));
        c.engine().infer(g);
        return g;
    }

    static void ifNode(InferContext c) {
        TensorValues cond = c.data(0);
        Graph taken;
        if (cond != null) {
            taken = branch(c, cond.longAt(0) != 0 ? "then_branch" : "else_branch");
        } else {
            Graph thenG = branch(c, "then_branch");
            Graph elseG = branch(c, "else_branch");
            long thenCost = thenG.nodes().size();
            long elseCost = elseG.nodes().size();
            taken = thenCost >= elseCost ? thenG : elseG;
            c.note("If condition is not known at analysis time; erg prices the larger branch ("
                    + (taken == thenG ? "then" : "else") + ")");
        }
        List<Value> outs = taken.outputs();
        if (outs.size() < c.outputCount()) {
            throw c.fail("has " + c.outputCount() + " outputs but its branch gives " + outs.size());
        }
        for (int i = 0; i < c.outputCount(); i++) {
            Value v = outs.get(i);
            if (!v.hasShape()) {
                throw c.fail("has a branch output '" + v.name() + "' whose shape cannot be inferred");
            }
            c.out(i, v.type(), v.dims());
            if (v.data() != null) {
                c.outData(i, v.data());
            }
        }
        c.node().setSubgraphs(List.of(taken), 1);
    }
}
