package dev.erg.onnx;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Map;
import java.util.Random;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Corrupt files, made by mutating real exports (byte overwrites, bit flips, truncations, runs of 0xff)
 * with a fixed seed: every one is either analysed or refused with one line that names the file.
 * Nothing else may escape: no other exception, no multi-line message (names from a corrupt file can
 * hold line breaks).
 */
class MutationRobustnessTest {
    private static final int MUTANTS = 250;

    @TempDir
    Path dir;

    @ParameterizedTest
    @ValueSource(strings = {"resnet18.graph.onnx", "shufflenet_v2_x0_5.graph.onnx", "tiny_transformer.opset17.graph.onnx",
        "lstm_kws.graph.onnx", "mobilenet_v2.qdq.graph.onnx"})
    void mutantsAreAnalysedOrRefusedInOneLine(String name) throws Exception {
        byte[] original = Files.readAllBytes(Path.of("src/test/resources/models", name));
        Random random = new Random(name.hashCode());
        Path file = dir.resolve("mutant.onnx");
        int refused = 0;
        for (int i = 0; i < MUTANTS; i++) {
            byte[] b = mutate(original, random);
            Files.write(file, b);
            try {
                Analyzer.analyze(file, Map.of());
            } catch (BadInputException e) {
                refused++;
                String m = e.getMessage();
                assertTrue(m.startsWith(file.toString()), "names the file: " + m);
                assertFalse(m.contains("\n") || m.contains("\r"), "one line: " + m);
            } catch (RuntimeException | Error e) {
                fail("mutant " + i + " of " + name + " escaped as " + e, e);
            }
        }
        assertTrue(refused > MUTANTS / 4, "most mutants are refused (" + refused + " of " + MUTANTS + ")");
    }

    private static byte[] mutate(byte[] original, Random r) {
        byte[] b = original.clone();
        switch (r.nextInt(4)) {
            case 0:
                for (int k = 0; k < 1 + r.nextInt(8); k++) {
                    b[r.nextInt(b.length)] = (byte) r.nextInt(256);
                }
                return b;
            case 1:
                return Arrays.copyOf(b, r.nextInt(b.length));
            case 2: {
                int p = r.nextInt(b.length);
                b[p] = (byte) (b[p] ^ (1 << r.nextInt(8)));
                return b;
            }
            default: {
                int p = r.nextInt(b.length);
                Arrays.fill(b, p, Math.min(b.length, p + 1 + r.nextInt(64)), (byte) 0xff);
                return b;
            }
        }
    }
}
