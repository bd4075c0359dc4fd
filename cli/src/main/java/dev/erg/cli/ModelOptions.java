package dev.erg.cli;

import dev.erg.workload.ModelWorkload;
import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import picocli.CommandLine;
import picocli.CommandLine.Option;

/** The options every command that reads a model shares: dim bindings and the unmodelled switch. */
final class ModelOptions {
    @Option(names = "--dim", paramLabel = "NAME=VALUE",
            description = "Binds a symbolic input dim, e.g. --dim batch=1 (repeatable; applies to every model).")
    List<String> dims = new ArrayList<>();

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
}
