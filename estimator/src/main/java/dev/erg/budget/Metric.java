package dev.erg.budget;

/** A quantity a budget or a baseline limits, with its display unit. */
public enum Metric {
    FRAME_RATE("frameRate", "frame rate", "fps"),
    POWER("power", "average power", "mW"),
    ENERGY_PER_FRAME("energyPerFrame", "energy per frame", "µJ"),
    LATENCY("latency", "latency", "ms"),
    WEIGHTS("weights", "weights", "KiB"),
    ACTIVATIONS("peakActivations", "peak activations", "KiB"),
    MACS("macs", "MACs", "MACs");

    /** The key used in JSON and JUnit reports. */
    public final String key;
    public final String label;
    public final String unit;

    Metric(String key, String label, String unit) {
        this.key = key;
        this.label = label;
        this.unit = unit;
    }
}
