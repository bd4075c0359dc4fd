package dev.erg.device;

import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

/**
 * The {@code calibration} section of a profile, as far as estimates use it: the fitted correction
 * factors (docs/calibration.md) and the error bands that verdicts carry. The rest of the section
 * (measurement files, residuals, notes) is a record for the reader and is checked by the schema only.
 *
 * @param factors fitted factors by key, in the key's unit (ratios; {@code layer-overhead-us} in
 *                microseconds; {@code static-power-mw} in milliwatts). A factor that was not fitted is absent.
 * @param latency the error band of latency estimates, or null when no latency was measured
 * @param energy  the error band of energy estimates, or null when no energy was measured
 */
public record ProfileCalibration(Map<String, Double> factors, Band latency, Band energy) {
    public static final String DENSE_CONV = "compute-efficiency-dense-conv";
    public static final String LAYER_OVERHEAD_US = "layer-overhead-us";
    public static final String DRAM_BANDWIDTH_SCALE = "dram-bandwidth-scale";
    public static final String ENERGY_SCALE_COMPUTE = "energy-scale-compute";
    public static final String ENERGY_SCALE_ON_CHIP = "energy-scale-on-chip";
    public static final String ENERGY_SCALE_DRAM = "energy-scale-dram";
    public static final String STATIC_POWER_MW = "static-power-mw";

    public ProfileCalibration {
        factors = Collections.unmodifiableMap(new TreeMap<>(factors));
    }

    /**
     * The relative error of an estimate against measurement (estimate / measured - 1) over the values a
     * calibration was judged on.
     *
     * @param low    the most negative error (0 or below)
     * @param high   the most positive error (0 or above)
     * @param layers how many single layers were measured
     * @param models how many models were measured
     * @param from   {@code leave-one-model-out} (each model predicted by a fit on the others) or {@code fit}
     */
    public record Band(double low, double high, int layers, int models, String from) {
        /** "14 layers of 3 models", or "3 models" when no single layer was measured. */
        public String basis() {
            String m = models + (models == 1 ? " model" : " models");
            return layers == 0 ? m : layers + (layers == 1 ? " layer of " : " layers of ") + m;
        }
    }

    /** A factor's value, or {@code otherwise} when it was not fitted. */
    public double factor(String key, double otherwise) {
        Double v = factors.get(key);
        return v == null ? otherwise : v;
    }

    /** The compute efficiency of an operator class ({@code dense-conv}, {@code grouped-conv}, {@code matmul}, {@code matrix-vector}, {@code vector}). */
    public double efficiency(String opClass) {
        return factor("compute-efficiency-" + opClass, 1);
    }

    /** True when the per-layer overhead was fitted (it then replaces the profile's). */
    public boolean overheadFitted() {
        return factors.containsKey(LAYER_OVERHEAD_US);
    }
}
