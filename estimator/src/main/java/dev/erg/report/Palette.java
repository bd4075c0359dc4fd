package dev.erg.report;

import dev.erg.estimate.Bound;

/** The colours of the HTML report's charts (the page's own colours are in report.css). */
final class Palette {
    static final String COMPUTE = "#35679a";
    static final String REGISTERS = "#6fae98";
    static final String SRAM = "#d4a541";
    static final String DRAM = "#b5533f";
    static final String STATIC = "#9a93ab";
    static final String NONE = "#aea89c";

    /** The energy destinations, in the order of {@link #DESTINATION_COLOURS}. */
    static final String[] DESTINATIONS = {"compute", "registers", "SRAM", "DRAM", "static"};
    static final String[] DESTINATION_COLOURS = {COMPUTE, REGISTERS, SRAM, DRAM, STATIC};

    private Palette() {
    }

    /** The colour of what bounds a layer: the colour of that memory level or of compute. */
    static String bound(Bound b) {
        switch (b) {
            case COMPUTE:
                return COMPUTE;
            case SRAM:
                return SRAM;
            case DRAM:
                return DRAM;
            default:
                return NONE;
        }
    }
}
