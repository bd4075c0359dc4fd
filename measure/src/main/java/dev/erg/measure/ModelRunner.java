package dev.erg.measure;

import ai.onnxruntime.OnnxTensor;
import ai.onnxruntime.OrtEnvironment;
import ai.onnxruntime.OrtException;
import ai.onnxruntime.OrtSession;
import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import dev.erg.graph.Node;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.Comparator;
import java.util.HashMap;
import java.util.HashSet;
import java.util.Set;
import java.util.List;
import java.util.Map;

/**
 * Runs one model in onnxruntime on this host's CPU and times it.
 *
 * <p>Graph optimisations are off ({@code NO_OPT}): onnxruntime then neither fuses nor renames
 * nodes, so each ONNX node runs as one kernel under its own name, and the per-node profile matches
 * erg's node names one to one. (Constant nodes are the exception: the runtime turns them into
 * initializers when it loads the model, so they never run.) The timed figures are those of the
 * unoptimised graph, which is the graph erg prices. Execution is sequential, with {@code threads}
 * intra-op threads and one inter-op thread.
 *
 * <p>Two sessions run: the first times whole runs (warm-ups, then the timed runs), the second
 * repeats the same runs with the runtime's profiler on and gives the per-node kernel times. Keeping
 * the profiler out of the first session keeps its small per-node cost out of the model latency.
 *
 * <p>With the CPU clock, the per-node medians are taken over the profiled runs that the machine
 * disturbed least ({@link #leastDisturbed}): kernel times are wall times, and on a busy machine the
 * long kernels of most runs are interrupted.
 */
final class ModelRunner {
    private ModelRunner() {
    }

    /** What times a whole run. */
    enum Clock {
        /** Wall-clock time: what a user waits. */
        WALL("wall"),
        /**
         * CPU time of the calling thread: with one intra-op thread onnxruntime runs every kernel on the
         * caller, so this is the run's time without the waits of a busy, shared machine.
         */
        CPU("cpu");

        final String label;

        Clock(String label) {
            this.label = label;
        }
    }

    static ModelTiming measure(Path model, Map<String, Long> dims, int threads, int warmups, int runs, long seed) {
        return measure(model, dims, threads, warmups, runs, seed, Clock.WALL);
    }

    static ModelTiming measure(Path model, Map<String, Long> dims, int threads, int warmups, int runs, long seed,
                               Clock clock) {
        if (clock == Clock.CPU && threads != 1) {
            throw new BadInputException("the cpu clock times one thread: use it with --threads 1");
        }
        java.lang.management.ThreadMXBean mx = java.lang.management.ManagementFactory.getThreadMXBean();
        if (clock == Clock.CPU && !mx.isCurrentThreadCpuTimeSupported()) {
            throw new BadInputException("this Java runtime cannot read a thread's CPU time: use --clock wall");
        }
        ModelWorkload w = Analyzer.analyze(model, dims);
        String label = model.getFileName().toString();
        OrtEnvironment env = Host.runtime();
        List<String> described = new ArrayList<>();
        Map<String, OnnxTensor> inputs = null;
        Path profileDir = null;
        try {
            inputs = Inputs.make(env, w.graph(), seed, described);
            double[] runMs = new double[runs];
            try (OrtSession.SessionOptions o = options(threads);
                 OrtSession s = open(env, model, o)) {
                for (int i = 0; i < warmups; i++) {
                    run(s, inputs, model);
                }
                for (int i = 0; i < runs; i++) {
                    long t0 = clock == Clock.CPU ? mx.getCurrentThreadCpuTime() : System.nanoTime();
                    run(s, inputs, model);
                    long t1 = clock == Clock.CPU ? mx.getCurrentThreadCpuTime() : System.nanoTime();
                    runMs[i] = (t1 - t0) / 1e6;
                }
            }
            String measuredAt = Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
            profileDir = Files.createTempDirectory("erg-measure");
            ProfileEvents events;
            double[] share = new double[runs];
            try (OrtSession.SessionOptions o = options(threads)) {
                o.enableProfiling(profileDir.resolve("profile").toString());
                try (OrtSession s = open(env, model, o)) {
                    for (int i = 0; i < warmups + runs; i++) {
                        long c0 = clock == Clock.CPU ? mx.getCurrentThreadCpuTime() : 0;
                        long t0 = System.nanoTime();
                        run(s, inputs, model);
                        long t1 = System.nanoTime();
                        long c1 = clock == Clock.CPU ? mx.getCurrentThreadCpuTime() : 0;
                        if (i >= warmups) {
                            share[i - warmups] = clock == Clock.CPU && t1 > t0 ? (double) (c1 - c0) / (t1 - t0) : 1;
                        }
                    }
                    events = ProfileEvents.read(Path.of(s.endProfiling()));
                }
            }
            List<NodeTiming> nodes = new ArrayList<>();
            List<String> notRun = new ArrayList<>();
            match(w, events, runs, clock == Clock.CPU ? leastDisturbed(share) : null, nodes, notRun, label);
            return new ModelTiming(label, "onnxruntime " + env.getVersion() + ", CPU", threads, warmups, clock.label, runMs,
                    Stats.median(runMs), Stats.quantile(runMs, 0.9), nodes, described, notRun, seed, measuredAt,
                    Host.describe());
        } catch (OrtException e) {
            throw new BadInputException(model + ": onnxruntime cannot run the model: " + firstLine(e.getMessage()));
        } catch (IOException e) {
            throw new BadInputException(model + ": cannot read onnxruntime's profile (" + e.getMessage() + ")");
        } finally {
            if (inputs != null) {
                inputs.values().forEach(OnnxTensor::close);
            }
            deleteTree(profileDir);
        }
    }

