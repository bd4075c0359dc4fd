package dev.erg.analysis;

/**
 * Options of {@link Analyzer#analyze(java.nio.file.Path, java.util.Map, AnalysisOptions)}.
 *
 * @param failOnUnmodelled when true, an analysis in which some node has no rule (or is left
 *                         unresolved downstream of one) fails with a {@link BadInputException} that
 *                         lists the operators and their counts, instead of returning a workload whose
 *                         {@code complete()} is false
 */
public record AnalysisOptions(boolean failOnUnmodelled) {
    /** The defaults: unmodelled operators are listed in the result, not an error. */
    public static final AnalysisOptions DEFAULTS = new AnalysisOptions(false);
}
