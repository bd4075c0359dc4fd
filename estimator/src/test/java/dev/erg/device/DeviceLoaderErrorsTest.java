package dev.erg.device;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/** Each bad profile gives one line naming the file, the line and the key path. */
class DeviceLoaderErrorsTest {
    /** A valid profile; the cases below change one line of it (line numbers as in the comments). */
    static final List<String> BASE = List.of(
            "name: Feeder test",                       // 1
            "clock-mhz: 200",                          // 2
            "engines:",                                // 3
            "  - id: mac-array",                       // 4
            "    kind: mac-array",                     // 5
            "    rows: 16",                            // 6
            "    columns: 16",                         // 7
            "    dataflow: weight-stationary",         // 8
            "    mac-energy-fj: { int8: 150 }",        // 9
            "  - id: vector",                          // 10
            "    kind: vector",                        // 11
            "    lanes: 32",                           // 12
            "    op-energy-fj: { int8: 30 }",          // 13
            "memories:",                               // 14
            "  - id: sram",                            // 15
            "    capacity-kib: 512",                   // 16
            "    read-energy-fj-per-byte: 120",        // 17
            "    write-energy-fj-per-byte: 150",       // 18
            "  - id: dram",                            // 19
            "    read-energy-pj-per-byte: 60",         // 20
            "    write-energy-pj-per-byte: 60");       // 21

    @TempDir
    Path dir;

    /** BASE with line {@code n} (1-based) replaced by {@code lines} (none deletes it). */
    static String replace(int n, String... lines) {
        List<String> l = new ArrayList<>(BASE);
        l.remove(n - 1);
        l.addAll(n - 1, Arrays.asList(lines));
        return String.join("\n", l) + "\n";
    }

    /** BASE without lines {@code from} to {@code to} (1-based, inclusive). */
    static String delete(int from, int to) {
        List<String> l = new ArrayList<>(BASE);
        l.subList(from - 1, to).clear();
        return String.join("\n", l) + "\n";
    }

    /** BASE with {@code lines} inserted after line {@code n}. */
    static String insert(int n, String... lines) {
        List<String> l = new ArrayList<>(BASE);
        l.addAll(n, Arrays.asList(lines));
        return String.join("\n", l) + "\n";
    }

