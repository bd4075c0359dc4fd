package dev.erg.budget;

import dev.erg.device.ProfileCalibration;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.format.Numbers;
import dev.erg.estimate.NodeEstimate;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.function.ToDoubleFunction;

/** The table of budget rules, in the order checks are listed, and the one way every rule is checked. */
public final class BudgetRules {
    public static final String TARGET_FPS = "targetFps";
    public static final String MAX_POWER_MW = "maxPowerMw";
    public static final String MAX_ENERGY_PER_FRAME_UJ = "maxEnergyPerFrameUj";
    public static final String MAX_LATENCY_MS = "maxLatencyMs";
    public static final String MAX_WEIGHT_KIB = "maxWeightKib";
    public static final String MAX_ACTIVATION_KIB = "maxActivationKib";

    private static final BudgetRule.Words WITHIN = new BudgetRule.Words("is within", "exceeds", "limit");
    private static final BudgetRule.Words FIT = new BudgetRule.Words("fit", "exceed", "limit");
    private static final ToDoubleFunction<NodeEstimate> ENERGY = n -> n.energy().total();

    /** Every budget rule. */
    public static final List<BudgetRule> RULES = List.of(
            new BudgetRule(TARGET_FPS, Metric.FRAME_RATE, BudgetRule.Direction.AT_LEAST,
                    (e, fps) -> e.maxFps(), NodeEstimate::latencySeconds, "latency",
                    new BudgetRule.Words("meets", "is below", "target"), null, null),
            new BudgetRule(MAX_POWER_MW, Metric.POWER, BudgetRule.Direction.AT_MOST,
                    (e, fps) -> e.averagePowerWatts(fps) * 1e3, ENERGY, "energy", WITHIN,
                    (e, fps) -> " at " + Numbers.sig(fps) + " fps",
                    (e, fps) -> "; static power is " + Numbers.sig(e.device().staticPowerMw()) + " mW of it"),
            new BudgetRule(MAX_ENERGY_PER_FRAME_UJ, Metric.ENERGY_PER_FRAME, BudgetRule.Direction.AT_MOST,
                    (e, fps) -> e.energyPerFrameJoules() * 1e6, ENERGY, "energy", WITHIN, null, null),
            new BudgetRule(MAX_LATENCY_MS, Metric.LATENCY, BudgetRule.Direction.AT_MOST,
                    (e, fps) -> e.latencySeconds() * 1e3, NodeEstimate::latencySeconds, "latency", WITHIN, null, null),
            new BudgetRule(MAX_WEIGHT_KIB, Metric.WEIGHTS, BudgetRule.Direction.AT_MOST,
                    (e, fps) -> e.weightBytes() / 1024.0, NodeEstimate::weightBytes, "weight bytes", FIT, null, null),
            new BudgetRule(MAX_ACTIVATION_KIB, Metric.ACTIVATIONS, BudgetRule.Direction.AT_MOST,
                    (e, fps) -> e.activationPeakBytes() / 1024.0, n -> n.work().outputBytes(), "output bytes", FIT,
                    null, null));

    private BudgetRules() {
    }

    /** The rule of {@code key}, or null. */
    public static BudgetRule rule(String key) {
        for (BudgetRule r : RULES) {
            if (r.key().equals(key)) {
                return r;
            }
        }
        return null;
    }

    /** The budget keys, in table order. */
    public static List<String> keys() {
        List<String> out = new ArrayList<>();
        for (BudgetRule r : RULES) {
            out.add(r.key());
        }
        return out;
    }

    /** The frame rate power is taken at: the budget's target, or frames back to back without one. */
    public static double fps(Budget budget, DeviceEstimate e) {
        return budget.targetFps() != null ? budget.targetFps() : e.maxFps();
    }

    /**
     * Checks every limit {@code budget} sets, in table order.
     *
     * @param who  "MODEL on DEVICE", the start of every message
     * @param band the estimate's relative uncertainty; a value that holds by less is at risk (0: none)
     */
    public static List<Check> check(String who, DeviceEstimate e, Budget budget, double band) {
        return check(who, e, budget, band, false);
    }

    /**
     * As above; a profile's calibration gives each estimated metric its own band (see {@link #band}),
     * which takes the place of {@code band}. With {@code failWhenAtRisk}, a check at risk fails.
     */
    public static List<Check> check(String who, DeviceEstimate e, Budget budget, double band, boolean failWhenAtRisk) {
        double fps = fps(budget, e);
        List<Check> out = new ArrayList<>();
        for (BudgetRule r : RULES) {
            Double limit = budget.limit(r.key());
            if (limit != null) {
                out.add(check(r, who, e, fps, limit, band, failWhenAtRisk));
            }
        }
        return out;
    }

