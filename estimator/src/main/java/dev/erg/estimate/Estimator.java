package dev.erg.estimate;

import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.device.Memory;
import dev.erg.device.Precisions;
import dev.erg.device.ProfileCalibration;
import dev.erg.error.BadInputException;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.TensorDef;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import dev.erg.workload.OpClass;
import dev.erg.workload.PrecisionOverrides;
import dev.erg.workload.WorkloadCounter;
import dev.erg.workload.WorkloadRules;
import java.util.ArrayList;
import java.util.Collections;
import java.util.IdentityHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/**
 * Prices a workload on a device profile, following docs/method.md: settle each node's deployed
 * precision, fuse elementwise followers ({@link Fusion}), map each MAC node onto the engine of its
 * kind ({@link EngineModel}: folds, cycles, utilisation, operand traffic), place weights and
 * activations by SRAM capacity ({@link Placement}), take each node's latency from its roofline bound,
 * and split its energy by destination.
 */
public final class Estimator {
    private final DeviceProfile device;
    private final PrecisionOverrides overrides;
    private final WorkloadRules rules = WorkloadRules.standard();
    private final List<String> assumptions = new ArrayList<>();
    private final Pricing pricing;
    private final Engine arrayEngine;
    private final Engine vectorEngine;
    private final EngineModel array;
    private final VectorUnit vector;
    private Schedule s;
    // The state of one run's mapping pass (see map): kept in fields so that the per-node body is its own
    // small method, which the JIT compiles after a few hundred nodes rather than interpreting a long loop.
    private final Set<TensorDef> allWeights = Collections.newSetFromMap(new IdentityHashMap<>());
    private final Set<TensorDef> sramWeights = Collections.newSetFromMap(new IdentityHashMap<>());
    private final List<TensorDef> src = new ArrayList<>(4);
    private long[] weightBytes;
    private final List<MacJob> cellJobs = new ArrayList<>();
    private final List<NodeEstimate> cellEstimates = new ArrayList<>();

    private Estimator(DeviceProfile device, PrecisionOverrides overrides) {
        this.device = device;
        this.overrides = overrides == null ? PrecisionOverrides.NONE : overrides;
        this.pricing = new Pricing(device, assumptions);
        Engine a = null;
        for (Engine e : device.engines()) {
            if (e.isArray()) {
                a = e;
                break;
            }
        }
        this.arrayEngine = a;
        this.vectorEngine = device.first(Engine.Kind.VECTOR);
        this.array = a == null ? null : EngineModel.of(a);
        this.vector = vectorEngine == null ? null : new VectorUnit(vectorEngine);
    }

    public static DeviceEstimate estimate(ModelWorkload w, DeviceProfile device) {
        return estimate(w, device, PrecisionOverrides.NONE);
    }

    /**
     * As {@link #estimate(ModelWorkload, DeviceProfile)}, with per-node precision overrides: the first
     * rule that matches a node sets its weight and/or activation bits (docs/method.md, "Deployed precision").
     */
    public static DeviceEstimate estimate(ModelWorkload w, DeviceProfile device, PrecisionOverrides overrides) {
        return new Estimator(device, overrides).run(w);
    }

