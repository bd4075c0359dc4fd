package dev.erg.report;

import com.github.mustachejava.DefaultMustacheFactory;
import com.github.mustachejava.Mustache;
import dev.erg.budget.GateResult;
import dev.erg.estimate.Energy;
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
 * The comparison of one model on every device of a run, side by side: energy per MAC, TOPS/W achieved
 * (two operations per MAC), MAC utilisation, the dominant destination, the frame rate and the power,
 * then the frame's energy by destination. Written as {@code MODEL.compare.md} and
 * {@code MODEL.compare.html} beside the pair reports when a model runs on two devices or more; the
 * console lists the first table after the pairs. Deterministic, "\n" line ends.
 */
public final class ComparisonReport {
    private static final Mustache TEMPLATE = new DefaultMustacheFactory("dev/erg/report").compile("comparison.mustache");
    private static final String CSS = resource("report.css");

    private ComparisonReport() {
    }

    /** The Markdown comparison of one model. */
    static String markdown(Comparison c) {
        StringBuilder b = new StringBuilder();
        b.append("### erg: ").append(MarkdownReport.code(c.modelName())).append(" on ").append(c.pairs.size())
                .append(" devices\n\n");
        b.append("Model ").append(MarkdownReport.code(c.model)).append(". Each row is the same model estimated on one"
                + " device of the run. Energy per MAC is the frame's energy over its MACs; TOPS/W counts two"
                + " operations per MAC; utilisation is MAC-weighted over the MAC layers; dominant is the destination"
                + " of most dynamic energy.\n\n");
        b.append('|');
        StringBuilder rule = new StringBuilder("|");
        for (String[] col : Comparison.COLUMNS) {
            b.append(' ').append(col[1]).append(" |");
            rule.append(isNumber(col[0]) ? "---:|" : "---|");
        }
        b.append('\n').append(rule).append('\n');
        for (Figures f : c.pairs) {
            Map<String, String> r = Comparison.row(f);
            b.append('|');
            for (String[] col : Comparison.COLUMNS) {
                String v = r.get(col[0]);
                b.append(' ').append(col[0].equals("device") ? MarkdownReport.code(v) : col[0].equals("verdict")
                        && v.equals("FAIL") ? "**FAIL**" : MarkdownReport.text(v)).append(" |");
            }
            b.append('\n');
        }
        List<Energy.Destination> dests = c.destinations();
        b.append("\n**Energy per frame by destination** (µJ)\n\n| device |");
        StringBuilder r2 = new StringBuilder("|---|");
        for (Energy.Destination d : dests) {
            b.append(' ').append(Figures.label(d)).append(" |");
            r2.append("---:|");
        }
        b.append(" total |\n").append(r2).append("---:|\n");
        for (Figures f : c.pairs) {
            Energy e = f.estimate.energy();
            b.append("| ").append(MarkdownReport.code(f.device)).append(" |");
            for (Energy.Destination d : dests) {
                b.append(' ').append(Comparison.uj(e.of(d))).append(" |");
            }
            b.append(' ').append(Comparison.uj(e.total())).append(" |\n");
        }
        b.append("\n> ").append(MarkdownReport.text(AnalysisJson.NOTICE)).append('\n');
        return b.toString();
    }

    private static boolean isNumber(String key) {
        return key.equals("energyPerMac") || key.equals("topsPerWatt") || key.equals("utilisation")
                || key.equals("maxFps") || key.equals("power") || key.equals("energyPerFrame");
    }

