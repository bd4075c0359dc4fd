package dev.erg.device;

import static dev.erg.device.SchemaWords.andList;
import static dev.erg.device.SchemaWords.article;
import static dev.erg.device.SchemaWords.defName;
import static dev.erg.device.SchemaWords.enumText;
import static dev.erg.device.SchemaWords.isEngine;
import static dev.erg.device.SchemaWords.join;
import static dev.erg.device.SchemaWords.lastKey;
import static dev.erg.device.SchemaWords.orList;
import static dev.erg.device.SchemaWords.orText;
import static dev.erg.device.SchemaWords.path;
import static dev.erg.device.SchemaWords.range;
import static dev.erg.device.SchemaWords.schemaAt;
import static dev.erg.device.SchemaWords.siblingsTake;
import static dev.erg.device.SchemaWords.stem;
import static dev.erg.device.SchemaWords.text;
import static dev.erg.device.SchemaWords.unitHint;

import static dev.erg.device.ProfileTree.clip;

import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.networknt.schema.JsonNodePath;
import com.networknt.schema.JsonSchema;
import com.networknt.schema.JsonSchemaFactory;
import com.networknt.schema.SpecVersion;
import com.networknt.schema.ValidationMessage;
import dev.erg.device.ProfileTree.Entry;
import dev.erg.device.ProfileTree.Node;
import dev.erg.device.ProfileTree.Type;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;

/**
 * The profile format is defined in one place, the published JSON Schema (docs/device-profile.schema.json,
 * packaged as a resource): this class validates a profile document against it and turns every fault
 * into one line {@code file:line: key.path: what}. Hints (the keys an object takes, the unit to write,
 * the values a key takes) are read from the schema, not from lists kept here.
 */
final class ProfileSchema {
    static final String RESOURCE = "dev/erg/device/device-profile.schema.json";
    /** Plain decimal numbers (JSON's grammar): no hex, octal, underscores, .inf or .nan. */
    private static final Pattern DECIMAL = Pattern.compile("-?(0|[1-9][0-9]*)(\\.[0-9]*)?([eE][-+]?[0-9]+)?");

    /** One fault of a document: its line, its key path as erg writes it, and what is wrong. */
    record Fault(int line, String path, String what) {
        String format(String label) {
            return ProfileTree.at(label, line, path, what);
        }
    }

    /** The schema as JSON (for tests and hints). */
    static JsonNode schemaJson() {
        return SchemaSource.JSON;
    }

    private final String label;
    /** Key path (erg's form) to the node and, for a mapping member, its entry. */
    private final Map<String, Node> nodes = new HashMap<>();
    private final Map<String, Entry> entries = new HashMap<>();
    private final List<Fault> faults = new ArrayList<>();
    /** Key paths whose "missing" fault a key with a wrong unit explains (capacity: 512 for capacity-kib). */
    private final Set<String> explained = new java.util.HashSet<>();

    private ProfileSchema(String label) {
        this.label = label;
    }

    /** Every fault of the document, in line order; empty when it follows the schema. */
    static List<Fault> check(String label, Node root) {
        ProfileSchema s = new ProfileSchema(label);
        JsonNode doc = s.convert(root, "");
        Set<ValidationMessage> messages = SchemaSource.SCHEMA.validate(doc);
        s.map(messages);
        return s.sorted();
    }

    // ---- the document as Jackson nodes, with lines kept by path ----

    private JsonNode convert(Node n, String path) {
        nodes.put(path, n);
        JsonNodeFactory f = JsonNodeFactory.instance;
        switch (n.type) {
            case MAP: {
                ObjectNode o = f.objectNode();
                for (Entry e : n.map.values()) {
                    String p = path.isEmpty() ? e.key : path + "." + e.key;
                    entries.put(p, e);
                    o.set(e.key, convert(e.value, p));
                }
                return o;
            }
            case LIST: {
                ArrayNode a = f.arrayNode();
                for (int i = 0; i < n.list.size(); i++) {
                    a.add(convert(n.list.get(i), path + "[" + i + "]"));
                }
                return a;
            }
            default:
                return scalar(n, path, f);
        }
    }

