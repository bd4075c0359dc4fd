package dev.erg.device;

import static dev.erg.device.ProfileTree.clip;

import com.fasterxml.jackson.core.JsonToken;
import dev.erg.error.BadInputException;
import dev.erg.device.ProfileTree.Entry;
import dev.erg.device.ProfileTree.Node;
import dev.erg.device.ProfileTree.Type;
import dev.erg.onnx.ElemType;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Pattern;

/**
 * Turns a profile document tree into a {@link DeviceProfile}, strictly: every key must be known,
 * every number must carry its unit in the key name and lie in range. The first fault ends the read
 * with one line naming the file, the line and the key path.
 */
final class ProfileReader {
    /** Precision labels a profile may price: the numeric element types, as erg names them. */
    static final Set<String> PRECISIONS;

    static {
        Set<String> p = new TreeSet<>();
        for (ElemType t : ElemType.values()) {
            if ((t.isFloat() || t.isInteger()) && t != ElemType.BOOL) {
                p.add(t.label);
            }
        }
        PRECISIONS = Collections.unmodifiableSet(p);
    }

    static final List<String> ROOT_KEYS = List.of("$schema", "name", "description", "clock-mhz", "static-power-mw",
            "deploy-precision", "engines", "memories", "sources");
    static final List<String> MAC_ARRAY_KEYS = List.of("id", "kind", "rows", "columns", "dataflow", "mac-energy-fj",
            "mac-energy-pj", "multiply-fraction", "accumulator-bits", "layer-overhead-cycles");
    static final List<String> VECTOR_KEYS = List.of("id", "kind", "lanes", "op-energy-fj", "op-energy-pj",
            "multiply-fraction", "layer-overhead-cycles");
    static final List<String> REGISTER_KEYS = List.of("id", "level", "read-energy-fj-per-byte",
            "read-energy-pj-per-byte", "write-energy-fj-per-byte", "write-energy-pj-per-byte");
    static final List<String> SRAM_KEYS = List.of("id", "level", "capacity-kib", "capacity-mib", "capacity-bytes",
            "read-energy-fj-per-byte", "read-energy-pj-per-byte", "write-energy-fj-per-byte",
            "write-energy-pj-per-byte", "bytes-per-cycle", "gbytes-per-second");
    static final List<String> DRAM_KEYS = List.of("id", "level", "read-energy-fj-per-byte", "read-energy-pj-per-byte",
            "write-energy-fj-per-byte", "write-energy-pj-per-byte", "bytes-per-cycle", "gbytes-per-second");
    /** Every key a memory level may carry at some level, to tell "wrong level" from "unknown". */
    private static final Set<String> ANY_MEMORY_KEYS;

    static {
        Set<String> all = new LinkedHashSet<>(SRAM_KEYS);
        all.addAll(DRAM_KEYS);
        all.addAll(REGISTER_KEYS);
        ANY_MEMORY_KEYS = Collections.unmodifiableSet(all);
    }

    /** Keys written without a unit (or with a unit erg does not take) and the keys to write instead. */
    private static final Map<String, List<String>> UNIT_STEMS = new LinkedHashMap<>();

    static {
        UNIT_STEMS.put("clock", List.of("clock-mhz"));
        UNIT_STEMS.put("static-power", List.of("static-power-mw"));
        UNIT_STEMS.put("mac-energy", List.of("mac-energy-fj", "mac-energy-pj"));
        UNIT_STEMS.put("op-energy", List.of("op-energy-fj", "op-energy-pj"));
        UNIT_STEMS.put("capacity", List.of("capacity-kib", "capacity-mib", "capacity-bytes"));
        UNIT_STEMS.put("read-energy", List.of("read-energy-fj-per-byte", "read-energy-pj-per-byte"));
        UNIT_STEMS.put("write-energy", List.of("write-energy-fj-per-byte", "write-energy-pj-per-byte"));
        UNIT_STEMS.put("bandwidth", List.of("bytes-per-cycle", "gbytes-per-second"));
    }

