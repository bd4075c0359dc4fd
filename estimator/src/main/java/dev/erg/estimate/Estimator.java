package dev.erg.estimate;

import dev.erg.error.BadInputException;
import dev.erg.device.Dataflow;
import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.device.Memory;
import dev.erg.device.Precisions;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorDef;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import dev.erg.workload.WorkloadCounter;
import dev.erg.workload.WorkloadRules;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.IdentityHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Prices a workload on a device profile, following docs/method.md: map each MAC node onto an
 * engine (folds, cycles, utilisation), count SRAM and register traffic from the dataflow's reuse,
 * place weights and activations by SRAM capacity (resident or streamed weights, spills, tiling),
 * fuse elementwise followers, take each node's latency from its roofline bound, and split its energy
 * by destination.
 */
public final class Estimator {
    /** Elementwise operators that can run on the way out of a MAC node. */
    static final Set<String> FUSABLE = Set.of("Relu", "Clip", "LeakyRelu", "PRelu", "Sigmoid", "Tanh",
            "HardSigmoid", "HardSwish", "Gelu", "Swish", "Mish", "Elu", "Selu", "Softplus", "Add", "Sub", "Mul",
            "Div", "QuantizeLinear", "DequantizeLinear", "BatchNormalization");
    private static final double FJ = 1e-15;

    private final DeviceProfile device;
    private final WorkloadRules rules = WorkloadRules.standard();
    private final int deployBits;
    private final List<String> assumptions = new ArrayList<>();

    private Estimator(DeviceProfile device) {
        this.device = device;
        this.deployBits = device.deployPrecision() == null ? 0 : Precisions.bits(device.deployPrecision());
    }

    public static DeviceEstimate estimate(ModelWorkload w, DeviceProfile device) {
        return new Estimator(device).run(w);
    }

    // ---- element widths --------------------------------------------------------------------

    private int bits(ElemType t) {
        if (t == null) {
            return 0;
        }
        return deployBits > 0 && t.isFloat() ? deployBits : t.bits;
    }

    private long bytes(long elements, int bits) {
        return Math.multiplyExact(elements, bits) / 8 + ((elements * bits) % 8 == 0 ? 0 : 1);
    }

    /** Bytes of an activation value at its deployed width. */
    long actBytes(Value v) {
        if (v == null || !v.hasShape() || v.type() == null) {
            return 0;
        }
        return bytes(v.elements(), bits(WorkloadCounter.effectiveType(v)));
    }

    long storedBytes(TensorDef t) {
        return bytes(t.elements(), bits(t.type()));
    }

    private String label(String precision) {
        if (deployBits > 0 && Precisions.isFloat(precision)) {
            return device.deployPrecision();
        }
        return precision;
    }

    // ---- the run ---------------------------------------------------------------------------

    /** The nodes of the current run, by topological position. */
    private List<NodeWork> works = List.of();
    /** Per node of the run, the mask of its parameter inputs (looked up once per node). */
    private long[] paramMask = new long[0];

    private boolean isParam(Node node, int k) {
        int i = posOf(node);
        long mask = i >= 0 ? paramMask[i] : rules.parameterMask(node.opType());
        return k < 64 && (mask >>> k & 1) != 0;
    }

    /** The position of {@code n} in this run's nodes, or -1 when it belongs to another graph (a subgraph). */
    private int posOf(Node n) {
        int i = n.index();
        return i >= 0 && i < works.size() && works.get(i).node() == n ? i : -1;
    }

