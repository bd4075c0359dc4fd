package dev.erg.estimate;

import dev.erg.device.Memory;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.workload.Kind;
import dev.erg.workload.NodeWork;
import java.util.ArrayList;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;

/**
 * Capacity (docs/method.md, section 3): which weights stay resident in SRAM, which activations spill to
 * DRAM, and which layers are tiled. Independent of the engine kind: it sees bytes, not engines.
 */
final class Placement {
    private Placement() {
    }


    /** The outcome of placement: whether the weights stay in SRAM, and the peak of live activations. */
    static final class Result {
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
    private static final class BufferTable {
        private final Buffer[][] out;
        private final Map<Value, Buffer> inputs = new IdentityHashMap<>();

        private final Schedule s;

        BufferTable(Schedule s, int nodes) {
            this.s = s;
            out = new Buffer[nodes][];
        }

        Buffer get(Value v) {
            Node p = v.producer();
            if (p == null) {
                return inputs.get(v);
            }
            int i = s.posOf(p);
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
            int i = s.posOf(p);
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

    /**
     * Places one frame's data.
     *
     * @param cache true when the on-chip level is a processor's last cache rather than a managed SRAM: a
     *              cache keeps what was touched last, not what will be reused, so the weights stay in it
     *              from one frame to the next only when everything a frame touches (the weights and every
     *              activation buffer it writes) fits; an SRAM needs room for the weights and the peak of
     *              live activations only
     */
    static Result place(Schedule s, NodeEstimate[] est, long[] weightBytes, long totalWeights, Memory sram,
                        boolean cache, List<String> assumptions) {
        return new Sweep(s, est, weightBytes, totalWeights, sram, cache).run(assumptions);
    }

    /**
     * One placement: the buffers' live ranges, then a sweep of the schedule. The state lives in fields so
     * that each per-node step is its own small method, compiled by the JIT after a few hundred nodes
     * rather than interpreted through a long loop.
     */
    private static final class Sweep {
        final Schedule s;
        final NodeEstimate[] est;
        final long[] weightBytes;
        final long totalWeights;
        final Memory sram;
        final boolean cache;
        final List<NodeWork> works;
        final boolean[] fusedIn;
        final int n;
        final BufferTable bufOf;
        final List<Buffer> buffers = new ArrayList<>();
        final Result p = new Result();
        long[] live;
        long cap;
        long[] adjust;
        long adj;
        int next;
        final List<Buffer> active = new ArrayList<>();
        final List<Buffer> touched = new ArrayList<>(8);

        Sweep(Schedule s, NodeEstimate[] est, long[] weightBytes, long totalWeights, Memory sram, boolean cache) {
            this.s = s;
            this.cache = cache;
            this.est = est;
            this.weightBytes = weightBytes;
            this.totalWeights = totalWeights;
            this.sram = sram;
            this.works = s.works;
            this.fusedIn = s.fusedIn;
            this.n = works.size();
            this.bufOf = new BufferTable(s, n);
        }

        Result run(List<String> assumptions) {
            for (int i = 0; i < n; i++) {
                buffersOf(i);
            }
            live = new long[n + 1];
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
            p.activationPeak = peak;
            cap = sram.capacityBytes();
            if (cache) {
                long written = 0;
                for (Buffer b : buffers) {
                    written += b.start < 0 ? 0 : b.bytes;
                }
                p.resident = totalWeights + written <= cap;
                if (!p.resident) {
                    assumptions.add("weights (" + totalWeights + " B) and the activations a frame writes (" + written
                            + " B) exceed the last cache '" + sram.id() + "' (" + cap
                            + " B): each layer reads its weights from DRAM every frame");
                }
            } else {
                p.resident = totalWeights + peak <= cap;
                if (!p.resident) {
                    assumptions.add("weights (" + totalWeights + " B) and peak activations (" + peak + " B) exceed the SRAM ("
                            + cap + " B): each layer streams its weights from DRAM every frame");
                }
            }
            // Sweep the schedule with the live set; evict idle buffers (furthest next use first) on overflow.
            adjust = new long[n + 2];
            adj = 0;
            // Buffers are created in the order of their first step, so they are nearly always sorted by start
            // already. Live buffers are appended as they start; ended ones are dropped when the list is scanned.
            buffers.removeIf(b -> b.start < 0);
            for (int q = 1; q < buffers.size(); q++) {
                if (buffers.get(q - 1).start > buffers.get(q).start) {
                    buffers.sort((x, y) -> Integer.compare(x.start, y.start));
                    break;
                }
            }
            next = 0;
            for (int i = 0; i < n; i++) {
                step(i);
            }
            return p;
        }

        /** The buffers node {@code i} reads and writes: their live ranges and uses. */
        private void buffersOf(int i) {
            NodeWork nw = works.get(i);
            Node node = nw.node();
            boolean view = nw.kind() == Kind.VIEW;
            if (!Schedule.runs(nw) && !view) {
                return;
            }
            for (int k = 0; k < node.inputCount(); k++) {
                Value v = node.input(k);
                if (v == null || v.isConstant() || s.isParam(node, k)) {
                    continue;
                }
                Buffer b = bufOf.get(v);
                if (b == null && v.isGraphInput()) {
                    b = new Buffer(v, s.actBytes(v));
                    b.inDram = true;
                    bufOf.put(v, b);
                    buffers.add(b);
                }
                if (b == null || (fusedIn[i] && s.fusedThrough(v))) {
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
                if (s.fusedThrough(v)) {
                    continue;
                }
                Buffer b = new Buffer(v, s.actBytes(v));
                b.start = i;
                b.end = i;
                b.use(i);
                bufOf.put(v, b);
                buffers.add(b);
            }
        }

        /** Step {@code i} of the sweep: the node's working set, evictions on overflow, DRAM traffic. */
        private void step(int i) {
            adj += adjust[i];
            while (next < buffers.size() && buffers.get(next).start <= i) {
                active.add(buffers.get(next++));
            }
            NodeWork nw = works.get(i);
            if (!est[i].priced) {
                return;
            }
            NodeEstimate e = est[i];
            Node node = nw.node();
            touched.clear();
            long ownBytes = 0;
            for (int vi = 0; vi < node.inputs().size(); vi++) {
                Value v = node.inputs().get(vi);
                Buffer b = v == null ? null : bufOf.get(v);
                if (b != null && b.usedAt(i) && !Schedule.containsSame(touched, b)) {
                    touched.add(b);
                    ownBytes += b.bytes;
                }
            }
            for (int vi = 0; vi < node.outputs().size(); vi++) {
                Value v = node.outputs().get(vi);
                Buffer b = v == null ? null : bufOf.get(v);
                if (b != null && b.start == i && !Schedule.containsSame(touched, b)) {
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
                    evict(e, i, need);
                }
                // Reads of inputs that sit in DRAM: graph inputs at their first use, evicted buffers coming back.
                for (int q = 0; q < touched.size(); q++) {
                    Buffer b = touched.get(q);
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
                    e.dramWriteBytes += s.actBytes(v);
                }
            }
        }

        /** Evicts idle buffers, the one used furthest in the future first, until step {@code i} fits. */
        private void evict(NodeEstimate e, int i, long need) {
            List<Buffer> idle = new ArrayList<>();
            int kept = 0;
            for (int q = 0; q < active.size(); q++) {
                Buffer b = active.get(q);
                if (b.end < i) {
                    continue; // ended: drop it from the live list
                }
                active.set(kept++, b);
                if (!Schedule.containsSame(touched, b) && b.evictedUntil <= i && b.nextUseAfter(i) > 0) {
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
    }

    /**
     * A layer whose working set exceeds the SRAM: keep a weight tile and stream the inputs again per
     * tile, or keep an input tile and stream the weights again per tile, whichever moves fewer bytes.
     * A tile may take half the SRAM; the other half buffers the streamed operand and the outputs.
     */
    private static void tileNode(NodeEstimate e, Node node, List<Buffer> touched, BufferTable bufOf, long weights,
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

    static long ceilDiv(long a, long b) {
        return b <= 0 ? 0 : (a + b - 1) / b;
    }
}
