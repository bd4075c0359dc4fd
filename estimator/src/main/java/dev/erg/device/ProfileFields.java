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
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.regex.Pattern;

/**
 * What the profile readers share: the document node with its key path, the one-line fault, and the
 * strict readers of scalars (numbers with units in the key names, text, ids) and energy tables.
 */
abstract class ProfileFields {
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

    /** The labels an energy table or deploy-precision accepts, as messages list them. */
    static final String KNOWN_LABELS = String.join(", ", PRECISIONS) + ", int1 to int64, uint1 to uint64, or a "
            + "weight/activation pair such as w4a8";


    /** Keys written without a unit (or with a unit erg does not take) and the keys to write instead. */
    private static final Map<String, List<String>> UNIT_STEMS = new LinkedHashMap<>();

    static {
        UNIT_STEMS.put("clock", List.of("clock-mhz"));
        UNIT_STEMS.put("max-clock", List.of("max-clock-mhz"));
        UNIT_STEMS.put("static-power", List.of("static-power-mw"));
        UNIT_STEMS.put("mac-energy", List.of("mac-energy-fj", "mac-energy-pj"));
        UNIT_STEMS.put("op-energy", List.of("op-energy-fj", "op-energy-pj"));
        UNIT_STEMS.put("capacity", List.of("capacity-kib", "capacity-mib", "capacity-bytes"));
        UNIT_STEMS.put("read-energy", List.of("read-energy-fj-per-byte", "read-energy-pj-per-byte"));
        UNIT_STEMS.put("write-energy", List.of("write-energy-fj-per-byte", "write-energy-pj-per-byte"));
        UNIT_STEMS.put("bandwidth", List.of("bytes-per-cycle", "gbytes-per-second"));
        UNIT_STEMS.put("multiply-energy", List.of("multiply-energy-fj", "multiply-energy-pj"));
        for (String stem : List.of("xnor-energy", "popcount-energy", "accumulation-energy", "conversion-energy",
                "partial-add-energy", "row-drive-energy", "column-energy", "cell-write-energy", "shift-add-energy")) {
            UNIT_STEMS.put(stem, List.of(stem + "-fj"));
        }
    }

    /** Plain decimal numbers (JSON's grammar): no hex, octal, underscores, .inf or .nan. */
    private static final Pattern DECIMAL = Pattern.compile("-?(0|[1-9][0-9]*)(\\.[0-9]*)?([eE][-+]?[0-9]+)?");
    private static final Pattern ID = Pattern.compile("[A-Za-z0-9][A-Za-z0-9._-]{0,63}");

    final String label;

    ProfileFields(String label) {
        this.label = label;
    }

    /** A mapping node with its key path. */
    final class Obj {
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

    BadInputException fail(int line, String path, String what) {
        return new BadInputException(ProfileTree.at(label, line, path, what));
    }

    private static String orList(List<String> keys) {
        if (keys.size() == 1) {
            return keys.get(0);
        }
        return String.join(", ", keys.subList(0, keys.size() - 1)) + " or " + keys.get(keys.size() - 1);
    }

    /** A precision -> energy table from {@code stem-fj} or {@code stem-pj}, in fJ. */
    Map<String, Double> energyTable(Obj o, String stem) {
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
            if (!Precisions.isLabel(p.key, PRECISIONS)) {
                throw fail(p.line, table.sub(p.key), "unknown precision label (known: " + KNOWN_LABELS + ")");
            }
            out.put(p.key, nonNegative(table, p) * factor);
        }
        return out;
    }


    // ---- scalars ----

    Entry requireEntry(Obj o, String key, String needs) {
        Entry e = o.get(key);
        if (e == null) {
            throw fail(o.node.line, o.sub(key), "missing (" + needs + ")");
        }
        return e;
    }

    /** Exactly one of two unit forms of the same value (or none, when not required). */
    Entry oneOf(Obj o, String a, String b, boolean required) {
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

    String requireText(Obj o, String key, String needs) {
        requireEntry(o, key, needs);
        String t = text(o, key);
        if (t.isBlank()) {
            throw fail(o.get(key).value.line, o.sub(key), "must not be empty");
        }
        return t;
    }

    /** A string value (YAML reads {@code name: 2024} or {@code name: yes} as no string: quote it). */
    String text(Obj o, String key) {
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

    String id(Obj o) {
        Entry e = requireEntry(o, "id", o.path.startsWith("engines") ? "an engine needs id and kind (mac-array or "
                + "vector)" : "a memory level needs an id (registers, sram, dram or any name with a level: key)");
        String id = text(o, "id");
        if (!ID.matcher(id).matches()) {
            throw fail(e.value.line, o.sub("id"), "must be 1 to 64 letters, digits, '.', '_' or '-', starting with a "
                    + "letter or digit (got \"" + clip(id) + "\")");
        }
        return id;
    }

    double number(Obj o, Entry e) {
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

    double positive(Obj o, Entry e) {
        double d = number(o, e);
        if (!(d > 0)) {
            throw fail(e.value.line, o.sub(e.key), "must be greater than 0 (got " + e.value.text + ")");
        }
        return d;
    }

    double nonNegative(Obj o, Entry e) {
        double d = number(o, e);
        if (d < 0) {
            throw fail(e.value.line, o.sub(e.key), "must not be negative (got " + e.value.text + ")");
        }
        return d + 0.0; // -0 becomes 0
    }

    double fraction(Obj o, Entry e) {
        double d = number(o, e);
        if (d < 0 || d > 1) {
            throw fail(e.value.line, o.sub(e.key), "must be from 0 to 1 (got " + e.value.text + ")");
        }
        return d + 0.0;
    }

    long whole(Obj o, Entry e, long min, long max) {
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
