package dev.erg.run;

import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.explore.Advice;
import dev.erg.explore.Sweep;
import java.nio.file.Path;
import java.util.List;

/**
 * What a run did: the one result model, the report files written, and the baseline written (if the
 * request asked for it). Front ends map it to their output and exit status.
 *
 * @param result            every pair, its checks and its diff
 * @param reports           the report files written, in order
 * @param baselineWritten   the baseline file written, or null
 * @param baselineRefreshed how many entries this run wrote into it
 * @param baselineEntries   how many entries it holds in all (the entries of pairs not run are kept)
 * @param failOnViolation   whether a violation fails the run
 * @param sweeps            the sweeps of the models that have one, model by model and device by device
 * @param advice            the ways to meet the budget of each pair whose budget fails
 */
public record RunOutcome(GateResult result, List<Path> reports, Path baselineWritten, int baselineRefreshed,
                         int baselineEntries, boolean failOnViolation, List<Sweep> sweeps, List<Advice> advice) {
    /** How many candidates of each pair the failure message lists. */
    public static final int MESSAGE_CANDIDATES = 3;

    public RunOutcome {
        reports = List.copyOf(reports);
        sweeps = sweeps == null ? List.of() : List.copyOf(sweeps);
        advice = advice == null ? List.of() : List.copyOf(advice);
    }

    /**
     * The failure message of the run: the result's, then per failing pair the first
     * {@value #MESSAGE_CANDIDATES} ways to meet its budget (computed estimates).
     */
    public String failureMessage() {
        StringBuilder b = new StringBuilder(result.failureMessage());
        for (String line : adviceLines(MESSAGE_CANDIDATES)) {
            b.append('\n').append(line);
        }
        return b.toString();
    }

    /** The advice of every failing pair, the first {@code n} candidates each (all when n < 0). */
    public List<String> adviceLines(int n) {
        List<String> out = new java.util.ArrayList<>();
        for (Advice a : advice) {
            out.addAll(a.lines(n));
        }
        return out;
    }

    /** An outcome without sweeps. */
    public RunOutcome(GateResult result, List<Path> reports, Path baselineWritten, int baselineRefreshed,
                      int baselineEntries, boolean failOnViolation) {
        this(result, reports, baselineWritten, baselineRefreshed, baselineEntries, failOnViolation, List.of(), List.of());
    }

    /** The lines of every sweep (fits, broken ranges, the value found), for the console and the log. */
    public List<String> sweepLines() {
        List<String> out = new java.util.ArrayList<>();
        for (Sweep s : sweeps) {
            out.addAll(s.lines());
        }
        return out;
    }

    /** Every failed check, budget, growth and policy alike. */
    public List<Check> violations() {
        return result.failures();
    }

    /** "baseline written: FILE (N entries refreshed, M in all)", or null when no baseline was written. */
    public String baselineSummary() {
        if (baselineWritten == null) {
            return null;
        }
        return "baseline written: " + baselineWritten + " (" + baselineRefreshed
                + (baselineRefreshed == 1 ? " entry" : " entries") + " refreshed, " + baselineEntries + " in all)";
    }

    /** True when some check failed and the request makes violations fail the run. */
    public boolean failed() {
        return failOnViolation && !result.passed();
    }
}
