package dev.erg.conformance;

import java.nio.file.Path;
import java.util.Map;
import java.util.function.Consumer;

/**
 * One model to check: built with {@link M} at one opset, or read from a file. {@code subject} is
 * the operator the case is about (the table cell that a runtime refusal marks).
 */
final class Case {
    final String family;
    final String subject;
    final String variant;
    final long opset;
    final Consumer<M> body;
    final Path file;
    final Map<String, Long> dims;

    private Case(String family, String subject, String variant, long opset, Consumer<M> body, Path file,
                 Map<String, Long> dims) {
        this.family = family;
        this.subject = subject;
        this.variant = variant;
        this.opset = opset;
        this.body = body;
        this.file = file;
        this.dims = dims;
    }

    static Case built(String family, String subject, String variant, long opset, Consumer<M> body) {
        return new Case(family, subject, variant, opset, body, null, Map.of());
    }

    static Case file(String family, String subject, Path file, Map<String, Long> dims) {
        return new Case(family, subject, file.getFileName().toString(), 0, null, file, dims);
    }

    /** "Conv dilations @11"; unique across the suite. */
    String id() {
        return file != null ? "model " + variant : subject + " " + variant + " @" + opset;
    }

    @Override
    public String toString() {
        return id();
    }
}
