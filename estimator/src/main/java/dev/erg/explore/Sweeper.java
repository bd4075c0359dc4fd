package dev.erg.explore;

import dev.erg.analysis.AnalysisOptions;
import dev.erg.analysis.Analyzer;
import dev.erg.budget.Budget;
import dev.erg.budget.BudgetRule;
import dev.erg.budget.BudgetRules;
import dev.erg.budget.Check;
import dev.erg.budget.Verdict;
import dev.erg.device.DeviceProfile;
import dev.erg.error.BadInputException;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.format.Numbers;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.GraphDef;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.ValueDef;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.PrecisionOverrides;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.function.LongPredicate;

/**
 * Sweeps a symbolic dimension: for each value, builds, shapes, counts and estimates the model (read
 * once), checks the budget, fits each metric, names where each limit breaks, and finds the largest
 * (or smallest) value that meets every limit with the fitted curves, confirmed by a final estimate.
 */
public final class Sweeper {
    private final OnnxModel model;
    private final String label;
    private final InputBindings base;
    private final SweepRange range;
    private final DeviceProfile device;
    private final Budget budget;
    private final PrecisionOverrides overrides;
    private final Map<Long, SweepPoint> probes = new TreeMap<>();

    private Sweeper(OnnxModel model, String label, InputBindings base, SweepRange range, DeviceProfile device,
                    Budget budget, PrecisionOverrides overrides) {
        this.model = model;
        this.label = label;
        this.base = base == null ? InputBindings.NONE : base;
        this.range = range;
        this.device = device;
        this.budget = budget == null ? Budget.none() : budget;
        this.overrides = overrides == null ? PrecisionOverrides.NONE : overrides;
    }

    /**
     * Sweeps {@code range} over a model already read.
     *
     * @param label the model's label in messages
     * @param base  the other bindings; must not bind the swept dim
     * @throws BadInputException when the dim is not symbolic in the model, is also bound, or some point
     *                           cannot be analysed
     */
    public static Sweep run(OnnxModel model, String label, InputBindings base, SweepRange range,
                            DeviceProfile device, Budget budget, PrecisionOverrides overrides) {
        requireSweepable(model, base, range);
        return new Sweeper(model, label, base, range, device, budget, overrides).sweep();
    }

    /** The symbolic dim names of the model's runtime inputs (initializers excluded), sorted. */
    public static Set<String> symbolicDims(OnnxModel model) {
        GraphDef g = model.graph();
        Set<String> inits = new HashSet<>();
        for (TensorDef t : g.initializers()) {
            inits.add(t.name());
        }
        Set<String> out = new TreeSet<>();
        for (ValueDef v : g.inputs()) {
            if (inits.contains(v.name()) || v.dims() == null) {
                continue;
            }
            for (ValueDef.Dim d : v.dims()) {
                if (!d.isFixed() && d.param() != null && !d.param().isEmpty()) {
                    out.add(d.param());
                }
            }
        }
        return out;
    }

    /** Fails with one line when the dim cannot be swept: not symbolic in the model, or bound as well. */
    public static void requireSweepable(OnnxModel model, InputBindings base, SweepRange range) {
        Set<String> symbolic = symbolicDims(model);
        if (!symbolic.contains(range.name())) {
            throw new BadInputException(model.file() + ": the dimension '" + range.name()
                    + "' cannot be swept: no graph input has a symbolic dim of that name ("
                    + (symbolic.isEmpty() ? "the inputs have no symbolic dims" : "symbolic dims: "
                    + String.join(", ", symbolic)) + ")");
        }
        if (base != null && base.dims().containsKey(range.name())) {
            throw new BadInputException(model.file() + ": the dimension '" + range.name()
                    + "' is both bound to " + base.dims().get(range.name()) + " and swept; bind it one way only");
        }
    }

    /** The estimate at one value of the dim, through the same analysis and estimator as any run. */
    public DeviceEstimate estimateAt(long v) {
        Map<String, Long> dims = new LinkedHashMap<>(base.dims());
        dims.put(range.name(), v);
        ModelWorkload w;
        try {
            w = Analyzer.analyze(model, base.withDims(dims), AnalysisOptions.DEFAULTS);
        } catch (BadInputException x) {
            throw new BadInputException(x.getMessage() + " (at " + range.name() + " = " + v + " of the sweep)", x);
        }
        return Estimator.estimate(w, device, overrides);
    }

