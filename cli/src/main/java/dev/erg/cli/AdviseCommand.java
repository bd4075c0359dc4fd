package dev.erg.cli;

import picocli.CommandLine.Command;

/**
 * {@code erg advise MODEL.onnx --device SPEC [budget options]}: the same run as {@code check}, which
 * lists every way to meet a failed budget (each a computed estimate) instead of the first three. The
 * exit status is {@code check}'s.
 */
@Command(name = "advise", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Checks models like 'check' and lists every computed way to meet each failed budget:"
                + " lower precision on the costliest layers or the whole model, a higher clock, more SRAM,"
                + " another engine or dataflow, a smaller swept dim; exits 1 when a limit is broken.")
final class AdviseCommand extends CheckCommand {
    @Override
    int adviceCount() {
        return -1;
    }
}
