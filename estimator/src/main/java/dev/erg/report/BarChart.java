package dev.erg.report;

import java.util.List;

/** The drawing both bar charts share: one row per layer, bars stacked by series, a value at the end. */
final class BarChart {
    /** Width of every chart's drawing, in SVG units. */
    static final int WIDTH = 1000;
    /** Bars per chart; the remaining layers are summed into one "others" bar. */
    static final int BARS = 20;

    private BarChart() {
    }

    /** One bar: its label, its full name (for the tooltip) and its stacked segments. */
    record Bar(String label, String tip, double[] values, String[] colours, String[] names, boolean others) {
        double total() {
            double t = 0;
            for (double v : values) {
                t += v;
            }
            return t;
        }
    }

    /** The caption of a chart of {@code total} layers of which {@code top} are drawn, ranked by {@code by}. */
    static String caption(int total, int top, String by) {
        if (total == 0) {
            return "No layer runs on the device.";
        }
        if (total == top) {
            return "All " + ConsoleReport.plural(total, "layer") + ", most " + by + " first.";
        }
        return "The " + top + " layers of most " + by + " out of " + total + "; the other " + (total - top)
                + " are summed in the last bar.";
    }

    static String draw(String id, String label, List<Bar> bars, String unit) {
        StringBuilder h = new StringBuilder();
        int labelW = 270;
        int valueW = 80;
        int rowH = 22;
        int barH = 15;
        int top = 26;
        int plotW = WIDTH - labelW - valueW - 10;
        int height = top + Math.max(1, bars.size()) * rowH + 12;
        double max = 0;
        for (Bar b : bars) {
            max = Math.max(max, b.total());
        }
        double step = Svg.niceStep(max / 5);
        double axisMax = max <= 0 ? 1 : Math.ceil(max / step - 1e-9) * step;
        h.append("<svg id=\"").append(id).append("\" class=\"chart\" viewBox=\"0 0 ").append(WIDTH).append(' ')
                .append(height).append("\" role=\"img\" aria-label=\"").append(Svg.esc(label)).append("\">\n")
                .append("<title>").append(Svg.esc(label)).append("</title>\n");
        for (double t = 0; t <= axisMax * (1 + 1e-9); t += step) {
            double x = labelW + plotW * (t / axisMax);
            h.append("<line class=\"grid\" x1=\"").append(Svg.px(x)).append("\" y1=\"").append(top - 6)
                    .append("\" x2=\"").append(Svg.px(x)).append("\" y2=\"").append(height - 8).append("\"/>")
                    .append("<text class=\"tick\" x=\"").append(Svg.px(x)).append("\" y=\"").append(top - 10)
                    .append("\" text-anchor=\"middle\">").append(Svg.esc(Format.sig(t))).append("</text>\n");
        }
        h.append("<text class=\"tick\" x=\"").append(WIDTH - 4).append("\" y=\"").append(top - 10)
                .append("\" text-anchor=\"end\">").append(Svg.esc(unit)).append("</text>\n");
        int row = 0;
        for (Bar b : bars) {
            double y = top + row * rowH + (rowH - barH) / 2.0;
            h.append("<g class=\"bar").append(b.others() ? " others" : "").append("\"><title>").append(Svg.esc(b.tip()))
                    .append(": ").append(Svg.esc(Format.sig(b.total()))).append(' ').append(Svg.esc(unit))
                    .append("</title>");
            h.append("<text class=\"label\" x=\"").append(labelW - 8).append("\" y=\"").append(Svg.px(y + barH - 3))
                    .append("\" text-anchor=\"end\">").append(Svg.esc(AnalysisTable.shorten(b.label(), 40)))
                    .append("</text>");
            double x = labelW;
            for (int i = 0; i < b.values().length; i++) {
                double v = b.values()[i];
                if (!(v > 0)) {
                    continue;
                }
                double w = plotW * v / axisMax;
                h.append("<rect x=\"").append(Svg.px(x)).append("\" y=\"").append(Svg.px(y)).append("\" width=\"")
                        .append(Svg.px(Math.max(w, 0.5))).append("\" height=\"").append(barH).append("\" fill=\"")
                        .append(b.colours()[i]).append("\"><title>").append(Svg.esc(b.tip())).append(": ")
                        .append(Svg.esc(b.names()[i])).append(' ').append(Svg.esc(Format.sig(v))).append(' ')
                        .append(Svg.esc(unit)).append("</title></rect>");
                x += w;
            }
            h.append("<text class=\"value\" x=\"").append(Svg.px(x + 6)).append("\" y=\"").append(Svg.px(y + barH - 3))
                    .append("\">").append(Svg.esc(Format.sig(b.total()))).append("</text></g>\n");
            row++;
        }
        h.append("</svg>\n");
        return h.toString();
    }
}
