package dev.erg.run;

import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
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
 */
public record RunOutcome(GateResult result, List<Path> reports, Path baselineWritten, int baselineRefreshed,
                         int baselineEntries, boolean failOnViolation) {
    public RunOutcome {
        reports = List.copyOf(reports);
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
