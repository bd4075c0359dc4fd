package dev.erg.cli;

import dev.erg.error.BadInputException;
import dev.erg.run.ModelSpec;
import java.io.IOException;
import java.nio.file.AccessDeniedException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.FileSystemException;
import java.nio.file.NoSuchFileException;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import picocli.CommandLine;

/** Option parsing shared by the commands: dim bindings, usage errors, file-error wording. */
final class Options {
    private Options() {
    }

    /** NAME=VALUE pairs into a map; a malformed pair is a usage error. */
    static Map<String, Long> dims(CommandLine.Model.CommandSpec spec, List<String> specs) {
        Map<String, Long> out = new LinkedHashMap<>();
        for (String s : specs) {
            int eq = s.indexOf('=');
            if (eq <= 0) {
                throw usage(spec, "--dim '" + s + "' is not NAME=VALUE (e.g. --dim batch=1)");
            }
            String name = s.substring(0, eq).trim();
            long v;
            try {
                v = ModelSpec.parseDim("--dim " + name, s.substring(eq + 1));
            } catch (BadInputException e) {
                throw usage(spec, e.getMessage());
            }
            if (out.put(name, v) != null) {
                throw usage(spec, "--dim " + name + " is given twice");
            }
        }
        return out;
    }

    /** A positive, finite number, or null when the option is not given. */
    static Double positive(CommandLine.Model.CommandSpec spec, String option, Double v) {
        if (v != null && (!(v > 0) || v.isInfinite())) {
            throw usage(spec, option + " must be a number greater than 0, not " + v);
        }
        return v;
    }

    static CommandLine.ParameterException usage(CommandLine.Model.CommandSpec spec, String message) {
        return new CommandLine.ParameterException(spec.commandLine(), message);
    }

    /** What went wrong with a file, in a few words. */
    static String why(IOException e) {
        if (e instanceof AccessDeniedException) {
            return "permission denied on " + ((AccessDeniedException) e).getFile();
        }
        if (e instanceof FileAlreadyExistsException) {
            return ((FileAlreadyExistsException) e).getFile() + " is in the way";
        }
        if (e instanceof NoSuchFileException) {
            return "no such file or folder: " + ((NoSuchFileException) e).getFile();
        }
        if (e instanceof FileSystemException && ((FileSystemException) e).getReason() != null) {
            return ((FileSystemException) e).getReason();
        }
        return Main.oneLine(e.getMessage());
    }
}
