package dev.erg.format;

import java.math.BigDecimal;
import java.math.MathContext;
import java.math.RoundingMode;

/**
 * The one way erg writes a number for people: check messages, console, Markdown, HTML, JUnit. One
 * rule throughout: about three significant digits in plain notation, trailing zeros dropped, and never
 * a digit of the whole part rounded away (13383, 286, 2.44, 0.0747); counts and sizes take a unit
 * prefix first and then the same rule (1.2k, 11.6M, 48 KiB). No {@link java.util.Formatter}: it costs a
 * cold JVM tens of milliseconds.
 */
public final class Numbers {
    private static final String[] COUNT_UNITS = {"k", "M", "G", "T", "P", "E"};
    private static final String[] BYTE_UNITS = {"KiB", "MiB", "GiB", "TiB", "PiB", "EiB"};
    private static final MathContext THREE = new MathContext(3, RoundingMode.HALF_UP);

    private Numbers() {
    }

    /**
     * A quantity: "0" for zero, "unbounded" for an infinite value (with a minus sign when negative),
     * "n/a" for NaN; whole numbers from 1000 up; three significant digits below.
     */
    public static String sig(double v) {
        if (Double.isNaN(v)) {
            return "n/a";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "unbounded" : "-unbounded";
        }
        if (v == 0) {
            return "0";
        }
        String s;
        if (Math.abs(v) >= 999.5) {
            s = new BigDecimal(v).setScale(0, RoundingMode.HALF_UP).toPlainString();
        } else {
            s = new BigDecimal(v).round(THREE).stripTrailingZeros().toPlainString();
        }
        return s.equals("-0") ? "0" : s;
    }

    /** A count with a decimal unit: 950, 1.2k, 11.6M, 116M, 1.82G. */
    public static String count(long v) {
        return scaled(v, 1000, COUNT_UNITS, "");
    }

    /** A byte size with a binary unit: 512 B, 2.25 KiB, 44.6 MiB. */
    public static String bytes(long v) {
        return Math.abs(v) < 1024 ? v + " B" : scaled(v, 1024, BYTE_UNITS, " ");
    }

    private static String scaled(long v, long base, String[] units, String sep) {
        if (Math.abs(v) < base) {
            return Long.toString(v);
        }
        double x = (double) v / base;
        int u = 0;
        while (Math.abs(x) >= 999.5 && u + 1 < units.length) {
            x /= base;
            u++;
        }
        return sig(x) + sep + units[u];
    }

    /** A whole number with thousands separators: 1,819,066,368. */
    public static String exact(long v) {
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

    /** {@code v} with exactly {@code decimals} digits after the point, rounded half up. */
    public static String fixed(double v, int decimals) {
        if (Double.isNaN(v) || Double.isInfinite(v)) {
            return sig(v);
        }
        String s = new BigDecimal(v).setScale(decimals, RoundingMode.HALF_UP).toPlainString();
        return s.matches("-0(\\.0*)?") ? s.substring(1) : s;
    }

    /** A share 0..1 as a percentage with one decimal: 84.4%. */
    public static String percent(double share) {
        return fixed(100 * share, 1) + "%";
    }

    /** A signed percentage with one decimal: +50.0%, -3.2%, +0.0%. */
    public static String signedPercent(double pct) {
        String s = fixed(pct, 1);
        return (s.startsWith("-") ? s : "+" + s) + "%";
    }

    /** A signed quantity: +1.2, -0.35, 0. */
    public static String signed(double v) {
        String s = sig(v);
        return v > 0 ? "+" + s : s;
    }

    /** A signed whole number with thousands separators: +57,600, -64, 0. */
    public static String signedExact(long v) {
        return v > 0 ? "+" + exact(v) : exact(v);
    }

    /** An energy in joules with the unit that keeps it readable: nJ, µJ, mJ or J. */
    public static String joules(double j) {
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
}
