package dev.erg.report;

import com.github.mustachejava.DefaultMustacheFactory;
import com.github.mustachejava.Mustache;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.LayerDiff;
import dev.erg.budget.PairResult;
import dev.erg.budget.Verdict;
import dev.erg.device.Engine;
import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import java.io.IOException;
import java.io.InputStream;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * One self-contained HTML page per model x device pair: the verdict with every check, the totals,
 * three inline SVG charts ({@link EnergyChart}, {@link LatencyChart}, {@link RooflineChart}), the
 * costliest layers, the baseline diff and the assumptions. The page comes from the template
 * {@code report.mustache}, which escapes every value it is given; the style is {@code report.css},
 * set inline so that the page loads nothing from anywhere else. Deterministic: the same result gives
 * the same bytes.
 */
public final class HtmlReport {
    /** Bars per chart; the remaining layers are summed into one "others" bar. */
    public static final int CHART_BARS = BarChart.BARS;
    /** Rows of the per-layer table. */
    public static final int TABLE_ROWS = 50;
    /** MAC layers on the roofline, most MACs first. */
    public static final int ROOFLINE_POINTS = RooflineChart.POINTS;
    /** Rows of the baseline diff table. */
    public static final int DIFF_ROWS = 100;

    private static final Mustache TEMPLATE = new DefaultMustacheFactory("dev/erg/report").compile("report.mustache");
    private static final String CSS = resource("report.css");

    /** The columns of the layer table before the energy destinations, as every report labels them. */
    private static final String[][] COLUMNS = {{"#", ""}, {"layer", "l"}, {"op", "l"}, {"precision", "l"},
        {"MACs", ""}, {"utilisation", ""}, {"latency µs", ""}, {"bound", "l"}};
    /** The columns after the energy destinations. */
    private static final String[][] TAIL_COLUMNS = {{"total", ""}, {"share", ""}, {"DRAM bytes", ""}};

    private HtmlReport() {
    }

    /** The page of one pair of a gate result. */
    public static String render(GateResult result, PairResult p) {
        return render(Figures.of(p), result);
    }

    static String render(Figures f, GateResult result) {
        StringWriter out = new StringWriter(64 * 1024);
        TEMPLATE.execute(out, view(f, result));
        return out.toString();
    }