    private DeviceEstimate run(ModelWorkload w) {
        List<NodeWork> works = w.nodes();
        int deployBits = device.deployPrecision() == null ? 0 : Precisions.bits(device.deployPrecision());
        this.s = new Schedule(works, rules, deployBits);
        int n = works.size();
        NodeEstimate[] est = new NodeEstimate[n];
        for (int i = 0; i < n; i++) {
            est[i] = new NodeEstimate(works.get(i));
        }
        if (array == null && vector == null) {
            throw new BadInputException(device.id() + ": the profile has no engine");
        }
        Fusion.mark(s, est);
        Precision precision = new Precision(s, overrides, device, arrayEngine);
        for (int i = 0; i < n; i++) {
            if (Schedule.runs(works.get(i))) {
                precision.settle(i, est[i]);
            }
        }
        precision.noteUnusedRules(assumptions);
        weightBytes = new long[n];
        for (int i = 0; i < n; i++) {
            map(works.get(i), est[i], i);
        }
        if (array != null && !cellJobs.isEmpty()) {
            array.settle(cellJobs, cellEstimates, pricing);
        }
        long totalWeights = 0;
        for (TensorDef t : allWeights) {
            totalWeights += s.storedBytes(t);
        }
        long sramWeightBytes = 0;
        for (TensorDef t : sramWeights) {
            sramWeightBytes += s.storedBytes(t);
        }
        Placement.Result p = Placement.place(s, est, weightBytes, sramWeightBytes, device.sram(),
                !device.caches().isEmpty(), assumptions);
        double[] sum = new double[9]; // the total energy, summed part by part as Energy.plus does
        double latency = 0;
        long dramPerFrame = 0;
        boolean reloaded = false;
        for (int i = 0; i < n; i++) {
            if (!est[i].priced) {
                continue;
            }
            finish(est[i], works.get(i));
            Energy.add(sum, est[i].energy);
            latency += est[i].latencySeconds;
            dramPerFrame += est[i].dramReadBytes + est[i].dramWriteBytes;
            reloaded |= est[i].weightsReloaded;
        }
        Energy total = Energy.of(sum);
        if (!w.complete()) {
            assumptions.add("nodes without a rule are not priced: " + w.unmodelled().keySet()
                    + (w.unresolved().isEmpty() ? "" : ", and nodes downstream of them: " + w.unresolved().keySet()));
        }
        if (device.dram().bandwidth(device.clockHz()) == Double.POSITIVE_INFINITY) {
            assumptions.add("the profile gives no DRAM bandwidth: DRAM time is not limiting");
        }
        List<String> uniq = new ArrayList<>(new LinkedHashSet<>(assumptions));
        if (!device.energyKnown()) {
            uniq.add("the profile gives no energies: energy and power are unknown");
        }
        uniq.add(errorNote(device.calibration()));
        return new DeviceEstimate(w, device, List.of(est), total, latency, p.resident,
                p.resident ? sramWeightBytes : 0, totalWeights, p.activationPeak, dramPerFrame, uniq, reloaded);
    }

    /** Maps node {@code i} onto its engine: weights, folds and cycles, operand traffic. */
    private void map(NodeWork nw, NodeEstimate e, int i) {
        if (!Schedule.runs(nw)) {
            return;
        }
        e.priced = true;
        src.clear();
        long wb = weights(nw.node(), src);
        addAll(allWeights, src);
        e.weightBytes = wb;
        if (nw.kind() == Kind.MAC) {
            EngineModel model = array != null ? array : vector;
            MacJob job = job(nw, e, model.engine());
            if ((nw.gemmGroups() == 0 || model == vector) && !(model instanceof CpuCores)) {
                // No matrix view (a node that carries subgraphs) or no array: one MAC per unit per cycle.
                Engine flatEngine = model instanceof DigitalArray || vectorEngine == null ? model.engine()
                        : vectorEngine;
                model = new VectorUnit(flatEngine);
                if (array == null) {
                    assumptions.add("the profile has no MAC array: MACs run on the vector unit without reuse");
                } else if (flatEngine == vectorEngine) {
                    assumptions.add("'" + nw.name() + "' has no matrix view for '" + arrayEngine.id()
                            + "': its MACs run on the vector unit without reuse");
                }
            }
            model.map(job, e);
            if (model instanceof CpuCores) {
                CpuCores cpu = (CpuCores) model;
                note(cpu.derivedNote(e.precision, false));
                if (nw.vectorOps() > 0) { // the same cores run the node's vector work after its MACs
                    e.computeCycles += cpu.opCycles(nw.vectorOps(), e.precision);
                    note(cpu.derivedNote(e.precision, true));
                }
            }
            e.macModel = model;
            e.engine = model.engine().id();
            e.job = job;
            if (vector != null && nw.vectorOps() > 0) {
                e.computeCycles = Math.max(e.computeCycles, vector.cycles(nw.vectorOps()));
            }
            e.overheadSeconds = model.engine().layerOverheadCycles() / device.clockHz();
            if (model.holdsWeights() && nw.gemmGroups() > 0) {
                cellJobs.add(job);
                cellEstimates.add(e);
                return; // its weights live in the engine's cells, not in SRAM
            }
        } else {
            mapVector(e, nw, wb, s.fusedIn[i]);
        }
        weightBytes[i] = wb;
        addAll(sramWeights, src);
    }

    private static void addAll(Set<TensorDef> set, List<TensorDef> src) {
        for (int q = 0, m = src.size(); q < m; q++) {
            set.add(src.get(q));
        }
    }

