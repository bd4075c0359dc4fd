package dev.erg.explore;

import dev.erg.format.Numbers;
import java.math.BigDecimal;
import java.math.BigInteger;
import java.math.MathContext;
import java.util.ArrayList;
import java.util.List;
import org.hipparchus.fraction.BigFraction;

/**
 * A polynomial in one dimension with exact rational coefficients, {@code c0 + c1·x + c2·x² + ...},
 * fitted by {@link #fit}: the lowest degree that is exact on every sweep point.
 */
public final class Polynomial {
    /**
     * How close a floating metric (latency, energy, power) must come to each point for a fit to count
     * as exact: within this share of the largest absolute value among the points. A sum of a few
     * thousand node values in doubles rounds at about 1e-13 of the total; a metric that truly changes
     * shape (a roofline bound switching from compute to memory) misses by far more.
     */
    public static final double FLOAT_TOLERANCE = 1e-9;

    /**
     * The highest degree tried. Costs of networks are polynomials of low degree in one dim (attention
     * is 2 in the sequence length, a convolution 2 in a square picture's side); a metric that needs a
     * higher one is not a polynomial in practice (a roofline bound or a tile count changing with the dim).
     */
    public static final int MAX_DEGREE = 6;

    private final List<BigFraction> coefficients;

    private Polynomial(List<BigFraction> coefficients) {
        int d = coefficients.size() - 1;
        while (d > 0 && coefficients.get(d).equals(BigFraction.ZERO)) {
            d--;
        }
        this.coefficients = List.copyOf(coefficients.subList(0, d + 1));
    }

    /** Coefficients from the constant term up; the last is not zero unless the polynomial is 0. */
    public List<BigFraction> coefficients() {
        return coefficients;
    }

    public int degree() {
        return coefficients.size() - 1;
    }

    /** The value at {@code x}, exactly. */
    public BigFraction valueExact(long x) {
        BigFraction v = BigFraction.ZERO;
        BigFraction bx = new BigFraction(BigInteger.valueOf(x));
        for (int i = coefficients.size() - 1; i >= 0; i--) {
            v = v.multiply(bx).add(coefficients.get(i));
        }
        return v;
    }

    /** The value at {@code x}, rounded to a double. */
    public double value(long x) {
        return valueExact(x).doubleValue();
    }

    /**
     * The lowest-degree polynomial that is exact on the points, or null when none of degree up to
     * {@link #MAX_DEGREE} and below {@code xs.length - 1} is (a polynomial through every point always
     * exists and says nothing; at least one point beyond those that fix the coefficients must confirm it). Integer metrics must
     * match exactly; floating ones within {@link #FLOAT_TOLERANCE} of their largest value.
     *
     * @param xs      the dimension's values, distinct
     * @param ys      the metric at each value
     * @param integer whether the metric is a whole number (MACs, bytes)
     */
    public static Polynomial fit(long[] xs, double[] ys, boolean integer) {
        int n = xs.length;
        double scale = 0;
        for (double y : ys) {
            scale = Math.max(scale, Math.abs(y));
        }
        double tol = integer ? 0 : FLOAT_TOLERANCE * scale;
        for (int d = 0; d <= Math.min(n - 2, MAX_DEGREE); d++) {
            Polynomial p = interpolate(xs, ys, d + 1);
            if (p.fitsAll(xs, ys, integer, tol)) {
                return p;
            }
        }
        return null;
    }

    private boolean fitsAll(long[] xs, double[] ys, boolean integer, double tol) {
        for (int i = 0; i < xs.length; i++) {
            if (integer) {
                if (!valueExact(xs[i]).equals(exact(ys[i]))) {
                    return false;
                }
            } else if (Math.abs(value(xs[i]) - ys[i]) > tol) {
                return false;
            }
        }
        return true;
    }

    private static BigFraction exact(double y) {
        return new BigFraction(new BigDecimal(y).toBigIntegerExact());
    }

