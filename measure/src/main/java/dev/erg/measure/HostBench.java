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
import java.util.Locale;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * The host microbenchmarks, run in onnxruntime on the CPU with the same session settings as
 * {@code erg measure}:
 * <ul>
 *   <li>peak MAC rate: a square fp32 MatMul of side {@code n} (n^3 MACs), the median of the timed runs;</li>
 *   <li>memory bandwidth: an fp32 Add of two vectors of {@code elements} values, far larger than the
 *       caches; it must read both operands and write the result, 12 bytes per element.</li>
 * </ul>
 */
final class HostBench {
    private HostBench() {
    }

    static HostMeasurements run(int threads, int warmups, int runs, int matmulSide, int addElements) {
        OrtEnvironment env = Host.runtime();
        String runtime = "onnxruntime " + env.getVersion() + " (CPU, " + threads
                + (threads == 1 ? " intra-op thread" : " intra-op threads") + ")";
        Map<String, String> sources = new LinkedHashMap<>();
        long n = matmulSide;
        double mmMs = time(env, TinyModel.binary("MatMul", new long[] {n, n}, new long[] {n, n}, new long[] {n, n}),
                new long[] {n, n}, new long[] {n, n}, threads, warmups, runs);
        double macs = (double) n * n * n;
        sources.put(HostMeasurements.PEAK_KEY, String.format(Locale.ROOT,
                "fp32 MatMul %dx%d by %dx%d in %s: %.0f MACs over the median of %d runs (%.3f ms) after %d warm-up;"
                        + " measured %s", n, n, n, n, runtime, macs, runs, mmMs, warmups, now()));
        long e = addElements;
        double addMs = time(env, TinyModel.binary("Add", new long[] {e}, new long[] {e}, new long[] {e}),
                new long[] {e}, new long[] {e}, threads, warmups, runs);
        double bytes = 12.0 * e;
        sources.put(HostMeasurements.BANDWIDTH_KEY, String.format(Locale.ROOT,
                "fp32 Add of two %d-element vectors in %s: %.0f bytes (two operands read, the result written)"
                        + " over the median of %d runs (%.3f ms) after %d warm-up; measured %s", e, runtime, bytes,
                runs, addMs, warmups, now()));
        return new HostMeasurements(Host.cpuName(), Runtime.getRuntime().availableProcessors(), threads,
                macs / (mmMs / 1e3), bytes / (addMs / 1e3), sources);
    }

    private static String now() {
        return Instant.now().truncatedTo(ChronoUnit.SECONDS).toString();
    }

    /** The median wall time of one run, in milliseconds. */
    private static double time(OrtEnvironment env, byte[] model, long[] aDims, long[] bDims, int threads, int warmups,
                               int runs) {
        SplittableRandom r = new SplittableRandom(1);
        try (OrtSession.SessionOptions o = new OrtSession.SessionOptions()) {
            o.setOptimizationLevel(OrtSession.SessionOptions.OptLevel.NO_OPT);
            o.setExecutionMode(OrtSession.SessionOptions.ExecutionMode.SEQUENTIAL);
            o.setIntraOpNumThreads(threads);
            o.setInterOpNumThreads(1);
            try (OrtSession s = env.createSession(model, o);
                 OnnxTensor a = OnnxTensor.createTensor(env, random(aDims, r), aDims);
                 OnnxTensor b = OnnxTensor.createTensor(env, random(bDims, r), bDims)) {
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