    /** What is known of the estimate's error: the calibration's bands, or that it is unknown. */
    static String errorNote(ProfileCalibration c) {
        if (c == null) {
            return "the profile is not calibrated: the error of these estimates is unknown";
        }
        StringBuilder b = new StringBuilder("the profile is calibrated");
        String sep = ": ";
        for (String metric : new String[] {"latency", "energy"}) {
            ProfileCalibration.Band band = metric.equals("latency") ? c.latency() : c.energy();
            if (band == null) {
                continue;
            }
            b.append(sep).append(metric).append(" estimates were off by ").append(signed(band.low())).append(" \u2026 ")
                    .append(signed(band.high())).append(" on ").append(band.basis())
                    .append(band.from().equals("fit") ? "" : " (each model predicted from the others)");
            sep = "; ";
        }
        if (c.energy() == null) {
            b.append(sep).append("the error of energy estimates is unknown");
        }
        return b.toString();
    }

    private static String signed(double share) {
        long p = Math.round(share * 100);
        return (p < 0 ? "\u2212" + (-p) : "+" + p) + "%";
    }

    /** Deployed bytes of the constants a node reads (not its parameters); their stored tensors go to {@code src}. */
    private long weights(Node node, List<TensorDef> src) {
        long loose = 0;
        for (int k = 0; k < node.inputCount(); k++) {
            Value v = node.input(k);
            if (v == null || !v.isConstant() || s.isParam(node, k)) {
                continue;
            }
            if (v.sources().isEmpty()) {
                loose += s.actBytes(v);
            } else {
                for (TensorDef t : v.sources()) {
                    if (!Schedule.containsSame(src, t)) {
                        src.add(t);
                    }
                }
            }
        }
        long wb = loose;
        for (int q = 0; q < src.size(); q++) {
            wb += s.storedBytes(src.get(q));
        }
        return wb;
    }

    /** The MAC node as its engine sees it, at the deployed widths. */
    private MacJob job(NodeWork w, NodeEstimate e, Engine engine) {
        Node node = w.node();
        DeployedPrecision d = e.deployed;
        boolean aOver = d.activationOrigin() == DeployedPrecision.Origin.OVERRIDE;
        boolean wSet = e.weightBitsSet;
        int aBits = aOver ? d.activationBits() : s.bits(WorkloadCounter.effectiveType(node.input(0)));
        int wBits = node.inputCount() > 1 ? s.bits(WorkloadCounter.effectiveType(node.input(1))) : aBits;
        if (node.opType().startsWith("QLinear")) {
            wBits = s.bits(WorkloadCounter.effectiveType(node.input(3)));
        }
        if (wSet && d.weightBits() > 0) {
            wBits = d.weightBits();
        }
        int oBits = node.output(0) == null ? aBits : s.bits(node.output(0).type());
        if (s.deployBits > 0) {
            oBits = Math.min(oBits, Math.max(s.deployBits, 8));
        }
        if (aOver) {
            oBits = d.activationBits();
        }
        boolean writesOut = !s.fusedThrough(node.output(0));
        Value wv = node.opType().startsWith("QLinear") ? node.input(3) : node.inputCount() > 1 ? node.input(1) : null;
        boolean constant = wv != null && wv.isConstant();
        return new MacJob(w, aBits, wBits, oBits, engine.accumulatorBits(), e.precision, writesOut, constant);
    }

    private void mapVector(NodeEstimate e, NodeWork w, long weightBytes, boolean fusedIn) {
        Engine engine = vectorEngine != null ? vectorEngine : arrayEngine;
        e.engine = engine.id();
        Node node = w.node();
        Value fusedValue = fusedIn ? Fusion.fusedInput(node) : null;
        long in = 0;
        for (int k = 0; k < node.inputCount(); k++) {
            Value v = node.input(k);
            if (v == null || v.isConstant() || s.isParam(node, k) || (fusedIn && v == fusedValue)) {
                continue;
            }
            in += s.actBytes(v);
        }
        long out = 0;
        for (int vi = 0; vi < node.outputs().size(); vi++) {
            Value v = node.outputs().get(vi);
            if (v != null && !s.fusedThrough(v)) {
                out += s.actBytes(v);
            }
        }
        e.sramReadBytes = in + weightBytes;
        e.sramWriteBytes = out;
        if (array instanceof CpuCores && engine == arrayEngine) {
            CpuCores cpu = (CpuCores) array;
            e.computeCycles = w.vectorOps() == 0 ? 0 : cpu.opCycles(w.vectorOps(), e.precision);
            if (w.vectorOps() > 0) {
                note(cpu.derivedNote(e.precision, true));
            }
        } else {
            e.computeCycles = Placement.ceilDiv(w.vectorOps(), engine.units());
        }
        e.overheadSeconds = fusedIn ? 0 : engine.layerOverheadCycles() / device.clockHz();
    }

    private void note(String assumption) {
        if (assumption != null) {
            assumptions.add(assumption);
        }
    }