    private DeviceEstimate run(ModelWorkload w) {
        List<NodeWork> works = w.nodes();
        this.works = works;
        this.paramMask = new long[works.size()];
        for (int i = 0; i < works.size(); i++) {
            paramMask[i] = rules.parameterMask(works.get(i).opType());
        }
        int n = works.size();
        NodeEstimate[] est = new NodeEstimate[n];
        for (int i = 0; i < n; i++) {
            est[i] = new NodeEstimate(works.get(i));
        }
        Engine array = device.first(Engine.Kind.MAC_ARRAY);
        Engine vector = device.first(Engine.Kind.VECTOR);
        if (array == null && vector == null) {
            throw new BadInputException(device.id() + ": the profile has no engine");
        }
        boolean[] fusedIn = fusion(works, est);
        this.fusedInOf = fusedIn;
        Set<TensorDef> allWeights = Collections.newSetFromMap(new IdentityHashMap<>(2 * n));
        long[] weightBytes = new long[n];
        for (int i = 0; i < n; i++) {
            NodeWork nw = works.get(i);
            if (!runs(nw)) {
                continue;
            }
            est[i].priced = true;
            est[i].precision = label(nw.precision());
            List<TensorDef> src = null;
            long loose = 0;
            Node node = nw.node();
            for (int k = 0; k < node.inputCount(); k++) {
                Value v = node.input(k);
                if (v == null || !v.isConstant() || isParam(node, k)) {
                    continue;
                }
                if (v.sources().isEmpty()) {
                    loose += actBytes(v);
                } else {
                    if (src == null) {
                        src = new ArrayList<>(2);
                    }
                    for (TensorDef t : v.sources()) {
                        if (!containsSame(src, t)) {
                            src.add(t);
                        }
                    }
                }
            }
            long wb = loose;
            if (src != null) {
                for (int q = 0; q < src.size(); q++) {
                    wb += storedBytes(src.get(q));
                }
                allWeights.addAll(src);
            }
            weightBytes[i] = wb;
            est[i].weightBytes = wb;
            if (nw.kind() == Kind.MAC) {
                mapMac(est[i], nw, array != null ? array : vector, vector, wb, fusedIn[i]);
            } else {
                mapVector(est[i], nw, vector != null ? vector : array, wb, fusedIn[i]);
            }
        }
        long totalWeights = 0;
        for (TensorDef t : allWeights) {
            totalWeights += storedBytes(t);
        }
        Placement p = place(works, est, weightBytes, totalWeights, fusedIn);
        double eCompute = 0;
        double eRegisters = 0;
        double eSram = 0;
        double eDram = 0;
        double eStatic = 0;
        double latency = 0;
        long dramPerFrame = 0;
        for (int i = 0; i < n; i++) {
            if (!est[i].priced) {
                continue;
            }
            finish(est[i], works.get(i), array, vector);
            Energy ne = est[i].energy;
            eCompute += ne.compute();
            eRegisters += ne.registers();
            eSram += ne.sram();
            eDram += ne.dram();
            eStatic += ne.staticEnergy();
            latency += est[i].latencySeconds;
            dramPerFrame += est[i].dramReadBytes + est[i].dramWriteBytes;
        }
        if (!w.complete()) {
            assumptions.add("nodes without a rule are not priced: " + w.unmodelled().keySet()
                    + (w.unresolved().isEmpty() ? "" : ", and nodes downstream of them: " + w.unresolved().keySet()));
        }
        if (device.dram().bandwidth(device.clockHz()) == Double.POSITIVE_INFINITY) {
            assumptions.add("the profile gives no DRAM bandwidth: DRAM time is not limiting");
        }
        List<String> uniq = new ArrayList<>(new LinkedHashSet<>(assumptions));
        Energy total = new Energy(eCompute, eRegisters, eSram, eDram, eStatic);
        return new DeviceEstimate(w, device, List.of(est), total, latency, p.resident,
                p.resident ? totalWeights : 0, totalWeights, p.activationPeak, dramPerFrame, uniq);
    }

    private static <T> boolean containsSame(List<T> list, T x) {
        for (T t : list) {
            if (t == x) {
                return true;
            }
        }
        return false;
    }

    private static boolean runs(NodeWork w) {
        return w.kind() == Kind.MAC || w.kind() == Kind.VECTOR || w.kind() == Kind.MOVE;
    }

    // ---- fusion ----------------------------------------------------------------------------

    /**
     * Marks elementwise followers of MAC nodes as fused. Returns, per node, whether its first
     * activation input arrives fused (not read from SRAM). A fused-through output is not written.
     */
    private boolean[] fusion(List<NodeWork> works, NodeEstimate[] est) {
        boolean[] fusedIn = new boolean[works.size()];
        for (int i = 0; i < works.size(); i++) {
            NodeWork head = works.get(i);
            if (head.kind() != Kind.MAC) {
                continue;
            }
            Node cur = head.node();
            while (true) {
                Value out = cur.output(0);
                if (out == null || out.isGraphOutput() || out.consumers().size() != 1) {
                    break;
                }
                Node next = out.consumers().get(0);
                int j = posOf(next);
                if (j < 0 || next.isFolded() || !FUSABLE.contains(next.opType())
                        || works.get(j).kind() != Kind.VECTOR || fusedIn[j]) {
                    break;
                }
                if (next.input(0) != out && !(next.inputCount() > 1 && next.input(1) == out)) {
                    break;
                }
                fusedIn[j] = true;
                est[j].fusedInto = head.name();
                cur = next;
            }
        }
        return fusedIn;
    }

