package dev.erg.device;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import com.networknt.schema.JsonSchema;
import com.networknt.schema.JsonSchemaFactory;
import com.networknt.schema.SpecVersion;
import com.networknt.schema.ValidationMessage;
import dev.erg.error.BadInputException;
import java.io.InputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Set;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * docs/device-profile.schema.json (JSON Schema draft 2020-12) accepts the presets and the examples
 * and rejects broken documents; the loader agrees with it on every document here.
 */
class DeviceProfileSchemaTest {
    private static final ObjectMapper YAML = new ObjectMapper(new YAMLFactory());
    private static JsonSchema schema;

    @BeforeAll
    static void loadSchema() throws Exception {
        try (InputStream in = Files.newInputStream(TestFiles.repoRoot().resolve("docs/device-profile.schema.json"))) {
            schema = JsonSchemaFactory.getInstance(SpecVersion.VersionFlag.V202012).getSchema(in);
        }
    }

    private static Set<ValidationMessage> validate(String yamlOrJson) throws Exception {
        JsonNode doc = YAML.readTree(yamlOrJson);
        return schema.validate(doc);
    }

    @Test
    void schemaDeclaresDraft202012() throws Exception {
        JsonNode s = new ObjectMapper().readTree(TestFiles.repoRoot().resolve("docs/device-profile.schema.json")
                .toFile());
        assertEquals("https://json-schema.org/draft/2020-12/schema", s.get("$schema").asText());
    }

    /** The precision labels the schema lists are the numeric element types of the ONNX standard, as erg names them. */
    @Test
    void thePrecisionLabelsAreTheNumericElementTypes() {
        Set<String> labels = new java.util.TreeSet<>();
        for (dev.erg.onnx.ElemType t : dev.erg.onnx.ElemType.values()) {
            if ((t.isFloat() || t.isInteger()) && t != dev.erg.onnx.ElemType.BOOL) {
                labels.add(t.label);
            }
        }
        Set<String> listed = new java.util.TreeSet<>();
        ProfileSchema.schemaJson().at("/$defs/precision/anyOf/0/enum").forEach(n -> listed.add(n.asText()));
        assertEquals(labels, listed);
    }

    /** Every fault of a file is reported at once, on one line: "N faults: a; b; c", in line order. */
    @Test
    void everyFaultOfAFileIsReportedAtOnce() {
        String text = DeviceLoaderErrorsTest.BASE.stream().map(l -> l.equals("clock-mhz: 200") ? "clock-mhz: fast"
                : l.equals("    rows: 16") ? "    rows: 2.5" : l.equals("    read-energy-fj-per-byte: 120")
                ? "    read-energy-fj-per-byte: -1" : l).collect(java.util.stream.Collectors.joining("\n", "", "\n"));
        BadInputException e = assertThrows(BadInputException.class,
                () -> DeviceLoader.parse("bad.yaml", text.getBytes(StandardCharsets.UTF_8), false));
        assertEquals("3 faults: bad.yaml:2: clock-mhz: must be a number (got text \"fast\"); "
                + "bad.yaml:6: engines[0].rows: must be a whole number (got 2.5); "
                + "bad.yaml:17: memories[0].read-energy-fj-per-byte: must not be negative (got -1)", e.getMessage());
    }

    static List<String> presets() {
        return DeviceLoader.presetIds();
    }

    @ParameterizedTest
    @MethodSource("presets")
    void everyPresetIsValid(String id) throws Exception {
        Set<ValidationMessage> errors = validate(TestFiles.presetText(id));
        assertTrue(errors.isEmpty(), id + ": " + errors);
    }

    @ParameterizedTest
    @MethodSource("examples")
    void everyExampleIsValid(String name) throws Exception {
        String text = Files.readString(TestFiles.repoRoot().resolve("docs/examples").resolve(name),
                StandardCharsets.UTF_8);
        Set<ValidationMessage> errors = validate(text);
        assertTrue(errors.isEmpty(), name + ": " + errors);
    }

    /** The profile of the hearing-aid sample (samples/hearing-aid-kws) is valid too, and loads. */
    @Test
    void theSampleProfileIsValid() throws Exception {
        Path f = TestFiles.repoRoot().resolve("samples/hearing-aid-kws/earbud-imc.yaml");
        Set<ValidationMessage> errors = validate(Files.readString(f, StandardCharsets.UTF_8));
        assertTrue(errors.isEmpty(), errors.toString());
        assertEquals(Engine.Kind.IN_MEMORY_MACRO, DeviceLoader.load(f.toString(), null).engines().get(0).kind());
    }

    static Stream<String> examples() throws Exception {
        Path dir = TestFiles.repoRoot().resolve("docs/examples");
        List<String> names;
        try (Stream<Path> s = Files.list(dir)) {
            names = s.map(p -> p.getFileName().toString())
                    .filter(n -> n.endsWith(".yaml") || n.endsWith(".yml") || n.endsWith(".json")).sorted().toList();
        }
        assertFalse(names.isEmpty());
        return names.stream();
    }

