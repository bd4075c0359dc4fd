package dev.erg.graph;

import java.util.AbstractMap;
import java.util.HashMap;
import java.util.Map;
import java.util.Set;

/**
 * The values a subgraph can read: a graph's own values in front of its enclosing scopes, looked up
 * through the chain without copying it (a copy per control-flow node would make graphs with many of
 * them quadratic).
 */
public final class Scope extends AbstractMap<String, Value> {
    private final Map<String, Value> own;
    private final Map<String, Value> outer;

    private Scope(Map<String, Value> own, Map<String, Value> outer) {
        this.own = own;
        this.outer = outer;
    }

    /** Everything {@code g}'s nodes can read: its values, then those of its enclosing scopes. */
    public static Scope of(Graph g) {
        return new Scope(g.values(), g.outerScope());
    }

    @Override
    public Value get(Object key) {
        Value v = own.get(key);
        return v != null ? v : outer.get(key);
    }

    @Override
    public boolean containsKey(Object key) {
        return own.containsKey(key) || outer.containsKey(key);
    }

    @Override
    public boolean isEmpty() {
        return own.isEmpty() && outer.isEmpty();
    }

    @Override
    public Set<Entry<String, Value>> entrySet() {
        Map<String, Value> all = new HashMap<>(outer);
        all.putAll(own);
        return all.entrySet();
    }
}
