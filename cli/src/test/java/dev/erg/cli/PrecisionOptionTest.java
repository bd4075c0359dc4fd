package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * {@code --precision RULE} on estimate and check: the deployed precision of the matching layers, the
 * origin the table shows, a rule that matches nothing, and a malformed rule as a usage error.
 */
class PrecisionOptionTest {
    @TempDir
    Path dir;

    @Test
    void aRuleSetsTheLayersPrecisionAndTheTableSaysItIsAnOverride() {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        CliRun plain = CliRun.of("estimate", model.toString(), "--device", "preset:edge22-reuse");
        assertEquals(0, plain.code, plain.toString());
        assertTrue(plain.out.lines().anyMatch(l -> l.matches("1 +conv +Conv +w8a8 +profile default .*")), plain.out);
        CliRun r = CliRun.of("estimate", model.toString(), "--device", "preset:edge22-reuse", "--precision",
                "conv@Conv=w4a8");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.lines().anyMatch(l -> l.matches("1 +conv +Conv +w4a8 +override .*")), r.out);
        // Weight bytes follow the deployed width: 16 x 8 x 3 x 3 weights at 4 bits are 576 B, at 8 bits 1152 B
        // (INT4 packs two elements per byte: ONNX IR, "int4" element type).
        assertTrue(r.out.contains("Memory: weights 576 B "), r.out);
        assertTrue(plain.out.contains("Memory: weights 1.13 KiB "), plain.out);
    }

    @Test
    void aRuleThatMatchesNothingIsANoteOnCheck() {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        CliRun r = CliRun.of("check", model.toString(), "--device", "preset:edge22-reuse", "--precision",
                "/backbone/*=w4");
        assertEquals(0, r.code, r.toString());
        assertTrue(r.out.startsWith("note: " + model + ": precision rule \"/backbone/*=w4\" matches no node of the"
                + " model; it changes nothing\n"), r.out);
    }

    @Test
    void aMalformedRuleIsOneUsageLineNamingTheOption() {
        Path model = Fixtures.conv(dir, "m.onnx", 16);
        for (String cmd : new String[] {"estimate", "check"}) {
            CliRun r = CliRun.of(cmd, model.toString(), "--device", "preset:edge22-reuse", "--precision", "conv=w4x8");
            assertEquals(Main.BAD_INPUT, r.code, r.toString());
            assertEquals("erg: --precision: precision rule \"conv=w4x8\": write PATTERN[@OP]=wNaM, e.g."
                    + " /backbone/*@Conv=w4a8 (or wN, aM; re:EXPR for a regular expression) (see 'erg " + cmd + " --help')",
                    r.errLines().get(0), r.err);
            assertEquals(1, r.errLines().size(), r.err);
        }
    }
}
