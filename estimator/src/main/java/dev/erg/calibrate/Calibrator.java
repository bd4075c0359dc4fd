package dev.erg.calibrate;

import dev.erg.calibrate.Factor.Metric;
import dev.erg.error.BadInputException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.EnumMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;
import org.hipparchus.exception.MathIllegalStateException;
import org.hipparchus.linear.Array2DRowRealMatrix;
import org.hipparchus.linear.ArrayRealVector;
import org.hipparchus.linear.DiagonalMatrix;
import org.hipparchus.linear.RealVector;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LeastSquaresBuilder;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LeastSquaresOptimizer;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LeastSquaresProblem;
import org.hipparchus.optim.nonlinear.vector.leastsquares.LevenbergMarquardtOptimizer;
import org.hipparchus.util.Pair;

/**
 * Fits a profile's correction factors to measurements.
 *
 * <p>The fit minimises the sum of squared log ratios of predicted to measured values, so that a
 * layer of 20 us and a model of 20 ms weigh the same, and every factor is fitted as its logarithm,
 * so that it stays positive. The solver is the Levenberg-Marquardt least-squares optimiser of
 * Hipparchus. A latency fit runs twice and keeps the better result: once with the roofline's exact
 * maximum, once in two stages whose first smooths that maximum, so that a class hidden behind a memory
 * bound still pulls on its efficiency (docs/calibration.md, "How the fit works"). Latency is fitted
 * first (compute efficiencies, per-layer overhead, DRAM bandwidth),
 * then energy (the three destination scales and static power) with the calibrated latencies. A
 * factor that no measured value depends on is kept; with fewer values than factors, only as many
 * factors as there are values are fitted, those that explain the largest share of the prediction. A
 * term (overhead, an energy scale, static power) that the fit drives toward zero in every value is
 * kept at the profile's value and the others are fitted again. Energy of the chip alone is compared
 * with predictions without DRAM energy.
 */
public final class Calibrator {
    private static final Factor[] LATENCY = {Factor.EFFICIENCY_DENSE_CONV, Factor.EFFICIENCY_GROUPED_CONV,
        Factor.EFFICIENCY_MATMUL, Factor.EFFICIENCY_MATRIX_VECTOR, Factor.EFFICIENCY_VECTOR, Factor.LAYER_OVERHEAD,
        Factor.DRAM_BANDWIDTH_SCALE};
    private static final Factor[] ENERGY = {Factor.ENERGY_SCALE_COMPUTE, Factor.ENERGY_SCALE_ON_CHIP,
        Factor.ENERGY_SCALE_DRAM, Factor.STATIC_POWER};
    /** Fitted log-factors stay within e^-60 .. e^60 of 1 (a guard against runaway steps, far outside any real value). */
    private static final double LOG_LIMIT = 60;
    /** The norm that stands for the maximum of a layer's bounds in the first stage of a latency fit. */
    private static final double SOFT_NORM = 4;

    private Calibrator() {
    }

    /** A fitted factor whose part of every value it enters falls below this share has been driven out by the fit. */
    private static final double SWITCHED_OFF = 1e-6;

    /**
     * One measured value and the nodes whose prediction it is compared with; {@code chipOnly}: an energy
     * of the chip alone, compared with a prediction without DRAM energy.
     */
    private record Obs(String model, String node, Metric metric, double measured, List<NodeCost> nodes,
                       boolean fromPower, boolean chipOnly) {
    }

    /** Factor values, and which ones were fitted. */
    private record Fit(double[] values, boolean[] fitted, Map<Factor, String> notes) {
    }

