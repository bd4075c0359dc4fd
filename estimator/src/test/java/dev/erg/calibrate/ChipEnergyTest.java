package dev.erg.calibrate;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Energy and power of the chip alone ({@code chip-energy-uj}, {@code chip-power-mw}: DRAM not in them,
 * as papers on accelerators and a chip's own supply rail report it), and terms that a fit drives toward
 * zero. The data are generated from the factors of {@link CalibratorTest#truth()} through the energy
 * equation of docs/method.md with the DRAM term left out; a least-squares fit recovers the parameters
 * of noise-free data from an identifiable model (common practice, no single source).
 */
class ChipEnergyTest {
    /** The power of a device whose energy follows its time alone (invented for this test). */
    static final double FLAT_WATTS = 5.0;

    @TempDir
    Path dir;

    private Path write(String name, String text) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, text);
        return p;
    }

    @Test
    void chipColumnsAreReadAndMarked() throws IOException {
        MeasurementFile f = MeasurementFile.read(write("chip.csv",
                "# chip rail only\nmodel,node,latency-ms,chip-power-mw,chip-energy-uj\nm.onnx,a,2,150,\nm.onnx,,10,,900\n"
                        + "m.onnx,b,3,,\n"));
        Measurement a = f.rows().get(0);
        assertTrue(a.chipOnly());
        assertEquals(0.150, a.powerWatts(), 1e-12);
        assertEquals(9e-4, f.rows().get(1).energyJoules(), 1e-12);
        assertTrue(f.rows().get(1).chipOnly());
        assertFalse(f.rows().get(2).chipOnly(), "a row without energy or power is not marked");
        MeasurementFile system = MeasurementFile.read(write("board.csv", "model,node,power-mw\nm.onnx,a,150\n"));
        assertFalse(system.rows().get(0).chipOnly());
    }

    @Test
    void aRowGivesOneKindOfEnergy() throws IOException {
        Path p = write("both.csv", "model,node,power-mw,chip-power-mw\nm.onnx,a,,3\nm.onnx,b,5,4\n");
        String e = assertThrows(BadInputException.class, () -> MeasurementFile.read(p)).getMessage();
        assertEquals(p + ":3: the row gives both power-mw (DRAM included) and chip-power-mw (the chip alone); give one"
                + " of the two kinds per row", e);
        Path q = write("only.csv", "model,node,chip-energy-uj\nm.onnx,a,-1\n");
        e = assertThrows(BadInputException.class, () -> MeasurementFile.read(q)).getMessage();
        assertEquals(q + ":2: chip-energy-uj: -1 is negative; a measurement is 0 or more", e);
    }

    @Test
    void chipPowerIsFittedWithoutDram() throws IOException {
        List<ModelCosts> models = List.of(CalibratorTest.model("a.onnx", 24, 1), CalibratorTest.model("b.onnx", 17, 2));
        double[] v = CalibratorTest.values(CalibratorTest.truth());
        StringBuilder b = new StringBuilder("model,node,latency-ms,chip-power-mw\n");
        for (ModelCosts m : models) {
            for (NodeCost n : m.nodes()) {
                double t = Calibrator.latency(n, v, true);
                double e = Calibrator.energy(n, v, t, true);
                b.append(String.format(Locale.ROOT, "%s,%s,%.17g,%.17g%n", m.model(), n.name(), t * 1e3, e / t * 1e3));
            }
        }
        Calibration c = Calibrator.fit(models, List.of(MeasurementFile.read(write("rail.csv", b.toString()))), 1e-3);
        for (Factor f : List.of(Factor.ENERGY_SCALE_COMPUTE, Factor.ENERGY_SCALE_ON_CHIP, Factor.STATIC_POWER)) {
            assertTrue(c.factor(f).fitted(), f.key);
            assertEquals(CalibratorTest.truth().get(f), c.factor(f).value(), 1e-6 * CalibratorTest.truth().get(f), f.key);
        }
        FactorValue dram = c.factor(Factor.ENERGY_SCALE_DRAM);
        assertFalse(dram.fitted());
        assertEquals(1.0, dram.value());
        assertEquals("no measured energy or power includes DRAM energy", dram.note());
        assertTrue(c.errorAfter(Factor.Metric.ENERGY, Calibration.Scope.ALL).worst() < 1e-6);
        assertTrue(c.residuals().stream().filter(r -> r.metric() == Factor.Metric.ENERGY).allMatch(Residual::chipOnly));
        assertTrue(c.notes().contains("41 energy or power values are of the chip alone (chip-energy-uj, chip-power-mw):"
                + " compared with estimates without DRAM energy"), c.notes().toString());
        String section = CalibratedProfile.section(c);
        assertTrue(section.contains("metric: chip-energy-uj"), section);
        assertFalse(section.contains("metric: energy-uj"), section);
        // The calibrated estimate of a node, as the estimator gives it, still holds its DRAM energy, at the
        // profile's scale.
        NodeCost n = models.get(0).nodes().get(0);
        double[] kept = v.clone();
        kept[Factor.ENERGY_SCALE_DRAM.ordinal()] = 1.0;
        assertTrue(n.dramJoules() > 0);
        assertEquals(Calibrator.energy(n, kept, c.latencySeconds(n), false), c.energyJoules(n), 1e-6 * c.energyJoules(n));
    }

    @Test
    void termsDrivenTowardZeroKeepTheProfileValue() throws IOException {
        // A device whose energy follows its time alone (a chip dominated by clock and leakage, the
        // extreme of what a published chip's per-layer power shows) and whose latency has no per-layer
        // overhead: the fit would set the dynamic energy scales and the overhead to zero. A device whose
        // MACs cost nothing is not physical, so these terms keep the profile's values and say why.
        List<ModelCosts> models = List.of(CalibratorTest.model("a.onnx", 24, 1));
        double[] v = CalibratorTest.values(CalibratorTest.truth());
        StringBuilder b = new StringBuilder("model,node,latency-ms,chip-power-mw\n");
        for (NodeCost n : models.get(0).nodes()) {
            double t = Calibrator.latency(n, v, true) - v[Factor.LAYER_OVERHEAD.ordinal()];
            b.append(String.format(Locale.ROOT, "a.onnx,%s,%.17g,%.17g%n", n.name(), t * 1e3, FLAT_WATTS * 1e3));
        }
        Calibration c = Calibrator.fit(models, List.of(MeasurementFile.read(write("flat.csv", b.toString()))), 0);
        String why = "the fit drove it toward zero in every measured value; these measurements cannot set it";
        for (Factor f : List.of(Factor.ENERGY_SCALE_COMPUTE, Factor.ENERGY_SCALE_ON_CHIP, Factor.LAYER_OVERHEAD)) {
            assertFalse(c.factor(f).fitted(), f.key + " = " + c.factor(f).value());
            assertEquals(why, c.factor(f).note(), f.key);
        }
        assertEquals(1.0, c.factor(Factor.ENERGY_SCALE_COMPUTE).value());
        assertEquals(1.0, c.factor(Factor.ENERGY_SCALE_ON_CHIP).value());
        assertTrue(c.notes().stream().anyMatch(s -> s.startsWith("the energy fit drove ")
                && s.contains("energy-scale-compute") && s.contains("energy-scale-on-chip")), c.notes().toString());
        assertTrue(c.notes().stream().anyMatch(s -> s.startsWith("the latency fit drove layer-overhead-us")),
                c.notes().toString());
        // What remains is fitted: the efficiencies, and a static power below the flat power (the profile's
        // dynamic energy is kept, so static power takes the rest).
        FactorValue stat = c.factor(Factor.STATIC_POWER);
        assertTrue(stat.fitted() && stat.value() > 0 && stat.value() < FLAT_WATTS, "static " + stat.value());
        assertTrue(c.factor(Factor.EFFICIENCY_DENSE_CONV).fitted());
        // The section writes no factor that the fit drove toward zero.
        String section = CalibratedProfile.section(c);
        String factors = section.substring(section.indexOf("  factors:"), section.indexOf("  not-fitted:"));
        assertFalse(factors.contains("energy-scale-compute") || factors.contains("layer-overhead-us"), factors);
    }

    @Test
    void staticPowerNotFittedIsTheProfiles() throws IOException {
        // One whole-model energy for four energy factors: only the one that moves the prediction most is
        // fitted; static power, not fitted, is the profile's (0 here), not the point the fit started from.
        List<ModelCosts> models = List.of(CalibratorTest.model("a.onnx", 12, 3));
        Calibration c = Calibrator.fit(models, List.of(MeasurementFile.read(write("one.csv",
                "model,node,latency-ms,energy-uj\na.onnx,,1.5,40\n"))), 0);
        FactorValue stat = c.factor(Factor.STATIC_POWER);
        assertFalse(stat.fitted());
        assertEquals(0.0, stat.value());
        assertTrue(c.errorAfter(Factor.Metric.ENERGY, Calibration.Scope.ALL).worst() < 1e-6,
                "the fitted factor alone meets the value: " + c.residuals());
    }
}
