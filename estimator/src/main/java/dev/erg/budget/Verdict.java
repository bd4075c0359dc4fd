package dev.erg.budget;

/**
 * How one check, one pair or a whole run came out. {@link #AT_RISK} is a pass whose limit lies inside
 * the estimate's error band (a calibrated profile's): it is listed and warned about, and fails a build
 * only when the run asks at-risk checks to fail.
 */
public enum Verdict {
    PASS("pass"), AT_RISK("at risk"), FAIL("fail");

    /** The word reports print. */
    public final String label;

    Verdict(String label) {
        this.label = label;
    }

    /** The worse of two verdicts: FAIL over AT_RISK over PASS. */
    public Verdict and(Verdict other) {
        return other.ordinal() > ordinal() ? other : this;
    }

    /**
     * The verdict of {@code value} against {@code limit}: FAIL when it breaks the limit, AT_RISK when
     * it holds but moving it by {@code band} (a relative uncertainty, 0 for none) would break it.
     */
    public static Verdict of(double value, double limit, boolean atMost, double band) {
        return of(value, limit, atMost, -band, band);
    }

    /**
     * As above with an uneven band: the true value may lie anywhere from {@code value x (1 + low)} to
     * {@code value x (1 + high)} ({@code low <= 0 <= high}); AT_RISK when the limit lies inside it.
     */
    public static Verdict of(double value, double limit, boolean atMost, double low, double high) {
        boolean ok = atMost ? value <= limit : value >= limit;
        if (!ok) {
            return FAIL;
        }
        double worst = atMost ? value * (1 + high) : value * (1 + low);
        return (atMost ? worst > limit : worst < limit) ? AT_RISK : PASS;
    }

}