    /**
     * Fits the factors.
     *
     * @param models           the predicted parts of every measured model
     * @param files            the measurement files (their names already checked against the models)
     * @param staticPowerWatts the profile's static power
     * @throws BadInputException when nothing can be fitted (no usable value, every value zero)
     */
    public static Calibration fit(List<ModelCosts> models, List<MeasurementFile> files, double staticPowerWatts) {
        Map<String, ModelCosts> byModel = new LinkedHashMap<>();
        for (ModelCosts m : models) {
            byModel.put(m.model(), m);
        }
        List<String> notes = new ArrayList<>();
        List<Obs> latency = new ArrayList<>();
        List<Measurement> energyRows = new ArrayList<>();
        int zeros = 0;
        int values = 0;
        int notRun = 0;
        String sources = String.join(", ", files.stream().map(f -> String.valueOf(f.file().getFileName())).toList());
        for (MeasurementFile f : files) {
            for (Measurement m : f.rows()) {
                ModelCosts mc = byModel.get(m.model());
                if (mc == null) {
                    throw new BadInputException(f.file() + ":" + m.line() + ": model '" + m.model()
                            + "' is not among the models given");
                }
                List<NodeCost> nodes = nodesOf(mc, m);
                for (Double v : new Double[] {m.latencySeconds(), m.energyJoules(), m.powerWatts()}) {
                    if (v != null) {
                        values++;
                        zeros += v == 0 ? 1 : 0;
                    }
                }
                if (nodes.isEmpty()) {
                    notRun++;
                    continue;
                }
                if (m.latencySeconds() != null && m.latencySeconds() > 0) {
                    latency.add(new Obs(m.model(), m.node(), Metric.LATENCY, m.latencySeconds(), nodes, false, false));
                }
                if ((m.energyJoules() != null && m.energyJoules() > 0) || (m.powerWatts() != null && m.powerWatts() > 0)) {
                    energyRows.add(m);
                }
            }
        }
        if (values > 0 && zeros == values) {
            throw new BadInputException("cannot calibrate: every measured value in " + sources
                    + " is zero; a fit needs measured values above zero");
        }
        if (notRun > 0) {
            notes.add(notRun + (notRun == 1 ? " row names a node" : " rows name nodes")
                    + " that erg does not run on the device (views, folded constants): left out");
        }
        if (zeros > 0) {
            notes.add(zeros + (zeros == 1 ? " measured value is" : " measured values are") + " zero: left out");
        }
        long chip = energyRows.stream().filter(Measurement::chipOnly).count();
        if (chip > 0) {
            notes.add(chip + (chip == 1 ? " energy or power value is" : " energy or power values are")
                    + " of the chip alone (" + MeasurementFile.CHIP_ENERGY_UJ + ", " + MeasurementFile.CHIP_POWER_MW
                    + "): compared with estimates without DRAM energy");
        }
        List<Residual> residuals = new ArrayList<>();
        Fit lat = fitLatency(latency, notes, true);
        List<Obs> energy = energyObs(energyRows, byModel, lat);
        if (latency.isEmpty() && energy.isEmpty()) {
            throw new BadInputException("cannot calibrate: no measured value in " + sources
                    + " belongs to a node that runs on the device or to a whole model; nothing to fit");
        }
        Fit all = fitEnergy(energy, lat, staticPowerWatts, notes, true);
        double[] neutral = neutral(latency, staticPowerWatts);
        for (Obs o : concat(latency, energy)) {
            double b = predict(o, neutral, false);
            double a = predict(o, all.values(), all.fitted()[Factor.LAYER_OVERHEAD.ordinal()]);
            residuals.add(new Residual(o.model(), o.node(), o.metric(), o.measured(), b, a, o.chipOnly()));
        }

        List<Residual> heldOut = null;
        TreeSet<String> measured = new TreeSet<>();
        for (Obs o : concat(latency, energy)) {
            measured.add(o.model());
        }
        if (measured.size() >= 3) {
            heldOut = new ArrayList<>();
            for (String held : measured) {
                List<Obs> lt = latency.stream().filter(o -> !o.model().equals(held)).toList();
                List<Obs> en = energy.stream().filter(o -> !o.model().equals(held)).toList();
                Fit l = fitLatency(lt, new ArrayList<>(), false);
                Fit e = fitEnergy(en, l, staticPowerWatts, new ArrayList<>(), false);
                for (Obs o : concat(latency, energy)) {
                    if (o.model().equals(held)) {
                        heldOut.add(new Residual(o.model(), o.node(), o.metric(), o.measured(), predict(o, neutral, false),
                                predict(o, e.values(), e.fitted()[Factor.LAYER_OVERHEAD.ordinal()]), o.chipOnly()));
                    }
                }
            }
        }
        EnumMap<Factor, FactorValue> out = new EnumMap<>(Factor.class);
        for (Factor f : Factor.values()) {
            out.put(f, new FactorValue(f, all.values()[f.ordinal()], all.fitted()[f.ordinal()], all.notes().get(f)));
        }
        return new Calibration(out, residuals, heldOut, notes, files);
    }

