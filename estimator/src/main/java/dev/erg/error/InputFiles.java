package dev.erg.error;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * The one check every input file passes before erg opens it: it must be a regular file. Opening a
 * named pipe blocks until a writer comes, and a device such as {@code /dev/zero} never ends, so
 * anything else is refused with a line that says what it is.
 */
public final class InputFiles {
    private InputFiles() {
    }

    /**
     * Fails unless {@code file} (after symbolic links) is a regular file.
     *
     * @param label how messages name the file
     * @param noun  what the file should be, e.g. {@code "model file"}
     * @throws BadInputException "LABEL: no such NOUN", "LABEL: is a directory, not a NOUN", "LABEL: is a
     *                           named pipe, not a NOUN" (and so on for sockets and devices)
     */
    public static void requireRegular(Path file, String label, String noun) {
        if (Files.isRegularFile(file)) {
            return;
        }
        if (!Files.exists(file)) {
            throw new BadInputException(label + ": no such " + noun);
        }
        throw new BadInputException(label + ": is " + kind(file) + ", not a " + noun);
    }

    /** What a file that is not a regular file is: "a directory", "a named pipe", "a character device"... */
    static String kind(Path file) {
        if (Files.isDirectory(file)) {
            return "a directory";
        }
        try {
            Object mode = Files.getAttribute(file, "unix:mode");
            if (mode instanceof Integer) {
                switch ((Integer) mode & 0170000) {
                    case 0010000:
                        return "a named pipe";
                    case 0020000:
                        return "a character device";
                    case 0060000:
                        return "a block device";
                    case 0140000:
                        return "a socket";
                    default:
                        break;
                }
            }
        } catch (IOException | UnsupportedOperationException | IllegalArgumentException | SecurityException e) {
            // no unix view: fall through to the general wording
        }
        return "something other than a regular file";
    }
}
