package dev.erg.device;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import dev.erg.device.ProfileTree.Node;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Set;
import java.util.TreeSet;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.MethodSource;

class DeviceLoaderTest {
    private static final double EPS = 1e-6;

    static List<String> presets() {
        return DeviceLoader.presetIds();
    }

    @Test
    void presetIndexMatchesThePresetFiles() throws Exception {
        Path dir = TestFiles.repoRoot().resolve("estimator/src/main/resources/dev/erg/device/presets");
        Set<String> files = new TreeSet<>();
        try (Stream<Path> s = Files.list(dir)) {
            s.map(p -> p.getFileName().toString()).filter(n -> n.endsWith(".yaml"))
                    .forEach(n -> files.add(n.substring(0, n.length() - ".yaml".length())));
        }
        assertEquals(List.copyOf(files), DeviceLoader.presetIds());
        assertEquals(List.of("edge22-analog", "edge22-in-memory", "edge22-no-reuse", "edge22-reuse", "edge22-xnor",
                "feeder-npu", "generic-45nm", "host-2core-example", "validation-65nm", "validation-in-memory-65nm"), DeviceLoader.presetIds());
    }

    @ParameterizedTest
    @MethodSource("presets")
    void everyPresetLoads(String id) {
        DeviceProfile p = DeviceLoader.load("preset:" + id, null);
        assertEquals("preset:" + id, p.id());
        assertNotNull(p.sram());
        assertNotNull(p.dram());
        assertTrue(p.engines().stream().anyMatch(Engine::isArray), "an engine for MAC layers");
        assertFalse(p.sources().isEmpty());
    }

    /** Every number of a preset has an entry in its sources map and a comment on its line. */
    @ParameterizedTest
    @MethodSource("presets")
    void everyPresetNumberNamesItsSource(String id) throws Exception {
        String text = TestFiles.presetText(id);
        Node root = ProfileTree.read(new YAMLFactory().createParser(text), id);
        List<String> numbers = new ArrayList<>();
        List<Integer> lines = new ArrayList<>();
        numericLeaves(root, "", numbers, lines);
        assertFalse(numbers.isEmpty());
        DeviceProfile p = DeviceLoader.load("preset:" + id, null);
        String[] raw = text.split("\n", -1);
        for (int i = 0; i < numbers.size(); i++) {
            String path = numbers.get(i);
            assertTrue(p.sources().containsKey(path), id + ": no source for " + path);
            assertFalse(p.sources().get(path).isBlank(), id + ": empty source for " + path);
            assertTrue(raw[lines.get(i) - 1].contains("#"), id + ": no comment on the line of " + path);
        }
    }

    private static void numericLeaves(Node n, String path, List<String> out, List<Integer> lines) {
        if (n.type == ProfileTree.Type.MAP) {
            for (ProfileTree.Entry e : n.map.values()) {
                if (path.isEmpty() && e.key.equals("sources")) {
                    continue;
                }
                numericLeaves(e.value, path.isEmpty() ? e.key : path + "." + e.key, out, lines);
            }
        } else if (n.type == ProfileTree.Type.LIST) {
            for (int i = 0; i < n.list.size(); i++) {
                numericLeaves(n.list.get(i), path + "[" + i + "]", out, lines);
            }
        } else if (n.isNumber()) {
            out.add(path);
            lines.add(n.line);
        }
    }

    @Test
    void feederPresetIsLabelledInventedThroughout() {
        DeviceProfile p = DeviceLoader.load("preset:feeder-npu", null);
        for (String source : p.sources().values()) {
            assertTrue(source.startsWith("invented for the demo"), source);
        }
        assertEquals("int8", p.deployPrecision());
    }

