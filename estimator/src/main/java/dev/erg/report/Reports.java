package dev.erg.report;

import dev.erg.BadInputException;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
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
        String model = Path.of(p.model()).getFileName().toString().replaceAll("\\.onnx$", "");
        String dev = p.device().startsWith("preset:") ? p.device().substring(7)
                : Path.of(p.device()).getFileName().toString().replaceAll("\\.(ya?ml|json)$", "");
        return (model + "." + dev).replaceAll("[^A-Za-z0-9._-]", "_");
    }

    /**
     * Writes the requested formats for every pair into {@code dir}; returns the files written, in a
     * stable order.
     */
    public static List<Path> write(GateResult result, Path dir, Set<String> formats) {
        List<Path> written = new ArrayList<>();
        try {
            Files.createDirectories(dir);
            for (PairResult p : result.pairs()) {
                if (formats.contains("json")) {
                    Path f = dir.resolve(stem(p) + ".json");
                    Files.write(f, GateJson.toBytes(result, p));
                    written.add(f);
                }
            }
        } catch (IOException e) {
            throw new BadInputException(dir + ": cannot write the reports (" + e.getMessage() + ")");
        }
        return written;
    }

    /** The console rendering: one line per pair and the verdict. */
    public static String console(GateResult result) {
        StringBuilder b = new StringBuilder();
        for (PairResult p : result.pairs()) {
            b.append(String.format(Locale.ROOT, "%s on %s: %.4g fps max, %.4g mJ per frame, %s%n", p.model(),
                    p.device(), p.estimate().maxFps(), p.estimate().energyPerFrameJoules() * 1e3,
                    p.passed() ? "pass" : "FAIL"));
            for (Check c : p.checks()) {
                b.append("  ").append(c.passed() ? "ok   " : "FAIL ").append(c.message()).append('\n');
            }
        }
        b.append(result.passed() ? "erg: all budgets hold\n" : "erg: " + result.failureMessage() + "\n");
        return b.toString();
    }

    static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}
