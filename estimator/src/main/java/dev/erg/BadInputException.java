package dev.erg;

/**
 * Broken input or configuration: a model file, a profile or an option that erg cannot use.
 *
 * <p>The message is one line that names the file and the node, field or key at fault. Front ends
 * print it as it is (the CLI exits 2, the Maven plugin raises a MojoExecutionException) and never
 * show a stack trace for it.
 */
public class BadInputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    public BadInputException(String message) {
        super(message);
    }

    public BadInputException(String message, Throwable cause) {
        super(message, cause);
    }
}
