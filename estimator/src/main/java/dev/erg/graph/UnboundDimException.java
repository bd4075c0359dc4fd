package dev.erg.graph;

import dev.erg.error.BadInputException;

/**
 * A graph input has a dim that no binding gives a value: a symbolic dim ({@link #dim()} names it), or
 * an axis without a name or an input without a declared shape ({@link #dim()} is null, and the whole
 * shape must be bound; {@link #shapeExample()} suggests one). The message names the file, the input
 * and the axis; front ends add how their users bind it.
 */
public final class UnboundDimException extends BadInputException {
    private static final long serialVersionUID = 1L;

    private final String dim;
    private final String input;
    private final String shapeExample;

    public UnboundDimException(String message, String dim) {
        this(message, dim, null, null);
    }

    public UnboundDimException(String message, String dim, String input, String shapeExample) {
        super(message);
        this.dim = dim;
        this.input = input;
        this.shapeExample = shapeExample;
    }

    /** The name of the symbolic dim that has no value, or null when the input's whole shape is needed. */
    public String dim() {
        return dim;
    }

    /** The graph input whose shape is not known. */
    public String input() {
        return input;
    }

    /** A shape of the declared rank to show in a hint, e.g. {@code 1x1}. */
    public String shapeExample() {
        return shapeExample;
    }
}