    private static List<Obs> concat(List<Obs> a, List<Obs> b) {
        List<Obs> out = new ArrayList<>(a);
        out.addAll(b);
        return out;
    }

    private static List<NodeCost> nodesOf(ModelCosts mc, Measurement m) {
        if (m.node() == null) {
            return mc.nodes();
        }
        NodeCost c = mc.byName().get(m.node());
        return c == null ? List.of() : List.of(c);
    }

    /** Energy values: measured energy, or power times the row's latency (or the calibrated latency when the row gives none). */
    private static List<Obs> energyObs(List<Measurement> rows, Map<String, ModelCosts> byModel, Fit lat) {
        List<Obs> out = new ArrayList<>();
        for (Measurement m : rows) {
            List<NodeCost> nodes = nodesOf(byModel.get(m.model()), m);
            if (m.energyJoules() != null && m.energyJoules() > 0) {
                out.add(new Obs(m.model(), m.node(), Metric.ENERGY, m.energyJoules(), nodes, false, m.chipOnly()));
            } else {
                double t = m.latencySeconds() != null && m.latencySeconds() > 0 ? m.latencySeconds()
                        : latencyOf(nodes, lat.values(), lat.fitted()[Factor.LAYER_OVERHEAD.ordinal()]);
                out.add(new Obs(m.model(), m.node(), Metric.ENERGY, m.powerWatts() * t, nodes, true, m.chipOnly()));
            }
        }
        return out;
    }

    // ---- the model --------------------------------------------------------------------------

    /** The factors that leave the profile as it is. */
    private static double[] neutral(List<Obs> latency, double staticPowerWatts) {
        double[] v = new double[Factor.values().length];
        for (Factor f : Factor.values()) {
            v[f.ordinal()] = f.neutral;
        }
        v[Factor.LAYER_OVERHEAD.ordinal()] = profileOverhead(latency);
        v[Factor.STATIC_POWER.ordinal()] = staticPowerWatts;
        return v;
    }

    /** The profile's per-layer overhead: the median over launched nodes (0 when none). */
    private static double profileOverhead(List<Obs> obs) {
        List<Double> o = new ArrayList<>();
        for (Obs x : obs) {
            for (NodeCost n : x.nodes()) {
                if (n.launches() > 0) {
                    o.add(n.overheadSeconds());
                }
            }
        }
        if (o.isEmpty()) {
            return 0;
        }
        o.sort(null);
        return o.get(o.size() / 2);
    }

    static double latency(NodeCost n, double[] f, boolean overheadFitted) {
        double c = n.computeSeconds() / f[Factor.efficiency(n.opClass()).ordinal()];
        double d = n.dramSeconds() / f[Factor.DRAM_BANDWIDTH_SCALE.ordinal()];
        double t = Math.max(c, Math.max(n.sramSeconds(), d));
        return t + (overheadFitted ? f[Factor.LAYER_OVERHEAD.ordinal()] * n.launches() : n.overheadSeconds());
    }

    static double energy(NodeCost n, double[] f, double latencySeconds) {
        return energy(n, f, latencySeconds, false);
    }

    /** The calibrated energy of a node; {@code chipOnly} leaves DRAM energy out. */
    static double energy(NodeCost n, double[] f, double latencySeconds, boolean chipOnly) {
        return f[Factor.ENERGY_SCALE_COMPUTE.ordinal()] * n.computeJoules()
                + f[Factor.ENERGY_SCALE_ON_CHIP.ordinal()] * n.onChipJoules()
                + (chipOnly ? 0 : f[Factor.ENERGY_SCALE_DRAM.ordinal()] * n.dramJoules())
                + f[Factor.STATIC_POWER.ordinal()] * latencySeconds;
    }