    @Test
    void theLoaderAcceptsTheBaseDocument() throws Exception {
        String base = String.join("\n", DeviceLoaderErrorsTest.BASE) + "\n";
        assertTrue(validate(base).isEmpty(), validate(base).toString());
        DeviceLoader.parse("base.yaml", base.getBytes(StandardCharsets.UTF_8), false);
    }

    static Stream<Arguments> invalid() {
        return Stream.of(
            Arguments.of("unknown key", DeviceLoaderErrorsTest.replace(6, "    rowz: 16")),
            Arguments.of("no unit", DeviceLoaderErrorsTest.replace(16, "    capacity: 512")),
            Arguments.of("zero capacity", DeviceLoaderErrorsTest.replace(16, "    capacity-kib: 0")),
            Arguments.of("rows not a number", DeviceLoaderErrorsTest.replace(6, "    rows: \"16\"")),
            Arguments.of("fractional rows", DeviceLoaderErrorsTest.replace(6, "    rows: 2.5")),
            Arguments.of("both fj and pj", DeviceLoaderErrorsTest.insert(9, "    mac-energy-pj: { int8: 0.15 }")),
            Arguments.of("no mac energy", DeviceLoaderErrorsTest.replace(9)),
            Arguments.of("unknown dataflow", DeviceLoaderErrorsTest.replace(8, "    dataflow: row-stationary")),
            Arguments.of("unknown kind", DeviceLoaderErrorsTest.replace(11, "    kind: gpu")),
            Arguments.of("unknown precision", DeviceLoaderErrorsTest.replace(13, "    op-energy-fj: { int99: 30 }")),
            Arguments.of("missing name", DeviceLoaderErrorsTest.replace(1)),
            Arguments.of("no sram", DeviceLoaderErrorsTest.delete(15, 18)),
            Arguments.of("two sram levels",
                    DeviceLoaderErrorsTest.insert(18, "  - id: buf2", "    level: sram", "    capacity-kib: 1",
                            "    read-energy-fj-per-byte: 1", "    write-energy-fj-per-byte: 1")),
            Arguments.of("id names no level", DeviceLoaderErrorsTest.replace(19, "  - id: offchip")),
            Arguments.of("capacity on dram", DeviceLoaderErrorsTest.insert(19, "    capacity-kib: 8")),
            Arguments.of("sram without capacity", DeviceLoaderErrorsTest.replace(16)),
            Arguments.of("lanes on a mac array", DeviceLoaderErrorsTest.insert(9, "    lanes: 4")),
            Arguments.of("multiply fraction above 1", DeviceLoaderErrorsTest.insert(9, "    multiply-fraction: 1.5")),
            Arguments.of("no engines", DeviceLoaderErrorsTest.delete(4, 13).replace("engines:\n", "engines: []\n")),
            Arguments.of("name as number", DeviceLoaderErrorsTest.replace(1, "name: 2024")),
            Arguments.of("both bandwidths",
                    DeviceLoaderErrorsTest.insert(18, "    bytes-per-cycle: 8", "    gbytes-per-second: 1")),
            Arguments.of("negative static power", DeviceLoaderErrorsTest.insert(2, "static-power-mw: -1")),
            Arguments.of("source not text", DeviceLoaderErrorsTest.insert(21, "sources:", "  clock-mhz: 5")),
            Arguments.of("cache without capacity", CPU.replace("    capacity-kib: 64\n", "")),
            Arguments.of("cache beside sram", CPU.replace("  - id: dram", "  - id: sram\n    capacity-kib: 1\n"
                    + "    read-energy-fj-per-byte: 1\n    write-energy-fj-per-byte: 1\n  - id: dram")),
            Arguments.of("cpu without rates", CPU.replace("    macs-per-cycle-per-core: { fp32: 16 }\n", "")),
            Arguments.of("cpu rate zero", CPU.replace("{ fp32: 16 }", "{ fp32: 0 }")),
            Arguments.of("cpu mac energy without op energy", CPU.replace("    cores: 2\n",
                    "    cores: 2\n    mac-energy-fj: { fp32: 900 }\n")),
            Arguments.of("memory energies on a mac-array profile are required",
                    DeviceLoaderErrorsTest.replace(20)));
    }

    /** A valid processor profile without energies (example values). */
    static final String CPU = "name: host\nclock-mhz: 2000\nengines:\n  - id: cpu\n    kind: cpu\n    cores: 2\n"
            + "    macs-per-cycle-per-core: { fp32: 16 }\nmemories:\n  - id: l1\n    level: cache\n"
            + "    capacity-kib: 64\n    bytes-per-cycle: 64\n  - id: dram\n    gbytes-per-second: 20\n";

    @Test
    void aProcessorProfileWithoutEnergiesIsValid() throws Exception {
        assertTrue(validate(CPU).isEmpty(), validate(CPU).toString());
        assertFalse(DeviceLoader.parse("cpu.yaml", CPU.getBytes(StandardCharsets.UTF_8), false).energyKnown());
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("invalid")
    void brokenDocumentsAreRejectedByTheSchemaAndTheLoader(String name, String text) throws Exception {
        assertFalse(validate(text).isEmpty(), name + ": the schema accepted it");
        assertThrows(BadInputException.class,
                () -> DeviceLoader.parse("bad.yaml", text.getBytes(StandardCharsets.UTF_8), false));
    }
}
