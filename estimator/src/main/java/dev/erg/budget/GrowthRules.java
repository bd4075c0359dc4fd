package dev.erg.budget;

import dev.erg.estimate.DeviceEstimate;
import dev.erg.format.Numbers;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/** The table of growth rules, in the order checks are listed, and the one way every rule is checked. */
public final class GrowthRules {
    /** Every metric whose growth over the baseline is limited. */
    public static final List<GrowthRule> RULES = List.of(
            new GrowthRule(Metric.MACS, e -> e.workload().macs(), Baseline.Entry::macs, d -> d.macsDelta()),
            new GrowthRule(Metric.ENERGY_PER_FRAME, e -> e.energyPerFrameJoules() * 1e6,
                    b -> b.energyPerFrameJoules() * 1e6, d -> d.energyDeltaJoules() * 1e6),
            new GrowthRule(Metric.LATENCY, e -> e.latencySeconds() * 1e3, b -> b.latencySeconds() * 1e3,
                    d -> d.latencyDeltaSeconds() * 1e3),
            new GrowthRule(Metric.WEIGHTS, e -> e.weightBytes() / 1024.0, b -> b.weightBytes() / 1024.0, null),
            new GrowthRule(Metric.ACTIVATIONS, e -> e.activationPeakBytes() / 1024.0,
                    b -> b.peakActivationBytes() / 1024.0, null));

    private GrowthRules() {
    }

    /** Checks every rule of the table against the baseline entry, allowing {@code allowed} percent. */
    public static List<Check> check(String who, DeviceEstimate e, Baseline.Entry base, double allowed,
                                    List<LayerDiff> diff) {
        List<Check> out = new ArrayList<>();
        for (GrowthRule r : RULES) {
            double before = r.before().applyAsDouble(base);
            if (r.metric() == Metric.ENERGY_PER_FRAME && (!e.energyKnown() || !Double.isFinite(before))) {
                continue; // a profile without energies: energy is unknown, so it cannot grow
            }
            out.add(check(r, who, r.now().applyAsDouble(e), before, allowed, diff));
        }
        return out;
    }

    static Check check(GrowthRule r, String who, double now, double before, double allowed, List<LayerDiff> diff) {
        double limit = before * (1 + allowed / 100);
        boolean ok = now <= limit + 1e-12 * Math.max(1, Math.abs(limit));
        double pct = before == 0 ? (now == 0 ? 0 : Double.POSITIVE_INFINITY) : 100 * (now - before) / before;
        List<LayerShare> top = new ArrayList<>();
        if (r.layer() != null) {
            List<LayerDiff> grown = new ArrayList<>(diff);
            grown.removeIf(d -> r.layer().applyAsDouble(d) <= 0);
            grown.sort(Comparator.comparingDouble(r.layer()).reversed());
            double total = now - before;
            for (int i = 0; i < Math.min(3, grown.size()); i++) {
                LayerDiff d = grown.get(i);
                double v = r.layer().applyAsDouble(d);
                top.add(new LayerShare(d.name(), d.opType(), v, total > 0 ? v / total : 0));
            }
        }
        String unit = r.metric().unit;
        StringBuilder msg = new StringBuilder(who).append(": ").append(r.metric().label).append(' ');
        String pctText = Double.isInfinite(pct) ? "from zero" : Numbers.signedPercent(pct);
        msg.append("changed ").append(pctText).append(" over the baseline (").append(Numbers.sig(before))
                .append(" -> ").append(Numbers.sig(now)).append(' ').append(unit).append(")");
        if (ok) {
            msg.append(", within the allowed ").append(Numbers.sig(allowed)).append('%');
        } else {
            msg.append(", more than the allowed ").append(Numbers.sig(allowed)).append('%');
            if (!top.isEmpty()) {
                msg.append(" (layers that grew most: ");
                for (int i = 0; i < top.size(); i++) {
                    LayerShare s = top.get(i);
                    msg.append(i == 0 ? "" : ", ").append(s.name()).append(" +").append(Numbers.sig(s.value()))
                            .append(' ').append(unit);
                }
                msg.append(')');
            }
        }
        return new Check(Check.Kind.GROWTH, r.metric(), now, limit, before, ok ? Verdict.PASS : Verdict.FAIL, top,
                msg.toString());
    }
}
