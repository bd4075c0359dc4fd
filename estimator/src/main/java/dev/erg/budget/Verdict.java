package dev.erg.budget;

/**
 * How one check, one pair or a whole run came out. {@link #AT_RISK} is a pass whose margin is
 * smaller than the estimate's known uncertainty: it is listed, but it never fails a build.
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
        boolean ok = atMost ? value <= limit : value >= limit;
        if (!ok) {
            return FAIL;
        }
        if (band > 0) {
            double worst = atMost ? value * (1 + band) : value * (1 - band);
            if (atMost ? worst > limit : worst < limit) {
                return AT_RISK;
            }
        }
        return PASS;
    }
}
