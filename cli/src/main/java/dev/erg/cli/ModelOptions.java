package dev.erg.cli;

import dev.erg.analysis.AnalysisOptions;
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
            description = "Fails (exit 2, one line listing them) when some operator has no rule, instead of listing it.")
    boolean failOnUnmodelled;

    /** The bindings, parsed and checked; a malformed one is a usage error of {@code spec}. */
    Map<String, Long> bound(CommandLine.Model.CommandSpec spec) {
        return Options.dims(spec, dims);
    }

    AnalysisOptions analysis() {
        return new AnalysisOptions(failOnUnmodelled);
    }
}
