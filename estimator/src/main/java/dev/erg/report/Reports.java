package dev.erg.report;

import dev.erg.error.BadInputException;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;

/**
 * The entry point of every front end into the report writers: all of them read one {@link GateResult}
 * in one pass.
 */
public final class Reports {
    /** The file formats, as named in the plugin's {@code formats} parameter and the CLI. */
    public static final Set<String> FORMATS = Set.of("json", "html", "markdown", "junit");

    private Reports() {
    }

    /** Parses a comma-separated list of formats ("json,html"); an unknown name is a one-line error. */
    public static Set<String> parseFormats(String list) {
        Set<String> out = new TreeSet<>();
        for (String f : list.split(",")) {
            String t = f.trim().toLowerCase(Locale.ROOT);
            if (t.isEmpty()) {
                continue;
            }
            if (!FORMATS.contains(t)) {
                throw new BadInputException("formats: unknown report format '" + f.trim() + "' (known: "
                        + new TreeSet<>(FORMATS) + ")");
            }
            out.add(t);
        }
        return out;
    }

    /** A file-name stem for a model x device pair: model file name and device name, made safe. */
    public static String stem(PairResult p) {
        return stem(p.model(), p.device());
    }

    /** The stem of a model and a device as configured (the model's path, preset:ID or the profile's path). */
    public static String stem(String modelLabel, String deviceLabel) {
        String model = fileName(modelLabel).replaceAll("\\.onnx$", "");
        String dev = deviceLabel.startsWith("preset:") ? deviceLabel.substring(7)
                : fileName(deviceLabel).replaceAll("\\.(ya?ml|json)$", "");
        return (model + "." + dev).replaceAll("[^A-Za-z0-9._-]", "_");
    }

    /**
     * The stem of a model's comparison files ({@code MODEL.compare.md}, {@code MODEL.compare.html}),
     * written when the model runs on two devices or more.
     */
    public static String compareStem(String modelLabel) {
        return (fileName(modelLabel).replaceAll("\\.onnx$", "") + ".compare").replaceAll("[^A-Za-z0-9._-]", "_");
    }

    /**
     * The stems of every file set a run of {@code models} on {@code devices} writes, each with who writes
     * it: one per pair, and one comparison per model when there are two devices or more. Two writers of
     * one stem are a one-line error naming both.
     */
    public static void checkStems(List<String> models, List<String> devices) {
        Map<String, String> stems = new HashMap<>();
        for (String m : models) {
            for (String d : devices) {
                claim(stems, stem(m, d), m + " on " + d);
            }
        }
        if (devices.size() > 1) {
            for (String m : models) {
                claim(stems, compareStem(m), "the comparison of " + m);
            }
        }
    }

    private static void claim(Map<String, String> stems, String stem, String who) {
        String other = stems.put(stem, who);
        if (other != null) {
            throw new BadInputException(other + " and " + who + " would write the same report files (" + stem
                    + ".*); give the models or device files distinct names");
        }
    }

    private static String fileName(String path) {
        String t = path.replace('\\', '/');
        while (t.endsWith("/") && t.length() > 1) {
            t = t.substring(0, t.length() - 1);
        }
        int slash = t.lastIndexOf('/');
        return slash < 0 ? t : t.substring(slash + 1);
    }

    /** Throws the one-line error for a format that is not one of {@link #FORMATS}. */
    public static void checkFormats(Set<String> formats) {
        for (String f : formats) {
            if (!FORMATS.contains(f)) {
                throw new BadInputException("formats: unknown report format '" + f + "' (known: "
                        + new TreeSet<>(FORMATS) + ")");
            }
        }
    }

    /**
     * Writes the requested formats for every pair into {@code dir}; returns the files written, in a
     * stable order: pair by pair as in the result, and per pair {@code STEM.json}, {@code STEM.html},
     * {@code STEM.md}, {@code TEST-erg.STEM.xml} (those requested); then, for every model that ran on two
     * devices or more, {@code MODEL.compare.html} and {@code MODEL.compare.md} ({@link ComparisonReport}).
     * Two pairs that share a stem (two
     * models with the same file name) are refused before anything is written: no file is overwritten.
     * A run checks this before it reads the first model ({@code RunRequest.validate}).
     */
    public static List<Path> write(GateResult result, Path dir, Set<String> formats) {
        checkFormats(formats);
        Map<String, String> stems = new HashMap<>();
        for (PairResult p : result.pairs()) {
            claim(stems, stem(p), p.model() + " on " + p.device());
        }
        List<Comparison> comparisons = Comparison.of(result);
        for (Comparison c : comparisons) {
            claim(stems, c.stem(), "the comparison of " + c.model);
        }
        List<Path> written = new ArrayList<>();
        Path target = dir;
        try {
            Files.createDirectories(dir);
            for (PairResult p : result.pairs()) {
                String stem = stem(p);
                Figures f = Figures.of(p); // the one view of the pair that every writer reads
                if (formats.contains("json")) {
                    target = dir.resolve(stem + ".json");
                    Files.write(target, EstimateJson.bytes(f, result));
                    written.add(target);
                }
                if (formats.contains("html")) {
                    target = dir.resolve(stem + ".html");
                    Files.write(target, utf8(HtmlReport.render(f, result)));
                    written.add(target);
                }
                if (formats.contains("markdown")) {
                    target = dir.resolve(stem + ".md");
                    Files.write(target, utf8(MarkdownReport.render(f, result)));
                    written.add(target);
                }
                if (formats.contains("junit")) {
                    target = dir.resolve("TEST-erg." + stem + ".xml");
                    Files.write(target, utf8(JUnitReport.render(f, result, stem)));
                    written.add(target);
                }
            }
            for (Comparison c : comparisons) {
                if (formats.contains("html")) {
                    target = dir.resolve(c.stem() + ".html");
                    Files.write(target, utf8(ComparisonReport.html(c)));
                    written.add(target);
                }
                if (formats.contains("markdown")) {
                    target = dir.resolve(c.stem() + ".md");
                    Files.write(target, utf8(ComparisonReport.markdown(c)));
                    written.add(target);
                }
            }
        } catch (IOException e) {
            throw new BadInputException(target + ": cannot write the report (" + e.getClass().getSimpleName()
                    + (e.getMessage() == null ? "" : ": " + e.getMessage()) + ")");
        }
        return written;
    }

    /**
     * The console rendering: per pair the {@value ConsoleReport#DEFAULT_TOP} layers of most energy, the
     * totals and every check (ok / FAIL with its message verbatim), then the verdict. The baseline
     * note ({@link GateResult#baselineNote()}) is not part of it: front ends log it themselves.
     */
    public static String console(GateResult result) {
        return ConsoleReport.gate(result, ConsoleReport.DEFAULT_TOP);
    }

    /** As {@link #console(GateResult)}, listing {@code top} layers per pair. */
    public static String console(GateResult result, int top) {
        return ConsoleReport.gate(result, top);
    }

    static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
