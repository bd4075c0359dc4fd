package dev.erg.calibrate;

import dev.erg.workload.OpClass;

/**
 * The correction factors a calibration fits. Each one means something physical, so that a fitted
 * value can be read and judged: an efficiency of 0.3 says the engine reaches 30% of the profile's
 * peak on that class of operator.
 */
public enum Factor {
    /** Achieved fraction of the profile's peak MAC rate on dense convolutions. */
    EFFICIENCY_DENSE_CONV("compute-efficiency-dense-conv", Metric.LATENCY, 1, ""),
    /** Achieved fraction of the peak on grouped and depthwise convolutions. */
    EFFICIENCY_GROUPED_CONV("compute-efficiency-grouped-conv", Metric.LATENCY, 1, ""),
    /** Achieved fraction of the peak on MatMul, Gemm and recurrent cells. */
    EFFICIENCY_MATMUL("compute-efficiency-matmul", Metric.LATENCY, 1, ""),
    /** Achieved fraction of the peak on matrix-vector products (one row per group: M = 1). */
    EFFICIENCY_MATRIX_VECTOR("compute-efficiency-matrix-vector", Metric.LATENCY, 1, ""),
    /** Achieved fraction of the peak vector rate on nodes without MACs. */
    EFFICIENCY_VECTOR("compute-efficiency-vector", Metric.LATENCY, 1, ""),
    /** Time added per layer launched (scheduling, kernel dispatch); replaces the profile's overhead. */
    LAYER_OVERHEAD("layer-overhead-us", Metric.LATENCY, Double.NaN, "us"),
    /** Effective DRAM bandwidth over the profile's. */
    DRAM_BANDWIDTH_SCALE("dram-bandwidth-scale", Metric.LATENCY, 1, ""),
    /** Scale on the energy of MACs and vector operations. */
    ENERGY_SCALE_COMPUTE("energy-scale-compute", Metric.ENERGY, 1, ""),
    /** Scale on the energy of register and SRAM accesses. */
    ENERGY_SCALE_ON_CHIP("energy-scale-on-chip", Metric.ENERGY, 1, ""),
    /** Scale on the energy of DRAM accesses. */
    ENERGY_SCALE_DRAM("energy-scale-dram", Metric.ENERGY, 1, ""),
    /** Static power, drawn all the time; replaces the profile's. */
    STATIC_POWER("static-power-mw", Metric.ENERGY, Double.NaN, "mW");

    /** The factor's key, in the units it is shown in. */
    public final String key;
    /** Which measurements fit it. */
    public final Metric metric;
    /** The value that leaves the profile unchanged, or NaN when that depends on the profile (an absolute quantity). */
    final double neutral;
    /** The unit the key is shown in (empty for a ratio); values are held in SI units (seconds, watts). */
    public final String unit;

    Factor(String key, Metric metric, double neutral, String unit) {
        this.key = key;
        this.metric = metric;
        this.neutral = neutral;
        this.unit = unit;
    }

    /** The compute efficiency of an operator class. */
    public static Factor efficiency(OpClass c) {
        return switch (c) {
            case DENSE_CONV -> EFFICIENCY_DENSE_CONV;
            case GROUPED_CONV -> EFFICIENCY_GROUPED_CONV;
            case MATMUL -> EFFICIENCY_MATMUL;
            case MATRIX_VECTOR -> EFFICIENCY_MATRIX_VECTOR;
            case VECTOR -> EFFICIENCY_VECTOR;
        };
    }

    /** A value in SI units (seconds, watts) converted to the unit of the key. */
    public double shown(double si) {
        return switch (unit) {
            case "us" -> si * 1e6;
            case "mW" -> si * 1e3;
            default -> si;
        };
    }

    /** What a measurement file row can measure. */
    public enum Metric {
        LATENCY("latency"), ENERGY("energy");

        public final String label;

        Metric(String label) {
            this.label = label;
        }
    }
}
