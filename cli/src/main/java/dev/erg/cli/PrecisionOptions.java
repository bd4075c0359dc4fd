package dev.erg.cli;

import dev.erg.error.BadInputException;
import dev.erg.workload.PrecisionOverrides;
import java.util.ArrayList;
import java.util.List;
import picocli.CommandLine;
import picocli.CommandLine.Option;

/** The precision rules of the commands that estimate ({@code estimate}, {@code check}). */
final class PrecisionOptions {
    @Option(names = "--precision", paramLabel = "RULE",
            description = "Deploys the nodes whose name matches at a precision: PATTERN[@OP]=wNaM, e.g."
                    + " --precision '/backbone/*@Conv=w4a8' (glob; re:EXPR for a regular expression; wN or aM"
                    + " sets one operand). Repeatable; the first rule that matches a node decides.")
    List<String> rules = new ArrayList<>();

    /** The rules, parsed in order; a malformed one is a usage error that names the option. */
    PrecisionOverrides parsed(CommandLine.Model.CommandSpec spec) {
        try {
            return PrecisionOverrides.parse(rules);
        } catch (BadInputException e) {
            throw Options.usage(spec, "--precision: " + e.getMessage());
        }
    }
}
