package dev.erg.calibrate;

/**
 * One factor of a calibration.
 *
 * @param factor which factor
 * @param value  its value in SI units (seconds for the overhead, watts for static power, else a ratio)
 * @param fitted true when the measurements set it; false when it keeps the profile's value
 * @param note   why it was not fitted, or null
 */
public record FactorValue(Factor factor, double value, boolean fitted, String note) {
    /** The value in the unit of the factor's key (microseconds, milliwatts, or the ratio). */
    public double shown() {
        return factor.shown(value);
    }
}