    private JsonNode scalar(Node n, String path, JsonNodeFactory f) {
        JsonToken t = n.token;
        if (t == JsonToken.VALUE_STRING) {
            return f.textNode(n.text);
        }
        if (t == JsonToken.VALUE_TRUE || t == JsonToken.VALUE_FALSE) {
            return f.booleanNode(t == JsonToken.VALUE_TRUE);
        }
        if (!n.isNumber()) {
            return f.nullNode();
        }
        if (!DECIMAL.matcher(n.text).matches()) {
            faults.add(new Fault(n.line, path, "must be a plain decimal number (got " + clip(n.text) + ")"));
            return f.missingNode();
        }
        BigDecimal d = new BigDecimal(n.text);
        if (t == JsonToken.VALUE_NUMBER_FLOAT && !Double.isFinite(d.doubleValue())) {
            faults.add(new Fault(n.line, path, "must be a finite number (got " + clip(n.text) + ")"));
            return f.missingNode();
        }
        if (t == JsonToken.VALUE_NUMBER_INT) {
            return f.numberNode(d.toBigInteger());
        }
        return f.numberNode(d.doubleValue());
    }

    // ---- validator messages to lines ----

    private void map(Set<ValidationMessage> messages) {
        Set<String> levelFaults = new LinkedHashSet<>();
        Map<String, List<ValidationMessage>> alternatives = new LinkedHashMap<>();
        for (ValidationMessage m : messages) {
            String path = path(m.getInstanceLocation());
            String where = m.getSchemaLocation() == null ? "" : m.getSchemaLocation().toString();
            String type = m.getType();
            if (path.equals("memories") && (type.endsWith("Contains") || type.equals("contains")
                    || type.equals("oneOf") || type.equals("not"))) {
                levelFaults.add(path);
                continue;
            }
            int alt = Math.max(where.lastIndexOf("/oneOf/"), where.lastIndexOf("/anyOf/"));
            if (type.equals("required") && alt >= 0) {
                alternatives.computeIfAbsent(path + " " + where.substring(0, alt), k -> new ArrayList<>()).add(m);
                continue;
            }
            if (type.equals("oneOf") && m.getArguments() != null && m.getArguments().length > 0
                    && "0".equals(String.valueOf(m.getArguments()[0]))) {
                continue; // its branches say what is missing
            }
            one(m, path, where, type);
        }
        for (List<ValidationMessage> group : alternatives.values()) {
            missingOneOf(group);
        }
        if (!levelFaults.isEmpty()) {
            levels();
        }
    }

    private void one(ValidationMessage m, String path, String where, String type) {
        Object[] args = m.getArguments() == null ? new Object[0] : m.getArguments();
        Node n = nodes.get(path);
        int line = n == null ? 1 : n.line;
        String key = lastKey(path);
        switch (type) {
            case "type":
                add(line, path, typeFault(n, args.length > 1 ? String.valueOf(args[1]) : ""));
                return;
            case "additionalProperties":
                unknownKey(path, m.getProperty(), where);
                return;
            case "required":
                required(path, m.getProperty(), where);
                return;
            case "dependentRequired": {
                String present = m.getProperty();
                String missing = String.valueOf(args[0]);
                Entry e = entries.get(join(path, present));
                add(e != null ? e.line : line, join(path, missing), "missing (give " + present + " and " + missing
                        + " together)");
                return;
            }
            case "not":
                notBoth(path, where);
                return;
            case "oneOf":
                bothGiven(path, where);
                return;
            case "propertyNames": {
                String p = join(path, m.getProperty());
                Entry e = entries.get(p);
                add(e != null ? e.line : line, p, "unknown precision label (known: " + precisionLabels() + ")");
                return;
            }
            case "enum":
            case "pattern":
            case "const":
                if (path.equals("deploy-precision")) {
                    add(line, path, "unknown precision label \"" + clip(n.text) + "\" (known: "
                            + enumText(SchemaSource.JSON.at("/properties/deploy-precision/anyOf/0/enum"))
                            + ", int1 to int64, uint1 to uint64)");
                } else if (type.equals("enum") && where.contains("/memory/allOf/0/then")) {
                    Node item = nodes.get(path.substring(0, path.lastIndexOf('.')));
                    add(item.line, join(path.substring(0, path.lastIndexOf('.')), "level"), "missing (the id \""
                            + clip(n.text) + "\" names no level; add level: "
                            + orText(SchemaSource.JSON.at("/$defs/memory/properties/level/enum")) + ")");
                } else if (type.equals("enum")) {
                    add(line, path, "unknown " + key + " \"" + clip(n.text) + "\" (known: "
                            + enumText(schemaAt(where)) + ")");
                } else if (type.equals("pattern") && key.equals("id")) {
                    add(line, path, "must be 1 to 64 letters, digits, '.', '_' or '-', starting with a letter or "
                            + "digit (got \"" + clip(n.text) + "\")");
                } else if (type.equals("pattern") && key.equals("name")) {
                    add(line, path, "must be one line");
                } else {
                    add(line, path, "must be " + (args.length > 0 ? clip(String.valueOf(args[0])) : "another value")
                            + " (got " + n.describe() + ")");
                }
                return;
            case "minimum":
            case "exclusiveMinimum":
            case "maximum":
            case "exclusiveMaximum":
                add(line, path, range(type, String.valueOf(args[0]), n));
                return;
            case "minItems":
                add(line, path, "must not be an empty list");
                return;
            case "minProperties":
                add(line, path, "must not be empty (give at least one, e.g. { int8: 150 })");
                return;
            case "minLength":
                add(line, path, "must not be empty");
                return;
            default:
                add(line, path, plain(m, path));
        }
    }

