package dev.erg.estimate;

/** What limits a node's latency on the roofline: arithmetic, SRAM bandwidth or DRAM bandwidth. */
public enum Bound {
    COMPUTE("compute"), SRAM("sram"), DRAM("dram"), NONE("none");

    public final String label;

    Bound(String label) {
        this.label = label;
    }
}
