package dev.erg.error;

/**
 * Broken input or configuration: a model file, a profile or an option that erg cannot use.
 *
 * <p>The message is one line that names the file and the node, field or key at fault. Front ends
 * print it as it is (the CLI exits 2, the Maven plugin raises a MojoExecutionException) and never
 * show a stack trace for it.
 */
public class BadInputException extends RuntimeException {
    private static final long serialVersionUID = 1L;

    /** Messages longer than this are cut (a hostile file can hold names of any length). */
    static final int MAX_MESSAGE = 2000;

    public BadInputException(String message) {
        super(oneLine(message));
    }

    public BadInputException(String message, Throwable cause) {
        super(oneLine(message), cause);
    }

    /**
     * The message as one printable line: names read from a corrupt file may hold line breaks or
     * control characters, which are shown escaped (a line break as backslash-n, others as a unicode escape).
     */
    static String oneLine(String message) {
        if (message == null) {
            return "bad input";
        }
        StringBuilder b = new StringBuilder(Math.min(message.length(), MAX_MESSAGE) + 16);
        for (int i = 0; i < message.length() && b.length() < MAX_MESSAGE; i++) {
            char c = message.charAt(i);
            if (c == '\n') {
                b.append("\\n");
            } else if (c == '\r') {
                b.append("\\r");
            } else if (c == '\t') {
                b.append(' ');
            } else if (c < 0x20 || c == 0x7f || (c >= 0x80 && c < 0xa0) || c == '\u2028' || c == '\u2029') {
                b.append(String.format("\\u%04x", (int) c));
            } else {
                b.append(c);
            }
        }
        if (b.length() >= MAX_MESSAGE) {
            b.setLength(MAX_MESSAGE);
            b.append("...");
        }
        return b.toString();
    }
}
