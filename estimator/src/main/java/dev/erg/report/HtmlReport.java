package dev.erg.report;

import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.LayerDiff;
import dev.erg.budget.PairResult;
import dev.erg.device.Engine;
import dev.erg.estimate.Bound;
import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import java.util.ArrayList;
import java.util.List;
import java.util.function.ToDoubleFunction;

/**
 * One self-contained HTML page per model x device pair: the verdict with every check, the totals,
 * three inline SVG charts (energy per layer by destination, latency per layer by bound, a roofline of
 * the MAC layers), the costliest layers, the baseline diff and the assumptions. No script, no
 * stylesheet, font or image from anywhere else: the page renders offline as it is. Every name taken
 * from the model or the profile is escaped. Deterministic: the same result gives the same bytes.
 */
public final class HtmlReport {
    /** Bars per chart; the remaining layers are summed into one "others" bar. */
    public static final int CHART_BARS = 20;
    /** Rows of the per-layer table. */
    public static final int TABLE_ROWS = 50;
    /** MAC layers on the roofline, most MACs first. */
    public static final int ROOFLINE_POINTS = 400;
    /** Rows of the baseline diff table. */
    public static final int DIFF_ROWS = 100;

    static final String C_COMPUTE = "#3b6ea8";
    static final String C_REGISTERS = "#7fb8a4";
    static final String C_SRAM = "#e0b04a";
    static final String C_DRAM = "#c0504d";
    static final String C_STATIC = "#a59fb3";
    static final String C_NONE = "#b8b2a7";

    private static final String[] DEST_NAMES = {"compute", "registers", "SRAM", "DRAM", "static"};
    private static final String[] DEST_COLOURS = {C_COMPUTE, C_REGISTERS, C_SRAM, C_DRAM, C_STATIC};
    private static final Bound[] BOUNDS = {Bound.COMPUTE, Bound.SRAM, Bound.DRAM, Bound.NONE};

    private HtmlReport() {
    }

    /** The page of one pair of a gate result. */
    public static String render(GateResult result, PairResult p) {
        return render(Figures.of(p), result);
    }

    static String boundColour(Bound b) {
        switch (b) {
            case COMPUTE:
                return C_COMPUTE;
            case SRAM:
                return C_SRAM;
            case DRAM:
                return C_DRAM;
            default:
                return C_NONE;
        }
    }

