package dev.erg.explore;

import dev.erg.budget.Budget;
import dev.erg.budget.BudgetRule;
import dev.erg.budget.BudgetRules;
import dev.erg.budget.Check;
import dev.erg.budget.LayerShare;
import dev.erg.budget.PairResult;
import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.device.Dataflow;
import dev.erg.device.Memory;
import dev.erg.device.Precisions;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.estimate.NodeEstimate;
import dev.erg.format.Numbers;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.PrecisionOverrides;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.TreeSet;
import java.util.function.ToDoubleFunction;
import java.util.regex.Pattern;

/**
 * Finds ways to meet a failed budget by estimating changed versions of the model or the device,
 * each through the same {@link Estimator} (and, for precision, the same {@link PrecisionOverrides})
 * as any run: lower precision on the top 1, 3 and 5 layers of the failing metric and on the whole
 * model, at each integer precision the array engine prices below the deployed one; the clock raised
 * to the profile's declared maximum; SRAM large enough for resident weights; each other array engine
 * of the profile, and each other dataflow of the array; the largest passing value of a swept dim.
 */
public final class Advisor {
    /** How many layers the precision candidates cover. */
    public static final int[] TOP = {1, 3, 5};
    /** How many layers to slim are listed. */
    public static final int SLIM = 5;

    private final ModelWorkload workload;
    private final DeviceProfile device;
    private final Budget budget;
    private final String who;
    private final List<Check> before;
    private final List<Check> failing;

    private Advisor(PairResult p) {
        this.workload = p.workload();
        this.device = p.estimate().device();
        this.budget = p.budget();
        this.who = p.model() + " on " + p.device();
        this.before = budgetChecks(p.checks());
        List<Check> f = new ArrayList<>();
        for (Check c : before) {
            if (!c.passed()) {
                f.add(c);
            }
        }
        this.failing = f;
    }

    private static List<Check> budgetChecks(List<Check> all) {
        List<Check> out = new ArrayList<>();
        for (Check c : all) {
            if (c.kind() == Check.Kind.BUDGET) {
                out.add(c);
            }
        }
        return out;
    }

    /**
     * The advice for a pair whose budget fails, or null when every budget limit holds.
     *
     * @param sweep the sweep of the same model on the same device, or null
     */
    public static Advice advise(PairResult p, Sweep sweep) {
        Advisor a = new Advisor(p);
        if (a.failing.isEmpty()) {
            return null;
        }
        return a.run(p, sweep);
    }

    private Advice run(PairResult p, Sweep sweep) {
        BudgetRule first = rule(failing.get(0));
        List<Candidate> out = new ArrayList<>();
        DeviceEstimate e = p.estimate();
        for (String precision : lowerPrecisions()) {
            int bits = Precisions.bits(precision);
            List<String> ranked = ranked(e, first.blame());
            for (int k : TOP) {
                if (k <= ranked.size() && (k == TOP[0] || ranked.size() > previous(k))) {
                    List<PrecisionOverrides.Rule> rules = new ArrayList<>();
                    for (String name : ranked.subList(0, k)) {
                        rules.add(PrecisionOverrides.Rule.regex(Pattern.quote(name), null, bits, bits));
                    }
                    out.add(precision(precision + " on the " + (k == 1 ? "layer" : k + " layers") + " of most "
                            + first.blameBy(), new PrecisionOverrides(rules)));
                }
            }
            out.add(precision(precision + " on the whole model", new PrecisionOverrides(
                    List.of(PrecisionOverrides.Rule.glob("*", null, bits, bits)))));
        }
        if (device.maxClockMhz() > device.clockMhz()) {
            out.add(device("clock raised from " + Numbers.sig(device.clockMhz()) + " to "
                    + Numbers.sig(device.maxClockMhz()) + " MHz, the profile's maximum", "clock",
                    device.withClockMhz(device.maxClockMhz()),
                    "static power kept as profiled; a real chip also raises its voltage, which costs more"));
        }
        if (!e.weightsResident() && device.sram() != null) {
            long need = e.weightBytes() + e.activationPeakBytes();
            long kib = (need + 1023) / 1024;
            Memory s = device.sram();
            Memory bigger = new Memory(s.id(), s.level(), kib * 1024, s.readFjPerByte(), s.writeFjPerByte(),
                    s.bytesPerCycle(), s.bytesPerSecond());
            out.add(device("SRAM of " + Numbers.exact(kib) + " KiB (now " + Numbers.exact(s.capacityBytes() / 1024)
                    + " KiB), enough for resident weights and peak activations", "sram", device.withSram(bigger),
                    "SRAM energy per byte kept as profiled; a larger array costs more per access"));
        }
        List<Engine> engines = device.engines();
        for (int i = 0; i < engines.size(); i++) {
            Engine g = engines.get(i);
            if (g.isArray() && i != firstArray(engines)) {
                out.add(device("the profile's engine " + g.id() + " (" + g.kind().key + ") for the MAC layers",
                        "engine", device.withArrayFirst(i), null));
            }
        }
        int a = firstArray(engines);
        if (a >= 0 && engines.get(a).kind() == Engine.Kind.MAC_ARRAY && engines.get(a).dataflow() != null) {
            for (Dataflow d : Dataflow.values()) {
                if (d != engines.get(a).dataflow()) {
                    out.add(device("the array " + engines.get(a).id() + " with the " + d.key + " dataflow", "engine",
                            device.withDataflow(a, d), "a different design of the same array"));
                }
            }
        }
        if (sweep != null && sweep.best() != null && sweep.bestPoint() != null) {
            String name = sweep.range().name();
            List<Check> checks = sweep.bestPoint().checks();
            out.add(rank(name + " = " + Numbers.exact(sweep.best()) + ", the value the sweep found", "dimension",
                    checks, null, PrecisionOverrides.NONE, device, sweep.best()));
        }
        out.sort(Comparator.comparing((Candidate c) -> !c.meetsAll()).thenComparing(c -> -c.fixed())
                .thenComparing(c -> -c.gapClosed()).thenComparing(Candidate::change));
        List<LayerShare> slim = slim(e, first.blame());
        return new Advice(p.model(), p.device(), failing, out, slim, first.blameBy());
    }