    private static String resource(String name) {
        try (InputStream in = HtmlReport.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new IllegalStateException("missing resource " + name);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The values the template shows, every text cleaned of characters a page must not carry. */
    static Map<String, Object> view(Figures f, GateResult result) {
        Map<String, Object> v = new LinkedHashMap<>();
        v.put("title", Html.text("erg: " + f.modelName() + " on " + f.device));
        v.put("css", CSS);
        v.put("modelName", Html.text(f.modelName()));
        v.put("deviceName", Html.text(f.profile().name()));
        v.put("model", Html.text(f.model));
        v.put("device", Html.text(f.device));
        v.put("clockMhz", Format.sig(f.profile().clockMhz()));
        int devices = 0;
        for (PairResult p : result == null ? List.<PairResult>of() : result.pairs()) {
            devices += p.model().equals(f.model) ? 1 : 0;
        }
        if (devices > 1) {
            // The page sits beside the model's comparison page (Reports.write writes both with the html format).
            v.put("compareHref", Html.text(Reports.compareStem(f.model) + ".html"));
            v.put("compareCount", devices);
        }
        verdict(v, f.pair);
        v.put("notice", AnalysisJson.NOTICE);
        List<Map<String, Object>> checks = new ArrayList<>();
        for (Check c : f.pair == null ? List.<Check>of() : f.pair.checks()) {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("rowClass", c.verdict() == Verdict.FAIL ? "bad" : c.verdict() == Verdict.AT_RISK ? "risk" : "ok");
            m.put("status", c.verdict() == Verdict.FAIL ? "FAIL" : c.verdict() == Verdict.AT_RISK ? "at risk" : "ok");
            m.put("key", c.key());
            m.put("message", Html.text(c.message()));
            checks.add(m);
        }
        v.put("checks", checks);
        v.put("hasChecks", !checks.isEmpty());
        List<Map<String, Object>> totals = new ArrayList<>();
        for (String[] row : f.summary()) {
            totals.add(Map.of("label", row[0], "value", row[1], "detail", Html.text(row[2])));
        }
        v.put("totals", totals);
        v.put("incomplete", !f.estimate.complete());
        v.put("reloadedEachFrame", f.estimate.weightsReloadedEachFrame());
        v.put("charts", List.of(
                Map.of("section", "energy", "heading", "Energy per layer, by destination", "chart", EnergyChart.of(f)),
                Map.of("section", "latency", "heading", "Latency per layer, by what bounds it", "chart",
                        LatencyChart.of(f)),
                Map.of("section", "roofline", "heading", "Roofline of the MAC layers", "chart", RooflineChart.of(f))));
        layers(v, f);
        diff(v, f.pair, result);
        v.put("assumptions", assumptions(f));
        return v;
    }

    private static void verdict(Map<String, Object> v, PairResult p) {
        if (p == null || p.checks().isEmpty()) {
            v.put("verdict", "NOT CHECKED");
            v.put("verdictClass", "none");
        } else if (p.verdict() == Verdict.FAIL) {
            v.put("verdict", "FAIL");
            v.put("verdictClass", "fail");
        } else if (p.verdict() == Verdict.AT_RISK) {
            v.put("verdict", "AT RISK");
            v.put("verdictClass", "risk");
        } else {
            v.put("verdict", "PASS");
            v.put("verdictClass", "pass");
        }
    }

    private static void layers(Map<String, Object> v, Figures f) {
        List<NodeEstimate> ranked = f.byEnergy();
        int shown = Math.min(TABLE_ROWS, ranked.size());
        List<Map<String, Object>> columns = new ArrayList<>();
        List<Energy.Destination> dests = f.destinations();
        for (String[] c : COLUMNS) {
            columns.add(Map.of("label", c[0], "left", !c[1].isEmpty()));
        }
        for (Energy.Destination d : dests) {
            columns.add(Map.of("label", Figures.label(d), "left", false));
        }
        for (String[] c : TAIL_COLUMNS) {
            columns.add(Map.of("label", c[0], "left", !c[1].isEmpty()));
        }
        v.put("layerColumns", columns);
        v.put("layersCaption", shown == ranked.size() ? "All " + ConsoleReport.plural(shown, "layer")
                + " that run on the device" : "The " + shown + " of " + ranked.size() + " layers that cost most energy");
        List<Map<String, Object>> rows = new ArrayList<>();
        for (int i = 0; i < shown; i++) {
            NodeEstimate n = ranked.get(i);
            Energy e = n.energy();
            Map<String, Object> r = new LinkedHashMap<>();
            r.put("rank", i + 1);
            r.put("name", Html.text(n.name()));
            r.put("shortName", Html.text(AnalysisTable.shorten(n.name(), 36)));
            r.put("tiling", n.tiling() == null ? null : Html.text(n.tiling()));
            r.put("engine", Html.text(n.engine()));
            r.put("precision", ConsoleReport.precision(n));
            r.put("origin", ConsoleReport.origin(n));
            r.put("types", Html.text(n.precision()));
            r.put("reloaded", n.weightsReloaded());
            r.put("opType", Html.text(n.work().opType()));
            r.put("macs", Format.count(n.work().macs()));
            r.put("utilisation", ConsoleReport.utilisation(n));
            r.put("latency", Format.sig(n.latencySeconds() * 1e6));
            r.put("boundColour", Palette.bound(n.bound()));
            r.put("bound", n.bound().label);
            r.put("fusedInto", n.fusedInto() == null ? null : Html.text(n.fusedInto()));
            List<String> energies = new ArrayList<>();
            for (Energy.Destination d : dests) {
                energies.add(uj(e.of(d)));
            }
            r.put("energies", energies);
            r.put("total", uj(e.total()));
            r.put("share", Format.percent(f.energyShare(n)));
            r.put("dramBytes", Format.bytes(n.dramReadBytes() + n.dramWriteBytes()));
            rows.add(r);
        }
        v.put("layers", rows);
        v.put("hasLayers", !rows.isEmpty());
    }

    private static void diff(Map<String, Object> v, PairResult p, GateResult result) {
        v.put("hasDiff", false);
        if (p == null || !p.hasBaseline()) {
            v.put("diffNote", Html.text(result == null || result.baselineFile() == null ? "No baseline is configured."
                    : !result.baselineFound() ? Format.sentence(result.baselineNote())
                    : "The baseline " + result.baselineFile() + " has no entry for this model and device."));
            return;
        }
        if (p.diff().isEmpty()) {
            v.put("diffNote", Html.text("No layer changed since the baseline " + result.baselineFile() + "."));
            return;
        }
        int added = 0;
        int removed = 0;
        for (LayerDiff d : p.diff()) {
            added += d.change() == LayerDiff.Change.ADDED ? 1 : 0;
            removed += d.change() == LayerDiff.Change.REMOVED ? 1 : 0;
        }
        int changed = p.diff().size() - added - removed;
        int shown = Math.min(DIFF_ROWS, p.diff().size());
        v.put("hasDiff", true);
        v.put("diffCaption", Html.text("Since " + result.baselineFile() + ": " + added + " added, " + removed
                + " removed, " + changed + " changed" + (shown < p.diff().size() ? "; the first " + shown
                + " are listed" : "") + ". Deltas are current minus baseline."));
        List<Map<String, Object>> rows = new ArrayList<>();
        for (LayerDiff d : p.diff().subList(0, shown)) {
            Map<String, Object> r = new LinkedHashMap<>();
            r.put("change", d.change().label);
            r.put("name", Html.text(d.name()));
            r.put("shortName", Html.text(AnalysisTable.shorten(d.name(), 64)));
            r.put("opType", Html.text(d.opType()));
            r.put("macs", Format.signedExact(d.macsDelta()));
            r.put("energy", Format.signed(d.energyDeltaJoules() * 1e6));
            r.put("latency", Format.signed(d.latencyDeltaSeconds() * 1e6));
            rows.add(r);
        }
        v.put("diff", rows);
    }

    private static List<String> assumptions(Figures f) {
        List<String> out = new ArrayList<>();
        StringBuilder device = new StringBuilder("Device: ").append(f.profile().name()).append(", ")
                .append(Format.sig(f.profile().clockMhz())).append(" MHz");
        Engine a = f.macEngine();
        if (a != null && a.isArray()) {
            device.append(", ").append(f.macEngineWords());
        }
        if (f.profile().deployPrecision() != null) {
            device.append(", float tensors deployed at ").append(f.profile().deployPrecision());
        }
        out.add(Html.text(device.append('.').toString()));
        out.add("Power is taken at " + Format.sig(f.fps) + " fps" + (f.fps == f.estimate.maxFps()
                ? " (frames back to back)" : "") + ": dynamic energy per frame × fps + static power.");
        for (String s : f.estimate.assumptions()) {
            out.add(Html.text(s));
        }
        return out;
    }

    private static String uj(double joules) {
        return Format.sig(joules * 1e6);
    }
}