    private void add(int line, String path, String what) {
        faults.add(new Fault(line, path, what));
    }

    /** One fault per key path (the first, in line order), then by line. */
    private List<Fault> sorted() {
        Map<String, Fault> byPath = new LinkedHashMap<>();
        faults.sort(Comparator.comparingInt(Fault::line).thenComparing(Fault::path));
        for (Fault f : faults) {
            if (!(explained.contains(f.path()) && f.what().startsWith("missing"))) {
                byPath.putIfAbsent(f.path(), f);
            }
        }
        List<Fault> out = new ArrayList<>(byPath.values());
        out.sort(Comparator.comparingInt(Fault::line).thenComparing(Fault::path));
        return out;
    }

    private String typeFault(Node n, String expected) {
        String got = n == null ? "nothing" : n.describe();
        switch (expected) {
            case "integer":
                if (n != null && n.isNumber()) {
                    return "must be a whole number (got " + clip(n.text) + ")";
                }
                // fall through
            case "number": {
                boolean quoted = n != null && n.type == Type.SCALAR && n.token == JsonToken.VALUE_STRING
                        && DECIMAL.matcher(n.text.strip()).matches();
                return "must be a number (got " + got + (quoted ? "; write it without quotes" : "") + ")";
            }
            case "string": {
                boolean quotable = n != null && n.type == Type.SCALAR && !n.isNull();
                return "must be text (got " + got + (quotable ? "; put it in quotes" : "") + ")";
            }
            case "object":
                return "must be a mapping of keys (got " + got + ")";
            case "array":
                return "must be a list (got " + got + ")";
            default:
                return "must be " + expected + " (got " + got + ")";
        }
    }

    /** A key the object's definition does not take: a unit hint, "not used here", or the keys it takes. */
    private void unknownKey(String path, String key, String where) {
        Entry e = entries.get(join(path, key));
        int line = e != null ? e.line : nodes.get(path).line;
        String def = where.endsWith("/additionalProperties") ? where.substring(0, where.length()
                - "/additionalProperties".length()) : where;
        JsonNode schema = schemaAt(def);
        List<String> known = new ArrayList<>();
        schema.path("properties").fieldNames().forEachRemaining(known::add);
        String p = join(path, key);
        List<String> instead = unitHint(key, known);
        if (!instead.isEmpty()) {
            String rest = key.substring(stem(key, known).length());
            String what = rest.isEmpty() || rest.equals("-per-byte") || rest.equals("-per-second") ? "no unit"
                    : "unknown unit";
            add(line, p, what + "; write " + orList(instead));
            for (String k : instead) {
                explained.add(join(path, k));
            }
            return;
        }
        String kind = defName(def);
        if (siblingsTake(def, key)) {
            add(line, p, "not used " + (isEngine(def) ? "by " + article(kind) + " engine" : "for " + article(kind)
                    + " level") + " (known: " + String.join(", ", known) + ")");
            return;
        }
        add(line, p, "unknown key (known: " + String.join(", ", known) + ")");
    }

    private void required(String path, String key, String where) {
        String def = where.endsWith("/required") ? where.substring(0, where.length() - "/required".length()) : where;
        JsonNode req = schemaAt(def).path("required");
        List<String> needs = new ArrayList<>();
        for (JsonNode r : req) {
            if (!r.asText().equals("id") && !r.asText().equals("kind") || path.isEmpty()) {
                needs.add(r.asText());
            }
        }
        Node n = nodes.get(path);
        String who = defName(def).equals("profile") ? "a profile" : article(defName(def));
        add(n == null ? 1 : n.line, join(path, key), "missing (" + who + " needs " + andList(needs) + ")");
    }

