package dev.erg.run;

import dev.erg.analysis.AnalysisOptions;
import dev.erg.analysis.Analyzer;
import dev.erg.budget.Baseline;
import dev.erg.budget.Gate;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.report.Reports;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * Runs a {@link RunRequest}: the one way both front ends estimate every model on every device, check
 * the budgets, the growth over the baseline and the policies, write the reports and refresh the
 * baseline. Broken input is a {@link dev.erg.error.BadInputException}; a violation is not an error but
 * a failed check in the outcome.
 */
public final class Runner {
    private Runner() {
    }

    /** Progress lines (e.g. to the Maven log). */
    @FunctionalInterface
    public interface Progress {
        void say(String line);

        Progress NONE = line -> { };
    }

    /** Validates the whole request, then runs it. */
    public static RunOutcome run(RunRequest req, Progress progress) {
        req.validate();
        List<DeviceProfile> profiles = new ArrayList<>();
        for (DeviceSpec d : req.devices()) {
            profiles.add(d.profile() != null ? d.profile() : DeviceLoader.load(d.label(), req.deviceBase()));
        }
        Baseline baseline = req.baselineFile() == null ? null : Baseline.read(req.baselineFile());
        Double growth = req.growthChecked();
        List<PairResult> pairs = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        for (ModelSpec m : req.models()) {
            progress.say("analysing " + m.label());
            ModelWorkload w = Analyzer.analyze(m.file(), m.bindings(), AnalysisOptions.DEFAULTS);
            notes.addAll(Analyzer.unusedDimNotes(w, m.dims()));
            if (!w.complete() && !req.failOnUnmodelled()) {
                notes.add(w.incompleteness() + ". Those nodes are not priced, so every total is a lower bound"
                        + " and a budget can pass that the full model would break"
                        + " (requiring every node to be modelled makes this a violation)");
            }
            for (int i = 0; i < profiles.size(); i++) {
                DeviceSpec d = req.devices().get(i);
                DeviceProfile profile = profiles.get(i);
                progress.say("estimating " + m.label() + " on " + profile.id());
                DeviceEstimate e = Estimator.estimate(w, profile);
                pairs.add(Gate.evaluatePair(m.label(), profile.id(), e, req.budgetOf(m, d), baseline, growth,
                        req.failOnUnmodelled(), req.failWhenAtRisk()));
            }
        }
        GateResult result = Gate.result(pairs, req.budget(), growth, req.baselineLabel(), baseline != null, notes);
        List<Path> files = req.writesReports() ? Reports.write(result, req.reportDir(), req.formats()) : List.of();
        Path written = null;
        int total = 0;
        if (req.writeBaseline()) {
            Baseline fresh = Baseline.of(pairs).over(baseline);
            fresh.write(req.baselineFile());
            written = req.baselineFile();
            total = fresh.size();
        }
        return new RunOutcome(result, files, written, written == null ? 0 : pairs.size(), total,
                req.failOnViolation());
    }
}
