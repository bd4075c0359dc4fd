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

    private static final java.util.regex.Pattern INT_LABEL = java.util.regex.Pattern.compile("u?int([1-9][0-9]?)");
    private static final java.util.regex.Pattern MIXED_LABEL = java.util.regex.Pattern.compile("w([1-9][0-9]?)a([1-9][0-9]?)");

    /**
     * True when a profile may key an energy by {@code label}: an element type erg names (int8, fp16...),
     * an integer of any width from 1 to 64 bits ({@code int1}, {@code int2}, {@code uint3}...), or a
     * mixed integer pair {@code wNaM} (weights N bits, activations M bits).
     */
    public static boolean isLabel(String label, java.util.Set<String> elementTypes) {
        if (label == null) {
            return false;
        }
        if (elementTypes.contains(label)) {
            return true;
        }
        java.util.regex.Matcher m = INT_LABEL.matcher(label);
        if (m.matches()) {
            return Integer.parseInt(m.group(1)) <= 64;
        }
        m = MIXED_LABEL.matcher(label);
        return m.matches() && Integer.parseInt(m.group(1)) <= 64 && Integer.parseInt(m.group(2)) <= 64;
    }

    /** The label of an integer pair: {@code int8} when both widths agree, {@code w4a8} otherwise. */
    public static String intLabel(int weightBits, int activationBits) {
        return weightBits == activationBits ? "int" + weightBits : "w" + weightBits + "a" + activationBits;
    }

    /** {weight bits, activation bits} of a {@code wNaM} label, or null for any other label. */
    public static int[] mixedBits(String label) {
        java.util.regex.Matcher m = label == null ? null : MIXED_LABEL.matcher(label);
        return m != null && m.matches() ? new int[] {Integer.parseInt(m.group(1)), Integer.parseInt(m.group(2))} : null;
    }

    /**
     * Energy of one MAC with {@code wBits} weights and {@code aBits} activations from a listed energy at
     * {@code refBits} (both operands): the multiplier share scales with wBits x aBits / refBits^2, the
     * rest with max(wBits, aBits) / refBits. With wBits = aBits it is {@link #scale}.
     */
    public static double scaleMixed(double refEnergy, int refBits, int wBits, int aBits, double mulFraction) {
        double mul = (double) wBits * aBits / ((double) refBits * refBits);
        double add = (double) Math.max(wBits, aBits) / refBits;
        return refEnergy * (mulFraction * mul + (1 - mulFraction) * add);
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
        int[] mixed = mixedBits(precision);
        if (mixed != null) {
            return lookupMixed(table, precision, mixed[0], mixed[1], mulFraction);
        }
        int bits = bits(precision);
        String best = null;
        int bestScore = Integer.MAX_VALUE;
        for (String p : table.keySet()) {
            if (mixedBits(p) != null) {
                continue; // a mixed pair prices that pair only
            }
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

    /** A {@code wNaM} pair: from the nearest listed integer precision to max(N, M) bits, by {@link #scaleMixed}. */
    private static Lookup lookupMixed(Map<String, Double> table, String label, int wBits, int aBits,
                                      double mulFraction) {
        int bits = Math.max(wBits, aBits);
        String best = null;
        int bestScore = Integer.MAX_VALUE;
        for (String p : table.keySet()) {
            if (mixedBits(p) != null || bits(p) == 0) {
                continue;
            }
            int score = Math.abs(bits(p) - bits) + (isFloat(p) ? 1000 : 0);
            if (score < bestScore || (score == bestScore && p.compareTo(best) < 0)) {
                best = p;
                bestScore = score;
            }
        }
        if (best == null) {
            return null;
        }
        return new Lookup(scaleMixed(table.get(best), bits(best), wBits, aBits, mulFraction), true, best);
    }
}
