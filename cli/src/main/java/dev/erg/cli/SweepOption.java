package dev.erg.cli;

import dev.erg.error.BadInputException;
import dev.erg.explore.SweepRange;
import picocli.CommandLine;
import picocli.CommandLine.Option;

/** {@code --sweep NAME=FROM..TO:STEP} or {@code NAME=FROM..TO*FACTOR}: sweeps a symbolic dim of every model. */
final class SweepOption {
    @Option(names = "--sweep", paramLabel = "NAME=FROM..TO:STEP|NAME=FROM..TO*FACTOR",
            description = "Estimates and checks every value of a symbolic dim (e.g. seq=64..1024:64 or"
                    + " seq=16..2048*2), fits each metric, names where each limit breaks and the largest"
                    + " (or smallest) value that meets every limit. The dim must not be bound with --dim.")
    String sweep;

    /** The range, or null; a malformed one is a usage error. */
    SweepRange range(CommandLine.Model.CommandSpec spec) {
        if (sweep == null) {
            return null;
        }
        try {
            return SweepRange.parse("--sweep", sweep);
        } catch (BadInputException e) {
            throw Options.usage(spec, e.getMessage());
        }
    }
}
