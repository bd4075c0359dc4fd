package dev.erg.report;

import dev.erg.estimate.Bound;
import dev.erg.estimate.Energy;

/** The colours of the HTML report's charts (the page's own colours are in report.css). */
final class Palette {
    static final String COMPUTE = "#35679a";
    static final String REGISTERS = "#6fae98";
    static final String SRAM = "#d4a541";
    static final String DRAM = "#b5533f";
    static final String STATIC = "#9a93ab";
    static final String CONVERSION = "#7d4e8c";
    static final String CELL_WRITES = "#cf8aa4";
    static final String ROW_DRIVE = "#8b9640";
    static final String NONE = "#aea89c";

    /** The colour of an energy destination in the charts. */
    static String destination(Energy.Destination d) {
        switch (d) {
            case COMPUTE:
                return COMPUTE;
            case REGISTERS:
                return REGISTERS;
            case SRAM:
                return SRAM;
            case DRAM:
                return DRAM;
            case CONVERSION:
                return CONVERSION;
            case CELL_WRITES:
                return CELL_WRITES;
            case ROW_DRIVE:
                return ROW_DRIVE;
            default:
                return STATIC;
        }
    }

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
