package dev.erg.budget;

import dev.erg.analysis.AnalysisOptions;
import dev.erg.analysis.Analyzer;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.estimate.NodeEstimate;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.ToDoubleFunction;

/**
 * Evaluates every model on every device against the budget and the baseline, collecting every
 * check (passed or not) before anything fails.
 */
public final class Gate {
    private Gate() {
    }

    /** A model to gate: its label (the path as configured), its file and its symbolic dim bindings. */
    public static final class ModelSpec {
        final String label;
        final Path file;
        final Map<String, Long> dims;

        public ModelSpec(String label, Path file, Map<String, Long> dims) {
            this.label = label;
            this.file = file;
            this.dims = Map.copyOf(dims);
        }

        public String label() {
            return label;
        }

        public Path file() {
            return file;
        }

        public Map<String, Long> dims() {
            return dims;
        }
    }

    /** Progress callback, e.g. the Maven log. */
    public interface Progress {
        void say(String line);
    }

    /**
     * @param baseline the baseline read from {@code baselineFile}, or null when missing or not configured
     * @param baselineFile the configured baseline path, or null
     * @param maxGrowthPercent the allowed growth per metric, or null to skip growth checks
     */
    public static GateResult evaluate(List<ModelSpec> models, List<DeviceProfile> devices, Budget budget,
                                      Baseline baseline, String baselineFile, Double maxGrowthPercent,
                                      Progress progress) {
        return evaluate(models, devices, budget, baseline, baselineFile, maxGrowthPercent, progress,
                AnalysisOptions.DEFAULTS);
    }

    /** As above; with {@code options.failOnUnmodelled()}, a model with an unmodelled operator is bad input. */
    public static GateResult evaluate(List<ModelSpec> models, List<DeviceProfile> devices, Budget budget,
                                      Baseline baseline, String baselineFile, Double maxGrowthPercent,
                                      Progress progress, AnalysisOptions options) {
        List<PairResult> pairs = new ArrayList<>();
        List<String> notes = new ArrayList<>();
        for (ModelSpec m : models) {
            progress.say("analysing " + m.label);
            ModelWorkload w = Analyzer.analyze(m.file, m.dims, options);
            notes.addAll(Analyzer.unusedDimNotes(w, m.dims));
            if (!w.complete()) {
                notes.add(w.incompleteness() + ". Those nodes are not priced, so every total is a lower bound"
                        + " and a budget can pass that the full model would break"
                        + " (the fail-on-unmodelled option makes this an error)");
            }
            for (DeviceProfile d : devices) {
                progress.say("estimating " + m.label + " on " + d.id());
                DeviceEstimate e = Estimator.estimate(w, d);
                pairs.add(evaluatePair(m.label, d.id(), e, budget, baseline, maxGrowthPercent));
            }
        }
        return new GateResult(pairs, budget, maxGrowthPercent, baselineFile, baseline != null, notes);
    }

    static String fmt(double v) {
        if (v == 0 || Double.isInfinite(v) || Double.isNaN(v)) {
            return v == 0 ? "0" : Double.isNaN(v) ? "n/a" : "unbounded";
        }
        double a = Math.abs(v);
        String s;
        if (a >= 1000) {
            s = String.format(Locale.ROOT, "%.0f", v);
        } else if (a >= 100) {
            s = String.format(Locale.ROOT, "%.1f", v);
        } else if (a >= 10) {
            s = String.format(Locale.ROOT, "%.2f", v);
        } else {
            s = String.format(Locale.ROOT, "%.3g", v);
        }
        if (s.contains(".") && !s.contains("e")) {
            s = s.replaceAll("0+$", "").replaceAll("\\.$", "");
        }
        return s;
    }

    private static List<LayerShare> top(DeviceEstimate e, ToDoubleFunction<NodeEstimate> f) {
        double total = 0;
        List<NodeEstimate> ns = new ArrayList<>();
        for (NodeEstimate n : e.nodes()) {
            double v = f.applyAsDouble(n);
            if (v > 0) {
                total += v;
                ns.add(n);
            }
        }
        ns.sort(Comparator.comparingDouble(f).reversed());
        List<LayerShare> out = new ArrayList<>();
        for (int i = 0; i < Math.min(3, ns.size()); i++) {
            NodeEstimate n = ns.get(i);
            double v = f.applyAsDouble(n);
            out.add(new LayerShare(n.name(), n.work().opType(), v, total == 0 ? 0 : v / total));
        }
        return out;
    }

