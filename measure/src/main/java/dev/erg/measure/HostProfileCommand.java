package dev.erg.measure;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code erg host-profile}: measures this machine's peak MAC rate and memory bandwidth in onnxruntime
 * and writes a loadable {@code kind: cpu} device profile ({@link HostProfileWriter}), each number with its
 * source. No onnxruntime type appears in this class.
 */
@Command(name = "host-profile", mixinStandardHelpOptions = true,
        description = "Measures this machine's peak MAC rate (large MatMuls) and the bandwidth of its caches and"
                + " memory (chains of Adds) in onnxruntime and writes a kind: cpu device profile of it, each number with how and when it was"
                + " measured.")
public final class HostProfileCommand implements Callable<Integer> {
    @Option(names = "--out", paramLabel = "FILE", description = "Where to write the profile (YAML); printed when absent.")
    Path out;

    @Option(names = "--threads", paramLabel = "T", defaultValue = "1",
            description = "Intra-op threads (default: ${DEFAULT-VALUE}).")
    int threads;

    @Option(names = "--runs", paramLabel = "N", defaultValue = "10", description = "Timed runs (default: ${DEFAULT-VALUE}).")
    int runs;

    @Option(names = "--warmup", paramLabel = "N", defaultValue = "3",
            description = "Untimed runs first (default: ${DEFAULT-VALUE}).")
    int warmups;

    @Option(names = "--matmul-side", paramLabel = "N", split = ",", defaultValue = "768,1000,1536",
            description = "Sides of the square MatMuls; the peak is the best of them (default: ${DEFAULT-VALUE}).")
    int[] sides;

    @Option(names = "--add-elements", paramLabel = "N", defaultValue = "16777216",
            description = "Elements of each Add operand of the DRAM measurement (default: ${DEFAULT-VALUE}, 64 MiB of fp32).")
    int elements;

    @Option(names = "--clock-mhz", paramLabel = "MHZ",
            description = "The core clock, when the system does not tell it (default: 'cpu MHz' of /proc/cpuinfo).")
    Double clockMhz;

    @Option(names = "--figures-only",
            description = "Writes the measured figures (host-measurements) instead of a device profile.")
    boolean figuresOnly;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        check(threads >= 1 && threads <= 1024, "--threads must be from 1 to 1024, not " + threads);
        check(runs >= 1 && runs <= 10_000, "--runs must be from 1 to 10000, not " + runs);
        check(warmups >= 0 && warmups <= 10_000, "--warmup must be from 0 to 10000, not " + warmups);
        for (int side : sides) {
            check(side >= 16 && side <= 8192, "--matmul-side must be from 16 to 8192, not " + side);
        }
        check(elements >= 1024 && elements <= (1 << 28), "--add-elements must be from 1024 to 268435456, not " + elements);
        check(clockMhz == null || (clockMhz > 0 && clockMhz < 100_000), "--clock-mhz must be above 0, not " + clockMhz);
        double clock = clockMhz != null ? clockMhz : HostProfileWriter.clockMhz();
        if (!figuresOnly && !(clock > 0)) {
            throw new BadInputException("host-profile: the system does not tell the core clock; give it with"
                    + " --clock-mhz (or write the figures only with --figures-only)");
        }
        java.util.List<HostProfileWriter.Cache> caches = HostProfileWriter.caches();
        HostMeasurements m = HostBench.run(threads, warmups, runs, sides, elements, caches);
        String text = figuresOnly ? m.toYaml() : HostProfileWriter.profile(m, clock, clockMhz != null
                ? "given with --clock-mhz" : "'cpu MHz' of /proc/cpuinfo when measured", caches);
        PrintWriter pw = spec.commandLine().getOut();
        StringBuilder cacheFigures = new StringBuilder();
        new java.util.TreeMap<>(m.cacheBytesPerSecond()).forEach((level, bps) -> cacheFigures.append(String.format(
                Locale.ROOT, ", L%d %.2f GB/s", level, bps / 1e9)));
        pw.printf(Locale.ROOT, "peak %.2f GMAC/s (fp32 MatMul), memory %.2f GB/s (fp32 Add)%s, %d %s on %s%n",
                m.peakMacsPerSecond() / 1e9, m.memoryBytesPerSecond() / 1e9, cacheFigures, threads,
                threads == 1 ? "thread" : "threads", m.processor());
        if (out == null) {
            pw.print(text);
        } else {
            try {
                Files.writeString(out, text, StandardCharsets.UTF_8);
            } catch (IOException e) {
                throw new BadInputException(out + ": cannot write the host figures (" + e.getMessage() + ")");
            }
            pw.println((figuresOnly ? "host figures" : "host profile") + " written to " + out);
        }
        pw.flush();
        return 0;
    }

    private void check(boolean ok, String message) {
        if (!ok) {
            throw new CommandLine.ParameterException(spec.commandLine(), message);
        }
    }
}
