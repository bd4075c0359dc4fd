package dev.erg.cli;

import dev.erg.workload.ModelWorkload;
import java.io.PrintWriter;
import dev.erg.graph.InputBindings;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import picocli.CommandLine;
import picocli.CommandLine.Option;

/** The options every command that reads a model shares: input bindings and the unmodelled switch. */
final class ModelOptions {
    @Option(names = "--dim", paramLabel = "NAME=VALUE",
            description = "Binds a symbolic input dim, e.g. --dim batch=1 (repeatable; applies to every model).")
    List<String> dims = new ArrayList<>();

    @Option(names = "--shape", paramLabel = "INPUT=DIMS",
            description = "Gives a graph input its whole shape, e.g. --shape input=1x576 (also for dims without a name;"
                    + " repeatable).")
    List<String> shapes = new ArrayList<>();

    @Option(names = "--value", paramLabel = "INPUT=V[,V...]",
            description = "Gives a small graph input a constant value, e.g. --value sr=16000 or --value ids=1,2,3;"
                    + " it is folded like a weight (If conditions, Shape chains, Reshape targets; repeatable).")
    List<String> values = new ArrayList<>();

    @Option(names = "--fail-on-unmodelled",
            description = "Makes an operator without a rule a policy violation (exit 1, listed with the others)"
                    + " instead of a note.")
    boolean failOnUnmodelled;

    /** The bindings, parsed and checked; a malformed one is a usage error of {@code spec}. */
    Map<String, Long> bound(CommandLine.Model.CommandSpec spec) {
        return Options.dims(spec, dims);
    }

    /**
     * The exit status of a command that printed {@code w}: with {@code --fail-on-unmodelled} and a node
     * without a rule, the policy violation on stderr and {@link Main#VIOLATION}.
     */
    int verdict(ModelWorkload w, PrintWriter err) {
        if (failOnUnmodelled && !w.complete()) {
            err.println("erg: 1 policy violation: " + w.incompleteness()
                    + "; --fail-on-unmodelled requires every node to be modelled");
            return Main.VIOLATION;
        }
        return Main.OK;
    }

    /** Every input binding: the dims, the shapes and the values; a malformed one is a usage error. */
    InputBindings bindings(CommandLine.Model.CommandSpec spec) {
        Map<String, Long> dims = bound(spec);
        try {
            return InputBindings.parse(dims, pairs(spec, "--shape", shapes), pairs(spec, "--value", values), "--shape/--value");
        } catch (dev.erg.error.BadInputException e) {
            throw Options.usage(spec, e.getMessage());
        }
    }

    private static Map<String, String> pairs(CommandLine.Model.CommandSpec spec, String option, List<String> specs) {
        Map<String, String> out = new java.util.LinkedHashMap<>();
        for (String s : specs) {
            int eq = s.indexOf('=');
            if (eq <= 0) {
                throw Options.usage(spec, option + " '" + s + "' is not INPUT=..." + " (e.g. "
                        + (option.equals("--shape") ? "--shape input=1x576" : "--value sr=16000") + ")");
            }
            String name = s.substring(0, eq).trim();
            if (out.put(name, s.substring(eq + 1).trim()) != null) {
                throw Options.usage(spec, option + " " + name + " is given twice");
            }
        }
        return out;
    }
}