    /** Plain decimal numbers (JSON's grammar): no hex, octal, underscores, .inf or .nan. */
    private static final Pattern DECIMAL = Pattern.compile("-?(0|[1-9][0-9]*)(\\.[0-9]*)?([eE][-+]?[0-9]+)?");
    private static final Pattern ID = Pattern.compile("[A-Za-z0-9][A-Za-z0-9._-]{0,63}");
    /** Upper bound for rows, columns and lanes: far above any real array, far below overflow. */
    static final int MAX_UNITS_SIDE = 65536;

    private final String label;

    ProfileReader(String label) {
        this.label = label;
    }

    /** A mapping node with its key path. */
    private final class Obj {
        final Node node;
        final String path;

        Obj(Node node, String path) {
            this.node = node;
            this.path = path;
        }

        Entry get(String key) {
            return node.map.get(key);
        }

        String sub(String key) {
            return path.isEmpty() ? key : path + "." + key;
        }

        /** Rejects the first key not in {@code known}, with a hint when only the unit is wrong. */
        void checkKeys(List<String> known, Set<String> otherPlace, String otherWhat) {
            for (Entry e : node.map.values()) {
                if (known.contains(e.key)) {
                    continue;
                }
                for (Map.Entry<String, List<String>> stem : UNIT_STEMS.entrySet()) {
                    String s = stem.getKey();
                    List<String> instead = new ArrayList<>(stem.getValue());
                    instead.retainAll(known);
                    if (instead.isEmpty() || !(e.key.equals(s) || e.key.startsWith(s + "-"))) {
                        continue;
                    }
                    String rest = e.key.substring(s.length());
                    String what = rest.isEmpty() || rest.equals("-per-byte") || rest.equals("-per-second")
                            ? "no unit" : "unknown unit";
                    throw fail(e.line, sub(e.key), what + "; write " + orList(instead));
                }
                if (otherPlace != null && otherPlace.contains(e.key)) {
                    throw fail(e.line, sub(e.key), "not used " + otherWhat + " (known: " + String.join(", ", known)
                            + ")");
                }
                throw fail(e.line, sub(e.key), "unknown key (known: " + String.join(", ", known) + ")");
            }
        }
    }

    private BadInputException fail(int line, String path, String what) {
        return new BadInputException(ProfileTree.at(label, line, path, what));
    }

    private static String orList(List<String> keys) {
        if (keys.size() == 1) {
            return keys.get(0);
        }
        return String.join(", ", keys.subList(0, keys.size() - 1)) + " or " + keys.get(keys.size() - 1);
    }

    DeviceProfile read(String id, Node root) {
        if (root == null) {
            throw new BadInputException(label + ": the file is empty; a device profile needs name, clock-mhz, engines "
                    + "and memories");
        }
        if (root.type != Type.MAP) {
            throw fail(root.line, "", "a device profile must be a mapping of keys (got " + root.describe() + ")");
        }
        Obj top = new Obj(root, "");
        top.checkKeys(ROOT_KEYS, null, null);
        if (top.get("$schema") != null) {
            text(top, "$schema");
        }
        String name = requireText(top, "name", "a profile needs name, clock-mhz, engines and memories");
        String description = top.get("description") != null ? text(top, "description") : null;
        double clockMhz = positive(top, requireEntry(top, "clock-mhz",
                "a profile needs name, clock-mhz, engines and memories"));
        double staticMw = top.get("static-power-mw") != null ? nonNegative(top, top.get("static-power-mw")) : 0;
        String deploy = null;
        if (top.get("deploy-precision") != null) {
            Entry e = top.get("deploy-precision");
            deploy = text(top, "deploy-precision");
            if (!PRECISIONS.contains(deploy)) {
                throw fail(e.value.line, top.sub(e.key), "unknown precision label \"" + clip(deploy) + "\" (known: "
                        + String.join(", ", PRECISIONS) + ")");
            }
        }
        List<Engine> engines = engines(top);
        Memory[] levels = memories(top);
        Map<String, String> sources = sources(top, root);
        return new DeviceProfile(id, name, description, clockMhz, engines, levels[0], levels[1], levels[2], staticMw,
                deploy, sources);
    }

    // ---- engines ----

