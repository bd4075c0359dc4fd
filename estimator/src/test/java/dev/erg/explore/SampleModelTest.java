package dev.erg.explore;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import dev.erg.budget.Budget;
import dev.erg.device.DeviceLoader;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.OnnxReader;
import dev.erg.workload.PrecisionOverrides;
import java.io.IOException;
import java.math.BigInteger;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.hipparchus.fraction.BigFraction;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The sample project's model with a symbolic picture side is the one {@link SymbolicModels} writes. */
class SampleModelTest {
    static final Path SAMPLE = Path.of("../sample-project/src/main/onnx/feeder-any-size.onnx");

    @TempDir
    Path dir;

    @Test
    void committedSampleModelIsTheWrittenOne() throws IOException {
        Path fresh = SymbolicModels.feederAnySize(dir.resolve("f.onnx"));
        assertArrayEquals(Files.readAllBytes(fresh), Files.readAllBytes(SAMPLE),
                "rewrite the sample with SymbolicModels.feederAnySize");
    }

    /** Hand count in SymbolicModels.feederAnySize: 396·side² + 768 (side a multiple of 4). */
    @Test
    void sideSweepIsQuadratic() {
        Sweep s = Sweeper.run(OnnxReader.read(SAMPLE), "f", InputBindings.NONE,
                SweepRange.parse("s", "side=64..256:32"), DeviceLoader.load("preset:feeder-npu", null),
                Budget.none(), PrecisionOverrides.NONE);
        assertEquals(List.of(new BigFraction(BigInteger.valueOf(768)), BigFraction.ZERO,
                new BigFraction(BigInteger.valueOf(396))), s.fits().get(SweepMetric.MACS).coefficients());
    }
}
