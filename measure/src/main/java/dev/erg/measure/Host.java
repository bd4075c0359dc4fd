package dev.erg.measure;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

/** The processor erg measures on, for the records. */
final class Host {
    private Host() {
    }

    /**
     * onnxruntime's environment, logging fatal errors only: a model the runtime cannot load is
     * reported by erg in one line, not by the runtime's own log as well.
     */
    static ai.onnxruntime.OrtEnvironment runtime() {
        return ai.onnxruntime.OrtEnvironment.getEnvironment(
                ai.onnxruntime.OrtLoggingLevel.ORT_LOGGING_LEVEL_FATAL, "erg");
    }

    /** "MODEL NAME, N logical cores" (the model name from /proc/cpuinfo on Linux, else the architecture). */
    static String describe() {
        return cpuName() + ", " + Runtime.getRuntime().availableProcessors() + " logical cores";
    }

    static String cpuName() {
        Path info = Path.of("/proc/cpuinfo");
        if (Files.isReadable(info)) {
            try (var lines = Files.lines(info)) {
                String name = lines.filter(l -> l.startsWith("model name")).findFirst().orElse(null);
                if (name != null && name.indexOf(':') > 0) {
                    return name.substring(name.indexOf(':') + 1).strip();
                }
            } catch (IOException | java.io.UncheckedIOException ignored) {
                // Fall back to the architecture.
            }
        }
        return System.getProperty("os.arch");
    }
}