    private static double latencyOf(List<NodeCost> nodes, double[] f, boolean overheadFitted) {
        double t = 0;
        for (NodeCost n : nodes) {
            t += latency(n, f, overheadFitted);
        }
        return t;
    }

    private static double predict(Obs o, double[] f, boolean overheadFitted) {
        double s = 0;
        for (NodeCost n : o.nodes()) {
            double t = latency(n, f, overheadFitted);
            s += o.metric() == Metric.LATENCY ? t : energy(n, f, t, o.chipOnly());
        }
        return s;
    }

    /**
     * The prediction of {@code o} and its derivative by the logarithm of each factor, into {@code grad}.
     * With {@code soft} above 0, a latency takes the {@code soft}-norm of its compute, SRAM and DRAM times
     * in place of their maximum (see {@link #solve}); 0 is the estimator's own maximum.
     */
    private static double predictWithGradient(Obs o, double[] f, boolean overheadFitted, double[] grad, double soft) {
        Arrays.fill(grad, 0);
        double s = 0;
        int ovh = Factor.LAYER_OVERHEAD.ordinal();
        int bw = Factor.DRAM_BANDWIDTH_SCALE.ordinal();
        boolean lat = o.metric() == Metric.LATENCY;
        for (NodeCost n : o.nodes()) {
            int eff = Factor.efficiency(n.opClass()).ordinal();
            double c = n.computeSeconds() / f[eff];
            double d = n.dramSeconds() / f[bw];
            double m = n.sramSeconds();
            double t;
            if (soft > 0 && lat) {
                double top = Math.max(c, Math.max(m, d));
                if (top > 0) {
                    // t = top * (sum (x/top)^p)^(1/p); dt/dlog(factor) = -x (x/t)^(p-1) for x = c, d
                    double rc = c / top;
                    double rm = m / top;
                    double rd = d / top;
                    t = top * Math.pow(Math.pow(rc, soft) + Math.pow(rm, soft) + Math.pow(rd, soft), 1 / soft);
                    grad[eff] -= c * Math.pow(c / t, soft - 1);
                    grad[bw] -= d * Math.pow(d / t, soft - 1);
                } else {
                    t = 0;
                }
            } else if (c >= m && c >= d) {
                t = c;
                if (lat) {
                    grad[eff] -= c;
                }
            } else if (d >= m) {
                t = d;
                if (lat) {
                    grad[bw] -= d;
                }
            } else {
                t = m;
            }
            double over = overheadFitted ? f[ovh] * n.launches() : n.overheadSeconds();
            t += over;
            if (o.metric() == Metric.LATENCY) {
                if (overheadFitted) {
                    grad[ovh] += over;
                }
                s += t;
            } else {
                double ec = f[Factor.ENERGY_SCALE_COMPUTE.ordinal()] * n.computeJoules();
                double em = f[Factor.ENERGY_SCALE_ON_CHIP.ordinal()] * n.onChipJoules();
                double ed = o.chipOnly() ? 0 : f[Factor.ENERGY_SCALE_DRAM.ordinal()] * n.dramJoules();
                double es = f[Factor.STATIC_POWER.ordinal()] * t;
                grad[Factor.ENERGY_SCALE_COMPUTE.ordinal()] += ec;
                grad[Factor.ENERGY_SCALE_ON_CHIP.ordinal()] += em;
                grad[Factor.ENERGY_SCALE_DRAM.ordinal()] += ed;
                grad[Factor.STATIC_POWER.ordinal()] += es;
                s += ec + em + ed + es;
            }
        }
        return s;
    }

    // ---- the fits ---------------------------------------------------------------------------