    /**
     * Pairs the profile's nodes with erg's, in erg's topological order. A node with a name in the file
     * keeps it in onnxruntime. A node without one is named by onnxruntime after its operator and its
     * index in the runtime's graph, {@code OpType_INDEX}, where the index counts the file's nodes
     * without the Constant nodes (which the runtime turns into initializers); erg names the same node
     * by its first output. Every pair is checked by operator too.
     */
    /**
     * The timed runs that a busy machine disturbed least: every run whose CPU time is at least 95% of
     * its wall time, and at least the quarter of the runs with the highest such share.
     */
    static boolean[] leastDisturbed(double[] share) {
        Integer[] order = new Integer[share.length];
        for (int i = 0; i < order.length; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (a, b) -> Double.compare(share[b], share[a]));
        int keep = (share.length + 3) / 4;
        boolean[] kept = new boolean[share.length];
        for (int r = 0; r < order.length; r++) {
            kept[order[r]] = r < keep || share[order[r]] >= 0.95;
        }
        return kept;
    }

    /**
     * Pairs the profile's nodes with erg's and takes each node's median kernel time over the timed
     * runs ({@code kept}: only over those runs; null: over all of them).
     */
    static void match(ModelWorkload w, ProfileEvents events, int runs, boolean[] kept, List<NodeTiming> nodes,
                      List<String> notRun, String label) {
        List<Node> inFile = new ArrayList<>();
        Set<String> named = new HashSet<>();
        for (NodeWork nw : w.nodes()) {
            inFile.add(nw.node());
            if (!nw.node().def().name().isEmpty()) {
                named.add(nw.node().def().name());
            }
        }
        inFile.sort(Comparator.comparingInt(Node::fileIndex));
        Map<Node, String> runtimeName = new HashMap<>();
        int index = 0;
        for (Node n : inFile) {
            if (n.opType().equals("Constant") && n.domain().isEmpty()) {
                continue;
            }
            String given = n.def().name();
            String generated = n.opType() + "_" + index;
            runtimeName.put(n, !given.isEmpty() ? given : named.contains(generated) ? null : generated);
            index++;
        }
        Set<String> used = new HashSet<>();
        for (NodeWork nw : w.nodes()) {
            String ort = runtimeName.get(nw.node());
            List<Double> d = ort == null ? null : events.durations.get(ort);
            if (d == null || !nw.opType().equals(events.opTypes.get(ort))) {
                notRun.add(nw.name() + " (" + nw.opType() + ")");
                continue;
            }
            used.add(ort);
            // The first entries belong to the warm-up runs.
            List<Double> timed = d.subList(Math.max(0, d.size() - runs), d.size());
            boolean select = kept != null && timed.size() == kept.length;
            double[] all = new double[timed.size()];
            int n = 0;
            for (int i = 0; i < all.length; i++) {
                if (!select || kept[i]) {
                    all[n++] = timed.get(i) / 1000.0;
                }
            }
            double[] ms = Arrays.copyOf(all, n);
            nodes.add(new NodeTiming(nw.name(), nw.opType(), Stats.median(ms), Stats.quantile(ms, 0.9), ms.length));
        }
        List<String> unknown = new ArrayList<>();
        for (String ort : events.durations.keySet()) {
            if (!used.contains(ort)) {
                unknown.add(ort);
            }
        }
        if (!unknown.isEmpty()) {
            notRun.add(0, "onnxruntime ran nodes that match none of erg's, left out: " + String.join(", ", unknown));
        }
    }

    private static OrtSession.SessionOptions options(int threads) throws OrtException {
        OrtSession.SessionOptions o = new OrtSession.SessionOptions();
        o.setOptimizationLevel(OrtSession.SessionOptions.OptLevel.NO_OPT);
        o.setExecutionMode(OrtSession.SessionOptions.ExecutionMode.SEQUENTIAL);
        o.setIntraOpNumThreads(threads);
        o.setInterOpNumThreads(1);
        return o;
    }

    private static OrtSession open(OrtEnvironment env, Path model, OrtSession.SessionOptions o) throws OrtException {
        return env.createSession(model.toString(), o);
    }

    private static void run(OrtSession s, Map<String, OnnxTensor> inputs, Path model) throws OrtException {
        try (OrtSession.Result r = s.run(inputs)) {
            if (r.size() == 0) {
                throw new BadInputException(model + ": the model has no outputs to compute");
            }
        }
    }

    static String firstLine(String s) {
        if (s == null) {
            return "no detail";
        }
        int nl = s.indexOf('\n');
        return (nl < 0 ? s : s.substring(0, nl)).strip();
    }

    private static void deleteTree(Path dir) {
        if (dir == null) {
            return;
        }
        try (var files = Files.list(dir)) {
            for (Path p : files.toList()) {
                Files.deleteIfExists(p);
            }
            Files.deleteIfExists(dir);
        } catch (IOException ignored) {
            // A temporary file left behind is harmless.
        }
    }
}
