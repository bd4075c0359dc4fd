package dev.erg.device;

import java.util.Map;

/**
 * Energy at precisions a profile does not list, by the bit-width rule: multiplier energy grows
 * about quadratically with operand bits, adder energy about linearly (Nagel et al., "A White Paper on
 * Neural Network Quantization", arXiv:2106.08295, 2021, section 2.1).
 */
public final class Precisions {
    private Precisions() {
    }

    /** Bits of a precision label such as "int8", "fp16", "bf16", "uint4"; 0 when unknown. */
    public static int bits(String label) {
        if (label == null) {
            return 0;
        }
        int i = 0;
        int n = label.length();
        while (i < n && Character.isLetter(label.charAt(i))) {
            i++;
        }
        int start = i;
        while (i < n && Character.isDigit(label.charAt(i))) {
            i++;
        }
        if (i == start) {
            return label.equals("bool") ? 8 : 0;
        }
        return Integer.parseInt(label.substring(start, i));
    }

    public static boolean isFloat(String label) {
        return label != null && (label.startsWith("fp") || label.startsWith("bf"));
    }

    /**
     * Energy of one MAC at {@code bits}, from a listed energy at {@code refBits}: the multiplier share
     * {@code mulFraction} scales with (bits/refBits)^2, the rest with bits/refBits.
     */
    public static double scale(double refEnergy, int refBits, int bits, double mulFraction) {
        double r = (double) bits / refBits;
        return refEnergy * (mulFraction * r * r + (1 - mulFraction) * r);
    }

    /** The result of looking up an energy: the value and whether the bit-width rule derived it. */
    public static final class Lookup {
        public final double fj;
        public final boolean derived;
        public final String from;

        Lookup(double fj, boolean derived, String from) {
            this.fj = fj;
            this.derived = derived;
            this.from = from;
        }
    }

    /**
     * The energy at {@code precision} from a table of listed energies: the listed value, or the
     * bit-width rule applied to the nearest listed precision of the same family (integer or float).
     */
    public static Lookup lookup(Map<String, Double> table, String precision, double mulFraction) {
        Double v = table.get(precision);
        if (v != null) {
            return new Lookup(v, false, precision);
        }
        int bits = bits(precision);
        String best = null;
        int bestScore = Integer.MAX_VALUE;
        for (String p : table.keySet()) {
            int score = Math.abs(bits(p) - bits) + (isFloat(p) == isFloat(precision) ? 0 : 1000);
            if (score < bestScore || (score == bestScore && p.compareTo(best) < 0)) {
                best = p;
                bestScore = score;
            }
        }
        if (best == null || bits == 0) {
            return null;
        }
        return new Lookup(scale(table.get(best), bits(best), bits, mulFraction), true, best);
    }
}
