package dev.erg.budget;

import java.util.ArrayList;
import java.util.List;

/** The one result model every report reads: all model x device pairs, their checks and diffs. */
public final class GateResult {
    private final List<PairResult> pairs;
    private final Budget budget;
    private final Double maxGrowthPercent;
    private final String baselineFile;
    private final boolean baselineFound;
    private final List<String> notes;

    GateResult(List<PairResult> pairs, Budget budget, Double maxGrowthPercent, String baselineFile,
               boolean baselineFound) {
        this(pairs, budget, maxGrowthPercent, baselineFile, baselineFound, List.of());
    }

    GateResult(List<PairResult> pairs, Budget budget, Double maxGrowthPercent, String baselineFile,
               boolean baselineFound, List<String> notes) {
        this.notes = List.copyOf(notes);
        this.pairs = List.copyOf(pairs);
        this.budget = budget;
        this.maxGrowthPercent = maxGrowthPercent;
        this.baselineFile = baselineFile;
        this.baselineFound = baselineFound;
    }

    public List<PairResult> pairs() {
        return pairs;
    }

    public Budget budget() {
        return budget;
    }

    /** The allowed growth over the baseline, in percent, or null when growth is not checked. */
    public Double maxGrowthPercent() {
        return maxGrowthPercent;
    }

    /** The baseline file as configured, or null when none is configured. */
    public String baselineFile() {
        return baselineFile;
    }

    /** Warnings about the configuration that do not stop the gate (e.g. an unused dimension binding). */
    public List<String> notes() {
        return notes;
    }

    public boolean baselineFound() {
        return baselineFound;
    }

    /**
     * A sentence for the log when a baseline is configured but missing, else null. Front ends add how
     * to create it with their own command.
     */
    public String baselineNote() {
        if (baselineFile == null || baselineFound) {
            return null;
        }
        return "no baseline at " + baselineFile + ": growth is not checked";
    }

    public List<Check> failures() {
        List<Check> out = new ArrayList<>();
        for (PairResult p : pairs) {
            for (Check c : p.checks()) {
                if (!c.passed()) {
                    out.add(c);
                }
            }
        }
        return out;
    }

    /** The checks that hold by less than the estimate's uncertainty, in order. */
    public List<Check> atRisk() {
        List<Check> out = new ArrayList<>();
        for (PairResult p : pairs) {
            for (Check c : p.checks()) {
                if (c.verdict() == Verdict.AT_RISK) {
                    out.add(c);
                }
            }
        }
        return out;
    }

    public boolean passed() {
        return failures().isEmpty();
    }

    /** The worst verdict of every pair; PASS when nothing was checked. */
    public Verdict verdict() {
        Verdict v = Verdict.PASS;
        for (PairResult p : pairs) {
            v = v.and(p.verdict());
        }
        return v;
    }

    /** Every violation, one per line, for the build failure. */
    public String failureMessage() {
        List<Check> f = failures();
        StringBuilder b = new StringBuilder();
        long growth = f.stream().filter(c -> c.kind() == Check.Kind.GROWTH).count();
        long policy = f.stream().filter(c -> c.kind() == Check.Kind.POLICY).count();
        long budget = f.size() - growth - policy;
        if (growth == 0 && policy == 0) {
            b.append(f.size()).append(f.size() == 1 ? " budget violation:" : " budget violations:");
        } else if (budget == 0 && policy == 0) {
            b.append(f.size()).append(f.size() == 1 ? " growth violation" : " growth violations").append(" over the baseline:");
        } else if (budget == 0 && growth == 0) {
            b.append(f.size()).append(f.size() == 1 ? " policy violation:" : " policy violations:");
        } else {
            List<String> parts = new ArrayList<>();
            if (budget > 0) {
                parts.add(budget + " budget");
            }
            if (growth > 0) {
                parts.add(growth + " growth over the baseline");
            }
            if (policy > 0) {
                parts.add(policy + " policy");
            }
            b.append(f.size()).append(" violations (").append(String.join(", ", parts)).append("):");
        }
        for (Check c : f) {
            b.append("\n  - ").append(c.message());
        }
        return b.toString();
    }
}