    /** True when {@code v} is written by its producer straight into a fused follower. */
    private boolean fusedThrough(Value v, boolean[] fusedIn) {
        if (v.consumers().size() != 1 || v.isGraphOutput() || v.producer() == null) {
            return false;
        }
        int p = posOf(v.producer());
        if (p < 0 || !(works.get(p).kind() == Kind.MAC || fusedIn[p]) || v.producer().output(0) != v) {
            return false; // only the chain's own activation passes through: a residual operand is read
        }
        int j = posOf(v.consumers().get(0));
        return j >= 0 && fusedIn[j];
    }

    // ---- mapping and on-chip traffic ----------------------------------------------------------

    private long activationInputBytes(Node node, boolean skipFused, Value fusedValue) {
        long b = 0;
        for (int k = 0; k < node.inputCount(); k++) {
            Value v = node.input(k);
            if (v == null || v.isConstant() || isParam(node, k)) {
                continue;
            }
            if (skipFused && v == fusedValue) {
                continue;
            }
            b += actBytes(v);
        }
        return b;
    }

    private void mapMac(NodeEstimate e, NodeWork w, Engine engine, Engine vector, long weightBytes, boolean fusedIn) {
        e.engine = engine.id();
        long m = w.gemmM();
        long k = w.gemmK();
        long nn = w.gemmN();
        long g = w.gemmGroups();
        Node node = w.node();
        int aBits = bits(WorkloadCounter.effectiveType(node.input(0)));
        int wBits = node.inputCount() > 1 ? bits(WorkloadCounter.effectiveType(node.input(1))) : aBits;
        if (node.opType().startsWith("QLinear")) {
            wBits = bits(WorkloadCounter.effectiveType(node.input(3)));
        }
        int oBits = node.output(0) == null ? aBits : bits(node.output(0).type());
        if (deployBits > 0) {
            oBits = Math.min(oBits, Math.max(deployBits, 8));
        }
        double aB = aBits / 8.0;
        double wB = wBits / 8.0;
        double oB = oBits / 8.0;
        double accB = engine.accumulatorBits() / 8.0;
        long macs = w.macs();
        boolean writesOut = !fusedThrough(node.output(0), fusedInOf);
        if (g == 0 || engine.kind() == Engine.Kind.VECTOR) {
            // A subgraph-carrying node or a device with no array: every MAC from SRAM, one per unit per cycle.
            long units = engine.units();
            e.computeCycles = ceilDiv(macs, units);
            e.utilization = e.computeCycles == 0 ? 0 : (double) macs / (e.computeCycles * units);
            e.sramReadBytes = Math.round(macs * (aB + wB + aB));
            e.sramWriteBytes = Math.round(macs * aB);
            if (engine.kind() == Engine.Kind.VECTOR) {
                assumptions.add("the profile has no MAC array: MACs run on the vector unit without reuse");
            }
        } else {
            long rows = engine.rows();
            long cols = engine.columns();
            Dataflow df = engine.dataflow();
            switch (df) {
                case WEIGHT_STATIONARY: {
                    long foldsK = ceilDiv(k, rows);
                    long foldsN = ceilDiv(nn, cols);
                    e.computeCycles = g * foldsK * foldsN * m;
                    double reads = wB * g * k * nn + aB * g * m * k * foldsN + accB * g * m * nn * (foldsK - 1);
                    double writes = accB * g * m * nn * (foldsK - 1) + (writesOut ? oB * g * m * nn : 0);
                    e.sramReadBytes = Math.round(reads);
                    e.sramWriteBytes = Math.round(writes);
                    e.registerReadBytes = Math.round(macs * (aB + wB + accB));
                    e.registerWriteBytes = Math.round(macs * accB);
                    break;
                }
                case OUTPUT_STATIONARY: {
                    long foldsM = ceilDiv(m, rows);
                    long foldsN = ceilDiv(nn, cols);
                    e.computeCycles = g * foldsM * foldsN * k;
                    double reads = aB * g * m * k * foldsN + wB * g * k * nn * foldsM;
                    double writes = writesOut ? oB * g * m * nn : 0;
                    e.sramReadBytes = Math.round(reads);
                    e.sramWriteBytes = Math.round(writes);
                    e.registerReadBytes = Math.round(macs * (aB + wB + accB));
                    e.registerWriteBytes = Math.round(macs * accB);
                    break;
                }
                case NO_REUSE:
                default: {
                    e.computeCycles = ceilDiv(macs, rows * cols);
                    // Three operand-width reads (activation, weight, partial sum) and one write per MAC.
                    e.sramReadBytes = Math.round(macs * (aB + wB + aB));
                    e.sramWriteBytes = Math.round(macs * aB);
                    break;
                }
            }
            e.utilization = e.computeCycles == 0 ? 0 : (double) macs / ((double) e.computeCycles * rows * cols);
        }
        // Inputs that are not part of the product (a residual operand of a fused op is read by that op).
        if (w.vectorOps() > 0 && vector != null) {
            e.computeCycles = Math.max(e.computeCycles, ceilDiv(w.vectorOps(), vector.units()));
        }
        e.overheadSeconds = engine.layerOverheadCycles() / device.clockHz();
    }