    private List<Engine> engines(Obj top) {
        Entry list = requireEntry(top, "engines", "a profile needs name, clock-mhz, engines and memories");
        if (list.value.type != Type.LIST) {
            throw fail(list.value.line, "engines", "must be a list of engines (got " + list.value.describe() + ")");
        }
        if (list.value.list.isEmpty()) {
            throw fail(list.value.line, "engines", "must list at least one engine");
        }
        List<Engine> out = new ArrayList<>();
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < list.value.list.size(); i++) {
            Node n = list.value.list.get(i);
            String path = "engines[" + i + "]";
            if (n.type != Type.MAP) {
                throw fail(n.line, path, "must be a mapping of engine keys (got " + n.describe() + ")");
            }
            Obj o = new Obj(n, path);
            String id = id(o);
            String clash = ids.putIfAbsent(id, path);
            if (clash != null) {
                throw fail(o.get("id").value.line, o.sub("id"), "duplicate id \"" + id + "\" (also " + clash + ")");
            }
            Entry kindEntry = requireEntry(o, "kind", "an engine needs id and kind (mac-array or vector)");
            String kind = text(o, "kind");
            if (kind.equals(Engine.Kind.MAC_ARRAY.key)) {
                out.add(macArray(o, id));
            } else if (kind.equals(Engine.Kind.VECTOR.key)) {
                out.add(vector(o, id));
            } else {
                throw fail(kindEntry.value.line, o.sub("kind"), "unknown kind \"" + clip(kind)
                        + "\" (known: mac-array, vector)");
            }
        }
        return out;
    }

    private Engine macArray(Obj o, String id) {
        o.checkKeys(MAC_ARRAY_KEYS, Set.copyOf(VECTOR_KEYS), "by a mac-array engine");
        String needs = "a mac-array needs rows, columns, dataflow and mac-energy-fj or mac-energy-pj";
        int rows = (int) whole(o, requireEntry(o, "rows", needs), 1, MAX_UNITS_SIDE);
        int columns = (int) whole(o, requireEntry(o, "columns", needs), 1, MAX_UNITS_SIDE);
        Entry df = requireEntry(o, "dataflow", needs);
        String dfText = text(o, "dataflow");
        Dataflow dataflow = Dataflow.ofKey(dfText);
        if (dataflow == null) {
            throw fail(df.value.line, o.sub("dataflow"), "unknown dataflow \"" + clip(dfText)
                    + "\" (known: weight-stationary, output-stationary, no-reuse)");
        }
        Map<String, Double> energy = energyTable(o, "mac-energy");
        double mulFraction = o.get("multiply-fraction") != null
                ? fraction(o, o.get("multiply-fraction")) : Engine.DEFAULT_MAC_MULTIPLY_FRACTION;
        int accBits = o.get("accumulator-bits") != null
                ? (int) whole(o, o.get("accumulator-bits"), 1, 64) : Engine.DEFAULT_ACCUMULATOR_BITS;
        long overhead = o.get("layer-overhead-cycles") != null
                ? whole(o, o.get("layer-overhead-cycles"), 0, 1L << 40) : (long) rows + columns;
        return new Engine(id, Engine.Kind.MAC_ARRAY, rows, columns, 0, dataflow, energy, mulFraction, accBits,
                overhead);
    }

    private Engine vector(Obj o, String id) {
        o.checkKeys(VECTOR_KEYS, Set.copyOf(MAC_ARRAY_KEYS), "by a vector engine");
        String needs = "a vector engine needs lanes and op-energy-fj or op-energy-pj";
        int lanes = (int) whole(o, requireEntry(o, "lanes", needs), 1, MAX_UNITS_SIDE);
        Map<String, Double> energy = energyTable(o, "op-energy");
        double mulFraction = o.get("multiply-fraction") != null
                ? fraction(o, o.get("multiply-fraction")) : Engine.DEFAULT_VECTOR_MULTIPLY_FRACTION;
        long overhead = o.get("layer-overhead-cycles") != null
                ? whole(o, o.get("layer-overhead-cycles"), 0, 1L << 40) : 0;
        return new Engine(id, Engine.Kind.VECTOR, 0, 0, lanes, null, energy, mulFraction, 0, overhead);
    }

    /** A precision -> energy table from {@code stem-fj} or {@code stem-pj}, in fJ. */
    private Map<String, Double> energyTable(Obj o, String stem) {
        Entry e = oneOf(o, stem + "-fj", stem + "-pj", true);
        double factor = e.key.endsWith("-pj") ? 1000 : 1;
        String path = o.sub(e.key);
        if (e.value.type != Type.MAP) {
            throw fail(e.value.line, path, "must be a mapping of precision to energy, e.g. { int8: 150 } (got "
                    + e.value.describe() + ")");
        }
        if (e.value.map.isEmpty()) {
            throw fail(e.value.line, path, "lists no precision; give at least one, e.g. { int8: 150 }");
        }
        Obj table = new Obj(e.value, path);
        Map<String, Double> out = new LinkedHashMap<>();
        for (Entry p : e.value.map.values()) {
            if (!PRECISIONS.contains(p.key)) {
                throw fail(p.line, table.sub(p.key), "unknown precision label (known: "
                        + String.join(", ", PRECISIONS) + ")");
            }
            out.put(p.key, nonNegative(table, p) * factor);
        }
        return out;
    }

    // ---- memories ----

    /** Registers (or null), SRAM and DRAM. */
    private Memory[] memories(Obj top) {
        Entry list = requireEntry(top, "memories", "a profile needs name, clock-mhz, engines and memories");
        if (list.value.type != Type.LIST) {
            throw fail(list.value.line, "memories", "must be a list of memory levels (got "
                    + list.value.describe() + ")");
        }
        Memory[] levels = new Memory[3];
        String[] where = new String[3]; // "memories[i], line n" of each level
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < list.value.list.size(); i++) {
            Node n = list.value.list.get(i);
            String path = "memories[" + i + "]";
            if (n.type != Type.MAP) {
                throw fail(n.line, path, "must be a mapping of memory keys (got " + n.describe() + ")");
            }
            Obj o = new Obj(n, path);
            String id = id(o);
            String clash = ids.putIfAbsent(id, path);
            if (clash != null) {
                throw fail(o.get("id").value.line, o.sub("id"), "duplicate id \"" + id + "\" (also " + clash + ")");
            }
            Memory.Level level;
            Entry levelEntry = o.get("level");
            if (levelEntry != null) {
                String l = text(o, "level");
                level = levelOf(l);
                if (level == null) {
                    throw fail(levelEntry.value.line, o.sub("level"), "unknown level \"" + clip(l)
                            + "\" (known: registers, sram, dram)");
                }
            } else {
                level = levelOf(id);
                if (level == null) {
                    throw fail(n.line, o.sub("level"), "missing (the id \"" + id + "\" names no level; add level: "
                            + "registers, sram or dram)");
                }
            }
            int k = level.ordinal();
            if (levels[k] != null) {
                throw fail(n.line, path, "a second " + level.key + " level (the first is " + where[k] + ")");
            }
            where[k] = path + " on line " + n.line;
            levels[k] = memory(o, id, level);
        }
        if (levels[Memory.Level.SRAM.ordinal()] == null || levels[Memory.Level.DRAM.ordinal()] == null) {
            String missing = levels[Memory.Level.SRAM.ordinal()] == null ? "sram" : "dram";
            throw fail(list.value.line, "memories", "no " + missing + " level (a profile needs sram and dram; "
                    + "registers are optional)");
        }
        return levels;
    }

    private static Memory.Level levelOf(String key) {
        for (Memory.Level l : Memory.Level.values()) {
            if (l.key.equals(key)) {
                return l;
            }
        }
        return null;
    }

    private Memory memory(Obj o, String id, Memory.Level level) {
        List<String> known = level == Memory.Level.SRAM ? SRAM_KEYS
                : level == Memory.Level.DRAM ? DRAM_KEYS : REGISTER_KEYS;
        o.checkKeys(known, ANY_MEMORY_KEYS, "for a " + level.key + " level");
        long capacity = -1;
        if (level == Memory.Level.SRAM) {
            capacity = capacity(o);
        }
        double read = energyPerByte(o, "read-energy");
        double write = energyPerByte(o, "write-energy");
        double perCycle = 0;
        double perSecond = 0;
        if (level != Memory.Level.REGISTERS) {
            Entry bw = oneOf(o, "bytes-per-cycle", "gbytes-per-second", false);
            if (bw != null && bw.key.equals("bytes-per-cycle")) {
                perCycle = positive(o, bw);
            } else if (bw != null) {
                perSecond = positive(o, bw) * 1e9;
            }
        }
        return new Memory(id, level, capacity, read, write, perCycle, perSecond);
    }

    private long capacity(Obj o) {
        Entry found = null;
        for (String k : List.of("capacity-kib", "capacity-mib", "capacity-bytes")) {
            Entry e = o.get(k);
            if (e != null && found != null) {
                throw fail(e.line, o.sub(k), "give one capacity, not both " + found.key + " (line " + found.line
                        + ") and " + k);
            }
            if (e != null) {
                found = e;
            }
        }
        if (found == null) {
            throw fail(o.node.line, o.sub("capacity-kib"), "missing (an sram level needs capacity-kib, capacity-mib "
                    + "or capacity-bytes)");
        }
        double v = positive(o, found);
        double unit = found.key.equals("capacity-kib") ? 1024 : found.key.equals("capacity-mib") ? 1024 * 1024 : 1;
        double bytes = v * unit;
        if (bytes != Math.rint(bytes)) {
            throw fail(found.value.line, o.sub(found.key), "must come to a whole number of bytes (got "
                    + found.value.text + ")");
        }
        if (bytes > 1L << 50) {
            throw fail(found.value.line, o.sub(found.key), "must be at most 2^50 bytes (got " + found.value.text + ")");
        }
        return (long) bytes;
    }

    private double energyPerByte(Obj o, String stem) {
        Entry e = oneOf(o, stem + "-fj-per-byte", stem + "-pj-per-byte", true);
        return nonNegative(o, e) * (e.key.contains("-pj-") ? 1000 : 1);
    }

    // ---- sources ----

    private Map<String, String> sources(Obj top, Node root) {
        Entry e = top.get("sources");
        if (e == null) {
            return Map.of();
        }
        if (e.value.type != Type.MAP) {
            throw fail(e.value.line, "sources", "must be a mapping of key path to source (got "
                    + e.value.describe() + ")");
        }
        Set<String> paths = new LinkedHashSet<>();
        collectPaths(root, "", paths);
        Obj src = new Obj(e.value, "sources");
        Map<String, String> out = new LinkedHashMap<>();
        for (Entry s : e.value.map.values()) {
            if (!paths.contains(s.key)) {
                throw fail(s.line, src.sub(s.key), "names no key of this profile (write key paths as in messages, "
                        + "e.g. engines[0].rows)");
            }
            String text = text(src, s.key);
            if (text.isBlank()) {
                throw fail(s.value.line, src.sub(s.key), "must name a source (got empty text)");
            }
            out.put(s.key, text);
        }
        return out;
    }

    /** Every key path of the document (mappings, lists and leaves), sources and $schema left out. */
    static void collectPaths(Node n, String path, Set<String> out) {
        if (n.type == Type.MAP) {
            for (Entry e : n.map.values()) {
                if (path.isEmpty() && (e.key.equals("sources") || e.key.equals("$schema"))) {
                    continue;
                }
                String p = path.isEmpty() ? e.key : path + "." + e.key;
                out.add(p);
                collectPaths(e.value, p, out);
            }
        } else if (n.type == Type.LIST) {
            for (int i = 0; i < n.list.size(); i++) {
                String p = path + "[" + i + "]";
                out.add(p);
                collectPaths(n.list.get(i), p, out);
            }
        }
    }

    // ---- scalars ----

    private Entry requireEntry(Obj o, String key, String needs) {
        Entry e = o.get(key);
        if (e == null) {
            throw fail(o.node.line, o.sub(key), "missing (" + needs + ")");
        }
        return e;
    }

    /** Exactly one of two unit forms of the same value (or none, when not required). */
    private Entry oneOf(Obj o, String a, String b, boolean required) {
        Entry ea = o.get(a);
        Entry eb = o.get(b);
        if (ea != null && eb != null) {
            Entry later = ea.line > eb.line ? ea : eb;
            Entry earlier = later == ea ? eb : ea;
            throw fail(later.line, o.sub(later.key), "give " + a + " or " + b + ", not both (" + earlier.key
                    + " is on line " + earlier.line + ")");
        }
        if (ea == null && eb == null && required) {
            throw fail(o.node.line, o.sub(a), "missing (give " + a + " or " + b + ")");
        }
        return ea != null ? ea : eb;
    }

    private String requireText(Obj o, String key, String needs) {
        requireEntry(o, key, needs);
        String t = text(o, key);
        if (t.isBlank()) {
            throw fail(o.get(key).value.line, o.sub(key), "must not be empty");
        }
        return t;
    }

    /** A string value (YAML reads {@code name: 2024} or {@code name: yes} as no string: quote it). */
    private String text(Obj o, String key) {
        Entry e = o.get(key);
        Node v = e.value;
        if (v.type != Type.SCALAR || v.token != JsonToken.VALUE_STRING) {
            boolean quotable = v.type == Type.SCALAR && !v.isNull();
            throw fail(v.line, o.sub(key), "must be text (got " + v.describe() + (quotable ? "; put it in quotes" : "")
                    + ")");
        }
        if (!key.equals("description") && (v.text.indexOf('\n') >= 0 || v.text.indexOf('\r') >= 0)) {
            throw fail(v.line, o.sub(key), "must be one line");
        }
        return v.text;
    }

    private String id(Obj o) {
        Entry e = requireEntry(o, "id", o.path.startsWith("engines") ? "an engine needs id and kind (mac-array or "
                + "vector)" : "a memory level needs an id (registers, sram, dram or any name with a level: key)");
        String id = text(o, "id");
        if (!ID.matcher(id).matches()) {
            throw fail(e.value.line, o.sub("id"), "must be 1 to 64 letters, digits, '.', '_' or '-', starting with a "
                    + "letter or digit (got \"" + clip(id) + "\")");
        }
        return id;
    }

    private double number(Obj o, Entry e) {
        Node v = e.value;
        String path = o.sub(e.key);
        if (!v.isNumber()) {
            boolean quoted = v.type == Type.SCALAR && v.token == JsonToken.VALUE_STRING
                    && DECIMAL.matcher(v.text.strip()).matches();
            throw fail(v.line, path, "must be a number (got " + v.describe() + (quoted ? "; write it without quotes" : "")
                    + ")");
        }
        if (!DECIMAL.matcher(v.text).matches()) {
            throw fail(v.line, path, "must be a plain decimal number (got " + clip(v.text) + ")");
        }
        double d = Double.parseDouble(v.text);
        if (!Double.isFinite(d)) {
            throw fail(v.line, path, "must be a finite number (got " + clip(v.text) + ")");
        }
        return d;
    }

    private double positive(Obj o, Entry e) {
        double d = number(o, e);
        if (!(d > 0)) {
            throw fail(e.value.line, o.sub(e.key), "must be greater than 0 (got " + e.value.text + ")");
        }
        return d;
    }

    private double nonNegative(Obj o, Entry e) {
        double d = number(o, e);
        if (d < 0) {
            throw fail(e.value.line, o.sub(e.key), "must not be negative (got " + e.value.text + ")");
        }
        return d + 0.0; // -0 becomes 0
    }

    private double fraction(Obj o, Entry e) {
        double d = number(o, e);
        if (d < 0 || d > 1) {
            throw fail(e.value.line, o.sub(e.key), "must be from 0 to 1 (got " + e.value.text + ")");
        }
        return d + 0.0;
    }

    private long whole(Obj o, Entry e, long min, long max) {
        double d = number(o, e);
        String path = o.sub(e.key);
        if (d != Math.rint(d)) {
            throw fail(e.value.line, path, "must be a whole number (got " + e.value.text + ")");
        }
        if (d < min) {
            throw fail(e.value.line, path, (min == 1 ? "must be greater than 0" : "must be at least " + min)
                    + " (got " + e.value.text + ")");
        }
        if (d > max) {
            throw fail(e.value.line, path, "must be at most " + max + " (got " + clip(e.value.text) + ")");
        }
        return (long) d;
    }
}
