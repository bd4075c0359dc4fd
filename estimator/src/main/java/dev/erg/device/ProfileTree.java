package dev.erg.device;

import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.yaml.YAMLParser;
import dev.erg.error.BadInputException;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A small document tree with the line of every key and value, built from a Jackson token stream
 * (YAML or JSON). Jackson's own tree drops locations, and the profile's error messages need them.
 * Duplicate keys, YAML aliases and a second document are rejected while the tree is built.
 */
final class ProfileTree {
    /** Deeper than any profile needs; keeps recursion and messages bounded on hostile input. */
    static final int MAX_DEPTH = 16;

    enum Type { MAP, LIST, SCALAR }

    /** A mapping, a list or a scalar, with the line it starts on (1-based). */
    static final class Node {
        final Type type;
        final int line;
        /** For scalars: the token (string, number, boolean, null) and its text as written. */
        final JsonToken token;
        final String text;
        final Map<String, Entry> map;
        final List<Node> list;

        private Node(Type type, int line, JsonToken token, String text, Map<String, Entry> map, List<Node> list) {
            this.type = type;
            this.line = line;
            this.token = token;
            this.text = text;
            this.map = map;
            this.list = list;
        }

        boolean isNumber() {
            return type == Type.SCALAR && (token == JsonToken.VALUE_NUMBER_INT || token == JsonToken.VALUE_NUMBER_FLOAT);
        }

        boolean isNull() {
            return type == Type.SCALAR && token == JsonToken.VALUE_NULL;
        }

        /** What the node is, for "got ..." in messages. */
        String describe() {
            switch (type) {
                case MAP:
                    return "a mapping";
                case LIST:
                    return "a list";
                default:
                    if (token == JsonToken.VALUE_NULL) {
                        return "nothing";
                    }
                    if (token == JsonToken.VALUE_STRING) {
                        return "text \"" + clip(text) + "\"";
                    }
                    return clip(text);
            }
        }
    }

    /** One key of a mapping with the line the key is written on. */
    static final class Entry {
        final String key;
        final int line;
        final Node value;

        Entry(String key, int line, Node value) {
            this.key = key;
            this.line = line;
            this.value = value;
        }
    }

    private final JsonParser parser;
    private final String label;

    private ProfileTree(JsonParser parser, String label) {
        this.parser = parser;
        this.label = label;
    }

    /**
     * Reads one document from {@code parser}. Returns null for an empty document. Syntax errors of
     * the underlying parser propagate as Jackson exceptions; the caller turns them into one line.
     */
    static Node read(JsonParser parser, String label) throws IOException {
        ProfileTree t = new ProfileTree(parser, label);
        JsonToken first = parser.nextToken();
        if (first == null) {
            return null;
        }
        Node root = t.value(first, "", 0);
        JsonToken more = parser.nextToken();
        if (more != null) {
            throw new BadInputException(label + ":" + t.line() + ": a second document starts here; a profile file "
                    + "holds one");
        }
        return root;
    }

    private int line() {
        return parser.currentTokenLocation().getLineNr();
    }

    private Node value(JsonToken token, String path, int depth) throws IOException {
        int line = line();
        if (depth > MAX_DEPTH) {
            throw new BadInputException(label + ":" + line + ": " + path + ": nested too deeply (more than "
                    + MAX_DEPTH + " levels)");
        }
        switch (token) {
            case START_OBJECT: {
                Map<String, Entry> map = new LinkedHashMap<>();
                JsonToken t;
                while ((t = parser.nextToken()) == JsonToken.FIELD_NAME) {
                    String key = parser.currentName();
                    int keyLine = line();
                    String keyPath = path.isEmpty() ? key : path + "." + key;
                    Entry previous = map.get(key);
                    if (previous != null) {
                        throw new BadInputException(label + ":" + keyLine + ": " + clip(keyPath)
                                + ": duplicate key (first on line " + previous.line + ")");
                    }
                    Node v = value(parser.nextToken(), keyPath, depth + 1);
                    map.put(key, new Entry(key, keyLine, v));
                }
                if (t != JsonToken.END_OBJECT) {
                    throw new BadInputException(at(label, line, path, "the mapping is not closed"));
                }
                return new Node(Type.MAP, line, null, null, Collections.unmodifiableMap(map), null);
            }
            case START_ARRAY: {
                List<Node> list = new ArrayList<>();
                JsonToken t;
                while ((t = parser.nextToken()) != JsonToken.END_ARRAY) {
                    if (t == null) {
                        throw new BadInputException(at(label, line, path, "the list is not closed"));
                    }
                    list.add(value(t, path + "[" + list.size() + "]", depth + 1));
                }
                return new Node(Type.LIST, line, null, null, null, Collections.unmodifiableList(list));
            }
            case VALUE_STRING:
            case VALUE_NUMBER_INT:
            case VALUE_NUMBER_FLOAT:
            case VALUE_TRUE:
            case VALUE_FALSE:
            case VALUE_NULL: {
                if (parser instanceof YAMLParser && ((YAMLParser) parser).isCurrentAlias()) {
                    throw new BadInputException(label + ":" + line + ": " + path + ": YAML aliases (*"
                            + clip(parser.getText()) + ") are not supported; write the value out");
                }
                return new Node(Type.SCALAR, line, token, parser.getText(), null, null);
            }
            default:
                throw new BadInputException(at(label, line, path, "unexpected " + token));
        }
    }

    /** One message line: {@code label:line: path: what} (the path left out at the top level). */
    static String at(String label, int line, String path, String what) {
        return label + ":" + line + ": " + (path.isEmpty() ? "" : clip(path) + ": ") + what;
    }

    /** Keeps user text in messages short and on one line. */
    static String clip(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < s.length() && b.length() < 100; i++) {
            char c = s.charAt(i);
            b.append(c < ' ' || c == 0x7f ? '?' : c);
        }
        if (b.length() < s.length()) {
            b.append("...");
        }
        return b.toString();
    }

    /** The line and the first line of the message of a parser's syntax error. */
    static String syntaxError(String label, JsonProcessingException e, String format) {
        int line = e.getLocation() != null ? e.getLocation().getLineNr() : -1;
        String what = e.getOriginalMessage();
        Throwable cause = e.getCause();
        if (cause instanceof org.yaml.snakeyaml.error.MarkedYAMLException) {
            org.yaml.snakeyaml.error.MarkedYAMLException m = (org.yaml.snakeyaml.error.MarkedYAMLException) cause;
            if (m.getProblemMark() != null) {
                line = m.getProblemMark().getLine() + 1;
            }
            what = m.getProblem();
            if (m.getContext() != null && m.getContextMark() != null) {
                what += " (" + m.getContext() + " started on line " + (m.getContextMark().getLine() + 1) + ")";
            }
        }
        if (what == null) {
            what = e.getClass().getSimpleName();
        }
        for (Throwable c = e; c != null; c = c.getCause()) {
            if (c instanceof java.io.CharConversionException || what.contains("Invalid UTF-8")) {
                return label + (line > 0 ? ":" + line : "") + ": not UTF-8 text (a profile file must be UTF-8)";
            }
        }
        int nl = what.indexOf('\n');
        if (nl >= 0) {
            what = what.substring(0, nl);
        }
        return label + (line > 0 ? ":" + line : "") + ": not valid " + format + ": " + what.trim();
    }
}
