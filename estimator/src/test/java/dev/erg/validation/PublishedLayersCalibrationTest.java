package dev.erg.validation;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.calibrate.Calibration;
import dev.erg.calibrate.CalibrationRun;
import dev.erg.calibrate.Factor;
import dev.erg.calibrate.FactorValue;
import dev.erg.calibrate.Residual;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.estimate.NodeEstimate;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.OnnxWriter;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Calibration on the per-layer figures of a published, measured chip: Chen, Krishna, Emer, Sze, IEEE
 * JSSC 52(1), 2017, AlexNet convolution layers at batch 4, latency and chip power of each of the five
 * layers ({@code measurements/published-chip/alexnet-conv-b4.csv}). Those per-layer figures are FROM
 * MEMORY (recalled, not re-read); they were cross-checked against the paper's totals in check-values.md
 * (status: paper): the five latencies sum to 115.3 ms, 4 frames at 34.7 frames/s, and their
 * latency-weighted power is 278.3 mW against the published 278 mW.
 *
 * <p>The profile is {@code preset:validation-65nm} (published parameters only), calibrated through
 * {@link CalibrationRun}, the path of {@code erg calibrate --device preset:validation-65nm}: the
 * calibrated profile is written, loaded back with {@link DeviceLoader} and estimated like any profile.
 * The model is {@code alexnet_conv_b4.graph.onnx} next to the file, {@link AlexNetConv} at batch 4.
 * Each layer's figure is put on the Conv node of that layer; erg fuses the layer's ReLU behind it, and
 * the two max-pools run as layers of their own that no row names (their predicted time is at most 0.6%
 * of the layer they follow; measurements/README.md). The power is of the chip alone, so the file uses
 * {@code chip-power-mw}: the fit compares it with estimates without DRAM energy. Nothing is timed here.
 */
class PublishedLayersCalibrationTest {
    static final Path DIR = Path.of("src/test/resources/measurements/published-chip");
    static final Path CSV = DIR.resolve("alexnet-conv-b4.csv");
    static final String MODEL = "alexnet_conv_b4.graph.onnx";
    /** The model the file measures: AlexNetConv at batch 4, its weights left out (docs/calibration.md runs it). */
    static final Path MODEL_FILE = DIR.resolve(MODEL);
    static final String PROFILE = "preset:validation-65nm";
    static final List<String> LAYERS = List.of("conv1", "conv2", "conv3", "conv4", "conv5");
    /** Chen et al., JSSC 2017 (check-values.md, status paper): AlexNet conv layers at batch 4. */
    static final double MEASURED_FPS = 34.7;
    static final double MEASURED_CHIP_WATTS = 0.278;
    static final double MEASURED_MACS_PER_SECOND = 23.1e9;
    /** Chen et al., JSSC 2017 (check-values.md, status paper): 168 units at 200 MHz, one MAC per unit per cycle. */
    static final double PEAK_MACS_PER_SECOND = 168 * 200e6;
    /**
     * The calibrated whole-model frame rate and chip power must lie within 10% of the published totals:
     * the fit is made on the layers that make up those totals, so a calibration that works lands close to
     * them (the profile as given misses the frame rate by 37%, PublishedChipValidationTest).
     */
    static final double TOTAL_TOLERANCE = 0.10;
    /** The band the method claims for an estimate on a profile of published parameters (PublishedChipValidationTest). */
    static final double POWER_BAND = 0.50;

    @TempDir
    static Path dir;
    /** Per layer: measured latency (s) and chip power (W), from the file. */
    static final Map<String, double[]> measured = new LinkedHashMap<>();
    static List<String> csvLines;

    @BeforeAll
    static void write() throws IOException {
        csvLines = Files.readAllLines(CSV, StandardCharsets.UTF_8);
        for (String l : csvLines) {
            String[] c = l.split(",", -1);
            if (!l.startsWith("#") && c.length == 4 && c[0].equals(MODEL)) {
                measured.put(c[1], new double[] {Double.parseDouble(c[2]) * 1e-3, Double.parseDouble(c[3]) * 1e-3});
            }
        }
        assertEquals(LAYERS, List.copyOf(measured.keySet()), "one row per conv layer");
    }

    private static DeviceEstimate estimate(String profile) {
        ModelWorkload w = Analyzer.analyze(MODEL_FILE, Map.of());
        return Estimator.estimate(w, DeviceLoader.load(profile, null));
    }