    private void mapVector(NodeEstimate e, NodeWork w, Engine engine, long weightBytes, boolean fusedIn) {
        e.engine = engine.id();
        Node node = w.node();
        Value fusedValue = fusedIn ? fusedInput(node) : null;
        long in = activationInputBytes(node, fusedIn, fusedValue);
        long out = 0;
        for (int vi = 0; vi < node.outputs().size(); vi++) {
            Value v = node.outputs().get(vi);
            if (v != null && !fusedThrough(v, fusedInOf)) {
                out += actBytes(v);
            }
        }
        e.sramReadBytes = in + weightBytes;
        e.sramWriteBytes = out;
        e.computeCycles = ceilDiv(w.vectorOps(), engine.units());
        e.overheadSeconds = fusedIn ? 0 : engine.layerOverheadCycles() / device.clockHz();
    }

    private static Value fusedInput(Node node) {
        for (int vi = 0; vi < node.inputs().size(); vi++) {
            Value v = node.inputs().get(vi);
            if (v != null && v.producer() != null && !v.isConstant()) {
                Node p = v.producer();
                if (p.output(0) == v && v.consumers().size() == 1) {
                    return v;
                }
            }
        }
        return null;
    }

    static long ceilDiv(long a, long b) {
        return b <= 0 ? 0 : (a + b - 1) / b;
    }

    // The fusion state of the current run, read by the mapping helpers.
    private boolean[] fusedInOf = new boolean[0];

    // ---- capacity: residency, spills, tiling ---------------------------------------------------

    private static final class Placement {
        boolean resident;
        long activationPeak;
    }

    /** A live activation buffer on the device. */
    private static final class Buffer {
        final Value value;
        final long bytes;
        int start = -1;
        int end = -1;
        /** The steps that read or write the buffer, ascending and distinct (the schedule is swept in order). */
        int[] uses = new int[2];
        int useCount;
        boolean inDram;
        int evictedUntil = -1;

        Buffer(Value value, long bytes) {
            this.value = value;
            this.bytes = bytes;
        }

        /** Records a use at {@code step}, which is never before the last one recorded. */
        void use(int step) {
            if (useCount > 0 && uses[useCount - 1] == step) {
                return;
            }
            if (useCount == uses.length) {
                uses = java.util.Arrays.copyOf(uses, 2 * useCount);
            }
            uses[useCount++] = step;
        }

        boolean usedAt(int step) {
            return java.util.Arrays.binarySearch(uses, 0, useCount, step) >= 0;
        }

        /** The first use after {@code step}, or -1: a binary search of the sorted uses. */
        int nextUseAfter(int step) {
            int i = java.util.Arrays.binarySearch(uses, 0, useCount, step);
            int next = i >= 0 ? i + 1 : -i - 1;
            return next < useCount ? uses[next] : -1;
        }
    }

    /**
     * The buffer of each activation value: node outputs by producer position and output slot (no
     * hashing on the hot path), graph inputs in a small map.
     */
    private final class BufferTable {
        private final Buffer[][] out;
        private final Map<Value, Buffer> inputs = new IdentityHashMap<>();

        BufferTable(int nodes) {
            out = new Buffer[nodes][];
        }

