package dev.erg.report;

import dev.erg.graph.Graph;
import dev.erg.onnx.OnnxModel;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

/** Number and shape formatting shared by the report writers. */
final class Format {
    private static final String[] COUNT_UNITS = {"k", "M", "G", "T", "P", "E"};
    private static final String[] BYTE_UNITS = {"KiB", "MiB", "GiB", "TiB", "PiB", "EiB"};

    /** The name the JSON and the table give the default ONNX domain (stored as the empty string). */
    static final String DEFAULT_DOMAIN = "ai.onnx";

    private Format() {
    }

    /** A count with a decimal unit: 950, 1.20k, 11.6M, 116M, 1.82G. */
    static String count(long v) {
        return scaled(v, 1000, COUNT_UNITS, "");
    }

    /** A byte size with a binary unit: 512 B, 2.25 KiB, 44.6 MiB. */
    static String bytes(long v) {
        if (v < 1024) {
            return v + " B";
        }
        return scaled(v, 1024, BYTE_UNITS, " ");
    }

    private static String scaled(long v, long base, String[] units, String sep) {
        if (v < base) {
            return Long.toString(v);
        }
        double x = (double) v / base;
        int u = 0;
        while (true) {
            String s = threeDigits(x);
            if (Double.parseDouble(s) >= 1000 && u + 1 < units.length) {
                x /= base;
                u++;
                continue;
            }
            return s + sep + units[u];
        }
    }

    /**
     * About three significant digits: 1.23, 12.3, 123 (and 1000 or more as whole numbers), rounded
     * half up. Formatted by hand: java.util.Formatter costs a cold JVM tens of milliseconds.
     */
    static String threeDigits(double x) {
        long hundredths = Math.round(x * 100);
        if (hundredths < 1000) {
            return fixed(hundredths, 2);
        }
        long tenths = Math.round(x * 10);
        if (tenths < 1000) {
            return fixed(tenths, 1);
        }
        return Long.toString(Math.round(x));
    }

    /** {@code scaled} / 10^decimals with exactly {@code decimals} digits after the point. */
    private static String fixed(long scaled, int decimals) {
        long unit = decimals == 1 ? 10 : 100;
        String frac = Long.toString(scaled % unit);
        while (frac.length() < decimals) {
            frac = "0" + frac;
        }
        return (scaled / unit) + "." + frac;
    }

    /** A whole number with thousands separators: 1,819,066,368. */
    static String exact(long v) {
        String digits = Long.toString(v);
        int sign = v < 0 ? 1 : 0;
        StringBuilder b = new StringBuilder(digits.length() + digits.length() / 3);
        for (int i = 0; i < digits.length(); i++) {
            int left = digits.length() - i;
            if (i > sign && left % 3 == 0) {
                b.append(',');
            }
            b.append(digits.charAt(i));
        }
        return b.toString();
    }

    /** A shape as 1x64x56x56; "scalar" for rank 0, "?" when unknown. */
    static String shape(long[] dims) {
        if (dims == null) {
            return "?";
        }
        if (dims.length == 0) {
            return "scalar";
        }
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < dims.length; i++) {
            b.append(i == 0 ? "" : "x").append(dims[i]);
        }
        return b.toString();
    }

    /** The number of nodes of kind {@code k}. */
    static int countKind(ModelWorkload w, Kind k) {
        int n = 0;
        for (NodeWork nw : w.nodes()) {
            if (nw.kind() == k) {
                n++;
            }
        }
        return n;
    }

    static OnnxModel model(ModelWorkload w) {
        Graph g = w.graph();
        return g == null ? null : g.model();
    }

    /** Opset per domain, sorted by domain name, the default domain shown as {@value #DEFAULT_DOMAIN}. */
    static Map<String, Long> opsets(OnnxModel m) {
        Map<String, Long> out = new TreeMap<>();
        if (m != null) {
            for (Map.Entry<String, Long> e : m.opsets().entrySet()) {
                out.put(e.getKey().isEmpty() ? DEFAULT_DOMAIN : e.getKey(), e.getValue());
            }
        }
        return out;
    }

    /**
     * The input bindings in effect, one line ({@code dims batch=1; shapes input=1x576; values sr=16000}),
     * or empty when nothing is bound.
     */
    static String bindings(ModelWorkload w) {
        return w == null || w.graph() == null ? "" : w.graph().bindings().describe();
    }

    /** The symbolic dims bound for this analysis, sorted by name. */
    static Map<String, Long> dims(ModelWorkload w) {
        return w.graph() == null ? new TreeMap<>() : new TreeMap<>(w.graph().boundDims());
    }

    /**
     * A quantity to three significant digits in plain notation, trailing zeros dropped: 0.0553,
     * 2.84, 99.5, 328, 1230. "0" for zero, "∞" for an infinite value, "n/a" for NaN.
     */
    /** An energy in joules with the unit that keeps it readable: nJ, µJ, mJ or J. */
    static String joules(double j) {
        double a = Math.abs(j);
        if (a != 0 && a < 1e-6) {
            return sig(j * 1e9) + " nJ";
        }
        if (a < 1e-3) {
            return sig(j * 1e6) + " µJ";
        }
        if (a < 1) {
            return sig(j * 1e3) + " mJ";
        }
        return sig(j) + " J";
    }

    static String sig(double v) {
        if (Double.isNaN(v)) {
            return "n/a";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "∞" : "-∞";
        }
        if (v == 0) {
            return "0";
        }
        BigDecimal d = new BigDecimal(v).round(new MathContext(3, RoundingMode.HALF_UP)).stripTrailingZeros();
        String s = d.toPlainString();
        return s.equals("-0") ? "0" : s;
    }

    /** {@code v} with exactly {@code decimals} digits after the point ("-" for a non-finite value). */
    static String fixed(double v, int decimals) {
        if (Double.isNaN(v) || Double.isInfinite(v)) {
            return Double.isNaN(v) ? "n/a" : v > 0 ? "∞" : "-∞";
        }
        return String.format(Locale.ROOT, "%." + decimals + "f", v);
    }

    /** A share 0..1 as a percentage with one decimal: 84.4%. */
    static String percent(double share) {
        return fixed(100 * share, 1) + "%";
    }

    /** A signed delta to three significant digits: +1.2, -0.35, 0. */
    static String signed(double v) {
        String s = sig(v);
        return v > 0 ? "+" + s : s;
    }

    /** A signed whole-number delta with thousands separators: +57,600, -64, 0. */
    static String signedExact(long v) {
        return v > 0 ? "+" + exact(v) : exact(v);
    }

    /** {@code s} with a capital first letter and a closing full stop. */
    static String sentence(String s) {
        if (s.isEmpty()) {
            return s;
        }
        String t = Character.toUpperCase(s.charAt(0)) + s.substring(1);
        return t.endsWith(".") ? t : t + ".";
    }
}