    /** The branches of a oneOf or anyOf that each require one key: none of them is given. */
    private void missingOneOf(List<ValidationMessage> group) {
        List<String> keys = new ArrayList<>();
        for (ValidationMessage m : group) {
            if (!keys.contains(m.getProperty())) {
                keys.add(m.getProperty());
            }
        }
        String path = path(group.get(0).getInstanceLocation());
        Node n = nodes.get(path);
        add(n == null ? 1 : n.line, join(path, keys.get(0)), "missing (give " + orList(keys) + ")");
    }

    /** {@code not: {required: [a, b]}}: both are given. */
    private void notBoth(String path, String where) {
        JsonNode req = schemaAt(where).path("required");
        if (req.size() == 2) {
            both(path, req.get(0).asText(), req.get(1).asText());
        } else {
            add(nodes.get(path).line, path, "breaks a rule of the schema at " + where);
        }
    }

    /** A oneOf of single-key branches with more than one given. */
    private void bothGiven(String path, String where) {
        List<String> given = new ArrayList<>();
        for (JsonNode branch : schemaAt(where)) {
            String k = branch.path("required").path(0).asText();
            if (entries.containsKey(join(path, k))) {
                given.add(k);
            }
        }
        if (given.size() >= 2) {
            both(path, given.get(0), given.get(1));
        } else {
            add(nodes.get(path).line, path, "must match exactly one form of " + where);
        }
    }

    private void both(String path, String a, String b) {
        Entry ea = entries.get(join(path, a));
        Entry eb = entries.get(join(path, b));
        if (ea == null || eb == null) {
            return;
        }
        Entry later = ea.line > eb.line ? ea : eb;
        Entry earlier = later == ea ? eb : ea;
        add(later.line, join(path, later.key), "give " + a + " or " + b + ", not both (" + earlier.key
                + " is on line " + earlier.line + ")");
    }

    /**
     * The memory levels as a whole: dram, and one sram or cache levels. The schema states it with
     * {@code contains}; this says which level is missing or repeated, and where.
     */
    private void levels() {
        Node list = nodes.get("memories");
        Map<String, String> firstAt = new HashMap<>();
        boolean sram = false;
        boolean cache = false;
        boolean dram = false;
        boolean unresolved = false;
        Set<String> known = new java.util.HashSet<>();
        for (JsonNode l : SchemaSource.JSON.at("/$defs/memory/properties/level/enum")) {
            known.add(l.asText());
        }
        for (int i = 0; i < list.list.size(); i++) {
            Node item = list.list.get(i);
            if (item.type != Type.MAP) {
                continue;
            }
            String level = text(item, "level");
            if (level == null) {
                level = text(item, "id");
            }
            if (level == null || !known.contains(level)) {
                unresolved = true; // its own fault says so
                continue;
            }
            String p = "memories[" + i + "]";
            if (level.equals("cache")) {
                if (sram) {
                    add(item.line, p, "a cache level beside an sram level (the sram is " + firstAt.get("sram")
                            + "; a profile has one sram or cache levels)");
                }
                cache = true;
                continue;
            }
            if (level.equals("sram") && cache) {
                add(item.line, p, "an sram level beside cache levels (a profile has one sram or cache levels)");
            }
            if (firstAt.containsKey(level) && !level.equals("cache")) {
                add(item.line, p, "a second " + level + " level (the first is " + firstAt.get(level) + ")");
            }
            firstAt.putIfAbsent(level, p + " on line " + item.line);
            sram |= level.equals("sram");
            dram |= level.equals("dram");
        }
        if ((!(sram || cache) || !dram) && !unresolved) {
            add(list.line, "memories", "no " + (sram || cache ? "dram" : "sram") + " level (a profile needs sram and "
                    + "dram, or cache levels and dram; registers are optional)");
        }
    }

    // ---- helpers ----

    /** The labels an energy or rate table accepts, as messages list them. */
    static String precisionLabels() {
        return enumText(SchemaSource.JSON.at("/$defs/precision/anyOf/0/enum")) + ", int1 to int64, uint1 to uint64, or "
                + "a weight/activation pair such as w4a8";
    }

    private static String plain(ValidationMessage m, String path) {
        String msg = m.getMessage();
        int colon = msg.indexOf(": ");
        return clip(colon >= 0 && msg.startsWith("$") ? msg.substring(colon + 2) : msg);
    }
}
