package dev.erg.report;

import dev.erg.estimate.Bound;
import java.util.ArrayList;
import java.util.List;

/**
 * One drawn chart of the HTML page: its caption (plain text, escaped by the template), its legend,
 * and its SVG drawing (markup, whose text the chart class has escaped itself).
 *
 * @param id      the svg element's id
 * @param caption one or two sentences that say how to read the chart
 * @param legend  the colour of each series
 * @param svg     the drawing
 */
record Chart(String id, String caption, List<Entry> legend, String svg) {
    /** One legend entry. */
    record Entry(String name, String colour) {
    }

    /** The legend of the bounds (compute, SRAM, DRAM; with {@code none}, also "none"). */
    static List<Entry> boundLegend(boolean none) {
        List<Entry> out = new ArrayList<>();
        for (Bound b : Bound.values()) {
            if (b != Bound.NONE || none) {
                out.add(new Entry(b.label + "-bound", Palette.bound(b)));
            }
        }
        return out;
    }
}
