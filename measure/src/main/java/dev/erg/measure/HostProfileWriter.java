package dev.erg.measure;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Turns what {@code erg host-profile} measured into a loadable {@code kind: cpu} device profile
 * (docs/profiles.md): one engine with {@code cores} = the threads the benchmarks ran with and
 * {@code macs-per-cycle-per-core} = peak MAC/s / (clock x cores), the data and unified cache levels the
 * system lists with the bandwidth measured in each, and DRAM at the measured bandwidth. No energies (nothing here measures them), and a
 * {@code sources} entry for each number.
 */
final class HostProfileWriter {
    /** One cache level as the system lists it. */
    record Cache(int level, long bytes, boolean shared) {
    }

    private HostProfileWriter() {
    }

    static String profile(HostMeasurements m, double clockMhz, String clockSource, List<Cache> caches) {
        StringBuilder b = new StringBuilder();
        StringBuilder src = new StringBuilder();
        b.append("# Written by erg host-profile: a profile of the machine it ran on (docs/measure.md).\n");
        b.append("# No energy was measured, so estimates on it report energy and power as unknown.\n");
        b.append("name: ").append(quote(m.processor() + ", " + m.threads() + (m.threads() == 1 ? " thread" : " threads")))
                .append('\n');
        b.append("clock-mhz: ").append(num(clockMhz)).append('\n');
        src.append("  clock-mhz: ").append(quote(clockSource)).append('\n');
        double perCycle = m.peakMacsPerSecond() / (clockMhz * 1e6 * m.threads());
        b.append("engines:\n  - id: cpu\n    kind: cpu\n");
        b.append("    cores: ").append(m.threads()).append('\n');
        src.append("  engines[0].cores: ").append(quote("the intra-op threads the benchmarks ran with")).append('\n');
        b.append("    macs-per-cycle-per-core:\n      fp32: ").append(num(perCycle)).append('\n');
        src.append("  engines[0].macs-per-cycle-per-core.fp32: ").append(quote(String.format(Locale.ROOT,
                "%.4g MAC/s / (%s MHz x %d cores); %s", m.peakMacsPerSecond(), num(clockMhz), m.threads(),
                m.sources().get(HostMeasurements.PEAK_KEY)))).append('\n');
        b.append("memories:\n");
        int i = 0;
        for (int k = 0; k < caches.size(); k++) {
            Cache c = caches.get(k);
            long bytes = c.shared() ? c.bytes() : c.bytes() * m.threads();
            b.append("  - id: l").append(c.level()).append("\n    level: cache\n    capacity-bytes: ").append(bytes)
                    .append('\n');
            src.append("  memories[").append(i).append("].capacity-bytes: ").append(quote("level " + c.level()
                    + " data cache, " + c.bytes() + " bytes" + (c.shared() ? ", shared"
                    : " per core x " + m.threads()) + " (from the system's cache list)")).append('\n');
            // A nearer cache is never slower than a farther one: when a level reads slower than the next (its
            // Adds are so short that the runtime's dispatch of each one dominates), it takes the next level's figure.
            int from = k;
            while (from + 1 < caches.size() && rate(m, caches.get(from + 1)) > rate(m, caches.get(from))) {
                from++;
            }
            double bps = rate(m, caches.get(from));
            if (bps > 0) {
                b.append("    bytes-per-cycle: ").append(num(bps / (clockMhz * 1e6))).append('\n');
                String how = m.sources().get(HostMeasurements.cacheKey(caches.get(from).level()));
                src.append("  memories[").append(i).append("].bytes-per-cycle: ").append(quote(String.format(Locale.ROOT,
                        "%.4g B/s / %s MHz; %s%s", bps, num(clockMhz), from == k ? "" : "the level " + caches.get(from).level()
                                + " figure, since the level " + c.level() + " one read lower (" + String.format(Locale.ROOT,
                                "%.4g B/s", rate(m, c)) + "), which a nearer cache cannot be: ", how))).append('\n');
            }
            i++;
        }
        b.append("  - id: dram\n    gbytes-per-second: ").append(num(m.memoryBytesPerSecond() / 1e9)).append('\n');
        src.append("  memories[").append(i).append("].gbytes-per-second: ")
                .append(quote(m.sources().get(HostMeasurements.BANDWIDTH_KEY))).append('\n');
        return b.append("sources:\n").append(src).toString();
    }

    private static double rate(HostMeasurements m, Cache c) {
        return m.cacheBytesPerSecond().getOrDefault(c.level(), 0.0);
    }

    /** The clock from /proc/cpuinfo ("cpu MHz"), or NaN. */
    static double clockMhz() {
        Path info = Path.of("/proc/cpuinfo");
        if (Files.isReadable(info)) {
            try (var lines = Files.lines(info)) {
                String l = lines.filter(x -> x.startsWith("cpu MHz")).findFirst().orElse(null);
                if (l != null && l.indexOf(':') > 0) {
                    return Double.parseDouble(l.substring(l.indexOf(':') + 1).strip());
                }
            } catch (IOException | RuntimeException ignored) {
                // unknown clock
            }
        }
        return Double.NaN;
    }

    /** The data and unified caches of cpu0, nearest first (Linux /sys; empty elsewhere). */
    static List<Cache> caches() {
        List<Cache> out = new ArrayList<>();
        Path dir = Path.of("/sys/devices/system/cpu/cpu0/cache");
        for (int k = 0; k < 16; k++) {
            Path idx = dir.resolve("index" + k);
            if (!Files.isDirectory(idx)) {
                break;
            }
            try {
                String type = Files.readString(idx.resolve("type")).strip();
                if (type.equals("Instruction")) {
                    continue;
                }
                int level = Integer.parseInt(Files.readString(idx.resolve("level")).strip());
                long bytes = size(Files.readString(idx.resolve("size")).strip());
                String sharedWith = Files.readString(idx.resolve("shared_cpu_list")).strip();
                out.add(new Cache(level, bytes, !sharedWith.equals("0")));
            } catch (IOException | RuntimeException ignored) {
                // leave this level out
            }
        }
        out.sort((a, c) -> Integer.compare(a.level(), c.level()));
        return out;
    }

    static long size(String s) {
        char u = Character.toUpperCase(s.charAt(s.length() - 1));
        long mul = u == 'K' ? 1024 : u == 'M' ? 1024 * 1024 : u == 'G' ? 1024L * 1024 * 1024 : 1;
        return Long.parseLong(mul == 1 ? s : s.substring(0, s.length() - 1)) * mul;
    }

    private static String num(double v) {
        return new java.math.BigDecimal(v).round(new java.math.MathContext(4)).stripTrailingZeros().toPlainString();
    }

    private static String quote(String s) {
        return '"' + s.replace("\\", "\\\\").replace("\"", "\\\"") + '"';
    }
}
