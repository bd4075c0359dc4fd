package dev.erg.device;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import dev.erg.error.BadInputException;
import java.nio.charset.StandardCharsets;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/** Broken profiles of the analog-sum, in-memory and 1-bit keys: one line naming the file, line and key. */
class EngineKindErrorsTest {
    private static final String MEMORIES = "memories:\n  - id: sram\n    capacity-kib: 64\n"
            + "    read-energy-fj-per-byte: 50\n    write-energy-fj-per-byte: 60\n  - id: dram\n"
            + "    read-energy-pj-per-byte: 20\n    write-energy-pj-per-byte: 20\n";

    private static String macro(String... lines) {
        StringBuilder b = new StringBuilder("name: t\nclock-mhz: 100\nengines:\n  - id: m\n    kind: in-memory-macro\n"
                + "    rows: 256\n    columns: 64\n");
        for (String l : lines) {
            b.append("    ").append(l).append('\n');
        }
        return b + MEMORIES;
    }

    private static final String[] MACRO_ENERGIES = {"row-drive-energy-fj: 10", "column-energy-fj: 20",
        "conversion-energy-fj: 100", "converter-bits: 8", "cell-write-energy-fj: 2", "shift-add-energy-fj: 5"};

    private static String macroWith(String extra) {
        String[] lines = new String[MACRO_ENERGIES.length + 1];
        System.arraycopy(MACRO_ENERGIES, 0, lines, 0, MACRO_ENERGIES.length);
        lines[MACRO_ENERGIES.length] = extra;
        return macro(lines);
    }

    private static final String CACHES = "memories:\n  - id: l1\n    level: cache\n    capacity-kib: 32\n"
            + "    bytes-per-cycle: 64\n  - id: dram\n    gbytes-per-second: 10\n";

    private static String cpu(String... lines) {
        StringBuilder b = new StringBuilder("name: t\nclock-mhz: 1000\nengines:\n  - id: c\n    kind: cpu\n");
        for (String l : lines) {
            b.append("    ").append(l).append('\n');
        }
        return b.toString();
    }

    static Stream<Arguments> cases() {
        return Stream.of(
                Arguments.of(cpu("cores: 2") + CACHES,
                        "p.yaml:4: engines[0].macs-per-cycle-per-core: missing (a cpu needs cores and "
                                + "macs-per-cycle-per-core)"),
                Arguments.of(cpu("cores: 2", "macs-per-cycle-per-core: { fp32: 0 }") + CACHES,
                        "p.yaml:7: engines[0].macs-per-cycle-per-core.fp32: must be greater than 0 (got 0)"),
                Arguments.of(cpu("cores: 2", "macs-per-cycle: { fp32: 16 }") + CACHES,
                        "p.yaml:7: engines[0].macs-per-cycle: no unit; write macs-per-cycle-per-core"),
                Arguments.of(cpu("cores: 2", "macs-per-cycle-per-core: { fp32: 16 }", "mac-energy-fj: { fp32: 900 }")
                                + CACHES,
                        "p.yaml:4: engines[0].op-energy-fj: missing (give op-energy-fj or op-energy-pj)"),
                Arguments.of(cpu("cores: 2", "macs-per-cycle-per-core: { fp32: 16 }", "mac-energy-fj: { fp32: 900 }",
                                "op-energy-fj: { fp32: 90 }") + CACHES,
                        "p.yaml:11: memories[0].read-energy-fj-per-byte: missing (give every energy of the profile or "
                                + "none: a processor profile without energies has its energy reported as unknown)"),
                Arguments.of(cpu("cores: 2", "macs-per-cycle-per-core: { fp32: 16 }") + CACHES.replace(
                                "  - id: dram", "  - id: sram\n    capacity-kib: 64\n  - id: dram"),
                        "p.yaml:13: memories[1]: an sram level beside cache levels (a profile has one sram or cache "
                                + "levels)"),
                Arguments.of(cpu("cores: 2", "macs-per-cycle-per-core: { fp32: 16 }") + CACHES.replace(
                                "    bytes-per-cycle: 64\n", "    bytes-per-cycle: 64\n    gbytes-per-second: 100\n"),
                        "p.yaml:13: memories[0].gbytes-per-second: give bytes-per-cycle or gbytes-per-second, not both "
                                + "(bytes-per-cycle is on line 12)"),
                Arguments.of(macro("row-drive-energy-fj: 10", "column-energy-fj: 20", "converter-bits: 8",
                        "cell-write-energy-fj: 2", "shift-add-energy-fj: 5"),
                        "p.yaml:4: engines[0].conversion-energy-fj: missing (an in-memory-macro needs rows, columns, "
                                + "row-drive-energy-fj, column-energy-fj, conversion-energy-fj, converter-bits, "
                                + "cell-write-energy-fj and shift-add-energy-fj)"),
                Arguments.of(macroWith("rows-active: 300"),
                        "p.yaml:14: engines[0].rows-active: must be at most 256 (got 300)"),
                Arguments.of(macroWith("bits-per-cell: 0"),
                        "p.yaml:14: engines[0].bits-per-cell: must be greater than 0 (got 0)"),
                Arguments.of(macroWith("conversion-energy: 3"),
                        "p.yaml:14: engines[0].conversion-energy: no unit; write conversion-energy-fj"),
                Arguments.of(macroWith("dataflow: weight-stationary"),
                        "p.yaml:14: engines[0].dataflow: not used by an in-memory-macro engine (known: id, kind, rows, "
                                + "columns, macros, bits-per-cell, weight-bits, rows-active, input-bits-per-cycle, "
                                + "row-drive-energy-fj, column-energy-fj, conversion-energy-fj, converter-bits, "
                                + "cell-write-energy-fj, shift-add-energy-fj, write-cycles-per-row, accumulator-bits, "
                                + "layer-overhead-cycles)"),
                Arguments.of("name: t\nclock-mhz: 100\nengines:\n  - id: a\n    kind: mac-array\n    rows: 8\n"
                        + "    columns: 8\n    dataflow: weight-stationary\n    mac-energy-fj: { int8: 50 }\n"
                        + "    xnor-energy-fj: 0.1\n" + MEMORIES,
                        "p.yaml:10: engines[0].popcount-energy-fj: missing (give xnor-energy-fj and popcount-energy-fj "
                                + "together)"),
                Arguments.of("name: t\nclock-mhz: 100\nengines:\n  - id: a\n    kind: analog-sum-array\n    rows: 8\n"
                        + "    columns: 8\n    multiply-energy-fj: { int8: 50 }\n    accumulation-energy-fj: 1\n"
                        + "    conversion-energy-fj: 100\n    converter-bits: 40\n    partial-add-energy-fj: 5\n" + MEMORIES,
                        "p.yaml:11: engines[0].converter-bits: must be at most 32 (got 40)"));
    }

    @ParameterizedTest
    @MethodSource("cases")
    void oneLineNamingFileLineAndKey(String yaml, String message) {
        BadInputException e = assertThrows(BadInputException.class,
                () -> DeviceLoader.parse("p.yaml", yaml.getBytes(StandardCharsets.UTF_8), false));
        assertEquals(message, e.getMessage());
    }
}
