package dev.erg.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

/** measure and host-profile live in the erg-measure jar; without it (as here) each says so in one line. */
class OptionalCommandTest {
    @Test
    void withoutTheMeasureJarTheCommandSaysWhereItIs() {
        for (String name : List.of("measure", "host-profile")) {
            CliRun r = CliRun.of(name, "model.onnx", "--runs", "3");
            assertEquals(Main.BAD_INPUT, r.code, r.toString());
            assertEquals(List.of("erg: 'erg " + name + "' runs models in onnxruntime and comes in the erg-measure jar:"
                    + " java -jar erg-measure.jar " + name + " ... (see docs/measure.md)"), r.errLines());
            assertEquals("", r.out);
        }
        CliRun help = CliRun.of("--help");
        assertTrue(help.out.contains("measure"), help.out);
    }

    @Test
    void onnxruntimeIsNotOnTheCliClasspath() {
        // The CLI must not carry the runtime (about 75 MB); only the erg-measure jar does.
        assertEquals(null, getClass().getClassLoader().getResource("ai/onnxruntime/OrtSession.class"));
    }
}
