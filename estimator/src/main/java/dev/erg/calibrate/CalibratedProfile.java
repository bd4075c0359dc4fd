package dev.erg.calibrate;

import dev.erg.calibrate.Calibration.Scope;
import dev.erg.calibrate.Factor.Metric;
import java.math.BigDecimal;
import java.math.MathContext;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeSet;

/**
 * Writes a calibrated profile: the input profile's text as written (comments kept, an earlier
 * {@code calibration} section dropped) followed by the {@code calibration} section of a fit
 * (format: docs/device-profile.schema.json, meaning: docs/calibration.md).
 */
public final class CalibratedProfile {
    private CalibratedProfile() {
    }

    /** The calibrated profile's text. */
    public static String of(String profileText, Calibration c) {
        StringBuilder b = new StringBuilder(withoutSection(profileText));
        if (b.length() > 0 && b.charAt(b.length() - 1) != '\n') {
            b.append('\n');
        }
        return b.append(section(c)).toString();
    }

    /** The text without its top-level {@code calibration:} block. */
    static String withoutSection(String text) {
        String[] lines = text.replace("\r\n", "\n").split("\n", -1);
        StringBuilder b = new StringBuilder();
        boolean skipping = false;
        for (int i = 0; i < lines.length; i++) {
            String l = lines[i];
            boolean top = !l.isEmpty() && !Character.isWhitespace(l.charAt(0)) && !l.startsWith("#");
            if (top) {
                skipping = l.startsWith("calibration:");
            }
            if (!skipping) {
                b.append(l);
                if (i < lines.length - 1) {
                    b.append('\n');
                }
            }
        }
        return b.toString();
    }

    /**
     * The error band of one metric. With three models or more: the signed errors of each model
     * predicted by a fit on the others (whole models, or layers when no whole model was measured).
     * With fewer: the fit's own errors on single layers, since a whole model that the fit was made on
     * says nothing of the error. Null when neither exists (the metric's error stays unknown).
     */
    public static Band band(Calibration c, Metric metric) {
        boolean heldOut = c.heldOut() != null;
        ErrorSummary used;
        if (heldOut) {
            ErrorSummary models = c.leaveOneModelOut(metric, Scope.MODELS);
            used = models.count() > 0 ? models : c.leaveOneModelOut(metric, Scope.LAYERS);
        } else {
            used = c.errorAfter(metric, Scope.LAYERS);
        }
        if (used.count() == 0) {
            return null;
        }
        TreeSet<String> names = new TreeSet<>();
        int layerCount = 0;
        for (Residual r : c.residuals()) {
            if (r.metric() == metric) {
                names.add(r.model());
                layerCount += r.node() == null ? 0 : 1;
            }
        }
        return new Band(used.low(), used.high(), layerCount, names.size(), heldOut ? "leave-one-model-out" : "fit");
    }

    /** An error band as the section writes it. */
    public record Band(double low, double high, int layers, int models, String from) {
    }