    private static int previous(int k) {
        int prev = 0;
        for (int t : TOP) {
            if (t < k) {
                prev = t;
            }
        }
        return prev;
    }

    private static int firstArray(List<Engine> engines) {
        for (int i = 0; i < engines.size(); i++) {
            if (engines.get(i).isArray()) {
                return i;
            }
        }
        return -1;
    }

    /** The integer precisions the first array engine prices, below the deployed one, widest first. */
    private List<String> lowerPrecisions() {
        int a = firstArray(device.engines());
        if (a < 0) {
            return List.of();
        }
        int deployed = device.deployPrecision() == null ? 32 : Precisions.bits(device.deployPrecision());
        TreeSet<String> out = new TreeSet<>(Comparator.comparingInt((String s) -> -Precisions.bits(s))
                .thenComparing(s -> s));
        for (String label : device.engines().get(a).energyFj().keySet()) {
            if (!Precisions.isFloat(label) && Precisions.bits(label) < deployed) {
                out.add(label);
            }
        }
        return new ArrayList<>(out);
    }

    private static List<String> ranked(DeviceEstimate e, ToDoubleFunction<NodeEstimate> f) {
        List<NodeEstimate> ns = new ArrayList<>();
        for (NodeEstimate n : e.nodes()) {
            if (f.applyAsDouble(n) > 0) {
                ns.add(n);
            }
        }
        ns.sort(Comparator.comparingDouble(f).reversed().thenComparing(NodeEstimate::name));
        List<String> out = new ArrayList<>();
        for (NodeEstimate n : ns) {
            out.add(n.name());
        }
        return out;
    }

    private static List<LayerShare> slim(DeviceEstimate e, ToDoubleFunction<NodeEstimate> f) {
        double total = 0;
        for (NodeEstimate n : e.nodes()) {
            total += Math.max(0, f.applyAsDouble(n));
        }
        List<LayerShare> out = new ArrayList<>();
        for (String name : ranked(e, f)) {
            if (out.size() == SLIM) {
                break;
            }
            for (NodeEstimate n : e.nodes()) {
                if (n.name().equals(name)) {
                    double v = f.applyAsDouble(n);
                    out.add(new LayerShare(name, n.work().opType(), v, total == 0 ? 0 : v / total));
                    break;
                }
            }
        }
        return out;
    }

    private Candidate precision(String change, PrecisionOverrides o) {
        DeviceEstimate e = Estimator.estimate(workload, device, o);
        return rank(change, "precision", BudgetRules.check(who, e, budget, 0), null, o, device, null);
    }

    private Candidate device(String change, String kind, DeviceProfile d, String note) {
        DeviceEstimate e = Estimator.estimate(workload, d);
        return rank(change, kind, BudgetRules.check(who, e, budget, 0), note, PrecisionOverrides.NONE, d, null);
    }

    private static BudgetRule rule(Check c) {
        for (BudgetRule r : BudgetRules.RULES) {
            if (r.metric() == c.metric()) {
                return r;
            }
        }
        throw new IllegalStateException("no rule for " + c.key());
    }

    private Candidate rank(String change, String kind, List<Check> after, String note, PrecisionOverrides o,
                           DeviceProfile d, Long dim) {
        Check f0 = failing.get(0);
        Check a0 = find(after, f0);
        double gap = f0.value() - f0.limit();
        double closed = a0 == null || gap == 0 ? 0 : (f0.value() - a0.value()) / gap;
        int fixed = 0;
        int broken = 0;
        for (Check b : before) {
            Check c = find(after, b);
            if (c == null) {
                continue;
            }
            if (!b.passed() && c.passed()) {
                fixed++;
            }
            if (b.passed() && !c.passed()) {
                broken++;
            }
        }
        return new Candidate(change, kind, after, closed, fixed, broken, note, o, d, dim);
    }

    private static Check find(List<Check> checks, Check like) {
        for (Check c : checks) {
            if (c.metric() == like.metric()) {
                return c;
            }
        }
        return null;
    }
}
