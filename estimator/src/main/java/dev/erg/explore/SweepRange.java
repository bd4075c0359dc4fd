package dev.erg.explore;

import dev.erg.error.BadInputException;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * The values a symbolic dimension is swept over: {@code NAME=FROM..TO:STEP} (FROM, FROM+STEP, ... up
 * to TO) or {@code NAME=FROM..TO*FACTOR} (FROM, FROM·FACTOR, ... up to TO). TO is always a point, even
 * when the steps do not land on it.
 *
 * @param name      the symbolic dimension
 * @param from      the first value, 1 or more
 * @param to        the last value, FROM or more
 * @param step      the step of a linear sweep (0 for a geometric one)
 * @param factor    the factor of a geometric sweep (0 for a linear one)
 */
public record SweepRange(String name, long from, long to, long step, long factor) {
    /** The most points one sweep may have: each is a whole estimate. */
    public static final int MAX_POINTS = 1024;

    private static final Pattern FORM = Pattern.compile(
            "\\s*([A-Za-z_][A-Za-z0-9_.:/-]*)\\s*=\\s*(\\d+)\\s*\\.\\.\\s*(\\d+)\\s*(?:([:*])\\s*(\\d+))\\s*");

    public SweepRange {
        if (from < 1 || to < from) {
            throw new BadInputException("sweep " + name + ": the range must run from 1 or more up to a value"
                    + " no smaller than its start (got " + from + ".." + to + ")");
        }
        if ((step > 0) == (factor > 0)) {
            throw new BadInputException("sweep " + name + ": give a step (:STEP) or a factor (*FACTOR) of 1 or more");
        }
        if (factor == 1) {
            throw new BadInputException("sweep " + name + ": a factor must be 2 or more (got 1)");
        }
        long n = step > 0 ? (to - from) / step + 2 : 66;
        if (step > 0 && n > MAX_POINTS + 1) {
            throw new BadInputException("sweep " + name + ": " + from + ".." + to + ":" + step + " has more than "
                    + MAX_POINTS + " points; use a larger step");
        }
    }

    /**
     * Parses {@code NAME=FROM..TO:STEP} or {@code NAME=FROM..TO*FACTOR}; anything else is a one-line
     * error that starts with {@code where}.
     */
    public static SweepRange parse(String where, String text) {
        Matcher m = FORM.matcher(text == null ? "" : text);
        if (!m.matches()) {
            throw new BadInputException(where + ": '" + text + "' is not NAME=FROM..TO:STEP or NAME=FROM..TO*FACTOR"
                    + " (e.g. seq=64..1024:64 or seq=16..2048*2)");
        }
        long from = number(where, m.group(2));
        long to = number(where, m.group(3));
        long by = number(where, m.group(5));
        boolean linear = m.group(4).equals(":");
        try {
            return new SweepRange(m.group(1), from, to, linear ? by : 0, linear ? 0 : by);
        } catch (BadInputException x) {
            throw new BadInputException(where + ": " + x.getMessage());
        }
    }

    private static long number(String where, String digits) {
        try {
            return Long.parseLong(digits);
        } catch (NumberFormatException x) {
            throw new BadInputException(where + ": " + digits + " is too large");
        }
    }

    /** True for a geometric sweep. */
    public boolean geometric() {
        return factor > 0;
    }

    /** The values, ascending, TO included. */
    public List<Long> values() {
        List<Long> out = new ArrayList<>();
        long v = from;
        while (v < to) {
            out.add(v);
            if (geometric()) {
                if (v > Long.MAX_VALUE / factor) {
                    break;
                }
                v *= factor;
            } else {
                if (v > Long.MAX_VALUE - step) {
                    break;
                }
                v += step;
            }
        }
        out.add(to);
        return out;
    }

    /** As written: {@code seq=64..1024:64}. */
    @Override
    public String toString() {
        return name + "=" + from + ".." + to + (geometric() ? "*" + factor : ":" + step);
    }
}