    static Check check(BudgetRule r, String who, DeviceEstimate e, double fps, double limit, double band) {
        return check(r, who, e, fps, limit, band, false);
    }

    static Check check(BudgetRule r, String who, DeviceEstimate e, double fps, double limit, double band,
                       boolean failWhenAtRisk) {
        double v = r.value().of(e, fps);
        double[] range = band(r.metric(), e.device().calibration());
        String basis = null;
        if (range != null) {
            basis = basis(r.metric(), e.device().calibration());
        } else if (band > 0) {
            range = new double[] {-band, band};
        }
        Verdict verdict = range == null ? Verdict.of(v, limit, r.atMost(), 0)
                : Verdict.of(v, limit, r.atMost(), range[0], range[1]);
        boolean atRisk = verdict == Verdict.AT_RISK;
        if (atRisk && failWhenAtRisk) {
            verdict = Verdict.FAIL;
        }
        boolean ok = verdict != Verdict.FAIL;
        boolean holds = ok || atRisk;
        List<LayerShare> top = top(e, r.blame());
        String unit = r.metric().unit;
        StringBuilder m = new StringBuilder(who).append(": ").append(r.metric().label).append(' ')
                .append(Numbers.sig(v)).append(' ').append(unit);
        if (basis != null) {
            m.append(" (").append(signed(range[0])).append(" \u2026 ").append(signed(range[1])).append(" after calibration on ")
                    .append(basis).append(')');
        }
        if (r.qualifier() != null) {
            m.append(r.qualifier().of(e, fps));
        }
        m.append(' ').append(holds ? r.words().pass() : r.words().fail()).append(" the ").append(r.words().limit())
                .append(" of ").append(Numbers.sig(limit)).append(' ').append(unit);
        if (!holds) {
            if (r.failDetail() != null) {
                m.append(r.failDetail().of(e, fps));
            }
            m.append(shares(r.blameBy(), top));
        } else if (atRisk && basis != null) {
            m.append(", but the ").append(r.words().limit()).append(" lies inside the error band: at risk");
        } else if (atRisk) {
            m.append(", by less than the estimate's uncertainty of ").append(percent(band));
        }
        if (atRisk && failWhenAtRisk) {
            m.append(" (checks at risk fail this run)");
        }
        return new Check(Check.Kind.BUDGET, r.metric(), v, limit, Double.NaN, verdict, top, m.toString());
    }

    /**
     * Where the true value of {@code metric} may lie, relative to the estimate, from a calibration's
     * error band: {low, high} with low <= 0 <= high, or null when the metric has no band (no
     * calibration, the metric was not measured, or it is a count such as weight bytes). A band is
     * made of errors e = estimate / measured - 1, so the measured value is estimate / (1 + e); a frame
     * rate is the inverse of a latency, so its range is the errors themselves.
     */
    public static double[] band(Metric metric, ProfileCalibration c) {
        if (c == null) {
            return null;
        }
        ProfileCalibration.Band b = switch (metric) {
            case FRAME_RATE, LATENCY -> c.latency();
            case POWER, ENERGY_PER_FRAME -> c.energy();
            default -> null;
        };
        if (b == null) {
            return null;
        }
        if (metric == Metric.FRAME_RATE) {
            return new double[] {b.low(), b.high()};
        }
        return new double[] {1 / (1 + b.high()) - 1, 1 / (1 + Math.max(b.low(), -0.9999)) - 1};
    }

    /** "14 layers of 3 models" for the metric's band, or null. */
    public static String basis(Metric metric, ProfileCalibration c) {
        ProfileCalibration.Band b = switch (metric) {
            case FRAME_RATE, LATENCY -> c.latency();
            case POWER, ENERGY_PER_FRAME -> c.energy();
            default -> null;
        };
        return b == null ? null : b.basis();
    }

    /** A signed whole percentage, with a true minus sign: "\u22129%", "+12%". */
    static String signed(double share) {
        long p = Math.round(share * 100);
        return (p < 0 ? "\u2212" + (-p) : "+" + p) + "%";
    }

    /** The three layers with the largest positive {@code f}, with their share of the sum of positive values. */
    static List<LayerShare> top(DeviceEstimate e, ToDoubleFunction<NodeEstimate> f) {
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
            b.append(i == 0 ? "" : ", ").append(s.name()).append(' ').append(percent(s.share()));
        }
        return b.append(')').toString();
    }

    private static String percent(double share) {
        return Numbers.percent(share);
    }
}