    private static String shares(String by, List<LayerShare> top) {
        if (top.isEmpty()) {
            return "";
        }
        StringBuilder b = new StringBuilder(" (top layers by ").append(by).append(": ");
        for (int i = 0; i < top.size(); i++) {
            LayerShare s = top.get(i);
            b.append(i == 0 ? "" : ", ").append(s.name()).append(' ')
                    .append(String.format(Locale.ROOT, "%.1f%%", 100 * s.share()));
        }
        return b.append(')').toString();
    }

    static PairResult evaluatePair(String model, String device, DeviceEstimate e, Budget budget, Baseline baseline,
                                   Double maxGrowthPercent) {
        String who = model + " on " + device;
        List<Check> checks = new ArrayList<>();
        if (!e.energyKnown() && (budget.maxPowerMw() != null || budget.maxEnergyPerFrameUj() != null)) {
            throw new dev.erg.error.BadInputException(who + ": the device profile gives no energies, so a "
                    + (budget.maxPowerMw() != null ? "power" : "energy-per-frame") + " budget cannot be checked on it "
                    + "(leave the limit out for this device, or use a profile with energies)");
        }
        double fps = budget.targetFps() != null ? budget.targetFps() : e.maxFps();
        if (budget.targetFps() != null) {
            double max = e.maxFps();
            boolean ok = max >= budget.targetFps();
            List<LayerShare> top = top(e, NodeEstimate::latencySeconds);
            checks.add(new Check(Check.Kind.BUDGET, Metric.FRAME_RATE, max, budget.targetFps(), Double.NaN, ok, top,
                    who + ": frame rate " + fmt(max) + " fps " + (ok ? "meets" : "is below") + " the target of "
                            + fmt(budget.targetFps()) + " fps" + (ok ? "" : shares("latency", top))));
        }
        if (budget.maxPowerMw() != null) {
            double mw = e.averagePowerWatts(fps) * 1e3;
            boolean ok = mw <= budget.maxPowerMw();
            List<LayerShare> top = top(e, n -> n.energy().total());
            checks.add(new Check(Check.Kind.BUDGET, Metric.POWER, mw, budget.maxPowerMw(), Double.NaN, ok, top,
                    who + ": average power " + fmt(mw) + " mW at " + fmt(fps) + " fps "
                            + (ok ? "is within" : "exceeds") + " the limit of " + fmt(budget.maxPowerMw()) + " mW"
                            + (ok ? "" : "; static power is " + fmt(e.device().staticPowerMw()) + " mW of it"
                            + shares("energy", top))));
        }
        if (budget.maxEnergyPerFrameUj() != null) {
            double uj = e.energyPerFrameJoules() * 1e6;
            boolean ok = uj <= budget.maxEnergyPerFrameUj();
            List<LayerShare> top = top(e, n -> n.energy().total());
            checks.add(new Check(Check.Kind.BUDGET, Metric.ENERGY_PER_FRAME, uj, budget.maxEnergyPerFrameUj(),
                    Double.NaN, ok, top, who + ": energy per frame " + fmt(uj) + " µJ " + (ok ? "is within" : "exceeds")
                            + " the limit of " + fmt(budget.maxEnergyPerFrameUj()) + " µJ"
                            + (ok ? "" : shares("energy", top))));
        }
        if (budget.maxLatencyMs() != null) {
            double ms = e.latencySeconds() * 1e3;
            boolean ok = ms <= budget.maxLatencyMs();
            List<LayerShare> top = top(e, NodeEstimate::latencySeconds);
            checks.add(new Check(Check.Kind.BUDGET, Metric.LATENCY, ms, budget.maxLatencyMs(), Double.NaN, ok, top,
                    who + ": latency " + fmt(ms) + " ms " + (ok ? "is within" : "exceeds") + " the limit of "
                            + fmt(budget.maxLatencyMs()) + " ms" + (ok ? "" : shares("latency", top))));
        }
        if (budget.maxWeightKib() != null) {
            double kib = e.weightBytes() / 1024.0;
            boolean ok = kib <= budget.maxWeightKib();
            List<LayerShare> top = top(e, NodeEstimate::weightBytes);
            checks.add(new Check(Check.Kind.BUDGET, Metric.WEIGHTS, kib, budget.maxWeightKib(), Double.NaN, ok, top,
                    who + ": weights " + fmt(kib) + " KiB " + (ok ? "fit" : "exceed") + " the limit of "
                            + fmt(budget.maxWeightKib()) + " KiB" + (ok ? "" : shares("weight bytes", top))));
        }
        if (budget.maxActivationKib() != null) {
            double kib = e.activationPeakBytes() / 1024.0;
            boolean ok = kib <= budget.maxActivationKib();
            List<LayerShare> top = top(e, n -> n.work().outputBytes());
            checks.add(new Check(Check.Kind.BUDGET, Metric.ACTIVATIONS, kib, budget.maxActivationKib(), Double.NaN, ok,
                    top, who + ": peak activations " + fmt(kib) + " KiB " + (ok ? "fit" : "exceed") + " the limit of "
                            + fmt(budget.maxActivationKib()) + " KiB" + (ok ? "" : shares("output bytes", top))));
        }
        Baseline.Entry base = baseline == null ? null : baseline.entry(model, device);
        List<LayerDiff> diff = base == null ? List.of() : Baseline.diff(base, e);
        if (base != null && maxGrowthPercent != null) {
            growth(checks, who, Metric.MACS, e.workload().macs(), base.macs(), maxGrowthPercent, diff,
                    d -> d.macsDelta(), "MACs");
            if (e.energyKnown() && Double.isFinite(base.energyPerFrameJoules())) {
                growth(checks, who, Metric.ENERGY_PER_FRAME, e.energyPerFrameJoules() * 1e6,
                        base.energyPerFrameJoules() * 1e6, maxGrowthPercent, diff, d -> d.energyDeltaJoules() * 1e6,
                        "µJ");
            }
            growth(checks, who, Metric.LATENCY, e.latencySeconds() * 1e3, base.latencySeconds() * 1e3,
                    maxGrowthPercent, diff, d -> d.latencyDeltaSeconds() * 1e3, "ms");
            growth(checks, who, Metric.WEIGHTS, e.weightBytes() / 1024.0, base.weightBytes() / 1024.0,
                    maxGrowthPercent, diff, null, "KiB");
            growth(checks, who, Metric.ACTIVATIONS, e.activationPeakBytes() / 1024.0,
                    base.peakActivationBytes() / 1024.0, maxGrowthPercent, diff, null, "KiB");
        }
        return new PairResult(model, device, e, fps, checks, diff, base != null);
    }

