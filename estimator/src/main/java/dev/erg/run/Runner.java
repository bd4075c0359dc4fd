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
import dev.erg.workload.NodeWork;
import dev.erg.explore.Advice;
import dev.erg.explore.Advisor;
import dev.erg.explore.Sweep;
import dev.erg.explore.SweepPoint;
import dev.erg.explore.Sweeper;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.OnnxReader;
import dev.erg.report.AdviceReport;
import dev.erg.report.SweepReport;
import dev.erg.workload.PrecisionOverrides;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;
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
        List<Sweep> sweeps = new ArrayList<>();
        List<Advice> advice = new ArrayList<>();
        Map<String, Advice> adviceStems = new LinkedHashMap<>();
        Map<String, Sweep> sweepStems = new LinkedHashMap<>();
        for (ModelSpec m : req.models()) {
            progress.say("analysing " + m.label());
            List<ModelWorkload> perDevice = null;
            if (m.sweep() != null) {
                OnnxModel om = OnnxReader.read(m.file());
                Sweeper.requireSweepable(om, m.bindings(), m.sweep());
                perDevice = new ArrayList<>();
                for (int i = 0; i < profiles.size(); i++) {
                    DeviceSpec d = req.devices().get(i);
                    progress.say("sweeping " + m.sweep() + " of " + m.label() + " on " + profiles.get(i).id());
                    Sweep s = Sweeper.run(om, m.label(), m.bindings(), m.sweep(), profiles.get(i), req.budgetOf(m, d),
                            m.precision());
                    for (String line : s.lines()) {
                        progress.say(line);
                    }
                    sweeps.add(s);
                    sweepStems.put(Reports.stem(m.label(), d.label()), s);
                    perDevice.add(Analyzer.analyze(om, bindingAt(m, s), AnalysisOptions.DEFAULTS));
                }
            }
            ModelWorkload w = perDevice != null ? perDevice.get(0)
                    : Analyzer.analyze(m.file(), m.bindings(), AnalysisOptions.DEFAULTS);
            notes.addAll(Analyzer.unusedDimNotes(w, m.dims()));
            if (!w.complete() && !req.failOnUnmodelled()) {
                notes.add(w.incompleteness() + ". Those nodes are not priced, so every total is a lower bound"
                        + " and a budget can pass that the full model would break"
                        + " (requiring every node to be modelled makes this a violation)");
            }
            notes.addAll(unmatchedRules(m, w));
            for (int i = 0; i < profiles.size(); i++) {
                DeviceSpec d = req.devices().get(i);
                DeviceProfile profile = profiles.get(i);
                progress.say("estimating " + m.label() + " on " + profile.id());
                DeviceEstimate e = Estimator.estimate(perDevice != null ? perDevice.get(i) : w, profile, m.precision());
                PairResult pair = Gate.evaluatePair(m.label(), profile.id(), e, req.budgetOf(m, d), baseline, growth,
                        req.failOnUnmodelled(), req.failWhenAtRisk());
                pairs.add(pair);
                Sweep sw = perDevice != null ? sweeps.get(sweeps.size() - profiles.size() + i) : null;
                Advice a = Advisor.advise(pair, sw);
                if (a != null) {
                    advice.add(a);
                    adviceStems.put(Reports.stem(m.label(), d.label()), a);
                }
            }
        }
        GateResult result = Gate.result(pairs, req.budget(), growth, req.baselineLabel(), baseline != null, notes);
        List<Path> files = new ArrayList<>();
        if (req.writesReports()) {
            files.addAll(Reports.write(result, req.reportDir(), req.formats()));
            files.addAll(SweepReport.write(sweepStems, req.reportDir(), req.formats()));
            files.addAll(AdviceReport.write(adviceStems, req.reportDir(), req.formats()));
        }
        Path written = null;
        int total = 0;
        if (req.writeBaseline()) {
            Baseline fresh = Baseline.of(pairs).over(baseline);
            fresh.write(req.baselineFile());
            written = req.baselineFile();
            total = fresh.size();
        }
        return new RunOutcome(result, files, written, written == null ? 0 : pairs.size(), total,
                req.failOnViolation(), sweeps, advice);
    }

    /**
     * The bindings a swept model's pair is gated at: the first value of the sweep that fails, or the
     * last value when every one passes.
     */
    private static InputBindings bindingAt(ModelSpec m, Sweep s) {
        long at = s.range().to();
        for (SweepPoint p : s.points()) {
            if (!p.passed()) {
                at = p.value();
                break;
            }
        }
        Map<String, Long> dims = new LinkedHashMap<>(m.dims());
        dims.put(s.range().name(), at);
        return m.bindings().withDims(dims);
    }

    /**
     * One note per precision rule of {@code m} that matches no node of its graph: such a rule is most
     * likely a typing error, and it changes nothing.
     */
    public static List<String> unmatchedRules(ModelSpec m, ModelWorkload w) {
        List<String> out = new ArrayList<>();
        for (PrecisionOverrides.Rule r : m.precision().rules()) {
            boolean hit = false;
            for (NodeWork n : w.nodes()) {
                if (r.matches(n.name(), n.opType())) {
                    hit = true;
                    break;
                }
            }
            if (!hit) {
                out.add(m.label() + ": precision rule \"" + r + "\" matches no node of the model; it changes nothing");
            }
        }
        return out;
    }
}