    /**
     * A whole-model value weighs as much as all the node values of its model together (at least 1), so
     * that the total of a model with 300 measured layers is not drowned by them; a node value weighs 1.
     */
    private static double[] weights(List<Obs> obs) {
        Map<String, Integer> nodeRows = new LinkedHashMap<>();
        for (Obs o : obs) {
            if (o.node() != null) {
                nodeRows.merge(o.model(), 1, Integer::sum);
            }
        }
        double[] w = new double[obs.size()];
        for (int i = 0; i < w.length; i++) {
            Obs o = obs.get(i);
            w[i] = o.node() != null ? 1 : Math.max(1, nodeRows.getOrDefault(o.model(), 0));
        }
        return w;
    }

    private static Fit fitLatency(List<Obs> obs, List<String> notes, boolean say) {
        double[] start = neutral(obs, 0);
        boolean[] fitted = new boolean[start.length];
        Map<Factor, String> why = new EnumMap<>(Factor.class);
        if (obs.isEmpty()) {
            for (Factor f : LATENCY) {
                why.put(f, "no latency was measured");
            }
            return new Fit(start, fitted, why);
        }
        // The overhead is fitted as an absolute time: start from the profile's, or from a small share
        // of the measured time per layer when the profile has none.
        if (!(start[Factor.LAYER_OVERHEAD.ordinal()] > 0)) {
            List<Double> perLayer = new ArrayList<>();
            for (Obs o : obs) {
                int launches = o.nodes().stream().mapToInt(NodeCost::launches).sum();
                perLayer.add(o.measured() / Math.max(1, launches));
            }
            perLayer.sort(null);
            start[Factor.LAYER_OVERHEAD.ordinal()] = 0.05 * perLayer.get(perLayer.size() / 2);
        }
        return solve(obs, LATENCY, start, start, true, why, notes, say);
    }

    private static Fit fitEnergy(List<Obs> obs, Fit lat, double staticPowerWatts, List<String> notes, boolean say) {
        double[] start = lat.values().clone();
        boolean[] fitted = lat.fitted().clone();
        Map<Factor, String> why = new EnumMap<>(lat.notes());
        start[Factor.STATIC_POWER.ordinal()] = staticPowerWatts;
        if (obs.isEmpty()) {
            for (Factor f : ENERGY) {
                why.put(f, "no energy or power was measured");
            }
            return new Fit(start, fitted, why);
        }
        boolean ovh = fitted[Factor.LAYER_OVERHEAD.ordinal()];
        if (!(staticPowerWatts > 0)) {
            List<Double> p = new ArrayList<>();
            for (Obs o : obs) {
                double t = latencyOf(o.nodes(), start, ovh);
                if (t > 0) {
                    p.add(o.measured() / t);
                }
            }
            p.sort(null);
            start[Factor.STATIC_POWER.ordinal()] = p.isEmpty() ? 1e-3 : 0.1 * p.get(p.size() / 2);
        }
        // A factor left out of the fit holds the profile's value, not the point the fit would start from.
        double[] kept = start.clone();
        kept[Factor.STATIC_POWER.ordinal()] = staticPowerWatts;
        Fit e = solve(obs, ENERGY, start, kept, ovh, why, notes, say);
        // Keep the latency factors as the latency fit set them.
        for (Factor f : LATENCY) {
            e.fitted()[f.ordinal()] = fitted[f.ordinal()];
        }
        return e;
    }