    /**
     * The polynomial through the first {@code m} points (Newton's divided differences, exact), in
     * monomial form. Floating values enter with their exact binary value.
     */
    static Polynomial interpolate(long[] xs, double[] ys, int m) {
        BigFraction[] dd = new BigFraction[m];
        for (int i = 0; i < m; i++) {
            dd[i] = new BigFraction(ys[i]); // the double's exact binary value
        }
        for (int j = 1; j < m; j++) {
            for (int i = m - 1; i >= j; i--) {
                dd[i] = dd[i].subtract(dd[i - 1]).divide(new BigFraction(BigInteger.valueOf(xs[i] - xs[i - j])));
            }
        }
        // Horner on the Newton form: p = dd[m-1]; p = p·(x - x_k) + dd[k] for k = m-2 .. 0.
        List<BigFraction> c = new ArrayList<>();
        c.add(dd[m - 1]);
        for (int k = m - 2; k >= 0; k--) {
            BigFraction xk = new BigFraction(BigInteger.valueOf(xs[k]));
            List<BigFraction> next = new ArrayList<>();
            for (int i = 0; i <= c.size(); i++) {
                BigFraction v = BigFraction.ZERO;
                if (i - 1 >= 0) {
                    v = v.add(c.get(i - 1));
                }
                if (i < c.size()) {
                    v = v.subtract(c.get(i).multiply(xk));
                }
                next.add(v);
            }
            next.set(0, next.get(0).add(dd[k]));
            c = next;
        }
        return new Polynomial(c);
    }

    /**
     * The formula, highest power first, e.g. {@code 1,024·seq² + 49,152·seq + 2,400}: whole
     * coefficients with thousands separators, fractions as {@code p/q} when the metric is whole,
     * otherwise to six significant digits.
     */
    public String formula(String name, boolean integer) {
        StringBuilder b = new StringBuilder();
        for (int i = coefficients.size() - 1; i >= 0; i--) {
            BigFraction c = coefficients.get(i);
            if (c.equals(BigFraction.ZERO) && coefficients.size() > 1) {
                continue;
            }
            boolean neg = c.compareTo(BigFraction.ZERO) < 0;
            BigFraction a = neg ? c.negate() : c;
            if (b.length() > 0) {
                b.append(neg ? " − " : " + ");
            } else if (neg) {
                b.append('−');
            }
            b.append(coefficientText(a, integer));
            if (i >= 1) {
                b.append('·').append(name);
            }
            if (i >= 2) {
                b.append(superscript(i));
            }
        }
        return b.toString();
    }

    /** A coefficient as text: a whole number exactly, a fraction of whole metrics as p/q, else 6 digits. */
    public static String coefficientText(BigFraction a, boolean integer) {
        if (a.getDenominator().equals(BigInteger.ONE) && a.getNumerator().bitLength() < 63) {
            return Numbers.exact(a.getNumerator().longValueExact());
        }
        if (integer && a.getNumerator().bitLength() < 63 && a.getDenominator().bitLength() < 63) {
            return Numbers.exact(a.getNumerator().longValueExact()) + "/" + Numbers.exact(a.getDenominator().longValueExact());
        }
        return new BigDecimal(a.getNumerator()).divide(new BigDecimal(a.getDenominator()), new MathContext(6))
                .stripTrailingZeros().toPlainString();
    }

    /** A coefficient as a JSON number: exact when whole, else a double. */
    public static Object jsonValue(BigFraction a) {
        if (a.getDenominator().equals(BigInteger.ONE)) {
            return a.getNumerator();
        }
        return a.doubleValue();
    }

    private static String superscript(int i) {
        String digits = "⁰¹²³⁴⁵⁶⁷⁸⁹";
        StringBuilder b = new StringBuilder();
        for (char ch : Integer.toString(i).toCharArray()) {
            b.append(digits.charAt(ch - '0'));
        }
        return b.toString();
    }
}
