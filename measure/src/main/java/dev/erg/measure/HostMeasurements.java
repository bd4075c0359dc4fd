package dev.erg.measure;

import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

/**
 * What {@code erg host-profile} measured on this machine: the peak MAC rate from a large MatMul
 * and the memory bandwidth from a large elementwise Add, each with a source that says how and when.
 * These are the numbers a CPU device profile is made of; turning them into a profile is a separate
 * step ({@link #toYaml()} writes the figures themselves).
 *
 * @param processor               the processor's name
 * @param logicalCores            logical cores the JVM sees
 * @param threads                 intra-op threads the benchmarks ran with
 * @param peakMacsPerSecond       fp32 multiply-accumulates per second in the MatMul
 * @param memoryBytesPerSecond    bytes per second an Add far larger than the caches moved (two operands read,
 *                                one result written)
 * @param cacheBytesPerSecond     per cache level (1, 2, ...), bytes per second an Add that fits in it moved
 * @param sources                 per figure's key, how and when it was measured
 */
public record HostMeasurements(String processor, int logicalCores, int threads, double peakMacsPerSecond,
                               double memoryBytesPerSecond, Map<Integer, Double> cacheBytesPerSecond,
                               Map<String, String> sources) {
    public static final String PEAK_KEY = "peak-macs-per-second-fp32";
    public static final String BANDWIDTH_KEY = "memory-gbytes-per-second";

    public HostMeasurements {
        cacheBytesPerSecond = Map.copyOf(cacheBytesPerSecond);
        sources = Map.copyOf(sources);
    }

    /** The key of a cache level's bandwidth figure. */
    public static String cacheKey(int level) {
        return "l" + level + "-gbytes-per-second";
    }

    /** The figures as YAML, under {@code host-measurements}, keys sorted. */
    public String toYaml() {
        StringBuilder b = new StringBuilder();
        b.append("# Measured by erg host-profile on this machine; see docs/measure.md.\n");
        b.append("host-measurements:\n");
        b.append("  processor: ").append(quote(processor)).append('\n');
        b.append("  logical-cores: ").append(logicalCores).append('\n');
        b.append("  threads: ").append(threads).append('\n');
        b.append("  ").append(PEAK_KEY).append(": ").append(String.format(Locale.ROOT, "%.4g", peakMacsPerSecond)).append('\n');
        b.append("  ").append(BANDWIDTH_KEY).append(": ")
                .append(String.format(Locale.ROOT, "%.4g", memoryBytesPerSecond / 1e9)).append('\n');
        for (Map.Entry<Integer, Double> c : new TreeMap<>(cacheBytesPerSecond).entrySet()) {
            b.append("  ").append(cacheKey(c.getKey())).append(": ")
                    .append(String.format(Locale.ROOT, "%.4g", c.getValue() / 1e9)).append('\n');
        }
        b.append("  sources:\n");
        for (Map.Entry<String, String> e : new TreeMap<>(sources).entrySet()) {
            b.append("    ").append(e.getKey()).append(": ").append(quote(e.getValue())).append('\n');
        }
        return b.toString();
    }

    private static String quote(String s) {
        return '"' + s.replace("\\", "\\\\").replace("\"", "\\\"") + '"';
    }
}