    /**
     * Chooses which of {@code candidates} the values can set and fits them with Levenberg-Marquardt
     * from {@code start}; the others hold their {@code kept} value (the profile's), with a note saying why.
     */
    private static Fit solve(List<Obs> obs, Factor[] candidates, double[] start, double[] kept, boolean overheadFitted,
                             Map<Factor, String> why, List<String> notes, boolean say) {
        boolean[] fitted = new boolean[start.length];
        for (int i = 0; i < start.length; i++) {
            fitted[i] = false;
        }
        int ovh = Factor.LAYER_OVERHEAD.ordinal();
        boolean latencyFit = candidates == LATENCY;
        // Sensitivity: how much of the predictions each factor moves, at the start point; for latency also
        // with the smoothed maximum, where a bound that does not limit a node at the start still pulls.
        double[] share = new double[start.length];
        double[] softShare = new double[start.length];
        double[] grad = new double[start.length];
        for (Obs o : obs) {
            double p = predictWithGradient(o, start, latencyFit || overheadFitted, grad, 0);
            if (p > 0) {
                for (int j = 0; j < grad.length; j++) {
                    share[j] += Math.abs(grad[j]) / p;
                }
            }
            if (latencyFit) {
                p = predictWithGradient(o, start, true, grad, SOFT_NORM);
                if (p > 0) {
                    for (int j = 0; j < grad.length; j++) {
                        softShare[j] += Math.abs(grad[j]) / p;
                    }
                }
            }
        }
        List<Factor> usable = new ArrayList<>();
        for (Factor f : candidates) {
            if (share[f.ordinal()] > 1e-9 * obs.size() || softShare[f.ordinal()] > 1e-9 * obs.size()) {
                usable.add(f);
            } else {
                why.put(f, f == Factor.DRAM_BANDWIDTH_SCALE ? "no measured node is limited by DRAM"
                        : f.name().startsWith("EFFICIENCY") ? "no measured node of this class is limited by compute"
                        : f == Factor.ENERGY_SCALE_DRAM ? "no measured energy or power includes DRAM energy"
                        : "no measured value depends on it");
            }
        }
        // The factors that move the predictions at the start first; those that only the smoothed maximum
        // reaches after them.
        usable.sort((a, b) -> share[a.ordinal()] != share[b.ordinal()] ? Double.compare(share[b.ordinal()], share[a.ordinal()])
                : Double.compare(softShare[b.ordinal()], softShare[a.ordinal()]));
        if (usable.size() > obs.size()) {
            List<Factor> dropped = usable.subList(obs.size(), usable.size());
            List<String> keys = new ArrayList<>();
            for (Factor f : dropped) {
                keys.add(f.key);
                why.put(f, "only " + obs.size() + " " + obs.get(0).metric().label + " value"
                        + (obs.size() == 1 ? "" : "s") + " for " + usable.size() + " factors");
            }
            if (say) {
                notes.add("only " + obs.size() + " " + obs.get(0).metric().label + (obs.size() == 1 ? " value" : " values")
                        + " for " + usable.size() + " factors: fitted " + String.join(", ", usable.subList(0, obs.size())
                        .stream().map(f -> f.key).toList()) + "; kept " + String.join(", ", keys) + " as the profile gives");
            }
            usable = new ArrayList<>(usable.subList(0, obs.size()));
        }
        double[] values = kept.clone();
        List<String> off = new ArrayList<>();
        while (!usable.isEmpty()) {
            int[] idx = usable.stream().mapToInt(Factor::ordinal).toArray();
            // The fitted overhead replaces the profile's only when it is among the factors fitted.
            boolean ovhOn = latencyFit ? usable.contains(Factor.LAYER_OVERHEAD) : overheadFitted;
            double[] f = passes(obs, idx, start, kept, ovhOn, latencyFit);
            // A term added to the predictions (overhead, an energy, static power) that the fit drove toward
            // zero in every value it enters has no optimum among physical values: these measurements cannot
            // set it. It keeps the profile's value and the others are fitted again. (An efficiency or a
            // bandwidth that lifts every node of its own onto another bound is a bound the data do set: kept.)
            double[] most = new double[f.length];
            double[] g = new double[f.length];
            for (Obs o : obs) {
                double p = predictWithGradient(o, f, ovhOn, g, 0);
                for (int j = 0; j < g.length; j++) {
                    most[j] = Math.max(most[j], p > 0 ? Math.abs(g[j]) / p : 0);
                }
            }
            List<Factor> out = usable.stream().filter(x -> (x.metric == Metric.ENERGY || x == Factor.LAYER_OVERHEAD)
                    && most[x.ordinal()] < SWITCHED_OFF).toList();
            if (out.isEmpty()) {
                for (int j : idx) {
                    values[j] = f[j];
                    fitted[j] = true;
                }
                break;
            }
            for (Factor x : out) {
                why.put(x, "the fit drove it toward zero in every measured value; these measurements cannot set it");
                off.add(x.key);
            }
            usable = new ArrayList<>(usable);
            usable.removeAll(out);
        }
        if (latencyFit) {
            // A bound that limits no measured node at the end moves no prediction: the smoothed stage may
            // have left its factor anywhere. It goes back to the profile's value (when that leaves every
            // prediction as it is) and is reported as not fitted.
            boolean ovhOn = fitted[ovh];
            double[] limiting = new double[values.length];
            for (Obs o : obs) {
                predictWithGradient(o, values, ovhOn, grad, 0);
                for (int j = 0; j < grad.length; j++) {
                    limiting[j] += Math.abs(grad[j]);
                }
            }
            double before = dataCost(obs, values, ovhOn);
            for (Factor f : candidates) {
                int j = f.ordinal();
                if (!fitted[j] || f == Factor.LAYER_OVERHEAD || limiting[j] > 0) {
                    continue;
                }
                double held = values[j];
                values[j] = kept[j];
                if (Math.abs(dataCost(obs, values, ovhOn) - before) <= 1e-12 * Math.max(1, before)) {
                    fitted[j] = false;
                    why.put(f, f == Factor.DRAM_BANDWIDTH_SCALE ? "no measured node is limited by DRAM"
                            : "no measured node of this class is limited by compute");
                } else {
                    // The fit lifted every node of the class off this bound, and any value past that point fits
                    // as well: the smallest such value, where the bound just stops limiting, is what the
                    // measurements say (a lower limit), rather than wherever the solver stopped.
                    values[j] = Math.min(held, lowestHidden(obs, values, f, held));
                }
            }
        }
        if (say && !off.isEmpty()) {
            notes.add("the " + obs.get(0).metric().label + " fit drove " + String.join(", ", off)
                    + " toward zero in every measured value, which these measurements cannot tell from a model"
                    + " without that term; " + (off.size() == 1 ? "it keeps" : "they keep")
                    + " the profile's value and the other factors were fitted again");
        }
        if (latencyFit && !fitted[ovh]) {
            // Not fitted: the profile's overhead applies node by node, as the estimator charges it.
            values[ovh] = profileOverhead(obs);
        }
        return new Fit(values, fitted, why);
    }

