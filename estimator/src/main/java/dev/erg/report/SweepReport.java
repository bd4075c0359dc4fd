package dev.erg.report;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import com.github.mustachejava.DefaultMustacheFactory;
import com.github.mustachejava.Mustache;
import dev.erg.budget.BudgetRule;
import dev.erg.budget.BudgetRules;
import dev.erg.budget.Check;
import dev.erg.explore.Polynomial;
import dev.erg.explore.Sweep;
import dev.erg.explore.SweepMetric;
import dev.erg.explore.SweepPoint;
import dev.erg.format.Numbers;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.StringWriter;
import java.io.UncheckedIOException;
import java.math.BigInteger;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.hipparchus.fraction.BigFraction;

/**
 * The report files of a sweep ({@code STEM.sweep.json}, {@code STEM.sweep.html}, {@code STEM.sweep.md}):
 * every point with its metrics and verdict, each metric's fitted polynomial, the ranges where limits
 * break and the value found. The HTML page draws one {@link SweepChart} per metric.
 */
public final class SweepReport {
    private static final JsonFactory FACTORY = JsonFactory.builder().build();
    private static final Mustache TEMPLATE = new DefaultMustacheFactory("dev/erg/report").compile("sweep.mustache");
    private static final String CSS = resource("report.css");

    private SweepReport() {
    }

    /** Writes the requested formats of each sweep, keyed by its file stem; returns the files written. */
    public static List<Path> write(Map<String, Sweep> byStem, Path dir, Set<String> formats) {
        Reports.checkFormats(formats);
        return ReportFiles.write(byStem, "sweep", dir, formats, SweepReport::json, SweepReport::html, SweepReport::markdown);
    }

    /**
     * The JSON document: {@code model}, {@code device}, {@code dimension}, {@code range} (from, to,
     * step or factor), {@code budget}, {@code points} ([{value, macs, weightBytes, activationBytes,
     * latencyMs, energyPerFrameUj, powerMw, verdict}]), {@code fits} ({metric: {degree, coefficients
     * (constant first; whole numbers exact), formula}} or null), {@code breaks}, {@code best},
     * {@code bestText}.
     */
    public static byte[] json(Sweep s) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (JsonGenerator g = FACTORY.createGenerator(out, JsonEncoding.UTF8)) {
            g.setPrettyPrinter(new AnalysisJson.Printer());
            g.writeStartObject();
            g.writeStringField("model", s.model());
            g.writeStringField("device", s.device());
            g.writeStringField("dimension", s.range().name());
            g.writeObjectFieldStart("range");
            g.writeNumberField("from", s.range().from());
            g.writeNumberField("to", s.range().to());
            if (s.range().geometric()) {
                g.writeNumberField("factor", s.range().factor());
            } else {
                g.writeNumberField("step", s.range().step());
            }
            g.writeEndObject();
            g.writeObjectFieldStart("budget");
            for (Map.Entry<String, Double> l : s.budget().limits().entrySet()) {
                g.writeNumberField(l.getKey(), l.getValue());
            }
            g.writeEndObject();
            g.writeArrayFieldStart("points");
            for (SweepPoint p : s.points()) {
                g.writeStartObject();
                g.writeNumberField("value", p.value());
                for (SweepMetric m : SweepMetric.values()) {
                    if (m.integer) {
                        g.writeNumberField(m.key, (long) p.metric(m));
                    } else {
                        g.writeNumberField(m.key, p.metric(m));
                    }
                }
                g.writeStringField("verdict", p.verdict().label);
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeObjectFieldStart("fits");
            for (SweepMetric m : SweepMetric.values()) {
                Polynomial f = s.fits().get(m);
                if (f == null) {
                    g.writeNullField(m.key);
                    continue;
                }
                g.writeObjectFieldStart(m.key);
                g.writeNumberField("degree", f.degree());
                g.writeArrayFieldStart("coefficients");
                for (BigFraction c : f.coefficients()) {
                    if (c.getDenominator().equals(BigInteger.ONE)) {
                        g.writeNumber(c.getNumerator());
                    } else {
                        g.writeNumber(c.doubleValue());
                    }
                }
                g.writeEndArray();
                g.writeStringField("formula", f.formula(s.range().name(), m.integer));
                g.writeEndObject();
            }
            g.writeEndObject();
            g.writeArrayFieldStart("breaks");
            for (String b : s.breaks()) {
                g.writeString(b);
            }
            g.writeEndArray();
            if (s.best() == null) {
                g.writeNullField("best");
            } else {
                g.writeNumberField("best", s.best());
            }
            g.writeStringField("bestText", s.bestText());
            g.writeEndObject();
        } catch (IOException x) {
            throw new UncheckedIOException(x);
        }
        out.write('\n');
        return out.toByteArray();
    }