        Buffer get(Value v) {
            Node p = v.producer();
            if (p == null) {
                return inputs.get(v);
            }
            int i = posOf(p);
            if (i < 0 || out[i] == null) {
                return null;
            }
            for (int j = 0; j < out[i].length; j++) {
                if (p.output(j) == v) {
                    return out[i][j];
                }
            }
            return null;
        }

        void put(Value v, Buffer b) {
            Node p = v.producer();
            if (p == null) {
                inputs.put(v, b);
                return;
            }
            int i = posOf(p);
            if (i < 0) {
                return;
            }
            if (out[i] == null) {
                out[i] = new Buffer[p.outputs().size()];
            }
            for (int j = 0; j < out[i].length; j++) {
                if (p.output(j) == v) {
                    out[i][j] = b;
                    return;
                }
            }
        }
    }

    private Placement place(List<NodeWork> works, NodeEstimate[] est, long[] weightBytes, long totalWeights,
                            boolean[] fusedIn) {
        int n = works.size();
        BufferTable bufOf = new BufferTable(n);
        List<Buffer> buffers = new ArrayList<>();
        for (int i = 0; i < n; i++) {
            NodeWork nw = works.get(i);
            Node node = nw.node();
            boolean view = nw.kind() == Kind.VIEW;
            if (!runs(nw) && !view) {
                continue;
            }
            for (int k = 0; k < node.inputCount(); k++) {
                Value v = node.input(k);
                if (v == null || v.isConstant() || isParam(node, k)) {
                    continue;
                }
                Buffer b = bufOf.get(v);
                if (b == null && v.isGraphInput()) {
                    b = new Buffer(v, actBytes(v));
                    b.inDram = true;
                    bufOf.put(v, b);
                    buffers.add(b);
                }
                if (b == null || (fusedIn[i] && fusedThrough(v, fusedIn))) {
                    continue;
                }
                if (b.start < 0) {
                    b.start = i;
                }
                b.end = Math.max(b.end, i);
                b.use(i);
            }
            for (int vi = 0; vi < node.outputs().size(); vi++) {
                Value v = node.outputs().get(vi);
                if (v == null || v.isConstant()) {
                    continue;
                }
                if (view && node.input(0) != null && bufOf.get(node.input(0)) != null) {
                    bufOf.put(v, bufOf.get(node.input(0)));
                    continue;
                }
                if (fusedThrough(v, fusedIn)) {
                    continue;
                }
                Buffer b = new Buffer(v, actBytes(v));
                b.start = i;
                b.end = i;
                b.use(i);
                bufOf.put(v, b);
                buffers.add(b);
            }
        }
        long[] live = new long[n + 1];
        for (Buffer b : buffers) {
            if (b.start < 0) {
                continue;
            }
            live[b.start] += b.bytes;
            live[b.end + 1] -= b.bytes;
        }
        long peak = 0;
        long run = 0;
        for (int i = 0; i < n; i++) {
            run += live[i];
            live[i] = run;
            peak = Math.max(peak, run);
        }
        Placement p = new Placement();
        p.activationPeak = peak;
        Memory sram = device.sram();
        long cap = sram.capacityBytes();
        p.resident = totalWeights + peak <= cap;
        if (!p.resident) {
            assumptions.add("weights (" + totalWeights + " B) and peak activations (" + peak + " B) exceed the SRAM ("
                    + cap + " B): each layer streams its weights from DRAM every frame");
        }
        // Sweep the schedule with the live set; evict idle buffers (furthest next use first) on overflow.
        long[] adjust = new long[n + 2];
        long adj = 0;
        // Buffers are created in the order of their first step, so they are nearly always sorted by start
        // already. Live buffers are appended as they start; ended ones are dropped when the list is scanned.
        buffers.removeIf(b -> b.start < 0);
        for (int q = 1; q < buffers.size(); q++) {
            if (buffers.get(q - 1).start > buffers.get(q).start) {
                buffers.sort((a, b) -> Integer.compare(a.start, b.start));
                break;
            }
        }
        int next = 0;
        List<Buffer> active = new ArrayList<>();
        List<Buffer> touched = new ArrayList<>(8);
        for (int i = 0; i < n; i++) {
            adj += adjust[i];
            while (next < buffers.size() && buffers.get(next).start <= i) {
                active.add(buffers.get(next++));
            }
            NodeWork nw = works.get(i);
            if (!est[i].priced) {
                continue;
            }
            NodeEstimate e = est[i];
            Node node = nw.node();
            touched.clear();
            long ownBytes = 0;
            for (int vi = 0; vi < node.inputs().size(); vi++) {
                Value v = node.inputs().get(vi);
                Buffer b = v == null ? null : bufOf.get(v);
                if (b != null && b.usedAt(i) && !containsSame(touched, b)) {
                    touched.add(b);
                    ownBytes += b.bytes;
                }
            }
            for (int vi = 0; vi < node.outputs().size(); vi++) {
                Value v = node.outputs().get(vi);
                Buffer b = v == null ? null : bufOf.get(v);
                if (b != null && b.start == i && !containsSame(touched, b)) {
                    touched.add(b);
                    ownBytes += b.bytes;
                }
            }
            long wNeed = p.resident ? totalWeights : weightBytes[i];
            long need = live[i] + adj + wNeed;
            boolean tile = !p.resident && ownBytes + weightBytes[i] > cap;
            if (tile) {
                tileNode(e, node, touched, bufOf, weightBytes[i], cap, i, adjust);
            } else {
                if (need > cap) {
                    List<Buffer> idle = new ArrayList<>();
                    int kept = 0;
                    for (int q = 0; q < active.size(); q++) {
                        Buffer b = active.get(q);
                        if (b.end < i) {
                            continue; // ended: drop it from the live list
                        }
                        active.set(kept++, b);
                        if (!containsSame(touched, b) && b.evictedUntil <= i && b.nextUseAfter(i) > 0) {
                            idle.add(b);
                        }
                    }
                    active.subList(kept, active.size()).clear();
                    final int step = i;
                    idle.sort((a, b) -> Integer.compare(b.nextUseAfter(step), a.nextUseAfter(step)));
                    for (Buffer b : idle) {
                        if (need <= cap) {
                            break;
                        }
                        int j = b.nextUseAfter(i);
                        if (!b.inDram) {
                            e.dramWriteBytes += b.bytes;
                            b.inDram = true;
                        }
                        b.evictedUntil = j;
                        adjust[j] += b.bytes;
                        adj -= b.bytes;
                        need -= b.bytes;
                    }
                }
                // Reads of inputs that sit in DRAM: graph inputs at their first use, evicted buffers coming back.
                for (Buffer b : touched) {
                    if (b.start == i && !b.value.isGraphInput()) {
                        continue;
                    }
                    boolean firstInputRead = b.value.isGraphInput() && b.start == i;
                    if (firstInputRead || b.evictedUntil == i) {
                        e.dramReadBytes += b.bytes;
                        b.evictedUntil = -1;
                    }
                }
                if (!p.resident) {
                    e.dramReadBytes += weightBytes[i];
                }
            }
            for (int vi = 0; vi < node.outputs().size(); vi++) {
                Value v = node.outputs().get(vi);
                if (v != null && v.isGraphOutput() && !tile) {
                    e.dramWriteBytes += actBytes(v);
                }
            }
        }
        return p;
    }