    /** Text for HTML element content and quoted attribute values; control characters become U+FFFD. */
    static String esc(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&':
                    b.append("&amp;");
                    break;
                case '<':
                    b.append("&lt;");
                    break;
                case '>':
                    b.append("&gt;");
                    break;
                case '"':
                    b.append("&quot;");
                    break;
                case '\'':
                    b.append("&#39;");
                    break;
                default:
                    if ((c < 0x20 && c != '\n' && c != '\t') || c == 0x7f || (c >= 0x80 && c < 0xa0)
                            || c == '\uFFFE' || c == '\uFFFF') {
                        b.append('\uFFFD');
                    } else {
                        b.append(c);
                    }
            }
        }
        return b.toString();
    }

    static String render(Figures f, GateResult result) {
        StringBuilder h = new StringBuilder(64 * 1024);
        String title = "erg: " + f.modelName() + " on " + f.device;
        h.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
                .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
                .append("<title>").append(esc(title)).append("</title>\n<style>\n").append(CSS).append("</style>\n")
                .append("</head>\n<body>\n");
        header(h, f);
        h.append("<main>\n");
        h.append("<p class=\"notice\" id=\"notice\"><strong>Analytical estimate.</strong> ")
                .append(esc(AnalysisJson.NOTICE)).append("</p>\n");
        checks(h, f);
        totals(h, f);
        charts(h, f);
        layerTable(h, f);
        diff(h, f, result);
        assumptions(h, f);
        h.append("</main>\n<footer>Written by erg from ").append(esc(f.model)).append(" and ").append(esc(f.device))
                .append(". Energies in µJ, times in µs unless marked.</footer>\n</body>\n</html>\n");
        return h.toString();
    }

    // ---- page parts -------------------------------------------------------------------------

    private static void header(StringBuilder h, Figures f) {
        String verdict;
        String cls;
        if (f.pair == null || f.pair.checks().isEmpty()) {
            verdict = "NOT CHECKED";
            cls = "none";
        } else if (f.pair.passed()) {
            verdict = "PASS";
            cls = "pass";
        } else {
            verdict = "FAIL";
            cls = "fail";
        }
        h.append("<header class=\"top\">\n<div class=\"head\">\n<div>\n<div class=\"kicker\">erg budget report</div>\n")
                .append("<h1>").append(esc(f.modelName())).append(" <span class=\"on\">on</span> ")
                .append(esc(f.profile().name())).append("</h1>\n<div class=\"sub\">model <code>").append(esc(f.model))
                .append("</code> &middot; device <code>").append(esc(f.device)).append("</code> &middot; ")
                .append(esc(Format.sig(f.profile().clockMhz()))).append(" MHz</div>\n</div>\n")
                .append("<div class=\"verdict ").append(cls).append("\" id=\"verdict\">").append(verdict)
                .append("</div>\n</div>\n</header>\n");
    }

    private static void checks(StringBuilder h, Figures f) {
        h.append("<section id=\"checks\">\n<h2>Checks</h2>\n");
        List<Check> checks = f.pair == null ? List.of() : f.pair.checks();
        if (checks.isEmpty()) {
            h.append("<p class=\"muted\">No budget and no baseline growth were checked for this pair.</p>\n");
        } else {
            h.append("<ul class=\"checks\">\n");
            for (Check c : checks) {
                h.append("<li class=\"").append(c.passed() ? "ok" : "bad").append("\"><span class=\"pill\">")
                        .append(c.passed() ? "ok" : "FAIL").append("</span> <span class=\"kind\">")
                        .append(esc(c.key())).append("</span> ")
                        .append(esc(c.message())).append("</li>\n");
            }
            h.append("</ul>\n");
        }
        h.append("</section>\n");
    }

    private static void totals(StringBuilder h, Figures f) {
        h.append("<section id=\"totals\">\n<h2>Totals per frame</h2>\n<div class=\"cards\">\n");
        for (String[] row : f.summary()) {
            h.append("<div class=\"card\"><div class=\"k\">").append(esc(row[0])).append("</div><div class=\"v\">")
                    .append(esc(row[1])).append("</div><div class=\"d\">").append(esc(row[2])).append("</div></div>\n");
        }
        h.append("</div>\n");
        if (!f.estimate.complete()) {
            h.append("<p class=\"warn\">Some nodes have no rule and are not priced: these totals are a lower bound"
                    + " (see the assumptions).</p>\n");
        }
        h.append("</section>\n");
    }

    private static void charts(StringBuilder h, Figures f) {
        h.append("<section id=\"energy\">\n<h2>Energy per layer, by destination</h2>\n");
        energyChart(h, f);
        h.append("</section>\n<section id=\"latency\">\n<h2>Latency per layer, by what bounds it</h2>\n");
        latencyChart(h, f);
        h.append("</section>\n<section id=\"roofline\">\n<h2>Roofline of the MAC layers</h2>\n");
        roofline(h, f);
        h.append("</section>\n");
    }

    private static void layerTable(StringBuilder h, Figures f) {
        List<NodeEstimate> ranked = f.byEnergy();
        int shown = Math.min(TABLE_ROWS, ranked.size());
        h.append("<section id=\"layers\">\n<h2>Layers by energy</h2>\n");
        if (ranked.isEmpty()) {
            h.append("<p class=\"muted\">No layer runs on the device.</p>\n</section>\n");
            return;
        }
        h.append("<p class=\"muted\">")
                .append(shown == ranked.size() ? "All " + ConsoleReport.plural(shown, "layer") + " that run on the device"
                        : "The " + shown + " of " + ranked.size() + " layers that cost most energy")
                .append(". Energy in µJ, latency in µs, DRAM bytes per frame; a fused layer runs on the way out of the"
                        + " MAC layer before it.</p>\n");
        h.append("<div class=\"scroll\"><table class=\"grid\">\n<thead><tr><th>#</th><th class=\"l\">layer</th>")
                .append("<th class=\"l\">op, precision</th><th>MACs</th>")
                .append("<th>util</th><th>latency</th><th class=\"l\">bound</th><th>compute</th><th>registers</th>")
                .append("<th>SRAM</th><th>DRAM</th><th>static</th><th>total</th><th>share</th>")
                .append("<th>DRAM bytes</th></tr></thead>\n<tbody>\n");
        for (int i = 0; i < shown; i++) {
            NodeEstimate n = ranked.get(i);
            Energy e = n.energy();
            h.append("<tr><td>").append(i + 1).append("</td><td class=\"l name\" title=\"").append(esc(n.name()))
                    .append("\">").append(esc(AnalysisTable.shorten(n.name(), 36)));
            if (n.tiling() != null) {
                h.append("<div class=\"note\">tiled: ").append(esc(n.tiling())).append("</div>");
            }
            h.append("</td><td class=\"l\" title=\"on ").append(esc(n.engine())).append(" at ")
                    .append(esc(n.precision())).append("\">").append(esc(n.work().opType()))
                    .append(" <span class=\"muted\">").append(esc(n.precision())).append("</span></td><td>").append(Format.count(n.work().macs())).append("</td><td>")
                    .append(ConsoleReport.utilization(n)).append("</td><td>").append(Format.sig(n.latencySeconds() * 1e6))
                    .append("</td><td class=\"l\"><span class=\"dot\" style=\"background:")
                    .append(boundColour(n.bound())).append("\"></span>").append(n.bound().label);
            if (n.fusedInto() != null) {
                h.append(" <span class=\"tag\" title=\"runs fused into ").append(esc(n.fusedInto()))
                        .append("\">fused</span>");
            }
            h.append("</td><td>").append(uj(e.compute())).append("</td><td>")
                    .append(uj(e.registers())).append("</td><td>").append(uj(e.sram())).append("</td><td>")
                    .append(uj(e.dram())).append("</td><td>").append(uj(e.staticEnergy())).append("</td><td><b>")
                    .append(uj(e.total())).append("</b></td><td>").append(Format.percent(f.energyShare(n)))
                    .append("</td><td>").append(Format.bytes(n.dramReadBytes() + n.dramWriteBytes()))
                    .append("</td></tr>\n");
        }
        h.append("</tbody>\n</table></div>\n</section>\n");
    }

    private static void diff(StringBuilder h, Figures f, GateResult result) {
        h.append("<section id=\"diff\">\n<h2>Against the baseline</h2>\n");
        PairResult p = f.pair;
        if (p == null || !p.hasBaseline()) {
            String why = result == null || result.baselineFile() == null ? "No baseline is configured."
                    : !result.baselineFound() ? Format.sentence(result.baselineNote())
                    : "The baseline " + result.baselineFile() + " has no entry for this model and device.";
            h.append("<p class=\"muted\">").append(esc(why)).append("</p>\n</section>\n");
            return;
        }
        if (p.diff().isEmpty()) {
            h.append("<p class=\"muted\">No layer changed since the baseline ").append(esc(result.baselineFile()))
                    .append(".</p>\n</section>\n");
            return;
        }
        int added = 0;
        int removed = 0;
        int changed = 0;
        for (LayerDiff d : p.diff()) {
            switch (d.change()) {
                case ADDED:
                    added++;
                    break;
                case REMOVED:
                    removed++;
                    break;
                default:
                    changed++;
            }
        }
        int shown = Math.min(DIFF_ROWS, p.diff().size());
        h.append("<p class=\"muted\">Since ").append(esc(result.baselineFile())).append(": ").append(added)
                .append(" added, ").append(removed).append(" removed, ").append(changed).append(" changed")
                .append(shown < p.diff().size() ? "; the first " + shown + " are listed" : "")
                .append(". Deltas are current minus baseline.</p>\n")
                .append("<div class=\"scroll\"><table class=\"grid\">\n<thead><tr><th class=\"l\">change</th>")
                .append("<th class=\"l\">layer</th><th class=\"l\">op</th><th>MACs</th><th>energy µJ</th>")
                .append("<th>latency µs</th></tr></thead>\n<tbody>\n");
        for (int i = 0; i < shown; i++) {
            LayerDiff d = p.diff().get(i);
            h.append("<tr class=\"").append(d.change().label).append("\"><td class=\"l\">").append(d.change().label)
                    .append("</td><td class=\"l name\" title=\"").append(esc(d.name())).append("\">")
                    .append(esc(AnalysisTable.shorten(d.name(), 64))).append("</td><td class=\"l\">")
                    .append(esc(d.opType())).append("</td><td>").append(Format.signedExact(d.macsDelta()))
                    .append("</td><td>").append(Format.signed(d.energyDeltaJoules() * 1e6)).append("</td><td>")
                    .append(Format.signed(d.latencyDeltaSeconds() * 1e6)).append("</td></tr>\n");
        }
        h.append("</tbody>\n</table></div>\n</section>\n");
    }

    private static void assumptions(StringBuilder h, Figures f) {
        h.append("<section id=\"assumptions\">\n<h2>Assumptions</h2>\n<ul>\n");
        Engine a = f.macEngine();
        h.append("<li>Device: ").append(esc(f.profile().name())).append(", ")
                .append(esc(Format.sig(f.profile().clockMhz()))).append(" MHz");
        if (a != null && a.kind() == Engine.Kind.MAC_ARRAY) {
            h.append(", a ").append(a.rows()).append("&times;").append(a.columns()).append(' ')
                    .append(esc(a.dataflow().key)).append(" MAC array");
        }
        if (f.profile().deployPrecision() != null) {
            h.append(", float tensors deployed at ").append(esc(f.profile().deployPrecision()));
        }
        h.append(".</li>\n<li>Power is taken at ").append(Format.sig(f.fps)).append(" fps")
                .append(f.fps == f.estimate.maxFps() ? " (frames back to back)" : "")
                .append(": dynamic energy per frame &times; fps + static power.</li>\n");
        for (String s : f.estimate.assumptions()) {
            h.append("<li>").append(esc(s)).append("</li>\n");
        }
        h.append("</ul>\n</section>\n");
    }

    private static String uj(double joules) {
        return Format.sig(joules * 1e6);
    }

    // ---- bar charts -------------------------------------------------------------------------

    /** One bar: its label, its full name (for the tooltip) and its stacked segments. */
    private static final class Bar {
        final String label;
        final String tip;
        final double[] values;
        final String[] colours;
        final String[] names;
        final boolean others;

        Bar(String label, String tip, double[] values, String[] colours, String[] names, boolean others) {
            this.label = label;
            this.tip = tip;
            this.values = values;
            this.colours = colours;
            this.names = names;
            this.others = others;
        }

        double total() {
            double t = 0;
            for (double v : values) {
                t += v;
            }
            return t;
        }
    }

    private static double[] energyParts(Energy e) {
        return new double[] {e.compute() * 1e6, e.registers() * 1e6, e.sram() * 1e6, e.dram() * 1e6,
                e.staticEnergy() * 1e6};
    }

    private static void energyChart(StringBuilder h, Figures f) {
        List<NodeEstimate> ranked = f.byEnergy();
        List<Bar> bars = new ArrayList<>();
        int top = Math.min(CHART_BARS, ranked.size());
        for (int i = 0; i < top; i++) {
            NodeEstimate n = ranked.get(i);
            bars.add(new Bar(n.name(), n.name() + " (" + n.work().opType() + ")", energyParts(n.energy()), DEST_COLOURS,
                    DEST_NAMES, false));
        }
        if (ranked.size() > top) {
            Energy rest = Energy.ZERO;
            for (NodeEstimate n : ranked.subList(top, ranked.size())) {
                rest = rest.plus(n.energy());
            }
            int k = ranked.size() - top;
            bars.add(new Bar("others (" + k + " layers)", "the other " + k + " layers together", energyParts(rest),
                    DEST_COLOURS, DEST_NAMES, true));
        }
        h.append(caption(ranked.size(), top, "energy")).append('\n');
        legend(h, DEST_NAMES, DEST_COLOURS);
        barChart(h, "chart-energy", "Energy per layer in µJ, stacked by destination", bars, "µJ");
    }

    private static void latencyChart(StringBuilder h, Figures f) {
        List<NodeEstimate> ranked = f.byLatency();
        String[] names = new String[BOUNDS.length];
        String[] colours = new String[BOUNDS.length];
        for (int i = 0; i < BOUNDS.length; i++) {
            names[i] = BOUNDS[i].label + "-bound";
            colours[i] = boundColour(BOUNDS[i]);
        }
        List<Bar> bars = new ArrayList<>();
        int top = Math.min(CHART_BARS, ranked.size());
        for (int i = 0; i < top; i++) {
            NodeEstimate n = ranked.get(i);
            double[] v = new double[BOUNDS.length];
            v[n.bound().ordinal()] = n.latencySeconds() * 1e6;
            bars.add(new Bar(n.name(), n.name() + " (" + n.work().opType() + ")", v, colours, names, false));
        }
        if (ranked.size() > top) {
            double[] v = new double[BOUNDS.length];
            for (NodeEstimate n : ranked.subList(top, ranked.size())) {
                v[n.bound().ordinal()] += n.latencySeconds() * 1e6;
            }
            int k = ranked.size() - top;
            bars.add(new Bar("others (" + k + " layers)", "the other " + k + " layers together, by bound", v, colours,
                    names, true));
        }
        h.append(caption(ranked.size(), top, "latency")).append('\n');
        // the legend names the bounds that occur
        List<String> usedNames = new ArrayList<>();
        List<String> usedColours = new ArrayList<>();
        for (int i = 0; i < BOUNDS.length; i++) {
            for (Bar b : bars) {
                if (b.values[i] > 0) {
                    usedNames.add(names[i]);
                    usedColours.add(colours[i]);
                    break;
                }
            }
        }
        legend(h, usedNames.toArray(new String[0]), usedColours.toArray(new String[0]));
        barChart(h, "chart-latency", "Latency per layer in µs, coloured by its bound", bars, "µs");
    }

    private static String caption(int total, int top, String by) {
        if (total == 0) {
            return "<p class=\"muted\">No layer runs on the device.</p>";
        }
        if (total == top) {
            return "<p class=\"muted\">All " + ConsoleReport.plural(total, "layer") + ", most " + by + " first.</p>";
        }
        return "<p class=\"muted\">The " + top + " layers of most " + by + " out of " + total + "; the other "
                + (total - top) + " are summed in the last bar.</p>";
    }

    private static void legend(StringBuilder h, String[] names, String[] colours) {
        h.append("<div class=\"legend\">");
        for (int i = 0; i < names.length; i++) {
            h.append("<span><i style=\"background:").append(colours[i]).append("\"></i>").append(esc(names[i]))
                    .append("</span>");
        }
        h.append("</div>\n");
    }

    private static final int W = 1000;

    private static void barChart(StringBuilder h, String id, String label, List<Bar> bars, String unit) {
        int labelW = 270;
        int valueW = 80;
        int rowH = 22;
        int barH = 15;
        int top = 26;
        int plotW = W - labelW - valueW - 10;
        int height = top + Math.max(1, bars.size()) * rowH + 12;
        double max = 0;
        for (Bar b : bars) {
            max = Math.max(max, b.total());
        }
        double step = niceStep(max / 5);
        double axisMax = max <= 0 ? 1 : Math.ceil(max / step - 1e-9) * step;
        h.append("<svg id=\"").append(id).append("\" class=\"chart\" viewBox=\"0 0 ").append(W).append(' ')
                .append(height).append("\" role=\"img\" aria-label=\"").append(esc(label)).append("\">\n")
                .append("<title>").append(esc(label)).append("</title>\n");
        // grid and axis labels
        for (double t = 0; t <= axisMax * (1 + 1e-9); t += step) {
            double x = labelW + plotW * (t / axisMax);
            h.append("<line class=\"grid\" x1=\"").append(px(x)).append("\" y1=\"").append(top - 6).append("\" x2=\"")
                    .append(px(x)).append("\" y2=\"").append(height - 8).append("\"/>")
                    .append("<text class=\"tick\" x=\"").append(px(x)).append("\" y=\"").append(top - 10)
                    .append("\" text-anchor=\"middle\">").append(esc(Format.sig(t))).append("</text>\n");
        }
        h.append("<text class=\"tick\" x=\"").append(W - 4).append("\" y=\"").append(top - 10)
                .append("\" text-anchor=\"end\">").append(esc(unit)).append("</text>\n");
        int row = 0;
        for (Bar b : bars) {
            double y = top + row * rowH + (rowH - barH) / 2.0;
            h.append("<g class=\"bar").append(b.others ? " others" : "").append("\"><title>").append(esc(b.tip))
                    .append(": ").append(esc(Format.sig(b.total()))).append(' ').append(esc(unit)).append("</title>");
            h.append("<text class=\"label\" x=\"").append(labelW - 8).append("\" y=\"").append(px(y + barH - 3))
                    .append("\" text-anchor=\"end\">").append(esc(AnalysisTable.shorten(b.label, 40))).append("</text>");
            double x = labelW;
            for (int i = 0; i < b.values.length; i++) {
                double v = b.values[i];
                if (!(v > 0)) {
                    continue;
                }
                double w = plotW * v / axisMax;
                h.append("<rect x=\"").append(px(x)).append("\" y=\"").append(px(y)).append("\" width=\"")
                        .append(px(Math.max(w, 0.5))).append("\" height=\"").append(barH).append("\" fill=\"")
                        .append(b.colours[i]).append("\"><title>").append(esc(b.tip)).append(": ")
                        .append(esc(b.names[i])).append(' ').append(esc(Format.sig(v))).append(' ').append(esc(unit))
                        .append("</title></rect>");
                x += w;
            }
            h.append("<text class=\"value\" x=\"").append(px(x + 6)).append("\" y=\"").append(px(y + barH - 3))
                    .append("\">").append(esc(Format.sig(b.total()))).append("</text></g>\n");
            row++;
        }
        h.append("</svg>\n");
    }

    /** A step of 1, 2 or 5 times a power of ten, at least {@code raw}. */
    static double niceStep(double raw) {
        if (!(raw > 0) || Double.isInfinite(raw)) {
            return 1;
        }
        double p = Math.pow(10, Math.floor(Math.log10(raw)));
        double m = raw / p;
        double n = m <= 1 ? 1 : m <= 2 ? 2 : m <= 5 ? 5 : 10;
        return n * p;
    }

    /** A coordinate with at most one decimal. */
    static String px(double v) {
        long tenths = Math.round(v * 10);
        return tenths % 10 == 0 ? Long.toString(tenths / 10) : (tenths / 10) + "." + Math.abs(tenths % 10);
    }

    // ---- roofline ---------------------------------------------------------------------------

    private static void roofline(StringBuilder h, Figures f) {
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
        StringBuilder cap = new StringBuilder("<p class=\"muted\">Each dot is a MAC layer: x its operational"
                + " intensity (MACs per byte of DRAM traffic), y its achieved rate (MACs over its latency), both"
                + " logarithmic. The flat roof is the peak of the ");
        cap.append(e == null ? "engine" : e.kind() == Engine.Kind.MAC_ARRAY ? e.rows() + "&times;" + e.columns()
                + " array" : e.lanes() + "-lane vector unit");
        cap.append(" (").append(Format.sig(peak / 1e9)).append(" GMAC/s)");
        if (slope) {
            cap.append(", the slope the DRAM bandwidth (").append(Format.sig(bw / 1e9)).append(" GB/s)");
        } else {
            cap.append("; the profile gives no DRAM bandwidth, so there is no DRAM slope");
        }
        cap.append(". Layers that move no DRAM byte (weights resident, activations on chip) sit in the"
                + " right-hand column. An SRAM-bound layer sits below both roofs: the SRAM bandwidth"
                + " limits it, which this plot's axes do not show.");
        int plotted = Math.min(ROOFLINE_POINTS, macs.size());
        if (plotted < macs.size()) {
            cap.append(" The ").append(plotted).append(" layers with most MACs of ").append(macs.size())
                    .append(" are plotted.");
        }
        h.append(cap).append("</p>\n");
        legendBounds(h);
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
            h.append("<line class=\"grid\" x1=\"").append(px(x)).append("\" y1=\"").append(top).append("\" x2=\"")
                    .append(px(x)).append("\" y2=\"").append(plotB).append("\"/><text class=\"tick\" x=\"").append(px(x))
                    .append("\" y=\"").append(plotB + 18).append("\" text-anchor=\"middle\">").append(decade(d, ""))
                    .append("</text>\n");
        }
        for (int d = (int) ly0; d <= (int) ly1; d++) {
            double y = sy.applyAsDouble(Math.pow(10, d));
            h.append("<line class=\"grid\" x1=\"").append(left).append("\" y1=\"").append(px(y)).append("\" x2=\"")
                    .append(right).append("\" y2=\"").append(px(y)).append("\"/><line class=\"grid\" x1=\"").append(stripX)
                    .append("\" y1=\"").append(px(y)).append("\" x2=\"").append(stripX + stripW).append("\" y2=\"")
                    .append(px(y)).append("\"/><text class=\"tick\" x=\"").append(left - 8).append("\" y=\"")
                    .append(px(y + 4)).append("\" text-anchor=\"end\">").append(decade(d, "")).append("</text>\n");
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
            h.append("<line class=\"roof\" x1=\"").append(px(xStart)).append("\" y1=\"").append(px(yPeak))
                    .append("\" x2=\"").append(right).append("\" y2=\"").append(px(yPeak)).append("\"/>")
                    .append("<line class=\"roof dashed\" x1=\"").append(stripX).append("\" y1=\"").append(px(yPeak))
                    .append("\" x2=\"").append(stripX + stripW).append("\" y2=\"").append(px(yPeak)).append("\"/>")
                    .append("<text class=\"rooflabel\" x=\"").append(right - 6).append("\" y=\"").append(px(yPeak - 7))
                    .append("\" text-anchor=\"end\">compute roof ").append(esc(Format.sig(peak / 1e9)))
                    .append(" GMAC/s</text>\n");
            if (slope) {
                // from the bottom edge (or the left edge) up to the ridge point, on y = bw * x
                double xLo = Math.max(Math.pow(10, lx0), Math.pow(10, ly0) / bw);
                double xa = sx.applyAsDouble(xLo);
                double ya = sy.applyAsDouble(bw * xLo);
                double xb = sx.applyAsDouble(ridge);
                h.append("<line class=\"roof\" x1=\"").append(px(xa)).append("\" y1=\"").append(px(ya))
                        .append("\" x2=\"").append(px(xb)).append("\" y2=\"").append(px(yPeak)).append("\"/>");
                double mid = Math.pow(10, (Math.log10(xLo) + Math.log10(ridge)) / 2);
                double angle = Math.toDegrees(Math.atan2(yPeak - ya, xb - xa));
                h.append("<text class=\"rooflabel\" transform=\"translate(").append(px(sx.applyAsDouble(mid)))
                        .append(' ').append(px(sy.applyAsDouble(bw * mid) - 8)).append(") rotate(").append(px(angle))
                        .append(")\" text-anchor=\"middle\">DRAM ").append(esc(Format.sig(bw / 1e9)))
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
            h.append("<circle cx=\"").append(px(cx)).append("\" cy=\"").append(px(cy)).append("\" r=\"5\" fill=\"")
                    .append(boundColour(n.bound())).append("\"><title>").append(esc(n.name())).append(" (")
                    .append(esc(n.work().opType())).append("): ")
                    .append(Double.isInfinite(x) ? "no DRAM traffic" : esc(Format.sig(x)) + " MACs per DRAM byte")
                    .append(", ").append(esc(Format.sig(y / 1e9))).append(" GMAC/s, ").append(n.bound().label)
                    .append("-bound</title></circle>\n");
        }
        if (macs.isEmpty()) {
            h.append("<text class=\"axis\" x=\"").append((left + right) / 2).append("\" y=\"").append((top + plotB) / 2)
                    .append("\" text-anchor=\"middle\">no MAC layer to plot</text>\n");
        }
        h.append("</svg>\n");
    }

    private static void legendBounds(StringBuilder h) {
        String[] names = new String[BOUNDS.length - 1];
        String[] colours = new String[BOUNDS.length - 1];
        for (int i = 0; i < BOUNDS.length - 1; i++) {
            names[i] = BOUNDS[i].label + "-bound";
            colours[i] = boundColour(BOUNDS[i]);
        }
        legend(h, names, colours);
    }

    /** 10^d with an SI prefix: 0.01, 0.1, 1, 10, 100, 1k ... 100G, 1T. */
    static String decade(int d, String unit) {
        String[] prefixes = {"", "k", "M", "G", "T", "P", "E"};
        if (d < 0) {
            return "0." + "0".repeat(-d - 1) + "1" + unit;
        }
        int p = Math.min(d / 3, prefixes.length - 1);
        long mant = 1;
        for (int i = 0; i < d - 3 * p; i++) {
            mant *= 10;
        }
        return mant + prefixes[p] + unit;
    }

    private static final String CSS = String.join("\n",
            ":root{--ink:#1d232b;--muted:#5d6673;--paper:#f4f2ec;--card:#fff;--line:#e0dbd0;--head:#24313f;"
                    + "--pass:#2e7d4f;--fail:#b3261e;--warn:#fbf1d9;}",
            "*{box-sizing:border-box}",
            "body{margin:0;background:var(--paper);color:var(--ink);"
                    + "font:14px/1.45 \"DejaVu Sans\",\"Segoe UI\",Helvetica,Arial,sans-serif}",
            "code{font-family:\"DejaVu Sans Mono\",Menlo,Consolas,monospace;font-size:12.5px}",
            "header.top{background:var(--head);color:#f4f2ec;padding:22px 0 20px}",
            ".head{max-width:1280px;margin:0 auto;padding:0 28px;display:flex;align-items:center;"
                    + "justify-content:space-between;gap:24px}",
            ".kicker{text-transform:uppercase;letter-spacing:.12em;font-size:11px;color:#b9c3cf}",
            "h1{margin:4px 0 6px;font-size:24px;font-weight:600;word-break:break-all}",
            "h1 .on{font-weight:400;color:#b9c3cf}",
            ".sub{color:#cbd3dc;font-size:13px}.sub code{color:#f4f2ec}",
            ".verdict{font-size:22px;font-weight:700;letter-spacing:.08em;padding:10px 22px;border-radius:4px;"
                    + "color:#fff;white-space:nowrap}",
            ".verdict.pass{background:var(--pass)}.verdict.fail{background:var(--fail)}"
                    + ".verdict.none{background:#6b7480}",
            "main{max-width:1280px;margin:0 auto;padding:8px 28px 32px}",
            "section{background:var(--card);border:1px solid var(--line);border-radius:6px;padding:16px 20px;"
                    + "margin:14px 0}",
            "h2{font-size:15px;margin:0 0 10px;letter-spacing:.02em}",
            ".muted{color:var(--muted);margin:4px 0 10px}",
            ".notice{background:var(--warn);border-left:4px solid #d39b2a;padding:10px 14px;margin:16px 0 0;"
                    + "border-radius:0 4px 4px 0}",
            ".warn{background:var(--warn);padding:6px 10px;border-radius:4px}",
            "ul.checks{list-style:none;margin:0;padding:0}",
            "ul.checks li{padding:6px 0;border-bottom:1px solid var(--line)}ul.checks li:last-child{border:0}",
            ".pill{display:inline-block;min-width:44px;text-align:center;font-size:12px;font-weight:700;"
                    + "padding:1px 8px;border-radius:10px;color:#fff;background:var(--pass)}",
            "li.bad .pill{background:var(--fail)}",
            ".kind{font-family:\"DejaVu Sans Mono\",Menlo,Consolas,monospace;font-size:12px;color:var(--muted)}",
            ".cards{display:grid;grid-template-columns:repeat(auto-fill,minmax(300px,1fr));gap:10px}",
            ".card{border:1px solid var(--line);border-radius:5px;padding:8px 12px;background:#fbfaf7}",
            ".card .k{font-size:12px;color:var(--muted)}.card .v{font-size:19px;font-weight:600}",
            ".card .d{font-size:11.5px;color:var(--muted)}",
            ".legend{display:flex;flex-wrap:wrap;gap:16px;font-size:12.5px;margin:2px 0 6px}",
            ".legend i{display:inline-block;width:12px;height:12px;border-radius:2px;margin-right:6px;"
                    + "vertical-align:-1px}",
            "svg.chart{width:100%;height:auto;display:block}",
            "svg .grid{stroke:#ebe7df;stroke-width:1}",
            "svg .plot{fill:#fcfbf8;stroke:#d9d3c7}svg .strip{fill:#f6f3ec}",
            "svg text{font-family:\"DejaVu Sans\",\"Segoe UI\",Helvetica,Arial,sans-serif;fill:var(--ink)}",
            "svg .tick{font-size:11px;fill:var(--muted)}svg .label{font-size:12px}svg .value{font-size:11px;"
                    + "fill:var(--muted)}",
            "svg .others .label{font-style:italic;fill:var(--muted)}svg .others rect{opacity:.6}",
            "svg .axis{font-size:12.5px;fill:var(--muted)}",
            "svg .roof{stroke:#24313f;stroke-width:2;fill:none}svg .dashed{stroke-dasharray:5 4}",
            "svg .rooflabel{font-size:12px;fill:#24313f}",
            "svg circle{stroke:#fff;stroke-width:1.2;fill-opacity:.9}",
            ".scroll{overflow-x:auto}",
            "table.grid{border-collapse:collapse;font-size:12px;font-variant-numeric:tabular-nums;width:100%}",
            "table.grid th,table.grid td{padding:4px 6px;border-bottom:1px solid var(--line);text-align:right;"
                    + "white-space:nowrap}",
            "table.grid th{font-weight:600;color:var(--muted);background:#faf8f4}",
            "table.grid .l{text-align:left}table.grid .name{font-family:\"DejaVu Sans Mono\",Menlo,Consolas,"
                    + "monospace;font-size:11.5px}",
            "table.grid .note{color:var(--muted);font-family:\"DejaVu Sans\",Helvetica,Arial,sans-serif;"
                    + "font-size:11px}",
            ".tag{font-size:10.5px;padding:0 5px;border:1px solid var(--line);border-radius:8px;color:var(--muted)}",
            "table.grid .muted{margin:0}",
            "table.grid tbody tr:hover{background:#f7f4ec}",
            "tr.added td:first-child{color:var(--pass)}tr.removed td:first-child{color:var(--fail)}",
            ".dot{display:inline-block;width:9px;height:9px;border-radius:50%;margin-right:5px}",
            "footer{max-width:1280px;margin:0 auto;padding:0 28px 28px;color:var(--muted);font-size:12px}",
            "");
}
