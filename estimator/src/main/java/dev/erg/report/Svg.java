package dev.erg.report;

/** Escaping and number helpers of the SVG charts. */
final class Svg {
    private Svg() {
    }

    /**
     * Text for SVG element content and double-quoted attribute values: the five markup characters as
     * references, characters XML 1.0 does not allow (and C1 controls) as U+FFFD.
     */
    static String esc(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&':
                    b.append("&amp;");
                    break;
                case '<':
                    b.append("&lt;");
                    break;
                case '>':
                    b.append("&gt;");
                    break;
                case '"':
                    b.append("&quot;");
                    break;
                case '\'':
                    b.append("&#39;");
                    break;
                default:
                    b.append(Html.allowed(c) ? c : '\uFFFD');
            }
        }
        return b.toString();
    }

    /** A coordinate with at most one decimal. */
    static String px(double v) {
        long tenths = Math.round(v * 10);
        return tenths % 10 == 0 ? Long.toString(tenths / 10) : (tenths / 10) + "." + Math.abs(tenths % 10);
    }

    /** A step of 1, 2 or 5 times a power of ten, at least {@code raw}. */
    static double niceStep(double raw) {
        if (!(raw > 0) || Double.isInfinite(raw)) {
            return 1;
        }
        double p = Math.pow(10, Math.floor(Math.log10(raw)));
        double m = raw / p;
        double n = m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10;
        return n * p;
    }

    /** 10^d with an SI prefix: 0.01, 0.1, 1, 10, 100, 1k ... 100G, 1T. */
    static String decade(int d, String unit) {
        String[] prefixes = {"", "k", "M", "G", "T", "P", "E"};
        if (d < 0) {
            return "0." + "0".repeat(-d - 1) + "1" + unit;
        }
        int p = Math.min(d / 3, prefixes.length - 1);
        long mant = 1;
        for (int i = 0; i < d - 3 * p; i++) {
            mant *= 10;
        }
        return mant + prefixes[p] + unit;
    }
}