    /**
     * A layer whose working set exceeds the SRAM: keep a weight tile and stream the inputs again per
     * tile, or keep an input tile and stream the weights again per tile, whichever moves fewer bytes.
     * A tile may take half the SRAM; the other half buffers the streamed operand and the outputs.
     */
    private void tileNode(NodeEstimate e, Node node, List<Buffer> touched, BufferTable bufOf, long weights,
                          long cap, int step, long[] adjust) {
        long in = 0;
        long out = 0;
        for (Buffer b : touched) {
            if (b.start == step && !b.value.isGraphInput()) {
                out += b.bytes;
            } else {
                in += b.bytes;
                if (!b.inDram) {
                    e.dramWriteBytes += b.bytes; // it has to leave the chip before the layer can stream it
                    b.inDram = true;
                }
            }
        }
        long tileCap = Math.max(cap / 2, 1);
        long passesA = Math.max(1, ceilDiv(weights, tileCap));
        long passesB = Math.max(1, ceilDiv(in, tileCap));
        long a = weights + passesA * in;
        long b = in + passesB * weights;
        if (weights == 0) {
            e.dramReadBytes += in;
            e.tiling = "streamed through SRAM in tiles (no weights)";
        } else if (a <= b) {
            e.dramReadBytes += a;
            e.tiling = "weight tiles x" + passesA + ", inputs streamed per tile";
        } else {
            e.dramReadBytes += b;
            e.tiling = "input tiles x" + passesB + ", weights streamed per tile";
        }
        e.dramWriteBytes += out;
        for (Buffer buf : touched) {
            if (buf.start == step && !buf.value.isGraphInput()) {
                buf.inDram = true;
                int j = buf.nextUseAfter(step);
                if (j > 0) {
                    buf.evictedUntil = j;
                    adjust[step + 1] -= buf.bytes;
                    adjust[j] += buf.bytes;
                }
            }
        }
    }

