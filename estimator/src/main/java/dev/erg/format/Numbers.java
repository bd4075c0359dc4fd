package dev.erg.format;

import java.util.Locale;

/** The one way erg writes a number for people: check messages, console, Markdown, HTML and JUnit. */
public final class Numbers {
    private Numbers() {
    }

    /**
     * A quantity in plain notation that keeps every digit of its whole part and about three
     * significant digits otherwise, trailing zeros dropped: 13383, 2.44, 0.0747, 99.5. "0" for zero,
     * "unbounded" for an infinite value, "n/a" for NaN.
     */
    public static String quantity(double v) {
        if (v == 0 || Double.isInfinite(v) || Double.isNaN(v)) {
            return v == 0 ? "0" : Double.isNaN(v) ? "n/a" : "unbounded";
        }
        double a = Math.abs(v);
        String s;
        if (a >= 1000) {
            s = String.format(Locale.ROOT, "%.0f", v);
        } else if (a >= 100) {
            s = String.format(Locale.ROOT, "%.1f", v);
        } else if (a >= 10) {
            s = String.format(Locale.ROOT, "%.2f", v);
        } else {
            s = String.format(Locale.ROOT, "%.3g", v);
        }
        if (s.contains(".") && !s.contains("e")) {
            s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        }
        return s;
    }
}