    static String section(Calibration c) {
        StringBuilder b = new StringBuilder();
        b.append("# Written by erg calibrate: factors fitted to the measurements below (docs/calibration.md).\n");
        b.append("calibration:\n  factors:\n");
        List<FactorValue> kept = new ArrayList<>();
        for (FactorValue f : c.factors().values()) {
            if (f.fitted()) {
                b.append("    ").append(f.factor().key).append(": ").append(num(f.shown())).append('\n');
            } else {
                kept.add(f);
            }
        }
        if (!kept.isEmpty()) {
            b.append("  not-fitted:\n");
            for (FactorValue f : kept) {
                b.append("    ").append(f.factor().key).append(": ")
                        .append(str(f.note() == null ? "kept as the profile gives it" : f.note())).append('\n');
            }
        }
        b.append("  measurements:\n");
        for (MeasurementFile f : c.files()) {
            b.append("    - file: ").append(str(String.valueOf(f.file().getFileName()))).append('\n');
            b.append("      sha256: ").append(f.sha256()).append('\n');
        }
        TreeSet<String> models = new TreeSet<>();
        for (Residual r : c.residuals()) {
            models.add(r.model());
        }
        b.append("  models:\n");
        for (String m : models) {
            b.append("    - ").append(str(m)).append('\n');
        }
        int errorAt = b.length();
        b.append("  error:\n");
        for (Metric m : Metric.values()) {
            Band band = band(c, m);
            if (band == null) {
                continue;
            }
            b.append("    ").append(m.label).append(":\n");
            b.append("      layers: ").append(band.layers()).append('\n');
            b.append("      models: ").append(band.models()).append('\n');
            ErrorSummary before = c.errorBefore(m, Scope.ALL);
            ErrorSummary after = c.errorAfter(m, Scope.ALL);
            b.append("      median-before: ").append(err(before.median())).append('\n');
            b.append("      worst-before: ").append(err(before.worst())).append('\n');
            b.append("      median: ").append(err(after.median())).append('\n');
            b.append("      worst: ").append(err(after.worst())).append('\n');
            ErrorSummary wm = c.errorAfter(m, Scope.MODELS);
            if (wm.count() > 0) {
                b.append("      models-median: ").append(err(wm.median())).append('\n');
                b.append("      models-worst: ").append(err(wm.worst())).append('\n');
            }
            ErrorSummary lo = c.leaveOneModelOut(m, Scope.ALL);
            if (lo != null && lo.count() > 0) {
                b.append("      leave-one-model-out-median: ").append(err(lo.median())).append('\n');
                b.append("      leave-one-model-out-worst: ").append(err(lo.worst())).append('\n');
            }
            b.append("      band-low: ").append(err(Math.max(band.low(), -0.9999))).append('\n');
            b.append("      band-high: ").append(err(band.high())).append('\n');
            b.append("      band-from: ").append(band.from()).append('\n');
        }
        if (b.length() == errorAt + "  error:\n".length()) {
            b.setLength(errorAt);
            b.append("  error: {}\n");
        }
        b.append("  residuals:\n");
        for (Residual r : c.residuals()) {
            boolean lat = r.metric() == Metric.LATENCY;
            double scale = lat ? 1e3 : 1e6;
            b.append("    - { model: ").append(str(r.model()));
            if (r.node() != null) {
                b.append(", node: ").append(str(r.node()));
            }
            b.append(", metric: ").append(lat ? "latency-ms" : r.chipOnly() ? "chip-energy-uj" : "energy-uj")
                    .append(", measured: ").append(num(r.measured() * scale))
                    .append(", estimated: ").append(num(r.after() * scale))
                    .append(", error: ").append(err(r.errorAfter())).append(" }\n");
        }
        if (!c.notes().isEmpty()) {
            b.append("  notes:\n");
            for (String n : c.notes()) {
                b.append("    - ").append(str(n)).append('\n');
            }
        }
        return b.toString();
    }

    /** A relative error, to four decimals. */
    static String err(double v) {
        return num(Math.round(v * 1e4) / 1e4);
    }

    /** Four significant digits, plain decimal (the profile format takes no NaN). */
    static String num(double v) {
        if (!Double.isFinite(v)) {
            return "0";
        }
        if (v == 0) {
            return "0";
        }
        return new BigDecimal(v).round(new MathContext(4)).stripTrailingZeros().toPlainString();
    }

    /** A double-quoted YAML string. */
    static String str(String s) {
        StringBuilder b = new StringBuilder("\"");
        for (char ch : s.toCharArray()) {
            switch (ch) {
                case '"' -> b.append("\\\"");
                case '\\' -> b.append("\\\\");
                case '\n' -> b.append("\\n");
                case '\t' -> b.append("\\t");
                default -> {
                    if (ch < 0x20) {
                        b.append(String.format("\\x%02x", (int) ch));
                    } else {
                        b.append(ch);
                    }
                }
            }
        }
        return b.append('"').toString();
    }
}
