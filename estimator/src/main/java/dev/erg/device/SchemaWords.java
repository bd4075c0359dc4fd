package dev.erg.device;

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

/** The words of profile-schema faults: ranges, unit hints, key lists, and where a key belongs. */
final class SchemaWords {
    private SchemaWords() {
    }

    static String range(String type, String bound, Node n) {
        String got = n == null ? "" : " (got " + clip(n.text) + ")";
        switch (type) {
            case "minimum":
                if (bound.equals("0")) {
                    return "must not be negative" + got;
                }
                return (bound.equals("1") ? "must be greater than 0" : "must be at least " + bound) + got;
            case "exclusiveMinimum":
                return "must be greater than " + bound + got;
            case "maximum":
                return "must be at most " + bound + got;
            default:
                return "must be less than " + bound + got;
        }
    }

    /** The keys to write for a key written without a unit or with a wrong one: known keys of the same stem. */
    static List<String> unitHint(String key, List<String> known) {
        String stem = stem(key, known);
        List<String> out = new ArrayList<>();
        if (stem.isEmpty()) {
            return out;
        }
        for (String k : known) {
            if (k.startsWith(stem + "-")) {
                out.add(k);
            }
        }
        return out;
    }

    /** The longest leading part of {@code key}, cut at a '-', that starts some known key followed by '-'. */
    static String stem(String key, List<String> known) {
        String s = key;
        while (!s.isEmpty()) {
            for (String k : known) {
                if (k.startsWith(s + "-")) {
                    return s;
                }
            }
            int dash = s.lastIndexOf('-');
            s = dash < 0 ? "" : s.substring(0, dash);
        }
        return "";
    }

    static boolean isEngine(String def) {
        return !List.of("registers", "sram", "cache", "dram").contains(defName(def));
    }

    /** True when a sibling definition (another engine kind, another memory level) takes {@code key}. */
    static boolean siblingsTake(String def, String key) {
        boolean engine = isEngine(def);
        JsonNode defs = SchemaSource.JSON.path("$defs");
        for (Iterator<String> it = defs.fieldNames(); it.hasNext(); ) {
            String name = it.next();
            if (name.equals(defName(def)) || isEngine("#/$defs/" + name) != engine) {
                continue;
            }
            if (defs.path(name).path("properties").has(key) && defs.path(name).has("additionalProperties")) {
                return true;
            }
        }
        return false;
    }

    static String defName(String def) {
        int i = def.lastIndexOf('/');
        return def.startsWith("#/$defs/") ? def.substring(i + 1) : "profile";
    }

    static String article(String word) {
        return ("aeiou".indexOf(word.charAt(0)) >= 0 ? "an " : "a ") + word;
    }

    static String text(Node map, String key) {
        Entry e = map.map.get(key);
        return e == null || e.value.type != Type.SCALAR || e.value.token != JsonToken.VALUE_STRING ? null
                : e.value.text;
    }

    /** erg's key path ({@code engines[0].rows}) of a validator location. */
    static String path(JsonNodePath p) {
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < p.getNameCount(); i++) {
            Object el = p.getElement(i);
            if (el instanceof Integer) {
                b.append('[').append(el).append(']');
            } else {
                if (b.length() > 0) {
                    b.append('.');
                }
                b.append(el);
            }
        }
        return b.toString();
    }

    static String join(String path, String key) {
        return path.isEmpty() ? key : path + "." + key;
    }

    static String lastKey(String path) {
        int dot = path.lastIndexOf('.');
        String k = dot < 0 ? path : path.substring(dot + 1);
        int br = k.indexOf('[');
        return br < 0 ? k : k.substring(0, br);
    }

    /** The schema node at a location such as {@code #/$defs/mac-array/oneOf}. */
    static JsonNode schemaAt(String location) {
        String pointer = location.startsWith("#") ? location.substring(1) : location;
        return SchemaSource.JSON.at(pointer);
    }

    static String enumText(JsonNode values) {
        List<String> out = new ArrayList<>();
        for (JsonNode v : values) {
            out.add(v.asText());
        }
        return String.join(", ", out);
    }

    static String orText(JsonNode values) {
        List<String> out = new ArrayList<>();
        for (JsonNode v : values) {
            out.add(v.asText());
        }
        return orList(out);
    }

    static String orList(List<String> keys) {
        if (keys.size() == 1) {
            return keys.get(0);
        }
        return String.join(", ", keys.subList(0, keys.size() - 1)) + " or " + keys.get(keys.size() - 1);
    }

    static String andList(List<String> keys) {
        if (keys.size() == 1) {
            return keys.get(0);
        }
        return String.join(", ", keys.subList(0, keys.size() - 1)) + " and " + keys.get(keys.size() - 1);
    }
}