    // Horowitz, "Computing's Energy Problem (and what we can do about it)", ISSCC 2014 (status: paper),
    // 45 nm: MAC = multiply + add.
    @Test
    void genericPresetCarriesHorowitzEnergies() {
        DeviceProfile p = DeviceLoader.load("preset:generic-45nm", null);
        Engine mac = p.first(Engine.Kind.MAC_ARRAY);
        assertEquals((0.2 + 0.03) * 1000, mac.energyFj().get("int8"), EPS);  // 230 fJ
        assertEquals((3.1 + 0.1) * 1000, mac.energyFj().get("int32"), EPS);  // 3200 fJ
        assertEquals((1.1 + 0.4) * 1000, mac.energyFj().get("fp16"), EPS);   // 1500 fJ
        assertEquals((3.7 + 0.9) * 1000, mac.energyFj().get("fp32"), EPS);   // 4600 fJ
        assertEquals(0.2 / 0.23, mac.multiplyFraction(), 1e-6);
        Engine vec = p.first(Engine.Kind.VECTOR);
        assertEquals(30, vec.energyFj().get("int8"), EPS);
        assertEquals(100, vec.energyFj().get("int32"), EPS);
        assertEquals(400, vec.energyFj().get("fp16"), EPS);
        assertEquals(900, vec.energyFj().get("fp32"), EPS);
        // 1 MB SRAM: 100 pJ per 64-bit access = 100000 fJ / 8 bytes
        assertEquals(1024 * 1024, p.sram().capacityBytes());
        assertEquals(100_000.0 / 8, p.sram().readFjPerByte(), EPS);
        // DRAM 1.3-2.6 nJ per 64-bit access, midpoint: 1.95e6 fJ / 8 bytes
        assertEquals((1.3e6 + 2.6e6) / 2 / 8, p.dram().readFjPerByte(), EPS);
        assertNull(p.registers(), "Horowitz gives no register-file energy");
        assertEquals(0, p.staticPowerMw());
    }

    // Bit-width rule: multiplier energy ~ bits^2, adder ~ bits (Nagel et al., "A White Paper on Neural
    // Network Quantization", arXiv:2106.08295, 2021, section 2.1). int16 is not listed: it comes from
    // int8 (the nearest integer precision): 230 x (f x (16/8)^2 + (1 - f) x 16/8).
    @Test
    void unlistedInt16FollowsTheBitWidthRule() {
        Engine mac = DeviceLoader.load("preset:generic-45nm", null).first(Engine.Kind.MAC_ARRAY);
        double f = mac.multiplyFraction();
        Precisions.Lookup l = Precisions.lookup(mac.energyFj(), "int16", f);
        assertTrue(l.derived);
        assertEquals("int8", l.from);
        assertEquals(230 * (f * 4 + (1 - f) * 2), l.fj, EPS);
        // with f = 0.2 / 0.23 that is Horowitz's 8-bit parts scaled: 0.2 x 4 + 0.03 x 2 = 0.86 pJ
        assertEquals(860, l.fj, 0.01);
        assertEquals(l.fj, mac.energyAt("int16").fj, EPS);
    }

    // Chen, Krishna, Emer, Sze, IEEE JSSC 52(1), 2017 (status: paper): 168 units (12x14), 108 kB
    // global buffer, 16-bit fixed point, 200 MHz. Ratios: Chen, Emer, Sze, ISCA 2016, Table IV
    // (status: memory): register file 1x, global buffer 6x, DRAM 200x one 16-bit MAC per 16-bit access.
    @Test
    void validationPresetCarriesPublishedParameters() {
        DeviceProfile p = DeviceLoader.load("preset:validation-65nm", null);
        Engine mac = p.first(Engine.Kind.MAC_ARRAY);
        assertEquals(168, mac.units());
        assertEquals(12, mac.rows());
        assertEquals(14, mac.columns());
        assertEquals(200, p.clockMhz(), EPS);
        assertEquals(108 * 1024, p.sram().capacityBytes());
        assertEquals("int16", p.deployPrecision());
        double mac16 = (0.2 * 4 + 0.03 * 2) * 1000;   // Horowitz 8-bit parts by the bit-width rule: 860 fJ
        assertEquals(mac16, mac.energyFj().get("int16"), EPS);
        assertEquals(1 * mac16 / 2, p.registers().readFjPerByte(), EPS);
        assertEquals(6 * mac16 / 2, p.sram().readFjPerByte(), EPS);
        assertEquals(200 * mac16 / 2, p.dram().readFjPerByte(), EPS);
        assertEquals(0, p.staticPowerMw());
        assertEquals(Double.POSITIVE_INFINITY, p.dram().bandwidth(p.clockHz()), "no DRAM bandwidth published");
        // its multiply fraction reproduces Horowitz's 8-bit MAC (0.2 + 0.03 pJ) going back down to int8
        assertEquals(230, mac.energyAt("int8").fj, 0.01);
    }

