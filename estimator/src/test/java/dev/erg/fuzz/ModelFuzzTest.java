package dev.erg.fuzz;

import com.code_intelligence.jazzer.junit.FuzzTest;
import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import dev.erg.estimate.Estimator;
import dev.erg.graph.InputBindings;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;

/**
 * Fuzz targets for the two files a user brings: a model and a device profile. Whatever the bytes, erg
 * either analyses them or refuses them with one {@link BadInputException} line; any other exception
 * or error is a finding.
 *
 * <p>In every build these run as a regression test over the seed corpus in
 * {@code src/test/resources/dev/erg/fuzz/ModelFuzzTestInputs/<method>/} (seconds). With
 * {@code JAZZER_FUZZ=1} they fuzz for {@code maxDuration} each; see DEVELOPERS.md, "Fuzzing".
 *
 * <p>The model seeds, written with {@code OnnxWriter} by {@link SeedCorpus}: {@code if-one-branch-shapes}
 * (the structure of the voice-activity model, without weights: an If on a runtime input whose then
 * branch cannot be shaped), {@code conv-transpose-bad-attrs} (a
 * ConvTranspose whose pads and output_padding fit no rank: once an escaped index error),
 * {@code undefined-type} (an input of element type 0: once accepted), {@code opset-0},
 * {@code opset-99} and {@code opset-twice} (once accepted silently). The faults that need no bytes
 * or too many (a million-node graph, a named pipe, a 2^31 - 1 byte file) have tests of their own:
 * {@code HostileInputTest} in the CLI and {@code ReaderBoundsTest}. The profile seeds are the
 * packaged presets and two broken ones.
 */
class ModelFuzzTest {
    private static final Path DIR;
    private static final dev.erg.device.DeviceProfile DEVICE =
            dev.erg.device.DeviceLoader.load("preset:" + dev.erg.device.DeviceLoader.presetIds().get(0), null);

    static {
        try {
            DIR = Files.createTempDirectory("erg-fuzz-");
            DIR.toFile().deleteOnExit();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static Path write(String name, byte[] data) {
        Path f = DIR.resolve(name);
        try {
            Files.write(f, data);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
        return f;
    }

    /** Reads, links, shapes and counts the bytes as a model, then estimates it on a preset device. */
    @FuzzTest(maxDuration = "5m")
    void analyze(byte[] data) {
        Path f = write("model.onnx", data);
        ModelWorkload w;
        try {
            w = Analyzer.analyze(f, InputBindings.NONE, dev.erg.analysis.AnalysisOptions.DEFAULTS);
        } catch (BadInputException e) {
            requireOneLine(e);
            return;
        }
        Analyzer.unusedDimNotes(w, Map.of());
        try {
            Estimator.estimate(w, DEVICE);
        } catch (BadInputException e) {
            requireOneLine(e);
        }
    }

    /** Parses and validates the bytes as a YAML device profile. */
    @FuzzTest(maxDuration = "2m")
    void profile(byte[] data) {
        Path f = write("device.yaml", data);
        try {
            dev.erg.device.DeviceLoader.load(f.toString(), null);
        } catch (BadInputException e) {
            requireOneLine(e);
        }
    }

    private static void requireOneLine(BadInputException e) {
        String m = e.getMessage();
        if (m == null || m.isBlank() || m.indexOf('\n') >= 0) {
            throw new AssertionError("a refusal must be one line, not: " + m, e);
        }
        if (m.matches(".*\\b[A-Z]\\w*(Exception|Error)\\b.*")) {
            throw new AssertionError("a refusal must not leak an internal exception: " + m, e);
        }
    }
}
