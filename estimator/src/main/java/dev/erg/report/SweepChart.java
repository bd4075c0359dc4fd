package dev.erg.report;

import dev.erg.explore.Polynomial;
import dev.erg.explore.Sweep;
import dev.erg.explore.SweepMetric;
import dev.erg.explore.SweepPoint;
import dev.erg.format.Numbers;

/**
 * One metric of a sweep against the swept dimension, on linear axes: the estimated points (a dot each,
 * the failing ones in the fail colour), the fitted polynomial as a thin curve, and the budget line of
 * the limit that bears on the metric (dashed), when there is one.
 */
final class SweepChart {
    private static final int W = 620;
    private static final int H = 250;
    private static final int L = 78;
    private static final int R = 16;
    private static final int T = 14;
    private static final int B = 40;

    private SweepChart() {
    }

    static String draw(Sweep s, SweepMetric m, Double line, String lineLabel) {
        double x0 = s.range().from();
        double x1 = Math.max(s.range().to(), x0 + 1);
        double y1 = 0;
        for (SweepPoint p : s.points()) {
            y1 = Math.max(y1, p.metric(m));
        }
        if (line != null) {
            y1 = Math.max(y1, line);
        }
        y1 = y1 <= 0 ? 1 : y1 * 1.08;
        double pw = W - L - R;
        double ph = H - T - B;
        StringBuilder b = new StringBuilder();
        b.append("<svg class=\"chart\" viewBox=\"0 0 ").append(W).append(' ').append(H)
                .append("\" role=\"img\" aria-label=\"").append(Svg.esc(m.label + " against " + s.range().name()))
                .append("\">\n");
        b.append("<rect class=\"plot\" x=\"").append(L).append("\" y=\"").append(T).append("\" width=\"")
                .append(Svg.px(pw)).append("\" height=\"").append(Svg.px(ph)).append("\"/>\n");
        double step = Svg.niceStep(y1 / 4);
        for (double y = 0; y <= y1; y += step) {
            double py = T + ph - y / y1 * ph;
            b.append("<line class=\"grid\" x1=\"").append(L).append("\" x2=\"").append(Svg.px(L + pw)).append("\" y1=\"")
                    .append(Svg.px(py)).append("\" y2=\"").append(Svg.px(py)).append("\"/>");
            b.append("<text class=\"tick\" x=\"").append(L - 6).append("\" y=\"").append(Svg.px(py + 4))
                    .append("\" text-anchor=\"end\">").append(Svg.esc(Numbers.sig(y))).append("</text>\n");
        }
        double xstep = Math.max(1, Svg.niceStep((x1 - x0) / 5));
        for (double x = Math.ceil(x0 / xstep) * xstep; x <= x1; x += xstep) {
            double px = L + (x - x0) / (x1 - x0) * pw;
            b.append("<text class=\"tick\" x=\"").append(Svg.px(px)).append("\" y=\"").append(T + ph + 16)
                    .append("\" text-anchor=\"middle\">").append(Svg.esc(Numbers.exact((long) x))).append("</text>");
        }
        b.append("\n<text class=\"axis\" x=\"").append(Svg.px(L + pw / 2)).append("\" y=\"").append(H - 6)
                .append("\" text-anchor=\"middle\">").append(Svg.esc(s.range().name())).append("</text>\n");
        Polynomial f = s.fits().get(m);
        if (f != null) {
            StringBuilder path = new StringBuilder();
            int n = 120;
            for (int i = 0; i <= n; i++) {
                long x = Math.round(x0 + (x1 - x0) * i / n);
                double y = Math.max(0, Math.min(y1, f.value(x)));
                path.append(i == 0 ? "M" : "L").append(Svg.px(L + (x - x0) / (x1 - x0) * pw)).append(',')
                        .append(Svg.px(T + ph - y / y1 * ph));
            }
            b.append("<path class=\"roof\" stroke-width=\"1\" d=\"").append(path).append("\"/>\n");
        }
        if (line != null) {
            double py = T + ph - line / y1 * ph;
            b.append("<line class=\"roof dashed\" x1=\"").append(L).append("\" x2=\"").append(Svg.px(L + pw))
                    .append("\" y1=\"").append(Svg.px(py)).append("\" y2=\"").append(Svg.px(py)).append("\"/>");
            b.append("<text class=\"rooflabel\" x=\"").append(Svg.px(L + pw - 4)).append("\" y=\"")
                    .append(Svg.px(py - 5)).append("\" text-anchor=\"end\">").append(Svg.esc(lineLabel))
                    .append("</text>\n");
        }
        for (SweepPoint p : s.points()) {
            double px = L + (p.value() - x0) / (x1 - x0) * pw;
            double py = T + ph - p.metric(m) / y1 * ph;
            b.append("<circle cx=\"").append(Svg.px(px)).append("\" cy=\"").append(Svg.px(py)).append("\" r=\"3.5\" fill=\"")
                    .append(p.passed() ? Palette.COMPUTE : Palette.DRAM).append("\"><title>")
                    .append(Svg.esc(s.range().name() + " " + Numbers.exact(p.value()) + ": "
                            + Numbers.sig(p.metric(m)) + " " + m.unit)).append("</title></circle>");
        }
        return b.append("\n</svg>").toString();
    }
}