    /**
     * The fit of the factors {@code idx} (docs/calibration.md, "How the fit works"). The roofline's maximum
     * of compute, SRAM and DRAM time makes the problem piecewise: a factor has no pull on a layer while
     * another bound hides it, so a fit started at the profile can stall where a slow class of layers looks
     * memory-bound at the profile's figures. So a latency fit also runs in two stages: first with the
     * maximum smoothed into a 4-norm, where each bound pulls on its factor in proportion to how close it is
     * to limiting, then with the true maximum from there. Of the two fits, the one that leaves the smaller
     * error is kept.
     */
    private static double[] passes(List<Obs> obs, int[] idx, double[] start, double[] kept, boolean ovhOn,
                                   boolean latencyFit) {
        double[] plain = optimize(obs, idx, start, kept, ovhOn, 0);
        if (latencyFit) {
            double[] staged = optimize(obs, idx, optimize(obs, idx, start, kept, ovhOn, SOFT_NORM), kept, ovhOn, 0);
            if (dataCost(obs, staged, ovhOn) < dataCost(obs, plain, ovhOn)) {
                return staged;
            }
        }
        return plain;
    }

    /**
     * The smallest value of the efficiency or bandwidth scale {@code f} at which its bound limits none of the
     * measured nodes it acts on (the others at {@code values}); {@code fallback} when no node has another
     * bound to hide behind.
     */
    private static double lowestHidden(List<Obs> obs, double[] values, Factor f, double fallback) {
        double lowest = 0;
        int bw = Factor.DRAM_BANDWIDTH_SCALE.ordinal();
        for (Obs o : obs) {
            for (NodeCost n : o.nodes()) {
                double raw;
                double other;
                if (f == Factor.DRAM_BANDWIDTH_SCALE) {
                    raw = n.dramSeconds();
                    other = Math.max(n.computeSeconds() / values[Factor.efficiency(n.opClass()).ordinal()], n.sramSeconds());
                } else if (Factor.efficiency(n.opClass()) == f) {
                    raw = n.computeSeconds();
                    other = Math.max(n.sramSeconds(), n.dramSeconds() / values[bw]);
                } else {
                    continue;
                }
                if (raw > 0) {
                    if (!(other > 0)) {
                        return fallback;
                    }
                    lowest = Math.max(lowest, raw / other);
                }
            }
        }
        return lowest > 0 ? lowest : fallback;
    }

