package dev.erg.report;

import dev.erg.device.Engine;
import dev.erg.estimate.NodeEstimate;
import java.util.ArrayList;
import java.util.List;
import java.util.function.ToDoubleFunction;

/**
 * The roofline chart of a pair's MAC layers: achieved MAC/s against MACs per DRAM byte, both
 * logarithmic, under the compute roof and the DRAM slope; layers that move no DRAM byte sit in a
 * column of their own. An SVG drawing; every name in it is escaped here.
 */
final class RooflineChart {
    /** MAC layers on the chart, most MACs first. */
    static final int POINTS = 400;
    private static final int W = BarChart.WIDTH;

    private RooflineChart() {
    }

    /** The chart of {@code f}, with its caption and legend. */
    static Chart of(Figures f) {
        StringBuilder h = new StringBuilder();
        List<NodeEstimate> macs = new ArrayList<>();
        for (NodeEstimate n : f.layers) {
            if (n.work().macs() > 0 && n.latencySeconds() > 0) {
                macs.add(n);
            }
        }
        double peak = f.peakMacsPerSecond();
        double bw = f.dramBytesPerSecond();
        boolean slope = bw > 0 && !Double.isInfinite(bw);
        Engine e = f.macEngine();
        StringBuilder cap = new StringBuilder("Each dot is a MAC layer: x its operational"
                + " intensity (MACs per byte of DRAM traffic), y its achieved rate (MACs over its latency), both"
                + " logarithmic. The flat roof is the peak of the ");
        cap.append(e == null ? "engine" : f.macEngineWords().replaceFirst("^an? ", ""));
        if (e != null && e.kind() == Engine.Kind.IN_MEMORY_MACRO) {
            int[] wa = f.peakPrecision();
            cap.append(" at w").append(wa[0]).append('a').append(wa[1]);
        }
        cap.append(" (").append(Format.sig(peak / 1e9)).append(" GMAC/s)");
        if (slope) {
            cap.append(", the slope the DRAM bandwidth (").append(Format.sig(bw / 1e9)).append(" GB/s)");
        } else {
            cap.append("; the profile gives no DRAM bandwidth, so there is no DRAM slope");
        }
        cap.append(". Layers that move no DRAM byte (weights resident, activations on chip) sit in the"
                + " right-hand column. An SRAM-bound layer sits below both roofs: the SRAM bandwidth"
                + " limits it, which this plot's axes do not show.");
        int plotted = Math.min(POINTS, macs.size());
        if (plotted < macs.size()) {
            cap.append(" The ").append(plotted).append(" layers with most MACs of ").append(macs.size())
                    .append(" are plotted.");
        }
        if (plotted < macs.size()) {
            macs.sort((a, b) -> Long.compare(b.work().macs(), a.work().macs()));
            macs = new ArrayList<>(macs.subList(0, plotted));
        }
        int height = 420;
        int left = 84;
        int top = 24;
        int bottom = 56;
        int stripW = 110;
        int right = W - 24 - stripW - 18;
        int plotB = height - bottom;
        // domains (log10)
        double minX = Double.POSITIVE_INFINITY;
        double maxX = Double.NEGATIVE_INFINITY;
        double minY = peak > 0 ? peak : 1;
        for (NodeEstimate n : macs) {
            double x = n.intensity();
            if (!Double.isInfinite(x) && x > 0) {
                minX = Math.min(minX, x);
                maxX = Math.max(maxX, x);
            }
            minY = Math.min(minY, n.opsPerSecond());
        }
        double ridge = slope && peak > 0 ? peak / bw : Double.NaN;
        if (!Double.isNaN(ridge)) {
            minX = Math.min(minX, ridge);
            maxX = Math.max(maxX, ridge);
        }
        if (Double.isInfinite(minX)) {
            minX = 1;
            maxX = 100;
        }
        double lx0 = Math.floor(Math.log10(minX) - 0.15);
        double lx1 = Math.ceil(Math.log10(maxX) + 0.15);
        if (lx1 - lx0 < 2) {
            lx1 = lx0 + 2;
        }
        double ly1 = Math.ceil(Math.log10((peak > 0 ? peak : 1) * 1.6));
        double ly0 = Math.floor(Math.log10(minY) - 0.15);
        if (ly1 - ly0 < 2) {
            ly0 = ly1 - 2;
        }
        if (ly1 - ly0 > 8) {
            ly0 = ly1 - 8;
        }
        if (slope && peak > 0) {
            // show the DRAM slope from the bottom edge up to the ridge, within six decades in all
            double foot = Math.floor(Math.log10(Math.pow(10, ly0) / bw));
            lx0 = Math.max(Math.min(lx0, foot), lx1 - 6);
        }
        final double x0 = lx0;
        final double x1 = lx1;
        final double y0 = ly0;
        final double y1 = ly1;
        ToDoubleFunction<Double> sx = v -> left + (right - left) * (Math.log10(v) - x0) / (x1 - x0);
        ToDoubleFunction<Double> sy = v -> plotB - (plotB - top) * (Math.max(Math.log10(v), y0) - y0) / (y1 - y0);
        h.append("<svg id=\"chart-roofline\" class=\"chart\" viewBox=\"0 0 ").append(W).append(' ').append(height)
                .append("\" role=\"img\" aria-label=\"Roofline: achieved MAC/s against MACs per DRAM byte\">\n")
                .append("<title>Roofline: achieved MAC/s against MACs per DRAM byte</title>\n");
        h.append("<rect class=\"plot\" x=\"").append(left).append("\" y=\"").append(top).append("\" width=\"")
                .append(right - left).append("\" height=\"").append(plotB - top).append("\"/>\n");
        int stripX = right + 18;
        h.append("<rect class=\"plot strip\" x=\"").append(stripX).append("\" y=\"").append(top).append("\" width=\"")
                .append(stripW).append("\" height=\"").append(plotB - top).append("\"/>\n");
        for (int d = (int) lx0; d <= (int) lx1; d++) {
            double x = sx.applyAsDouble(Math.pow(10, d));
            h.append("<line class=\"grid\" x1=\"").append(Svg.px(x)).append("\" y1=\"").append(top).append("\" x2=\"")
                    .append(Svg.px(x)).append("\" y2=\"").append(plotB).append("\"/><text class=\"tick\" x=\"").append(Svg.px(x))
                    .append("\" y=\"").append(plotB + 18).append("\" text-anchor=\"middle\">").append(Svg.decade(d, ""))
                    .append("</text>\n");
        }
        for (int d = (int) ly0; d <= (int) ly1; d++) {
            double y = sy.applyAsDouble(Math.pow(10, d));
            h.append("<line class=\"grid\" x1=\"").append(left).append("\" y1=\"").append(Svg.px(y)).append("\" x2=\"")
                    .append(right).append("\" y2=\"").append(Svg.px(y)).append("\"/><line class=\"grid\" x1=\"").append(stripX)
                    .append("\" y1=\"").append(Svg.px(y)).append("\" x2=\"").append(stripX + stripW).append("\" y2=\"")
                    .append(Svg.px(y)).append("\"/><text class=\"tick\" x=\"").append(left - 8).append("\" y=\"")
                    .append(Svg.px(y + 4)).append("\" text-anchor=\"end\">").append(Svg.decade(d, "")).append("</text>\n");
        }
        h.append("<text class=\"axis\" x=\"").append((left + right) / 2).append("\" y=\"").append(height - 14)
                .append("\" text-anchor=\"middle\">operational intensity (MACs per DRAM byte)</text>\n")
                .append("<text class=\"axis\" transform=\"translate(18 ").append((top + plotB) / 2)
                .append(") rotate(-90)\" text-anchor=\"middle\">achieved MAC/s</text>\n")
                .append("<text class=\"tick\" x=\"").append(stripX + stripW / 2).append("\" y=\"").append(plotB + 18)
                .append("\" text-anchor=\"middle\">no DRAM traffic</text>\n");
        // roofs
        if (peak > 0) {
            double yPeak = sy.applyAsDouble(peak);
            double xStart = slope ? sx.applyAsDouble(ridge) : left;
            h.append("<line class=\"roof\" x1=\"").append(Svg.px(xStart)).append("\" y1=\"").append(Svg.px(yPeak))
                    .append("\" x2=\"").append(right).append("\" y2=\"").append(Svg.px(yPeak)).append("\"/>")
                    .append("<line class=\"roof dashed\" x1=\"").append(stripX).append("\" y1=\"").append(Svg.px(yPeak))
                    .append("\" x2=\"").append(stripX + stripW).append("\" y2=\"").append(Svg.px(yPeak)).append("\"/>")
                    .append("<text class=\"rooflabel\" x=\"").append(right - 6).append("\" y=\"").append(Svg.px(yPeak - 7))
                    .append("\" text-anchor=\"end\">compute roof ").append(Svg.esc(Format.sig(peak / 1e9)))
                    .append(" GMAC/s</text>\n");
            if (slope) {
                // from the bottom edge (or the left edge) up to the ridge point, on y = bw * x
                double xLo = Math.max(Math.pow(10, lx0), Math.pow(10, ly0) / bw);
                double xa = sx.applyAsDouble(xLo);
                double ya = sy.applyAsDouble(bw * xLo);
                double xb = sx.applyAsDouble(ridge);
                h.append("<line class=\"roof\" x1=\"").append(Svg.px(xa)).append("\" y1=\"").append(Svg.px(ya))
                        .append("\" x2=\"").append(Svg.px(xb)).append("\" y2=\"").append(Svg.px(yPeak)).append("\"/>");
                double mid = Math.pow(10, (Math.log10(xLo) + Math.log10(ridge)) / 2);
                double angle = Math.toDegrees(Math.atan2(yPeak - ya, xb - xa));
                h.append("<text class=\"rooflabel\" transform=\"translate(").append(Svg.px(sx.applyAsDouble(mid)))
                        .append(' ').append(Svg.px(sy.applyAsDouble(bw * mid) - 8)).append(") rotate(").append(Svg.px(angle))
                        .append(")\" text-anchor=\"middle\">DRAM ").append(Svg.esc(Format.sig(bw / 1e9)))
                        .append(" GB/s</text>\n");
            }
        }
        // points: finite intensity in the plot, infinite in the strip (spread deterministically)
        int k = 0;
        for (NodeEstimate n : macs) {
            double x = n.intensity();
            double y = n.opsPerSecond();
            double cx;
            if (Double.isInfinite(x)) {
                cx = stripX + 14 + ((k++ * 37) % (stripW - 28));
            } else {
                cx = sx.applyAsDouble(x);
            }
            double cy = sy.applyAsDouble(y);
            h.append("<circle cx=\"").append(Svg.px(cx)).append("\" cy=\"").append(Svg.px(cy)).append("\" r=\"5\" fill=\"")
                    .append(Palette.bound(n.bound())).append("\"><title>").append(Svg.esc(n.name())).append(" (")
                    .append(Svg.esc(n.work().opType())).append("): ")
                    .append(Double.isInfinite(x) ? "no DRAM traffic" : Svg.esc(Format.sig(x)) + " MACs per DRAM byte")
                    .append(", ").append(Svg.esc(Format.sig(y / 1e9))).append(" GMAC/s, ").append(n.bound().label)
                    .append("-bound</title></circle>\n");
        }
        if (macs.isEmpty()) {
            h.append("<text class=\"axis\" x=\"").append((left + right) / 2).append("\" y=\"").append((top + plotB) / 2)
                    .append("\" text-anchor=\"middle\">no MAC layer to plot</text>\n");
        }
        h.append("</svg>\n");
        return new Chart("chart-roofline", cap.toString(), Chart.boundLegend(false), h.toString());
    }
}