    @Test
    void theCommittedModelIsAlexNetConvAtBatchFour() throws IOException {
        // The file is what the project's ONNX writer makes of AlexNetConv.graph(4) with its weights left out,
        // byte for byte, and erg estimates it exactly as the model with its weights.
        byte[] written = new OnnxWriter.Model(13, AlexNetConv.graph(4, true)).toBytes();
        assertTrue(Arrays.equals(written, Files.readAllBytes(MODEL_FILE)), "regenerate " + MODEL_FILE);
        Path full = dir.resolve("alexnet_conv_b4.onnx");
        new OnnxWriter.Model(13, AlexNetConv.graph(4)).write(full);
        DeviceProfile d = DeviceLoader.load(PROFILE, null);
        DeviceEstimate a = Estimator.estimate(Analyzer.analyze(full, Map.of()), d);
        DeviceEstimate b = Estimator.estimate(Analyzer.analyze(MODEL_FILE, Map.of()), d);
        assertEquals(4 * AlexNetConv.MACS_PER_IMAGE, b.workload().macs());
        assertEquals(a.latencySeconds(), b.latencySeconds());
        assertEquals(a.energy().total(), b.energy().total());
    }

    private static NodeEstimate node(DeviceEstimate e, String name) {
        return e.nodes().stream().filter(n -> n.name().equals(name)).findFirst().orElseThrow();
    }

    /** Latency (s) and chip power (W: energy without DRAM over the node's latency) of one node. */
    private static double[] layer(DeviceEstimate e, String name) {
        NodeEstimate n = node(e, name);
        return new double[] {n.latencySeconds(), (n.energy().total() - n.energy().dram()) / n.latencySeconds()};
    }

    private static double chipWatts(DeviceEstimate e) {
        return (e.energy().total() - e.energy().dram()) / e.latencySeconds();
    }

    private static double median(List<Double> v) {
        List<Double> s = new ArrayList<>(v);
        s.sort(null);
        int n = s.size();
        return n % 2 == 1 ? s.get(n / 2) : (s.get(n / 2 - 1) + s.get(n / 2)) / 2;
    }

    private static double worst(List<Double> v) {
        return v.stream().mapToDouble(Double::doubleValue).max().orElseThrow();
    }

    private static String pct(double err) {
        return String.format(Locale.ROOT, "%+.1f%%", 100 * err);
    }

    /** A size of error (no sign). */
    private static String size(double err) {
        return String.format(Locale.ROOT, "%.1f%%", 100 * err);
    }