    @Test
    void exampleFileLoadsAndYamlAndJsonGiveTheSameProfile() {
        Path root = TestFiles.repoRoot();
        DeviceProfile y = DeviceLoader.load("docs/examples/example-device.yaml", root);
        DeviceProfile j = DeviceLoader.load("docs/examples/example-device.json", root);
        assertEquals("docs/examples/example-device.yaml", y.id());
        assertEquals(describe(y), describe(j));
        assertEquals(y.sources(), j.sources());
        assertEquals("Example 16x16 int8 accelerator", y.name());
        // hand-worked: 64 bytes per cycle at 400 MHz = 25.6e9 bytes/s; 6.4 GB/s = 6.4e9 bytes/s
        assertEquals(64 * 400e6, y.sram().bandwidth(y.clockHz()), 1);
        assertEquals(6.4e9, y.dram().bandwidth(y.clockHz()), 1);
        assertEquals(60_000, y.dram().readFjPerByte(), EPS);   // 60 pJ = 60000 fJ
        assertEquals(1024 * 1024, y.sram().capacityBytes());
    }

    @Test
    void theReferenceShowsTheExampleFileVerbatim() throws Exception {
        Path root = TestFiles.repoRoot();
        String doc = Files.readString(root.resolve("docs/profiles.md"), StandardCharsets.UTF_8);
        String example = Files.readString(root.resolve("docs/examples/example-device.yaml"), StandardCharsets.UTF_8);
        assertTrue(doc.contains("```yaml\n" + example + "```"), "docs/profiles.md must embed example-device.yaml");
    }

    /** The processor preset loads with its caches nearest first, no energies, and is shown verbatim in the reference. */
    @Test
    void theHostPresetIsACpuWithCachesAndIsShownVerbatim() throws Exception {
        Path root = TestFiles.repoRoot();
        String doc = Files.readString(root.resolve("docs/profiles.md"), StandardCharsets.UTF_8);
        assertTrue(doc.contains("```yaml\n" + TestFiles.presetText("host-2core-example") + "```"),
                "docs/profiles.md must embed host-2core-example.yaml");
        DeviceProfile p = DeviceLoader.load("preset:host-2core-example", null);
        Engine cpu = p.engines().get(0);
        assertEquals(Engine.Kind.CPU, cpu.kind());
        assertEquals(2, cpu.cpu().cores());
        assertEquals(16.0, cpu.cpu().macsPerCycle().get("fp32"));
        assertEquals(List.of("l1", "l2", "l3"), p.caches().stream().map(Memory::id).toList());
        assertEquals(64 * 1024, p.caches().get(0).capacityBytes());
        assertEquals(8L << 20, p.sram().capacityBytes()); // the last cache is the on-chip capacity
        assertEquals(20e9, p.dram().bandwidth(p.clockHz()));
        assertFalse(p.energyKnown());
    }

    /** The examples of the new engine kinds load, carry their keys, and appear verbatim in docs/profiles.md. */
    @Test
    void analogAndInMemoryExamplesLoadAndAreShownVerbatim() throws Exception {
        Path root = TestFiles.repoRoot();
        String doc = Files.readString(root.resolve("docs/profiles.md"), StandardCharsets.UTF_8);
        for (String name : List.of("example-in-memory.yaml", "example-analog.yaml")) {
            String text = Files.readString(root.resolve("docs/examples").resolve(name), StandardCharsets.UTF_8);
            assertTrue(doc.contains("```yaml\n" + text + "```"), "docs/profiles.md must embed " + name);
        }
        DeviceProfile m = DeviceLoader.load("docs/examples/example-in-memory.yaml", root);
        Engine macro = m.engines().get(0);
        assertEquals(Engine.Kind.IN_MEMORY_MACRO, macro.kind());
        assertEquals(4L * 256 * 128, macro.units());
        assertEquals(new Engine.Macro(2, 4, 4, 64, 1, 30, 40, 150, 6, 4, 8, 1), macro.macro());
        assertEquals(24, macro.accumulatorBits());
        assertEquals(16, macro.layerOverheadCycles());
        DeviceProfile a = DeviceLoader.load("docs/examples/example-analog.yaml", root);
        Engine analog = a.engines().get(0);
        assertEquals(Engine.Kind.ANALOG_SUM_ARRAY, analog.kind());
        assertEquals(new Engine.AnalogSum(0.3, 120, 7, 12), analog.analog());
        assertEquals(3, analog.energyAt("int4").fj);
        assertEquals(new Engine.Binary(0.15, 1.2), a.engines().get(1).binary());
        assertEquals(25, a.engines().get(1).energyAt("w4a8").fj);
    }