    private SweepPoint point(long v) {
        SweepPoint p = probes.get(v);
        if (p != null) {
            return p;
        }
        DeviceEstimate e = estimateAt(v);
        Map<SweepMetric, Double> m = new EnumMap<>(SweepMetric.class);
        for (SweepMetric k : SweepMetric.values()) {
            m.put(k, k.of(e, budget));
        }
        List<Check> checks = BudgetRules.check(label + " on " + device.id() + " at " + range.name() + " = "
                + Numbers.exact(v), e, budget, 0);
        p = new SweepPoint(v, m, checks);
        probes.put(v, p);
        return p;
    }

    private Sweep sweep() {
        List<Long> values = range.values();
        List<SweepPoint> points = new ArrayList<>();
        for (long v : values) {
            points.add(point(v));
        }
        long[] xs = new long[points.size()];
        for (int i = 0; i < xs.length; i++) {
            xs[i] = points.get(i).value();
        }
        Map<SweepMetric, Polynomial> fits = new EnumMap<>(SweepMetric.class);
        for (SweepMetric k : SweepMetric.values()) {
            double[] ys = new double[xs.length];
            for (int i = 0; i < xs.length; i++) {
                ys[i] = points.get(i).metric(k);
            }
            Polynomial p = Polynomial.fit(xs, ys, k.integer);
            if (p != null) {
                fits.put(k, p);
            }
        }
        List<String> breaks = new ArrayList<>();
        List<Edge> edges = new ArrayList<>();
        for (BudgetRule r : BudgetRules.RULES) {
            Double limit = budget.limit(r.key());
            if (limit != null) {
                Edge b = breakOf(r, limit, points, fits);
                if (b != null) {
                    breaks.add(b.text);
                    edges.add(b);
                }
            }
        }
        Found best = null;
        String bestText;
        boolean[] pass = new boolean[points.size()];
        for (int i = 0; i < pass.length; i++) {
            pass[i] = points.get(i).passed();
        }
        Run run = Run.of(pass);
        if (budget.isEmpty()) {
            bestText = "no budget is set, so every value passes";
        } else if (run == null || run.noPass) {
            bestText = noRun(pass, points);
        } else if (run.allPass) {
            best = new Found(xs[xs.length - 1], false);
            bestText = "every point meets the budget; the largest swept value, " + at(best.value)
                    + ", is the largest known to pass (a larger one may too)";
        } else {
            boolean up = run.passEnd < run.failEnd;
            best = fromEdges(edges, up);
            if (best == null || !point(best.value).passed() || point(best.value + (up ? 1 : -1)).passed()) {
                best = boundary(xs[run.passEnd], xs[run.failEnd], null, v -> point(v).passed());
            }
            bestText = (up ? "largest" : "smallest") + " value that meets every limit: " + at(best.value)
                    + (best.byCurve ? ", found with the fitted curves" : ", found by bisection with estimates")
                    + " and confirmed by an estimate there; " + at(best.value + (up ? 1 : -1)) + " fails";
        }
        return new Sweep(label, device.id(), range, budget, points, fits, breaks,
                best == null ? null : best.value, best == null ? null : point(best.value), bestText);
    }

    private String at(long v) {
        return range.name() + " = " + Numbers.exact(v);
    }

    private String noRun(boolean[] pass, List<SweepPoint> points) {
        List<String> ok = new ArrayList<>();
        for (int i = 0; i < pass.length; i++) {
            if (pass[i]) {
                ok.add(Numbers.exact(points.get(i).value()));
            }
        }
        return ok.isEmpty() ? "no swept value meets every limit"
                : "the values that meet every limit are not one run (" + range.name() + " = " + String.join(", ", ok)
                + "), so no single boundary is given";
    }

    /**
     * One broken limit: its sentence, and when it breaks on one side only, the passing value at its
     * edge, how it was found, and which way the passing side lies.
     */
    private record Edge(String text, Found found, boolean up) {
    }

    /**
     * The value that meets every limit from the limits' own edges: the nearest edge to the passing side
     * (each found with its curve, or with estimates when its metric has no exact polynomial); null
     * when some limit breaks on both sides or not as a run.
     */
    private static Found fromEdges(List<Edge> edges, boolean up) {
        Found best = null;
        for (Edge e : edges) {
            if (e.found == null || e.up != up) {
                return null;
            }
            if (best == null || (up ? e.found.value < best.value : e.found.value > best.value)) {
                best = e.found;
            }
        }
        return best;
    }

