package dev.erg.run;

import dev.erg.budget.Budget;
import dev.erg.error.BadInputException;
import dev.erg.explore.SweepRange;
import dev.erg.graph.InputBindings;
import dev.erg.workload.PrecisionOverrides;
import java.nio.file.Path;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * One model of a run: its label (the path as the user wrote it, which names it in every message and
 * report), its file, the values of its symbolic dims, its own budget limits and its precision rules.
 *
 * <p>Immutable; each {@code with...} method returns a changed copy, so that a new per-model setting
 * (such as bindings of whole input shapes or constant input values) is one more field and one more
 * {@code with} method, and no caller that does not use it changes.
 */
public final class ModelSpec {
    private final String label;
    private final Path file;
    private final InputBindings bindings;
    private final Budget budget;
    private final PrecisionOverrides precision;
    private final SweepRange sweep;

    public ModelSpec(String label, Path file) {
        this(label, file, InputBindings.NONE, Budget.none(), PrecisionOverrides.NONE, null);
    }

    public ModelSpec(String label, Path file, Map<String, Long> dims) {
        this(label, file, InputBindings.ofDims(dims), Budget.none(), PrecisionOverrides.NONE, null);
    }

    private ModelSpec(String label, Path file, InputBindings bindings, Budget budget, PrecisionOverrides precision,
                      SweepRange sweep) {
        this.label = label;
        this.file = file;
        this.bindings = bindings == null ? InputBindings.NONE : bindings;
        this.budget = budget == null ? Budget.none() : budget;
        this.precision = precision == null ? PrecisionOverrides.NONE : precision;
        this.sweep = sweep;
    }

    /**
     * This model swept over a symbolic dim: every value is estimated and checked, and the model's pair
     * in the gate is taken at the first failing value (the last value when all pass).
     */
    public ModelSpec withSweep(SweepRange sweep) {
        return new ModelSpec(label, file, bindings, budget, precision, sweep);
    }

    /** The sweep of this model, or null. */
    public SweepRange sweep() {
        return sweep;
    }

    /** This model with {@code dims} as the values of its symbolic dims (its shapes and values kept). */
    public ModelSpec withDims(Map<String, Long> dims) {
        return new ModelSpec(label, file, bindings.withDims(dims), budget, precision, sweep);
    }

    /** This model with every kind of input binding: symbolic dims, whole shapes, constant values. */
    public ModelSpec withBindings(InputBindings bindings) {
        return new ModelSpec(label, file, bindings, budget, precision, sweep);
    }

    /** This model with its own limits: they override the device's and the run's, limit by limit. */
    public ModelSpec withBudget(Budget budget) {
        return new ModelSpec(label, file, bindings, budget, precision, sweep);
    }

    /**
     * This model with precision rules that override, node by node, the precision it is deployed at on
     * every device (the first rule that matches a node decides; see {@link PrecisionOverrides}).
     */
    public ModelSpec withPrecision(PrecisionOverrides rules) {
        return new ModelSpec(label, file, bindings, budget, rules, sweep);
    }

    /**
     * As {@link #withPrecision(PrecisionOverrides)}, from rules in text form ({@code PATTERN[@OP]=wNaM}).
     *
     * @throws BadInputException naming the first malformed rule
     */
    public ModelSpec withPrecision(java.util.List<String> rules) {
        return withPrecision(PrecisionOverrides.parse(rules == null ? java.util.List.of() : rules));
    }

    /** The model's precision rules, in order (empty when it has none). */
    public PrecisionOverrides precision() {
        return precision;
    }

    public String label() {
        return label;
    }

    public Path file() {
        return file;
    }

    /** The symbolic dim bindings, in the order given. */
    public Map<String, Long> dims() {
        return bindings.dims();
    }

    /** The input bindings: dims, whole shapes and constant values. */
    public InputBindings bindings() {
        return bindings;
    }

    /** The model's own limits (empty when it has none). */
    public Budget budget() {
        return budget;
    }

    /**
     * A dim value as written ("1", " 49 "): a whole number of 1 or more, or a one-line error that
     * starts with {@code where}.
     */
    public static long parseDim(String where, String text) {
        String v = text == null ? "" : text.strip();
        long n;
        try {
            n = Long.parseLong(v);
        } catch (NumberFormatException x) {
            n = -1;
        }
        if (n < 1) {
            throw new BadInputException(where + ": must be a whole number of 1 or more (got '" + v + "')");
        }
        return n;
    }
}