    static String describe(DeviceProfile p) {
        StringBuilder b = new StringBuilder();
        b.append(p.name()).append('|').append(p.description()).append('|').append(p.clockMhz()).append('|')
                .append(p.staticPowerMw()).append('|').append(p.deployPrecision()).append('\n');
        for (Engine e : p.engines()) {
            b.append(e.id()).append(' ').append(e.kind()).append(' ').append(e.rows()).append('x')
                    .append(e.columns()).append(' ').append(e.lanes()).append(' ').append(e.dataflow()).append(' ')
                    .append(e.energyFj()).append(' ').append(e.multiplyFraction()).append(' ')
                    .append(e.accumulatorBits()).append(' ').append(e.layerOverheadCycles()).append('\n');
        }
        for (Memory m : new Memory[] {p.registers(), p.sram(), p.dram()}) {
            if (m != null) {
                b.append(m.id()).append(' ').append(m.level()).append(' ').append(m.capacityBytes()).append(' ')
                        .append(m.readFjPerByte()).append(' ').append(m.writeFjPerByte()).append(' ')
                        .append(m.bytesPerCycle()).append(' ').append(m.bytesPerSecond()).append('\n');
            }
        }
        return b.toString();
    }

    @Test
    void defaultsAndUnitConversions(@TempDir Path dir) throws Exception {
        Files.writeString(dir.resolve("d.yaml"), String.join("\n",
                "name: defaults",
                "clock-mhz: 100",
                "engines:",
                "  - id: a",
                "    kind: mac-array",
                "    rows: 8",
                "    columns: 4",
                "    dataflow: output-stationary",
                "    mac-energy-pj: { int8: 0.23 }",
                "  - id: v",
                "    kind: vector",
                "    lanes: 4",
                "    op-energy-pj: { fp16: 0.4 }",
                "memories:",
                "  - id: buf",
                "    level: sram",
                "    capacity-mib: 0.5",
                "    read-energy-pj-per-byte: 1",
                "    write-energy-pj-per-byte: 2",
                "  - id: dram",
                "    read-energy-fj-per-byte: 5",
                "    write-energy-fj-per-byte: 6",
                ""), StandardCharsets.UTF_8);
        DeviceProfile p = DeviceLoader.load("d.yaml", dir);
        Engine a = p.first(Engine.Kind.MAC_ARRAY);
        assertEquals(230, a.energyFj().get("int8"), EPS);          // 0.23 pJ = 230 fJ
        assertEquals(8 + 4, a.layerOverheadCycles());                // default rows + columns
        assertEquals(0.2 / 0.23, a.multiplyFraction(), 1e-12);      // Horowitz 8-bit share
        assertEquals(32, a.accumulatorBits());
        assertEquals(Dataflow.OUTPUT_STATIONARY, a.dataflow());
        Engine v = p.first(Engine.Kind.VECTOR);
        assertEquals(0, v.layerOverheadCycles());
        assertEquals(0, v.multiplyFraction());
        // vector ops priced like adds: fp32 from fp16 is linear, 400 x 32/16 (Horowitz has 0.9 pJ; the rule is rough)
        assertEquals(800, v.energyAt("fp32").fj, EPS);
        assertEquals(0, p.staticPowerMw());
        assertNull(p.deployPrecision());
        assertNull(p.registers());
        assertEquals(512 * 1024, p.sram().capacityBytes());         // 0.5 MiB
        assertEquals("buf", p.sram().id());
        assertEquals(2000, p.sram().writeFjPerByte(), EPS);
        assertEquals(Double.POSITIVE_INFINITY, p.sram().bandwidth(p.clockHz()));
        assertEquals(Double.POSITIVE_INFINITY, p.dram().bandwidth(p.clockHz()));
        assertTrue(p.sources().isEmpty());
    }
}
