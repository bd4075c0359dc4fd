package dev.erg.shape;

import java.util.Collections;
import java.util.Map;
import java.util.Set;
import java.util.HashMap;
import java.util.TreeSet;

/**
 * The one table of shape rules, keyed by operator type of the default ONNX domain. Each operator
 * family registers its rules in {@link #standard()}; adding an operator is one rule function and
 * one line here (plus its test).
 */
public final class RuleTable {
    private final Map<String, ShapeRule> rules = new HashMap<>();

    public void add(String opType, ShapeRule rule) {
        if (rules.put(opType, rule) != null) {
            throw new IllegalStateException("two shape rules for " + opType);
        }
    }

    public ShapeRule get(String opType) {
        return rules.get(opType);
    }

    public Set<String> operators() {
        return Collections.unmodifiableSet(new TreeSet<>(rules.keySet()));
    }

    private static final RuleTable STANDARD = build();

    /** The rules of every operator erg knows. */
    public static RuleTable standard() {
        return STANDARD;
    }

    private static RuleTable build() {
        RuleTable t = new RuleTable();
        ElementwiseRules.register(t);
        TensorRules.register(t);
        LayoutRules.register(t);
        SelectRules.register(t);
        ConvRules.register(t);
        MatMulRules.register(t);
        PoolRules.register(t);
        NormRules.register(t);
        ReduceRules.register(t);
        RecurrentRules.register(t);
        QuantRules.register(t);
        ControlRules.register(t);
        DataDependentRules.register(t);
        GeneratorRules.register(t);
        return t;
    }
}
