package dev.erg.graph;

import dev.erg.error.BadInputException;

/**
 * A graph input has a symbolic dim that no binding gives a value. The message names the file, the
 * input, the dim and its axis; front ends add how their users bind it.
 */
public final class UnboundDimException extends BadInputException {
    private static final long serialVersionUID = 1L;

    private final String dim;

    public UnboundDimException(String message, String dim) {
        super(message);
        this.dim = dim;
    }

    /** The name of the symbolic dim that has no value. */
    public String dim() {
        return dim;
    }
}
