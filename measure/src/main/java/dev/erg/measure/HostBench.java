package dev.erg.measure;

import ai.onnxruntime.OnnxTensor;
import ai.onnxruntime.OrtEnvironment;
import ai.onnxruntime.OrtException;
import ai.onnxruntime.OrtSession;
import dev.erg.error.BadInputException;
import java.nio.FloatBuffer;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.SplittableRandom;
import java.util.TreeMap;

/**
 * The host microbenchmarks, run in onnxruntime on the CPU with the same session settings as
 * {@code erg measure}:
 * <ul>
 *   <li>peak MAC rate: square fp32 MatMuls of a few sides (n^3 MACs each), the best of their median
 *       rates. A peak is the best rate the machine reaches, and one side alone can read low: a power of
 *       two lines rows up on the same cache sets;</li>
 *   <li>bandwidth of each cache level and of DRAM: a chain of fp32 Adds over vectors sized so that the
 *       chain's working set (about four vectors) fills half the level, or far exceeds the last cache for
 *       DRAM. Each Add reads two operands and writes one result, 12 bytes per element. The time of one
 *       Add is the difference between a long chain and a single Add, divided by the extra links, so that
 *       the cost of starting a run drops out.</li>
 * </ul>
 */
final class HostBench {
    /** Extra links of the long chain of a bandwidth measurement. */
    static final int LINKS = 16;
    /** How many times more runs (and warm-up runs) a cache measurement makes than the others. */
    static final int CACHE_RUNS = 20;
    /** Fewest elements per vector of a cache measurement (a smaller Add is all dispatch). */
    static final long MIN_ELEMENTS = 1024;

    private HostBench() {
    }

    static HostMeasurements run(int threads, int warmups, int runs, int[] matmulSides, int addElements,
                                List<HostProfileWriter.Cache> caches) {
        OrtEnvironment env = Host.runtime();
        String runtime = "onnxruntime " + env.getVersion() + " (CPU, " + threads
                + (threads == 1 ? " intra-op thread" : " intra-op threads") + ")";
        Map<String, String> sources = new LinkedHashMap<>();
        double best = 0;
        StringBuilder tried = new StringBuilder();
        for (int side : matmulSides) {
            long n = side;
            double ms = time(env, TinyModel.binary("MatMul", new long[] {n, n}, new long[] {n, n}, new long[] {n, n}),
                    new long[] {n, n}, threads, warmups, runs);
            double rate = (double) n * n * n / (ms / 1e3);
            tried.append(tried.length() == 0 ? "" : ", ").append(String.format(Locale.ROOT, "%d: %.4g MAC/s (%.3f ms)",
                    n, rate, ms));
            best = Math.max(best, rate);
        }
        sources.put(HostMeasurements.PEAK_KEY, String.format(Locale.ROOT,
                "the best of fp32 square MatMuls of sides %s in %s, each the median of %d runs after %d warm-up;"
                        + " measured %s", tried, runtime, runs, warmups, now()));
        Map<Integer, Double> cacheRates = new TreeMap<>();
        for (HostProfileWriter.Cache c : caches) {
            long bytes = c.shared() ? c.bytes() : c.bytes() * threads;
            long n = Math.max(MIN_ELEMENTS, bytes / 2 / 16);
            // A cache-sized run lasts micro- to milliseconds: many more runs steady its median.
            int cacheRuns = runs * CACHE_RUNS;
            int cacheWarmups = warmups * CACHE_RUNS;
            double[] r = chainRate(env, n, threads, cacheWarmups, cacheRuns);
            cacheRates.put(c.level(), r[0]);
            sources.put(HostMeasurements.cacheKey(c.level()), String.format(Locale.ROOT,
                    "fp32 Add chains of %d-element vectors (working set %d KiB, half of the level) in %s: %.0f bytes"
                            + " per Add over %.3f us, from the medians of %d runs of 1 and %d Adds after %d warm-up;"
                            + " measured %s", n, 16 * n / 1024, runtime, 12.0 * n, r[1], cacheRuns, 1 + LINKS,
                    cacheWarmups, now()));
        }
        long e = addElements;
        double[] d = chainRate(env, e, threads, warmups, runs);
        sources.put(HostMeasurements.BANDWIDTH_KEY, String.format(Locale.ROOT,
                "fp32 Add chains of %d-element vectors (working set %d MiB) in %s: %.0f bytes per Add (two operands"
                        + " read, the result written) over %.3f us, from the medians of %d runs of 1 and %d Adds after %d"
                        + " warm-up; measured %s", e, 16 * e / (1024 * 1024), runtime, 12.0 * e, d[1], runs,
                1 + LINKS, warmups, now()));
        return new HostMeasurements(Host.cpuName(), Runtime.getRuntime().availableProcessors(), threads,
                best, d[0], cacheRates, sources);
    }

    private static String now() {
        return Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
    }

    /** Bytes per second of one Add in a chain over vectors of {@code n} elements, and the microseconds of one Add. */
    private static double[] chainRate(OrtEnvironment env, long n, int threads, int warmups, int runs) {
        double one = time(env, TinyModel.addChain(n, 1), new long[] {n}, threads, warmups, runs);
        double many = time(env, TinyModel.addChain(n, 1 + LINKS), new long[] {n}, threads, warmups, runs);
        // A chain can read no faster than its single Add: a difference at or below zero is noise, and the
        // whole run then stands for the Add (a lower bound on the rate).
        double perAdd = many > one ? (many - one) / LINKS : many / (1 + LINKS);
        return new double[] {12.0 * n / (perAdd / 1e3), perAdd * 1e3};
    }

    /** The median wall time of one run, in milliseconds. */
    private static double time(OrtEnvironment env, byte[] model, long[] dims, int threads, int warmups, int runs) {
        SplittableRandom r = new SplittableRandom(1);
        try (OrtSession.SessionOptions o = new OrtSession.SessionOptions()) {
            o.setOptimizationLevel(OrtSession.SessionOptions.OptLevel.NO_OPT);
            o.setExecutionMode(OrtSession.SessionOptions.ExecutionMode.SEQUENTIAL);
            o.setIntraOpNumThreads(threads);
            o.setInterOpNumThreads(1);
            try (OrtSession s = env.createSession(model, o);
                 OnnxTensor a = OnnxTensor.createTensor(env, random(dims, r), dims);
                 OnnxTensor b = OnnxTensor.createTensor(env, random(dims, r), dims)) {
                Map<String, OnnxTensor> in = Map.of("a", a, "b", b);
                for (int i = 0; i < warmups; i++) {
                    s.run(in).close();
                }
                double[] ms = new double[runs];
                for (int i = 0; i < runs; i++) {
                    long t0 = System.nanoTime();
                    s.run(in).close();
                    ms[i] = (System.nanoTime() - t0) / 1e6;
                }
                return Stats.median(ms);
            }
        } catch (OrtException e) {
            throw new BadInputException("host benchmark: onnxruntime failed: " + ModelRunner.firstLine(e.getMessage()));
        }
    }

    private static FloatBuffer random(long[] dims, SplittableRandom r) {
        long n = 1;
        for (long d : dims) {
            n *= d;
        }
        FloatBuffer b = FloatBuffer.allocate((int) n);
        for (int i = 0; i < n; i++) {
            b.put((float) (r.nextDouble() * 2 - 1));
        }
        return b.flip();
    }
}