    /** The Markdown: the fits, the broken ranges, the value found, and a table of every point. */
    public static String markdown(Sweep s) {
        StringBuilder b = new StringBuilder();
        String d = s.range().name();
        b.append("# Sweep of ").append(d).append(": ").append(s.model()).append(" on ").append(s.device())
                .append("\n\n");
        b.append("Each point is a computed estimate, not a measurement; ").append(s.range())
                .append(", ").append(s.points().size()).append(" points.\n\n");
        b.append("## Fitted formulas\n\n| metric | degree | formula |\n|---|---:|---|\n");
        for (SweepMetric m : SweepMetric.values()) {
            Polynomial f = s.fits().get(m);
            b.append("| ").append(m.label).append(" (").append(m.unit).append(") | ")
                    .append(f == null ? "–" : Integer.toString(f.degree())).append(" | ")
                    .append(s.formula(m)).append(" |\n");
        }
        b.append("\n## Limits\n\n");
        for (String line : s.breaks()) {
            b.append("- ").append(line).append('\n');
        }
        b.append("- ").append(s.bestText()).append("\n\n## Points\n\n| ").append(d)
                .append(" | MACs | weights | peak activations | latency ms | energy µJ | power mW | verdict |\n")
                .append("|---:|---:|---:|---:|---:|---:|---:|---|\n");
        for (SweepPoint p : s.points()) {
            b.append("| ").append(Numbers.exact(p.value())).append(" | ")
                    .append(Numbers.exact((long) p.metric(SweepMetric.MACS))).append(" | ")
                    .append(Numbers.bytes((long) p.metric(SweepMetric.WEIGHT_BYTES))).append(" | ")
                    .append(Numbers.bytes((long) p.metric(SweepMetric.ACTIVATION_BYTES))).append(" | ")
                    .append(Numbers.sig(p.metric(SweepMetric.LATENCY))).append(" | ")
                    .append(Numbers.sig(p.metric(SweepMetric.ENERGY_PER_FRAME))).append(" | ")
                    .append(Numbers.sig(p.metric(SweepMetric.POWER))).append(" | ")
                    .append(p.verdict().label).append(" |\n");
        }
        return b.toString();
    }

    /** The HTML page: one chart per metric with the budget line of the limit it carries. */
    public static String html(Sweep s) {
        Map<String, Object> v = new LinkedHashMap<>();
        String d = s.range().name();
        v.put("title", "erg sweep of " + d + ": " + s.model() + " on " + s.device());
        v.put("css", CSS);
        v.put("dimension", d);
        v.put("model", s.model());
        v.put("device", s.device());
        v.put("range", s.range().toString());
        v.put("count", s.points().size());
        v.put("verdict", s.passed() ? "every point passes" : "some points fail");
        v.put("verdictClass", s.passed() ? "pass" : "fail");
        v.put("breaks", s.breaks());
        v.put("best", s.bestText());
        List<Map<String, Object>> charts = new ArrayList<>();
        for (SweepMetric m : SweepMetric.values()) {
            Map<String, Object> c = new LinkedHashMap<>();
            Double line = null;
            String lineLabel = null;
            for (BudgetRule r : BudgetRules.RULES) {
                Double limit = s.budget().limit(r.key());
                if (limit != null && SweepMetric.forLimit(r.key()) == m) {
                    line = metricAtLimit(r.key(), limit);
                    lineLabel = r.key() + " " + Numbers.sig(limit) + " " + r.metric().unit;
                    break;
                }
            }
            c.put("heading", m.label + " (" + m.unit + ")");
            c.put("formula", s.formula(m));
            c.put("svg", SweepChart.draw(s, m, line, lineLabel));
            charts.add(c);
        }
        v.put("charts", charts);
        List<Map<String, Object>> rows = new ArrayList<>();
        for (SweepPoint p : s.points()) {
            Map<String, Object> r = new LinkedHashMap<>();
            r.put("value", Numbers.exact(p.value()));
            r.put("macs", Numbers.exact((long) p.metric(SweepMetric.MACS)));
            r.put("latency", Numbers.sig(p.metric(SweepMetric.LATENCY)));
            r.put("energy", Numbers.sig(p.metric(SweepMetric.ENERGY_PER_FRAME)));
            r.put("power", Numbers.sig(p.metric(SweepMetric.POWER)));
            r.put("verdict", p.verdict().label);
            List<String> failed = new ArrayList<>();
            for (Check ch : p.checks()) {
                if (!ch.passed()) {
                    failed.add(ch.metric().label);
                }
            }
            r.put("failed", String.join(", ", failed));
            rows.add(r);
        }
        v.put("rows", rows);
        StringWriter out = new StringWriter();
        TEMPLATE.execute(out, v);
        return out.toString();
    }

    /** A limit drawn in its metric's unit: a frame rate as the latency it allows, KiB as bytes. */
    private static double metricAtLimit(String key, double limit) {
        if (key.equals(BudgetRules.TARGET_FPS)) {
            return 1e3 / limit;
        }
        if (key.equals(BudgetRules.MAX_WEIGHT_KIB) || key.equals(BudgetRules.MAX_ACTIVATION_KIB)) {
            return limit * 1024;
        }
        return limit;
    }

    private static String resource(String name) {
        try (InputStream in = SweepReport.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new IllegalStateException("missing resource " + name);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