    /** The HTML page of one model's comparison. */
    static String html(Comparison c) {
        Map<String, Object> v = new LinkedHashMap<>();
        v.put("title", Html.text("erg: " + c.modelName() + " on " + c.pairs.size() + " devices"));
        v.put("css", CSS);
        v.put("modelName", Html.text(c.modelName()));
        v.put("model", Html.text(c.model));
        v.put("count", c.pairs.size());
        v.put("notice", AnalysisJson.NOTICE);
        List<Map<String, Object>> columns = new ArrayList<>();
        for (String[] col : Comparison.COLUMNS) {
            columns.add(Map.of("label", col[1], "left", !isNumber(col[0])));
        }
        v.put("columns", columns);
        List<Map<String, Object>> rows = new ArrayList<>();
        for (Figures f : c.pairs) {
            Map<String, String> r = Comparison.row(f);
            List<Map<String, Object>> cells = new ArrayList<>();
            for (String[] col : Comparison.COLUMNS) {
                Map<String, Object> cell = new LinkedHashMap<>();
                cell.put("value", Html.text(r.get(col[0])));
                cell.put("left", !isNumber(col[0]));
                if (col[0].equals("device")) {
                    // The pair's own page, written beside this one (Reports.write, html format).
                    cell.put("href", Html.text(Reports.stem(c.model, f.device) + ".html"));
                }
                cells.add(cell);
            }
            String verdict = r.get("verdict");
            rows.add(Map.of("cells", cells, "rowClass", verdict.equals("FAIL") ? "bad" : verdict.equals("AT RISK")
                    ? "risk" : "ok", "title", Html.text(f.profile().name())));
        }
        v.put("rows", rows);
        List<Energy.Destination> dests = c.destinations();
        List<String> destColumns = new ArrayList<>();
        for (Energy.Destination d : dests) {
            destColumns.add(Figures.label(d));
        }
        v.put("destColumns", destColumns);
        List<Map<String, Object>> energyRows = new ArrayList<>();
        String[] names = destColumns.toArray(new String[0]);
        String[] colours = new String[dests.size()];
        for (int i = 0; i < colours.length; i++) {
            colours[i] = Palette.destination(dests.get(i));
        }
        List<BarChart.Bar> bars = new ArrayList<>();
        for (Figures f : c.pairs) {
            Energy e = f.estimate.energy();
            List<String> cells = new ArrayList<>();
            double[] parts = new double[dests.size()];
            for (int i = 0; i < parts.length; i++) {
                double uj = e.of(dests.get(i)) * 1e6;
                parts[i] = Double.isNaN(uj) ? 0 : uj; // a profile without energies draws no segment
                cells.add(Comparison.uj(e.of(dests.get(i))));
            }
            energyRows.add(Map.of("device", Html.text(f.device), "cells", cells, "total",
                    Comparison.uj(e.total())));
            bars.add(new BarChart.Bar(f.device, f.device + " (" + f.profile().name() + ")", parts, colours, names,
                    false));
        }
        v.put("energyRows", energyRows);
        List<Chart.Entry> legend = new ArrayList<>();
        for (int i = 0; i < names.length; i++) {
            legend.add(new Chart.Entry(names[i], colours[i]));
        }
        v.put("legend", legend);
        v.put("chart", BarChart.draw("chart-compare", "Energy per frame in µJ per device, stacked by destination",
                bars, "µJ"));
        StringWriter out = new StringWriter(16 * 1024);
        TEMPLATE.execute(out, v);
        return out.toString();
    }

    /** The console block: per compared model, one line per device. */
    static String console(GateResult result) {
        StringBuilder b = new StringBuilder();
        for (Comparison c : Comparison.of(result)) {
            b.append(ConsoleReport.plain(c.model)).append(" on ").append(c.pairs.size()).append(" devices\n");
            List<String> heads = new ArrayList<>();
            for (String[] col : Comparison.COLUMNS) {
                heads.add((isNumber(col[0]) ? ">" : "") + col[1]);
            }
            TextTable t = new TextTable(heads.toArray(new String[0]));
            for (Figures f : c.pairs) {
                Map<String, String> r = Comparison.row(f);
                List<String> cells = new ArrayList<>();
                for (String[] col : Comparison.COLUMNS) {
                    cells.add(ConsoleReport.plain(r.get(col[0])));
                }
                t.row(cells.toArray(new String[0]));
            }
            t.appendTo(b, "");
            b.append('\n');
        }
        return b.toString();
    }

    private static String resource(String name) {
        try (InputStream in = ComparisonReport.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new IllegalStateException("missing resource " + name);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
