package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/**
 * {@link Main} builds only the subcommand a run names (the others are read by reflection only for
 * help, the version, or a missing or unknown command). Whichever way it is built, a command must be
 * the same command: its usage text the same as when every command is built.
 */
class CommandSetTest {
    @Test
    void theRootHelpListsEveryCommand() {
        CliRun h = CliRun.of("--help");
        assertEquals(0, h.code, h.toString());
        for (String c : new String[] {"analyze", "estimate", "check", "help"}) {
            assertTrue(h.out.contains("\n  " + c + " "), c + " missing from\n" + h.out);
        }
    }

    @Test
    void aCommandBuiltAloneIsTheCommandBuiltWithTheOthers() {
        for (String c : new String[] {"analyze", "estimate", "check"}) {
            CliRun alone = CliRun.of(c, "--help"); // only c is built
            CliRun all = CliRun.of("help", c); // every command is built
            assertEquals(0, alone.code, alone.toString());
            assertEquals(all.out, alone.out, c);
        }
    }

    @Test
    void anUnknownCommandIsStillOneLine() {
        CliRun r = CliRun.of("analyse", "model.onnx");
        assertEquals(Main.BAD_INPUT, r.code, r.toString());
        assertEquals(1, r.errLines().size(), r.toString());
        assertTrue(r.err.startsWith("erg: Unmatched argument"), r.err);
    }
}