    /**
     * The on-chip level that serves a node's traffic: the SRAM, or on a processor the nearest cache
     * that holds the node's working set (its activation inputs, weights and outputs), else the last.
     */
    private Memory onChipLevel(NodeWork w, NodeEstimate e) {
        List<Memory> caches = device.caches();
        if (caches.isEmpty()) {
            return device.sram();
        }
        Node node = w.node();
        long set = e.weightBytes;
        for (int k = 0; k < node.inputCount(); k++) {
            Value v = node.input(k);
            if (v != null && !v.isConstant() && !s.isParam(node, k)) {
                set += s.actBytes(v);
            }
        }
        for (Value v : node.outputs()) {
            set += s.actBytes(v);
        }
        for (Memory m : caches) {
            if (set <= m.capacityBytes()) {
                return m;
            }
        }
        return caches.get(caches.size() - 1);
    }

    // ---- latency and energy ---------------------------------------------------------------

    private void finish(NodeEstimate e, NodeWork w) {
        double hz = device.clockHz();
        e.computeSeconds = e.computeCycles / hz;
        Memory onChip = onChipLevel(w, e);
        e.onChipLevel = onChip.id();
        double sramBw = onChip.bandwidth(hz);
        double dramBw = device.dram().bandwidth(hz);
        e.sramSeconds = (e.sramReadBytes + e.sramWriteBytes) / sramBw;
        e.dramSeconds = (e.dramReadBytes + e.dramWriteBytes) / dramBw;
        ProfileCalibration cal = device.calibration();
        if (cal != null) {
            // The calibration's factors (docs/calibration.md): achieved share of the peak per operator
            // class, effective DRAM bandwidth, and a fitted per-layer overhead in place of the profile's.
            e.computeSeconds /= cal.efficiency(OpClass.of(w).label);
            e.dramSeconds /= cal.factor(ProfileCalibration.DRAM_BANDWIDTH_SCALE, 1);
            if (cal.overheadFitted()) {
                e.overheadSeconds = e.fusedInto == null ? cal.factor(ProfileCalibration.LAYER_OVERHEAD_US, 0) * 1e-6 : 0;
            }
        }
        double t = e.computeSeconds;
        e.bound = Bound.COMPUTE;
        if (e.sramSeconds > t) {
            t = e.sramSeconds;
            e.bound = Bound.SRAM;
        }
        if (e.dramSeconds > t) {
            t = e.dramSeconds;
            e.bound = Bound.DRAM;
        }
        if (t == 0) {
            e.bound = Bound.NONE;
        }
        e.latencySeconds = t + e.overheadSeconds;
        if (!device.energyKnown()) {
            e.energy = Energy.UNKNOWN;
            return;
        }
        Energy macs = w.macs() > 0 && e.macModel != null ? e.macModel.price(e.job, e, pricing) : Energy.ZERO;
        double compute = macs.compute();
        if (w.vectorOps() > 0) {
            Engine eng = vectorEngine != null ? vectorEngine : arrayEngine;
            String what = eng == vectorEngine || eng.cpu() != null ? "vector op" : "MAC";
            compute += w.vectorOps() * pricing.fj(eng, e.precision, what) * Pricing.FJ;
        }
        Memory reg = device.registers();
        double regJ = reg == null ? 0
                : (e.registerReadBytes * reg.readFjPerByte() + e.registerWriteBytes * reg.writeFjPerByte()) * Pricing.FJ;
        Memory sram = onChip;
        double sramJ = (e.sramReadBytes * sram.readFjPerByte() + e.sramWriteBytes * sram.writeFjPerByte()) * Pricing.FJ;
        Memory dram = device.dram();
        double dramJ = (e.dramReadBytes * dram.readFjPerByte() + e.dramWriteBytes * dram.writeFjPerByte()) * Pricing.FJ;
        double staticMw = device.staticPowerMw();
        double sc = 1;
        if (cal != null) {
            // energy scales per destination (a fitted static power is the profile's staticPowerMw())
            sc = cal.factor(ProfileCalibration.ENERGY_SCALE_COMPUTE, 1);
            double so = cal.factor(ProfileCalibration.ENERGY_SCALE_ON_CHIP, 1);
            compute *= sc;
            regJ *= so;
            sramJ *= so;
            dramJ *= cal.factor(ProfileCalibration.ENERGY_SCALE_DRAM, 1);
        }
        double leak = staticMw * 1e-3 * e.latencySeconds;
        e.energy = new Energy(compute, regJ, sramJ, dramJ, leak, sc * macs.conversion(), sc * macs.cellWrites(),
                sc * macs.rowDrive(), sc * macs.accumulation());
    }
}