    /** Where one limit breaks, or null when it holds at every point. */
    private Edge breakOf(BudgetRule r, double limit, List<SweepPoint> points, Map<SweepMetric, Polynomial> fits) {
        boolean[] pass = new boolean[points.size()];
        boolean any = false;
        for (int i = 0; i < pass.length; i++) {
            pass[i] = points.get(i).check(r.metric().key).passed();
            any |= !pass[i];
        }
        if (!any) {
            return null;
        }
        String head = r.metric().label + " " + r.words().fail() + " the " + r.words().limit() + " of "
                + Numbers.sig(limit) + " " + r.metric().unit + " for " + range.name();
        Run run = Run.of(pass);
        if (run == null || run.allPass) {
            List<String> bad = new ArrayList<>();
            for (int i = 0; i < pass.length; i++) {
                if (!pass[i]) {
                    bad.add(Numbers.exact(points.get(i).value()));
                }
            }
            return new Edge(head + " = " + String.join(", ", bad) + " (swept points)", null, false);
        }
        if (run.noPass) {
            return new Edge(head + " from " + Numbers.exact(range.from()) + " to " + Numbers.exact(range.to())
                    + " (every swept value)", null, false);
        }
        long[] xs = points.stream().mapToLong(SweepPoint::value).toArray();
        Found f = boundary(xs[run.passEnd], xs[run.failEnd], curveOne(r, limit, fits),
                v -> point(v).check(r.metric().key).passed());
        boolean up = run.passEnd < run.failEnd;
        return new Edge(up ? head + " ≥ " + Numbers.exact(f.value + 1) : head + " ≤ " + Numbers.exact(f.value - 1),
                f, up);
    }

    private static LongPredicate curveOne(BudgetRule r, double limit, Map<SweepMetric, Polynomial> fits) {
        SweepMetric m = SweepMetric.forLimit(r.key());
        Polynomial p = m == null ? null : fits.get(m);
        if (p == null) {
            return null;
        }
        return v -> Verdict.of(SweepMetric.limitValue(r.key(), p.value(v)), limit, r.atMost(), 0) != Verdict.FAIL;
    }

    /** A value found at a boundary; {@code byCurve} when the fitted curves found it and estimates agreed. */
    private record Found(long value, boolean byCurve) {
    }

    /**
     * The passing value next to the boundary between {@code pass} (a point that passes) and
     * {@code fail} (the nearest point that fails): the curves' answer when estimates at it and one step
     * beyond confirm it, else a bisection with estimates.
     */
    private Found boundary(long pass, long fail, LongPredicate curve, LongPredicate real) {
        long dir = fail > pass ? 1 : -1;
        if (curve != null) {
            long lo = pass;
            long hi = fail;
            while (Math.abs(hi - lo) > 1) {
                long mid = lo + (hi - lo) / 2;
                if (curve.test(mid)) {
                    lo = mid;
                } else {
                    hi = mid;
                }
            }
            if (real.test(lo) && (lo + dir == fail || !real.test(lo + dir))) {
                return new Found(lo, true);
            }
        }
        long lo = pass;
        long hi = fail;
        while (Math.abs(hi - lo) > 1) {
            long mid = lo + (hi - lo) / 2;
            if (real.test(mid)) {
                lo = mid;
            } else {
                hi = mid;
            }
        }
        return new Found(lo, false);
    }

    /**
     * Passing points that form one run at one end: {@code passEnd} is the index of the last passing
     * point next to the failing ones, {@code failEnd} the first failing one beside it.
     */
    private record Run(int passEnd, int failEnd, boolean allPass, boolean noPass) {
        static Run of(boolean[] pass) {
            int n = pass.length;
            int first = -1;
            int last = -1;
            for (int i = 0; i < n; i++) {
                if (pass[i]) {
                    if (first < 0) {
                        first = i;
                    }
                    last = i;
                }
            }
            if (first < 0) {
                return new Run(-1, -1, false, true);
            }
            for (int i = first; i <= last; i++) {
                if (!pass[i]) {
                    return null;
                }
            }
            if (first == 0 && last == n - 1) {
                return new Run(n - 1, -1, true, false);
            }
            if (first == 0) {
                return new Run(last, last + 1, false, false);
            }
            if (last == n - 1) {
                return new Run(first, first - 1, false, false);
            }
            return null; // passing in the middle only
        }
    }
}