    /** The weighted sum of squared log ratios that the factor values leave. */
    private static double dataCost(List<Obs> obs, double[] values, boolean ovh) {
        double[] w = weights(obs);
        double c = 0;
        for (int i = 0; i < w.length; i++) {
            double p = Math.max(predict(obs.get(i), values, ovh), 1e-30);
            double d = Math.log(p / obs.get(i).measured());
            c += w[i] * d * d;
        }
        return c;
    }

    /**
     * Levenberg-Marquardt over the logarithms of the factors {@code idx}, from {@code start}; the others
     * hold their {@code kept} values. It minimises the weighted squared log ratios of predicted to measured
     * values; {@code soft} as in {@link #predictWithGradient}.
     */
    private static double[] optimize(List<Obs> obs, int[] idx, double[] start, double[] kept, boolean ovhOn,
                                      double soft) {
        int m = obs.size();
        double[] target = new double[m];
        for (int i = 0; i < m; i++) {
            target[i] = Math.log(obs.get(i).measured());
        }
        double[] w = weights(obs);
        double[] theta0 = new double[idx.length];
        for (int j = 0; j < idx.length; j++) {
            theta0[j] = Math.log(start[idx[j]]);
        }
        LeastSquaresProblem problem = new LeastSquaresBuilder()
                .start(theta0)
                .target(target)
                .weight(new DiagonalMatrix(w))
                .model(point -> {
                    double[] f = kept.clone();
                    for (int j = 0; j < idx.length; j++) {
                        f[idx[j]] = Math.exp(point.getEntry(j));
                    }
                    double[] val = new double[m];
                    double[][] jac = new double[m][idx.length];
                    double[] g = new double[f.length];
                    for (int i = 0; i < m; i++) {
                        double p = predictWithGradient(obs.get(i), f, ovhOn, g, soft);
                        // A prediction of zero cannot be compared on a log scale: hold it at a tiny time.
                        double safe = Math.max(p, 1e-30);
                        val[i] = Math.log(safe);
                        for (int j = 0; j < idx.length; j++) {
                            jac[i][j] = g[idx[j]] / safe;
                        }
                    }
                    return new Pair<RealVector, org.hipparchus.linear.RealMatrix>(
                            new ArrayRealVector(val, false), new Array2DRowRealMatrix(jac, false));
                })
                .parameterValidator(p -> {
                    RealVector q = p.copy();
                    for (int j = 0; j < q.getDimension(); j++) {
                        q.setEntry(j, Math.max(-LOG_LIMIT, Math.min(LOG_LIMIT, q.getEntry(j))));
                    }
                    return q;
                })
                .maxEvaluations(20_000)
                .maxIterations(5_000)
                .build();
        LeastSquaresOptimizer.Optimum opt;
        try {
            opt = new LevenbergMarquardtOptimizer().optimize(problem);
        } catch (MathIllegalStateException e) {
            throw new BadInputException("cannot calibrate: the " + obs.get(0).metric().label
                    + " fit did not converge on " + obs.size() + " values (" + e.getMessage() + ")");
        }
        RealVector theta = opt.getPoint();
        double[] f = kept.clone();
        for (int j = 0; j < idx.length; j++) {
            f[idx[j]] = Math.exp(theta.getEntry(j));
        }
        return f;
    }
}
