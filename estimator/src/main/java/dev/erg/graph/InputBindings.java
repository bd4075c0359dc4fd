package dev.erg.graph;

import dev.erg.error.BadInputException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * What the user tells erg about a model's runtime inputs, beyond the file: values for symbolic dims
 * ({@code batch=1}), whole shapes for inputs ({@code input=1x576}, also for inputs whose dims carry no
 * name or that declare no shape at all), and constant values for small inputs ({@code sr=16000} or
 * {@code ids=1,2,3}). A bound value is folded through inference like an initializer: If conditions,
 * Shape chains and Reshape targets that depend on it are worked out at analysis time.
 *
 * <p>The maps are sorted by name. Values are kept as the numbers the user wrote; they are checked
 * against the input's declared element type and shape when the graph is built.
 */
public final class InputBindings {
    /** No bindings at all. */
    public static final InputBindings NONE = new InputBindings(Map.of(), Map.of(), Map.of());

    private final Map<String, Long> dims;
    private final Map<String, List<Long>> shapes;
    private final Map<String, List<String>> values;

    /**
     * @param dims   symbolic dim name to its value (at least 1)
     * @param shapes graph input name to its whole shape (every dim at least 0)
     * @param values graph input name to its values, as written (numbers; {@code true}/{@code false} for bool)
     */
    public InputBindings(Map<String, Long> dims, Map<String, List<Long>> shapes, Map<String, List<String>> values) {
        this.dims = Collections.unmodifiableMap(new TreeMap<>(dims));
        Map<String, List<Long>> s = new TreeMap<>();
        shapes.forEach((k, v) -> s.put(k, List.copyOf(v)));
        this.shapes = Collections.unmodifiableMap(s);
        Map<String, List<String>> vs = new TreeMap<>();
        values.forEach((k, v) -> vs.put(k, List.copyOf(v)));
        this.values = Collections.unmodifiableMap(vs);
    }

    /** Only symbolic dims bound, as the older API takes them. */
    public static InputBindings ofDims(Map<String, Long> dims) {
        return new InputBindings(dims, Map.of(), Map.of());
    }

    /**
     * Parses the texts a front end collects ({@code 1x576} per shape, {@code 16000} or {@code 1,2,3} per
     * value). {@code where} names the option or configuration element in messages.
     *
     * @throws BadInputException naming {@code where} and the entry when a text is malformed
     */
    public static InputBindings parse(Map<String, Long> dims, Map<String, String> shapes, Map<String, String> values,
                                      String where) {
        Map<String, List<Long>> s = new TreeMap<>();
        for (Map.Entry<String, String> e : shapes.entrySet()) {
            s.put(e.getKey(), parseShape(where, e.getKey(), e.getValue()));
        }
        Map<String, List<String>> v = new TreeMap<>();
        for (Map.Entry<String, String> e : values.entrySet()) {
            v.put(e.getKey(), parseValues(where, e.getKey(), e.getValue()));
        }
        return new InputBindings(dims, s, v);
    }

    /** A shape written as dims joined by {@code x} ({@code 1x576}); an empty text is a scalar. */
    public static List<Long> parseShape(String where, String name, String text) {
        String t = text == null ? "" : text.trim();
        List<Long> out = new ArrayList<>();
        if (t.isEmpty()) {
            return out;
        }
        for (String part : t.split("[xX]", -1)) {
            long d;
            try {
                d = Long.parseLong(part.trim());
            } catch (NumberFormatException e) {
                throw new BadInputException(where + ": shape of '" + name + "' is '" + text
                        + "'; write whole dims joined by x, e.g. 1x576");
            }
            if (d < 0) {
                throw new BadInputException(where + ": shape of '" + name + "' has the negative dim " + d);
            }
            out.add(d);
        }
        return out;
    }

    /** Values written as numbers joined by commas ({@code 16000}, {@code 1,2,3}). */
    public static List<String> parseValues(String where, String name, String text) {
        String t = text == null ? "" : text.trim();
        if (t.isEmpty()) {
            throw new BadInputException(where + ": value of '" + name + "' is empty; write a number, or numbers joined by commas");
        }
        List<String> out = new ArrayList<>();
        for (String part : t.split(",", -1)) {
            String p = part.trim();
            if (!p.equalsIgnoreCase("true") && !p.equalsIgnoreCase("false")) {
                try {
                    Double.parseDouble(p);
                } catch (NumberFormatException e) {
                    throw new BadInputException(where + ": value of '" + name + "' has '" + p + "', which is not a number");
                }
            }
            out.add(p);
        }
        return out;
    }

    /** Symbolic dim name to value, sorted. */
    /** These bindings with {@code dims} as the symbolic dims; the shapes and values are kept. */
    public InputBindings withDims(Map<String, Long> dims) {
        return new InputBindings(dims, shapes(), values());
    }

    public Map<String, Long> dims() {
        return dims;
    }

    /** Graph input name to its whole shape, sorted. */
    public Map<String, List<Long>> shapes() {
        return shapes;
    }

    /** Graph input name to its values as written, sorted. */
    public Map<String, List<String>> values() {
        return values;
    }

    public boolean isEmpty() {
        return dims.isEmpty() && shapes.isEmpty() && values.isEmpty();
    }

    /** A shape for display: {@code 1x576}, or {@code scalar} for rank 0. */
    public static String shapeText(List<Long> shape) {
        if (shape.isEmpty()) {
            return "scalar";
        }
        StringBuilder b = new StringBuilder();
        for (Long d : shape) {
            b.append(b.length() == 0 ? "" : "x").append(d);
        }
        return b.toString();
    }

    /** One line for reports: {@code dims batch=1; shapes input=1x576; values sr=16000}; empty when none. */
    public String describe() {
        List<String> parts = new ArrayList<>();
        if (!dims.isEmpty()) {
            List<String> p = new ArrayList<>();
            dims.forEach((k, v) -> p.add(k + "=" + v));
            parts.add("dims " + String.join(", ", p));
        }
        if (!shapes.isEmpty()) {
            List<String> p = new ArrayList<>();
            shapes.forEach((k, v) -> p.add(k + "=" + shapeText(v)));
            parts.add("shapes " + String.join(", ", p));
        }
        if (!values.isEmpty()) {
            List<String> p = new ArrayList<>();
            values.forEach((k, v) -> p.add(k + "=" + String.join(",", v)));
            parts.add("values " + String.join(", ", p));
        }
        return String.join("; ", parts);
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof InputBindings b && b.dims.equals(dims) && b.shapes.equals(shapes) && b.values.equals(values);
    }

    @Override
    public int hashCode() {
        return dims.hashCode() * 31 * 31 + shapes.hashCode() * 31 + values.hashCode();
    }

    @Override
    public String toString() {
        return describe();
    }
}
