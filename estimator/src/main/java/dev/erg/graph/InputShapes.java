package dev.erg.graph;

import dev.erg.error.BadInputException;
import dev.erg.onnx.GraphDef;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.ValueDef;
import java.util.HashSet;
import java.util.Map;
import java.util.TreeMap;

/**
 * The shapes of a graph's runtime inputs: declared dims, symbolic dims bound by name, whole shapes
 * bound by input; an axis with neither a value nor a name says how to bind it.
 */
final class InputShapes {
    private final String file;
    private final InputBindings bindings;
    private final Map<String, Long> dimBindings;
    private final Map<String, Long> used = new TreeMap<>();

    InputShapes(String file, InputBindings bindings) {
        this.file = file;
        this.bindings = bindings;
        this.dimBindings = bindings.dims();
    }

    /** The symbolic dims that some input used, by name. */
    Map<String, Long> used() {
        return used;
    }

    private BadInputException bad(String what) {
        return new BadInputException(file + ": " + what);
    }

    /** A shape or value bound to a name that is no runtime input is an error: a typo would go unnoticed. */
    void checkNamed(GraphDef g) {
        java.util.Set<String> names = new java.util.TreeSet<>();
        java.util.Set<String> inits = new HashSet<>();
        for (TensorDef t : g.initializers()) {
            inits.add(t.name());
        }
        for (ValueDef in : g.inputs()) {
            if (!inits.contains(in.name())) {
                names.add(in.name());
            }
        }
        java.util.Set<String> bound = new java.util.TreeSet<>(bindings.shapes().keySet());
        bound.addAll(bindings.values().keySet());
        for (String name : bound) {
            if (!names.contains(name)) {
                throw bad("a shape or value is bound to '" + name + "', which is not a runtime graph input (the inputs are "
                        + (names.isEmpty() ? "none" : String.join(", ", names)) + ")");
            }
        }
    }

    long[] dims(ValueDef in) {
        java.util.List<Long> given = bindings.shapes().get(in.name());
        if (given != null) {
            return givenShape(in, given);
        }
        if (in.dims() == null) {
            if (bindings.values().containsKey(in.name())) {
                return null; // the value's own shape
            }
            throw new UnboundDimException(file + ": graph input '" + in.name() + "' declares no shape", null,
                    in.name(), "1x...");
        }
        long[] dims = new long[in.dims().size()];
        for (int k = 0; k < dims.length; k++) {
            ValueDef.Dim d = in.dims().get(k);
            if (d.isFixed()) {
                dims[k] = d.value();
            } else if (d.param() != null) {
                Long bound = dimBindings.get(d.param());
                if (bound == null) {
                    throw new UnboundDimException(file + ": graph input '" + in.name() + "' has the symbolic dim '"
                            + d.param() + "' (axis " + k + ") with no value", d.param(), in.name(), null);
                }
                if (bound < 1) {
                    throw bad("symbolic dim '" + d.param() + "' is bound to " + bound + "; a dim must be at least 1");
                }
                dims[k] = bound;
                used.put(d.param(), bound);
            } else if (bindings.values().containsKey(in.name())) {
                dims[k] = -1; // the bound value gives it
            } else {
                throw new UnboundDimException(file + ": graph input '" + in.name() + "' has axis " + k + " of "
                        + declared(in) + " with neither a value nor a name; its whole shape must be bound", null,
                        in.name(), example(in));
            }
        }
        checkProduct(in.name(), dims);
        return dims;
    }

    /** A whole shape given by the user: its rank and fixed dims must agree with the declaration. */
    private long[] givenShape(ValueDef in, java.util.List<Long> given) {
        long[] dims = new long[given.size()];
        for (int k = 0; k < dims.length; k++) {
            dims[k] = given.get(k);
        }
        if (in.dims() != null) {
            if (in.dims().size() != dims.length) {
                throw bad("graph input '" + in.name() + "' is declared " + declared(in) + " (rank " + in.dims().size()
                        + ") but is bound to the shape " + InputBindings.shapeText(given) + " (rank " + dims.length + ")");
            }
            for (int k = 0; k < dims.length; k++) {
                ValueDef.Dim d = in.dims().get(k);
                if (d.isFixed() && d.value() != dims[k]) {
                    throw bad("graph input '" + in.name() + "' is declared " + declared(in) + " but is bound to the shape "
                            + InputBindings.shapeText(given) + ": axis " + k + " is fixed at " + d.value());
                }
                if (!d.isFixed() && d.param() != null) {
                    Long other = dimBindings.get(d.param());
                    if (other != null && other != dims[k]) {
                        throw bad("graph input '" + in.name() + "' is bound to the shape " + InputBindings.shapeText(given)
                                + ", but its axis " + k + " is the dim '" + d.param() + "', bound to " + other);
                    }
                }
            }
        }
        checkProduct(in.name(), dims);
        return dims;
    }

    private void checkProduct(String name, long[] dims) {
        long n = 1;
        for (long d : dims) {
            try {
                n = Math.multiplyExact(n, Math.max(d, 0));
            } catch (ArithmeticException e) {
                throw bad("graph input '" + name + "' has dims whose product overflows 64 bits");
            }
        }
    }

    /** The declared shape as text: {@code [?, ?]}, {@code [2, ?, 128]}, {@code [batch, 3]}. */
    static String declared(ValueDef in) {
        StringBuilder b = new StringBuilder("[");
        for (int k = 0; k < in.dims().size(); k++) {
            ValueDef.Dim d = in.dims().get(k);
            b.append(k == 0 ? "" : ", ").append(d.isFixed() ? String.valueOf(d.value()) : d.param() != null ? d.param() : "?");
        }
        return b.append(']').toString();
    }

    /** An example shape for the message: the declared dims, an unknown one shown as N. */
    private static String example(ValueDef in) {
        StringBuilder b = new StringBuilder();
        for (int k = 0; k < in.dims().size(); k++) {
            ValueDef.Dim d = in.dims().get(k);
            b.append(k == 0 ? "" : "x").append(d.isFixed() ? String.valueOf(d.value()) : "N");
        }
        return b.toString();
    }
}