    // ---- latency and energy ---------------------------------------------------------------

    private void finish(NodeEstimate e, NodeWork w, Engine array, Engine vector) {
        double hz = device.clockHz();
        e.computeSeconds = e.computeCycles / hz;
        double sramBw = device.sram().bandwidth(hz);
        double dramBw = device.dram().bandwidth(hz);
        e.sramSeconds = (e.sramReadBytes + e.sramWriteBytes) / sramBw;
        e.dramSeconds = (e.dramReadBytes + e.dramWriteBytes) / dramBw;
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
        double compute = 0;
        String prec = e.precision;
        if (w.macs() > 0) {
            Engine eng = w.kind() == Kind.MAC && array != null ? array : vector;
            compute += w.macs() * energy(eng, prec, "MAC") * FJ;
        }
        if (w.vectorOps() > 0) {
            Engine eng = vector != null ? vector : array;
            compute += w.vectorOps() * energy(eng, prec, eng == vector ? "vector op" : "MAC") * FJ;
        }
        Memory reg = device.registers();
        double regJ = reg == null ? 0
                : (e.registerReadBytes * reg.readFjPerByte() + e.registerWriteBytes * reg.writeFjPerByte()) * FJ;
        Memory sram = device.sram();
        double sramJ = (e.sramReadBytes * sram.readFjPerByte() + e.sramWriteBytes * sram.writeFjPerByte()) * FJ;
        Memory dram = device.dram();
        double dramJ = (e.dramReadBytes * dram.readFjPerByte() + e.dramWriteBytes * dram.writeFjPerByte()) * FJ;
        double leak = device.staticPowerMw() * 1e-3 * e.latencySeconds;
        e.energy = new Energy(compute, regJ, sramJ, dramJ, leak);
    }

    /** Energies already looked up: every node of one precision on one engine asks the same question. */
    private record EnergyKey(Engine engine, String precision, String what) {
    }

    private final Map<EnergyKey, Double> energyCache = new HashMap<>();

    /** A few recent lookups, checked before the map: most nodes ask one of two or three questions. */
    private final Engine[] memoEngine = new Engine[4];
    private final String[] memoPrecision = new String[4];
    private final String[] memoWhat = new String[4];
    private final double[] memoEnergy = new double[4];
    private int memoNext;

    private double energy(Engine engine, String precision, String what) {
        for (int i = 0; i < memoEngine.length; i++) {
            if (memoEngine[i] == engine && precision.equals(memoPrecision[i]) && what.equals(memoWhat[i])) {
                return memoEnergy[i];
            }
        }
        double fj = energyLookup(engine, precision, what);
        int slot = memoNext++ & 3;
        memoEngine[slot] = engine;
        memoPrecision[slot] = precision;
        memoWhat[slot] = what;
        memoEnergy[slot] = fj;
        return fj;
    }

    private double energyLookup(Engine engine, String precision, String what) {
        EnergyKey key = new EnergyKey(engine, precision, what);
        Double known = energyCache.get(key);
        if (known != null) {
            return known;
        }
        double fj = lookupEnergy(engine, precision, what);
        energyCache.put(key, fj);
        return fj;
    }

    private double lookupEnergy(Engine engine, String precision, String what) {
        Precisions.Lookup l = Precisions.lookup(engine.energyFj(), precision, engine.multiplyFraction());
        if (l == null) {
            throw new BadInputException(device.id() + ": engine '" + engine.id() + "' lists no " + what
                    + " energy from which " + precision + " can be derived (it lists " + engine.energyFj().keySet() + ")");
        }
        if (l.derived) {
            assumptions.add(what + " energy at " + precision + " on '" + engine.id() + "' is derived from " + l.from
                    + " by the bit-width rule (multiplier ~ bits^2, adder ~ bits; Nagel et al. 2021)");
        }
        return l.fj;
    }
}