    @Test
    void calibratedOnTheFiveLayersMeetsThePublishedTotals() {
        Path out = dir.resolve("validation-65nm.calibrated.yaml");
        Calibration c = CalibrationRun.run(List.of(MODEL_FILE), List.of(InputBindings.NONE), PROFILE, List.of(CSV), out);
        DeviceProfile loaded = DeviceLoader.load(out.toString(), null);
        assertNotNull(loaded.calibration(), "the written profile carries its calibration");
        DeviceEstimate before = estimate(PROFILE);
        DeviceEstimate after = estimate(out.toString());

        // The estimator, on the profile as written (factors to four digits) and loaded, gives the fit's own figures.
        for (Residual r : c.residuals()) {
            NodeEstimate n = node(after, r.node());
            double est = r.metric() == Factor.Metric.LATENCY ? n.latencySeconds()
                    : n.energy().total() - (r.chipOnly() ? n.energy().dram() : 0);
            assertEquals(r.after(), est, 1e-3 * r.after(), r.node() + " " + r.metric());
        }

        System.out.println("PUBLISHED-LAYERS | layer | measured ms | profile ms | calibrated ms | measured mW"
                + " | profile mW | calibrated mW");
        Errors profile = new Errors();
        Errors fitted = new Errors();
        for (String l : LAYERS) {
            double[] m = measured.get(l);
            double[] b = layer(before, l);
            double[] a = layer(after, l);
            profile.add(m, b);
            fitted.add(m, a);
            System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS | %s | %.1f | %.2f (%s) | %.2f (%s) | %.0f | %.1f (%s) | %.1f (%s)%n",
                    l, m[0] * 1e3, b[0] * 1e3, pct(b[0] / m[0] - 1), a[0] * 1e3, pct(a[0] / m[0] - 1), m[1] * 1e3,
                    b[1] * 1e3, pct(b[1] / m[1] - 1), a[1] * 1e3, pct(a[1] / m[1] - 1));
        }
        System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS | latency error: median %s before, %s after; worst %s before,"
                        + " %s after%n", size(median(profile.lat)), size(median(fitted.lat)), size(worst(profile.lat)),
                size(worst(fitted.lat)));
        System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS | chip energy error: median %s before, %s after; worst %s"
                        + " before, %s after%n", size(median(profile.en)), size(median(fitted.en)), size(worst(profile.en)),
                size(worst(fitted.en)));
        System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS | chip power error: median %s before, %s after; worst %s"
                        + " before, %s after%n", size(median(profile.pow)), size(median(fitted.pow)), size(worst(profile.pow)),
                size(worst(fitted.pow)));
        for (FactorValue f : c.factors().values()) {
            System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS | %s = %s%n", f.factor().key, f.fitted()
                    ? String.format(Locale.ROOT, "%.4g %s", f.shown(), f.factor().unit) : "not fitted: " + f.note());
        }
        double fpsBefore = 4 / before.latencySeconds();
        double fpsAfter = 4 / after.latencySeconds();
        double macRate = after.workload().macs() / after.latencySeconds();
        System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS | whole model | fps %.2f before, %.2f after (published %.1f)"
                        + " | chip power %.1f mW before, %.1f mW after (published %.0f) | %.2f GMAC/s after (published"
                        + " 23.1)%n", fpsBefore, fpsAfter, MEASURED_FPS, chipWatts(before) * 1e3, chipWatts(after) * 1e3,
                MEASURED_CHIP_WATTS * 1e3, macRate / 1e9);

        // Per layer: the fit brings every estimate of the published layers closer, median and worst.
        assertTrue(median(fitted.lat) < median(profile.lat) && worst(fitted.lat) < worst(profile.lat),
                "layer latency error falls: " + profile.lat + " -> " + fitted.lat);
        assertTrue(median(fitted.en) < median(profile.en) && worst(fitted.en) < worst(profile.en),
                "layer chip energy error falls: " + profile.en + " -> " + fitted.en);
        assertTrue(worst(fitted.pow) < POWER_BAND, "layer chip power error " + fitted.pow);

        // The whole model (pools included, which no row names) against the published totals.
        assertTrue(Math.abs(fpsAfter / MEASURED_FPS - 1) < TOTAL_TOLERANCE, "frame rate " + fpsAfter);
        assertTrue(Math.abs(chipWatts(after) / MEASURED_CHIP_WATTS - 1) < TOTAL_TOLERANCE,
                "chip power " + chipWatts(after));
        assertTrue(Math.abs(macRate / MEASURED_MACS_PER_SECOND - 1) < TOTAL_TOLERANCE, "MAC rate " + macRate);

        // Plausible factors. The array cannot beat its peak, and the chip ran below it: 23.1 of 33.6 GMAC/s
        // (Chen et al., JSSC 2017), so both convolution efficiencies lie below 1.
        for (Factor f : List.of(Factor.EFFICIENCY_DENSE_CONV, Factor.EFFICIENCY_GROUPED_CONV)) {
            FactorValue v = c.factor(f);
            assertTrue(v.fitted(), f.key + ": " + v.note());
            assertTrue(v.value() < 1, f.key + " = " + v.value() + ", peak " + PEAK_MACS_PER_SECOND);
        }
        // A profile made of the chip's own published parameters is not off by more than 10x in any part
        // (common practice, no single source): every fitted ratio lies between 0.1 and 10, none driven
        // toward zero.
        for (FactorValue v : c.factors().values()) {
            if (v.fitted() && v.factor().unit.isEmpty()) {
                assertTrue(v.value() > 0.1 && v.value() < 10, v.factor().key + " = " + v.value());
            }
        }
        // The power is of the chip alone: nothing measured can set the DRAM energy scale, and it stays.
        FactorValue dram = c.factor(Factor.ENERGY_SCALE_DRAM);
        assertFalse(dram.fitted(), "DRAM energy scale: " + dram.value());
        assertEquals(1.0, dram.value());
        assertTrue(dram.note().contains("DRAM"), dram.note());
        FactorValue stat = c.factor(Factor.STATIC_POWER);
        assertTrue(stat.fitted() && stat.value() > 0 && stat.value() < MEASURED_CHIP_WATTS,
                "static power below the chip's whole power: " + stat.value());
    }

    @Test
    void eachLayerPredictedFromTheOtherFour() throws IOException {
        DeviceEstimate before = estimate(PROFILE);
        Errors profile = new Errors();
        Errors heldOut = new Errors();
        System.out.println("PUBLISHED-LAYERS held out | layer | measured ms | profile ms | predicted ms | measured mW"
                + " | profile mW | predicted mW");
        for (String held : LAYERS) {
            // The fold's measurement file: the published file without the held-out layer's row.
            Path csv = dir.resolve("without-" + held + ".csv");
            List<String> kept = csvLines.stream().filter(l -> !l.startsWith(MODEL + "," + held + ",")).toList();
            assertEquals(csvLines.size() - 1, kept.size(), held);
            Files.write(csv, kept, StandardCharsets.UTF_8);
            Path out = dir.resolve("without-" + held + ".calibrated.yaml");
            Calibration c = CalibrationRun.run(List.of(MODEL_FILE), List.of(InputBindings.NONE), PROFILE, List.of(csv), out);
            assertTrue(c.residuals().stream().noneMatch(r -> held.equals(r.node())), "the fold never sees " + held);
            DeviceEstimate e = estimate(out.toString());
            double[] m = measured.get(held);
            double[] b = layer(before, held);
            double[] p = layer(e, held);
            profile.add(m, b);
            heldOut.add(m, p);
            System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS held out | %s | %.1f | %.2f (%s) | %.2f (%s) | %.0f | %.1f"
                            + " (%s) | %.1f (%s) | dense %.3f grouped %.3f static %.1f mW%n", held, m[0] * 1e3,
                    b[0] * 1e3, pct(b[0] / m[0] - 1), p[0] * 1e3, pct(p[0] / m[0] - 1), m[1] * 1e3, b[1] * 1e3,
                    pct(b[1] / m[1] - 1), p[1] * 1e3, pct(p[1] / m[1] - 1),
                    c.factor(Factor.EFFICIENCY_DENSE_CONV).value(), c.factor(Factor.EFFICIENCY_GROUPED_CONV).value(),
                    c.factor(Factor.STATIC_POWER).shown());
        }
        System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS held out | latency error: median %s (profile %s), worst %s"
                        + " (profile %s)%n", size(median(heldOut.lat)), size(median(profile.lat)), size(worst(heldOut.lat)),
                size(worst(profile.lat)));
        System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS held out | chip energy error: median %s (profile %s), worst"
                        + " %s (profile %s)%n", size(median(heldOut.en)), size(median(profile.en)), size(worst(heldOut.en)),
                size(worst(profile.en)));
        System.out.printf(Locale.ROOT, "PUBLISHED-LAYERS held out | chip power error: median %s (profile %s), worst"
                        + " %s (profile %s)%n", size(median(heldOut.pow)), size(median(profile.pow)), size(worst(heldOut.pow)),
                size(worst(profile.pow)));

        // The latency of a layer the fit never saw is predicted better than by the profile as given.
        assertTrue(median(heldOut.lat) < median(profile.lat) && worst(heldOut.lat) < worst(profile.lat),
                "held-out latency error " + heldOut.lat + " against the profile's " + profile.lat);
        // Its chip power stays inside the +/-50% band the method claims (docs/validation.md); it is not
        // predicted better than by the profile as given (docs/validation.md says why).
        assertTrue(worst(heldOut.pow) < POWER_BAND, "held-out chip power error " + heldOut.pow);
    }

    /** The relative errors of a set of layers, against measured {latency, chip power}: latency, power, energy. */
    private static final class Errors {
        final List<Double> lat = new ArrayList<>();
        final List<Double> pow = new ArrayList<>();
        final List<Double> en = new ArrayList<>();

        void add(double[] measured, double[] predicted) {
            lat.add(Math.abs(predicted[0] / measured[0] - 1));
            pow.add(Math.abs(predicted[1] / measured[1] - 1));
            en.add(Math.abs(predicted[0] * predicted[1] / (measured[0] * measured[1]) - 1));
        }
    }
}
