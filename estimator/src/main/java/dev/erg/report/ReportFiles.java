package dev.erg.report;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.function.Function;

/** Writes one result per file stem in each requested format (json, html, markdown); one place for the loop. */
final class ReportFiles {
    private ReportFiles() {
    }

    /**
     * Writes {@code STEM.SUFFIX.json}, {@code .html} and {@code .md} for each entry of {@code byStem},
     * as {@code formats} asks; returns the files written. A file that cannot be written is one line.
     */
    static <T> List<Path> write(Map<String, T> byStem, String suffix, Path dir, Set<String> formats,
                                Function<T, byte[]> json, Function<T, String> html, Function<T, String> markdown) {
        List<Path> written = new ArrayList<>();
        Path target = dir;
        try {
            Files.createDirectories(dir);
            for (Map.Entry<String, T> e : byStem.entrySet()) {
                String stem = e.getKey() + "." + suffix;
                if (formats.contains("json")) {
                    target = dir.resolve(stem + ".json");
                    Files.write(target, json.apply(e.getValue()));
                    written.add(target);
                }
                if (formats.contains("html")) {
                    target = dir.resolve(stem + ".html");
                    Files.write(target, html.apply(e.getValue()).getBytes(StandardCharsets.UTF_8));
                    written.add(target);
                }
                if (formats.contains("markdown")) {
                    target = dir.resolve(stem + ".md");
                    Files.write(target, markdown.apply(e.getValue()).getBytes(StandardCharsets.UTF_8));
                    written.add(target);
                }
            }
        } catch (IOException x) {
            throw new BadInputException(target + ": cannot write the report (" + x.getClass().getSimpleName()
                    + (x.getMessage() == null ? "" : ": " + x.getMessage()) + ")");
        }
        return written;
    }
}