    private String load(String fileName, String text) throws Exception {
        Path f = dir.resolve(fileName);
        Files.createDirectories(f.getParent());
        Files.writeString(f, text, StandardCharsets.UTF_8);
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load(fileName, dir));
        assertFalse(e.getMessage().contains("\n"), "one line: " + e.getMessage());
        return e.getMessage();
    }

    @Test
    void baseIsValid() throws Exception {
        Files.writeString(dir.resolve("feeder.yaml"), String.join("\n", BASE) + "\n");
        DeviceProfile p = DeviceLoader.load("feeder.yaml", dir);
        assertEquals(2, p.engines().size());
    }

    static Stream<Arguments> cases() {
        return Stream.of(
            Arguments.of("unknown key", insert(11, "    rowz: 4"),
                    "feeder.yaml:12: engines[1].rowz: unknown key (known: id, kind, lanes, op-energy-fj, op-energy-pj, multiply-fraction, layer-overhead-cycles)"),
            Arguments.of("unknown mac key", replace(6, "    rowz: 16"),
                    "2 faults: feeder.yaml:4: engines[0].rows: missing (a mac-array needs rows, columns and dataflow); feeder.yaml:6: engines[0].rowz: unknown key (known: id, kind, rows, columns, dataflow, mac-energy-fj, mac-energy-pj, multiply-fraction, accumulator-bits, layer-overhead-cycles, xnor-energy-fj, popcount-energy-fj)"),
            Arguments.of("no unit", replace(16, "    capacity: 512"),
                    "feeder.yaml:16: memories[0].capacity: no unit; write capacity-kib, capacity-mib or capacity-bytes"),
            Arguments.of("unknown unit", replace(16, "    capacity-kb: 512"),
                    "feeder.yaml:16: memories[0].capacity-kb: unknown unit; write capacity-kib, capacity-mib or capacity-bytes"),
            Arguments.of("zero capacity", replace(16, "    capacity-kib: 0"),
                    "feeder.yaml:16: memories[0].capacity-kib: must be greater than 0 (got 0)"),
            Arguments.of("negative energy", replace(17, "    read-energy-fj-per-byte: -1"),
                    "feeder.yaml:17: memories[0].read-energy-fj-per-byte: must not be negative (got -1)"),
            Arguments.of("text for number", replace(2, "clock-mhz: fast"),
                    "feeder.yaml:2: clock-mhz: must be a number (got text \"fast\")"),
            Arguments.of("quoted number", replace(2, "clock-mhz: \"200\""),
                    "feeder.yaml:2: clock-mhz: must be a number (got text \"200\"; write it without quotes)"),
            Arguments.of("list for number", replace(6, "    rows: [16]"),
                    "feeder.yaml:6: engines[0].rows: must be a number (got a list)"),
            Arguments.of("fractional rows", replace(6, "    rows: 2.5"),
                    "feeder.yaml:6: engines[0].rows: must be a whole number (got 2.5)"),
            Arguments.of("hex", replace(6, "    rows: 0x10"),
                    "feeder.yaml:6: engines[0].rows: must be a plain decimal number (got 0x10)"),
            Arguments.of("inf", replace(2, "clock-mhz: .inf"),
                    "feeder.yaml:2: clock-mhz: must be a plain decimal number (got .inf)"),
            Arguments.of("duplicate key", insert(7, "    rows: 8"),
                    "feeder.yaml:8: engines[0].rows: duplicate key (first on line 6)"),
            Arguments.of("both fj and pj", insert(9, "    mac-energy-pj: { int8: 0.15 }"),
                    "feeder.yaml:10: engines[0].mac-energy-pj: give mac-energy-fj or mac-energy-pj, not both (mac-energy-fj is on line 9)"),
            Arguments.of("both read fj and pj", insert(20, "    read-energy-fj-per-byte: 60000"),
                    "feeder.yaml:21: memories[1].read-energy-fj-per-byte: give read-energy-fj-per-byte or read-energy-pj-per-byte, not both (read-energy-pj-per-byte is on line 20)"),
            Arguments.of("unknown dataflow", replace(8, "    dataflow: row-stationary"),
                    "feeder.yaml:8: engines[0].dataflow: unknown dataflow \"row-stationary\" (known: weight-stationary, output-stationary, no-reuse)"),
            Arguments.of("unknown kind", replace(11, "    kind: gpu"),
                    "feeder.yaml:11: engines[1].kind: unknown kind \"gpu\" (known: mac-array, vector, analog-sum-array, in-memory-macro, cpu)"),
            Arguments.of("unknown precision", replace(9, "    mac-energy-fj: { int8: 150, int99: 80 }"),
                    "feeder.yaml:9: engines[0].mac-energy-fj.int99: unknown precision label (known: bf16, fp16, fp32, fp4, fp64, fp8e4m3, fp8e4m3fnuz, fp8e5m2, fp8e5m2fnuz, int16, int32, int4, int64, int8, uint16, uint32, uint4, uint64, uint8, int1 to int64, uint1 to uint64, or a weight/activation pair such as w4a8)"),
            Arguments.of("unknown deploy precision", insert(2, "deploy-precision: int99"),
                    "feeder.yaml:3: deploy-precision: unknown precision label \"int99\" (known: bf16, fp16, fp32, fp4, fp64, fp8e4m3, fp8e4m3fnuz, fp8e5m2, fp8e5m2fnuz, int16, int32, int4, int64, int8, uint16, uint32, uint4, uint64, uint8, int1 to int64, uint1 to uint64)"),
            Arguments.of("yaml syntax", replace(7, "    columns: 16: 17"),
                    "feeder.yaml:7: not valid YAML: mapping values are not allowed here"),
            Arguments.of("missing name", replace(1),
                    "feeder.yaml:1: name: missing (a profile needs name, clock-mhz, engines and memories)"),
            Arguments.of("missing rows", replace(6),
                    "feeder.yaml:4: engines[0].rows: missing (a mac-array needs rows, columns and dataflow)"),
            Arguments.of("missing energy", replace(9),
                    "feeder.yaml:4: engines[0].mac-energy-fj: missing (give mac-energy-fj or mac-energy-pj)"),
            Arguments.of("missing sram", delete(15, 18),
                    "feeder.yaml:15: memories: no sram level (a profile needs sram and dram, or cache levels and dram; registers are optional)"),
            Arguments.of("second sram", replace(19, "  - id: sram2", "    level: sram", "    capacity-kib: 1"),
                    "2 faults: feeder.yaml:15: memories: no dram level (a profile needs sram and dram, or cache levels and dram; registers are optional); feeder.yaml:19: memories[1]: a second sram level (the first is memories[0] on line 15)"),
            Arguments.of("level unknown", replace(19, "  - id: offchip"),
                    "feeder.yaml:19: memories[1].level: missing (the id \"offchip\" names no level; add level: registers, sram, cache or dram)"),
            Arguments.of("capacity on dram", insert(19, "    capacity-kib: 8192"),
                    "feeder.yaml:20: memories[1].capacity-kib: not used for a dram level (known: id, level, read-energy-fj-per-byte, read-energy-pj-per-byte, write-energy-fj-per-byte, write-energy-pj-per-byte, bytes-per-cycle, gbytes-per-second)"),
            Arguments.of("vector key on mac", insert(9, "    lanes: 4"),
                    "feeder.yaml:10: engines[0].lanes: not used by a mac-array engine (known: id, kind, rows, columns, dataflow, mac-energy-fj, mac-energy-pj, multiply-fraction, accumulator-bits, layer-overhead-cycles, xnor-energy-fj, popcount-energy-fj)"),
            Arguments.of("fraction range", insert(9, "    multiply-fraction: 1.5"),
                    "feeder.yaml:10: engines[0].multiply-fraction: must be at most 1 (got 1.5)"),
            Arguments.of("duplicate engine id", replace(10, "  - id: mac-array"),
                    "feeder.yaml:10: engines[1].id: duplicate id \"mac-array\" (also engines[0])"),
            Arguments.of("no engines", delete(4, 13).replace("engines:\n", "engines: []\n"),
                    "feeder.yaml:3: engines: must not be an empty list"),
            Arguments.of("source unknown path", insert(21, "sources:", "  engines[0].rowz: example"),
                    "feeder.yaml:23: sources.engines[0].rowz: names no key of this profile (write key paths as in messages, e.g. engines[0].rows)"),
            Arguments.of("alias", replace(7, "    columns: *x"),
                    "feeder.yaml:7: engines[0].columns: YAML aliases (*x) are not supported; write the value out"),
            Arguments.of("second document", insert(21, "---", "name: again"),
                    "feeder.yaml:23: a second document starts here; a profile file holds one"),
            Arguments.of("root list", "- a\n- b\n",
                    "feeder.yaml:1: a device profile must be a mapping of keys (got a list)"),
            Arguments.of("empty", "",
                    "feeder.yaml: the file is empty; a device profile needs name, clock-mhz, engines and memories"),
            Arguments.of("name as number", replace(1, "name: 2024"),
                    "feeder.yaml:1: name: must be text (got 2024; put it in quotes)"),
            Arguments.of("both bandwidths", insert(18, "    bytes-per-cycle: 8", "    gbytes-per-second: 1"),
                    "feeder.yaml:20: memories[0].gbytes-per-second: give bytes-per-cycle or gbytes-per-second, not both (bytes-per-cycle is on line 19)"),
            Arguments.of("capacity fraction bytes", replace(16, "    capacity-kib: 0.3"),
                    "feeder.yaml:16: memories[0].capacity-kib: must come to a whole number of bytes (got 0.3)"),
            Arguments.of("tab indent", replace(7, "\tcolumns: 16"),
                    "feeder.yaml:7: not valid YAML: found character '\\t(TAB)' that cannot start any token. (Do not use \\t(TAB) for indentation)"),
            Arguments.of("deep", insert(1, "description: " + "[".repeat(30) + "]".repeat(30)),
                    "feeder.yaml:2: description[0][0][0][0][0][0][0][0][0][0][0][0][0][0][0][0]: nested too deeply (more than 16 levels)"),
            Arguments.of("missing read energy", replace(17),
                    "feeder.yaml:15: memories[0].read-energy-fj-per-byte: missing (give read-energy-fj-per-byte or read-energy-pj-per-byte)"),
            Arguments.of("missing capacity", replace(16),
                    "feeder.yaml:15: memories[0].capacity-kib: missing (give capacity-kib, capacity-mib or capacity-bytes)"),
            Arguments.of("engine not a map", replace(10, "  - vector", "  - id: v2"),
                    "feeder.yaml:10: engines[1]: must be a mapping of keys (got text \"vector\")"),
            Arguments.of("energy table not a map", replace(13, "    op-energy-fj: 30"),
                    "feeder.yaml:13: engines[1].op-energy-fj: must be a mapping of keys (got 30)"),
            Arguments.of("empty energy table", replace(13, "    op-energy-fj: {}"),
                    "feeder.yaml:13: engines[1].op-energy-fj: must not be empty (give at least one, e.g. { int8: 150 })"),
            Arguments.of("null value", replace(2, "clock-mhz:"),
                    "feeder.yaml:2: clock-mhz: must be a number (got nothing)"),
            Arguments.of("octal-looking", replace(6, "    rows: 016"),
                    "feeder.yaml:6: engines[0].rows: must be a plain decimal number (got 016)"),
            Arguments.of("bad id", replace(10, "  - id: \"a b\""),
                    "feeder.yaml:10: engines[1].id: must be 1 to 64 letters, digits, '.', '_' or '-', starting with a letter or digit (got \"a b\")"),
            Arguments.of("registers capacity", insert(14, "  - id: registers", "    capacity-kib: 1", "    read-energy-fj-per-byte: 1", "    write-energy-fj-per-byte: 1"),
                    "feeder.yaml:16: memories[0].capacity-kib: not used for a registers level (known: id, level, read-energy-fj-per-byte, read-energy-pj-per-byte, write-energy-fj-per-byte, write-energy-pj-per-byte)"),
            Arguments.of("unknown root key", insert(2, "clock-ghz: 0.2"),
                    "feeder.yaml:3: clock-ghz: unknown unit; write clock-mhz"),
            Arguments.of("bad level", insert(19, "    level: l3"),
                    "feeder.yaml:20: memories[1].level: unknown level \"l3\" (known: registers, sram, cache, dram)"),
            Arguments.of("rows too big", replace(6, "    rows: 100000"),
                    "feeder.yaml:6: engines[0].rows: must be at most 65536 (got 100000)"));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void oneLineNamingFileLineAndKey(String name, String text, String expected) throws Exception {
        assertEquals(expected, load("feeder.yaml", text));
    }

    // ---- files, presets and JSON ----

    @Test
    void missingFileNamesThePathAsGiven() {
        BadInputException e = assertThrows(BadInputException.class,
                () -> DeviceLoader.load("profiles/nope.yaml", dir));
        assertEquals("profiles/nope.yaml: no such device profile file", e.getMessage());
    }

    @Test
    void pathsResolveAgainstTheBaseDirAndMessagesKeepThemAsGiven() throws Exception {
        Path base = Files.createDirectories(dir.resolve("project"));
        Files.writeString(dir.resolve("shared.yaml"), String.join("\n", BASE) + "\n");
        assertEquals("../shared.yaml", DeviceLoader.load("../shared.yaml", base).id());
        Files.createDirectories(base.resolve("hw"));
        Files.writeString(base.resolve("hw/feeder.yaml"), replace(6, "    rowz: 16"));
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load("hw/feeder.yaml", base));
        assertTrue(e.getMessage().contains("; hw/feeder.yaml:6: engines[0].rowz: unknown key"), e.getMessage());
    }

    @Test
    void wrongExtensionIsRejectedBeforeReading() {
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load("feeder.txt", dir));
        assertEquals("feeder.txt: not a device profile file name (it must end in .yaml, .yml or .json, or use "
                + "preset:ID; presets: edge22-analog, edge22-in-memory, edge22-no-reuse, edge22-reuse, edge22-xnor, feeder-npu, generic-45nm, host-2core-example, validation-65nm, validation-in-memory-65nm)", e.getMessage());
    }

    @Test
    void unknownPresetListsThePresets() {
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load("preset:nope", dir));
        assertEquals("preset:nope: no such preset (presets: edge22-analog, edge22-in-memory, edge22-no-reuse, edge22-reuse, edge22-xnor, feeder-npu, generic-45nm, host-2core-example, validation-65nm, validation-in-memory-65nm)",
                e.getMessage());
        e = assertThrows(BadInputException.class, () -> DeviceLoader.load("preset:../../secret", dir));
        assertTrue(e.getMessage().startsWith("preset:../../secret: no such preset"), e.getMessage());
    }

    @Test
    void directoryIsNotAProfile() throws Exception {
        Files.createDirectories(dir.resolve("looks.yaml"));
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load("looks.yaml", dir));
        assertEquals("looks.yaml: is a directory, not a device profile file", e.getMessage());
    }

    /** A file over the cap is refused without being parsed (no out-of-memory on a huge file). */
    @Test
    void hugeFileIsRefused() throws Exception {
        byte[] big = new byte[DeviceLoader.MAX_FILE_BYTES + 1];
        Arrays.fill(big, (byte) '#');
        Files.write(dir.resolve("big.yaml"), big);
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load("big.yaml", dir));
        assertEquals("big.yaml: too large for a device profile (more than 1 MiB)", e.getMessage());
    }

    @Test
    void invalidUtf8IsOneLine() throws Exception {
        byte[] head = "name: Feeder ".getBytes(StandardCharsets.US_ASCII);
        byte[] data = Arrays.copyOf(head, head.length + 3);
        data[head.length] = (byte) 0xff;   // never valid in UTF-8
        data[head.length + 1] = (byte) 0xfe;
        data[head.length + 2] = '\n';
        Files.write(dir.resolve("junk.yaml"), data);
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load("junk.yaml", dir));
        assertEquals("junk.yaml:1: not UTF-8 text (a profile file must be UTF-8)", e.getMessage());
    }

    @Test
    void blankSpecIsRejected() {
        BadInputException e = assertThrows(BadInputException.class, () -> DeviceLoader.load(" ", dir));
        assertTrue(e.getMessage().startsWith("device profile: none given"), e.getMessage());
    }

    static final String JSON = String.join("\n",
            "{",                                                                      // 1
            "  \"name\": \"Feeder test\",",                                           // 2
            "  \"clock-mhz\": 200,",                                                  // 3
            "  \"engines\": [",                                                       // 4
            "    { \"id\": \"mac-array\", \"kind\": \"mac-array\", \"rows\": 16, \"columns\": 16,", // 5
            "      \"dataflow\": \"weight-stationary\", \"mac-energy-fj\": { \"int8\": 150 } }", // 6
            "  ],",                                                                   // 7
            "  \"memories\": [",                                                      // 8
            "    { \"id\": \"sram\", \"capacity-kib\": 512,",                          // 9
            "      \"read-energy-fj-per-byte\": 120, \"write-energy-fj-per-byte\": 150 },", // 10
            "    { \"id\": \"dram\", \"read-energy-pj-per-byte\": 60, \"write-energy-pj-per-byte\": 60 }", // 11
            "  ]",                                                                    // 12
            "}", "");

    @Test
    void jsonProfileLoads() throws Exception {
        Files.writeString(dir.resolve("feeder.json"), JSON);
        DeviceProfile p = DeviceLoader.load("feeder.json", dir);
        assertEquals(512 * 1024, p.sram().capacityBytes());
    }

    static Stream<Arguments> jsonCases() {
        return Stream.of(
            Arguments.of(JSON.replace("\"capacity-kib\": 512", "\"capacity-kib\": \"512\""),
                    "feeder.json:9: memories[0].capacity-kib: must be a number (got text \"512\"; write it without "
                    + "quotes)"),
            Arguments.of(JSON.replace("\"rows\": 16,", "\"rows\": 16, \"rows\": 8,"),
                    "feeder.json:5: engines[0].rows: duplicate key (first on line 5)"),
            Arguments.of(JSON.replace("\"clock-mhz\": 200,", "\"clock-mhz\": 200"),
                    "feeder.json:4: not valid JSON: Unexpected character ('\"' (code 34)): was expecting comma to "
                    + "separate Object entries"),
            Arguments.of(JSON.replace("{ \"int8\": 150 }", "{ \"int8\": 150, \"fp16\": 1e999 }"),
                    "feeder.json:6: engines[0].mac-energy-fj.fp16: must be a finite number (got 1e999)"),
            Arguments.of(JSON + "{}\n", "feeder.json:14: a second document starts here; a profile file holds one"));
    }

    @ParameterizedTest
    @MethodSource("jsonCases")
    void jsonErrorsNameLineAndKey(String text, String expected) throws Exception {
        assertEquals(expected, load("feeder.json", text));
    }
}