    private static void growth(List<Check> checks, String who, Metric m, double now, double before, double allowed,
                               List<LayerDiff> diff, ToDoubleFunction<LayerDiff> delta, String unit) {
        double limit = before * (1 + allowed / 100);
        boolean ok = now <= limit + 1e-12 * Math.max(1, Math.abs(limit));
        double pct = before == 0 ? (now == 0 ? 0 : Double.POSITIVE_INFINITY) : 100 * (now - before) / before;
        List<LayerShare> top = new ArrayList<>();
        if (delta != null) {
            List<LayerDiff> grown = new ArrayList<>(diff);
            grown.removeIf(d -> delta.applyAsDouble(d) <= 0);
            grown.sort(Comparator.comparingDouble(delta).reversed());
            double total = now - before;
            for (int i = 0; i < Math.min(3, grown.size()); i++) {
                LayerDiff d = grown.get(i);
                double v = delta.applyAsDouble(d);
                top.add(new LayerShare(d.name(), d.opType(), v, total > 0 ? v / total : 0));
            }
        }
        StringBuilder msg = new StringBuilder(who).append(": ").append(m.label).append(' ');
        String pctText = Double.isInfinite(pct) ? "from zero" : String.format(Locale.ROOT, "%+.1f%%", pct);
        msg.append("changed ").append(pctText).append(" over the baseline (").append(fmt(before)).append(" -> ")
                .append(fmt(now)).append(' ').append(unit).append(")");
        if (ok) {
            msg.append(", within the allowed ").append(fmt(allowed)).append('%');
        } else {
            msg.append(", more than the allowed ").append(fmt(allowed)).append('%');
            if (!top.isEmpty()) {
                msg.append(" (layers that grew most: ");
                for (int i = 0; i < top.size(); i++) {
                    LayerShare s = top.get(i);
                    msg.append(i == 0 ? "" : ", ").append(s.name()).append(" +").append(fmt(s.value())).append(' ')
                            .append(unit);
                }
                msg.append(')');
            }
        }
        checks.add(new Check(Check.Kind.GROWTH, m, now, limit, before, ok, top, msg.toString()));
    }
}
