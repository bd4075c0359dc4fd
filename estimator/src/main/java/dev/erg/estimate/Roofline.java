package dev.erg.estimate;

/**
 * The roofline bound (Williams, Waterman, Patterson, "Roofline: An Insightful Visual Performance
 * Model for Multicore Architectures", CACM 52(4), 2009): attainable performance = min(peak compute,
 * peak memory bandwidth x operational intensity), with intensity = operations per byte of memory traffic.
 */
public final class Roofline {
    private Roofline() {
    }

    /**
     * @param peakOpsPerSecond peak arithmetic rate
     * @param bytesPerSecond memory bandwidth
     * @param opsPerByte operational intensity
     */
    public static double attainable(double peakOpsPerSecond, double bytesPerSecond, double opsPerByte) {
        return Math.min(peakOpsPerSecond, bytesPerSecond * opsPerByte);
    }
}
