package dev.erg.report;

import com.fasterxml.jackson.core.JsonEncoding;
import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import dev.erg.budget.Check;
import dev.erg.budget.LayerShare;
import dev.erg.explore.Advice;
import dev.erg.explore.Candidate;
import dev.erg.format.Numbers;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * The report files of the ways to meet a failed budget ({@code STEM.ways.json}, {@code STEM.ways.html},
 * {@code STEM.ways.md}), under the heading {@value Advice#TITLE}: every candidate, ranked, with the
 * value of every budgeted metric after it, and the layers to slim.
 */
public final class AdviceReport {
    private static final JsonFactory FACTORY = JsonFactory.builder().build();

    private AdviceReport() {
    }

    /** Writes the requested formats of each advice, keyed by its pair's file stem; returns the files. */
    public static List<Path> write(Map<String, Advice> byStem, Path dir, Set<String> formats) {
        return ReportFiles.write(byStem, "ways", dir, formats, AdviceReport::json, AdviceReport::html, AdviceReport::markdown);
    }

    /**
     * {@code model}, {@code device}, {@code notice}, {@code failing} ([{check, value, limit}]),
     * {@code candidates} ([{rank, change, kind, meetsAll, gapClosed, fixed, broken, note, checks:
     * [{check, value, limit, verdict}]}]), {@code slim} ({by, layers: [{name, op, share}]}).
     */
    public static byte[] json(Advice a) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (JsonGenerator g = FACTORY.createGenerator(out, JsonEncoding.UTF8)) {
            g.setPrettyPrinter(new AnalysisJson.Printer());
            g.writeStartObject();
            g.writeStringField("model", a.model());
            g.writeStringField("device", a.device());
            g.writeStringField("notice", Advice.NOTICE);
            g.writeArrayFieldStart("failing");
            for (Check c : a.failing()) {
                check(g, c);
            }
            g.writeEndArray();
            g.writeArrayFieldStart("candidates");
            int rank = 1;
            for (Candidate c : a.candidates()) {
                g.writeStartObject();
                g.writeNumberField("rank", rank++);
                g.writeStringField("change", c.change());
                g.writeStringField("kind", c.kind());
                g.writeBooleanField("meetsAll", c.meetsAll());
                g.writeNumberField("gapClosed", c.gapClosed());
                g.writeNumberField("fixed", c.fixed());
                g.writeNumberField("broken", c.broken());
                if (c.note() != null) {
                    g.writeStringField("note", c.note());
                }
                g.writeArrayFieldStart("checks");
                for (Check k : c.checks()) {
                    check(g, k);
                }
                g.writeEndArray();
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeObjectFieldStart("slim");
            g.writeStringField("by", a.slimBy());
            g.writeArrayFieldStart("layers");
            for (LayerShare s : a.slim()) {
                g.writeStartObject();
                g.writeStringField("name", s.name());
                g.writeStringField("op", s.opType());
                g.writeNumberField("share", s.share());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeEndObject();
            g.writeEndObject();
        } catch (IOException x) {
            throw new UncheckedIOException(x);
        }
        out.write('\n');
        return out.toByteArray();
    }

    private static void check(JsonGenerator g, Check c) throws IOException {
        g.writeStartObject();
        g.writeStringField("check", c.key());
        g.writeNumberField("value", c.value());
        g.writeNumberField("limit", c.limit());
        g.writeStringField("verdict", c.verdict().label);
        g.writeEndObject();
    }

    /** The Markdown section: the candidates as a table, then the layers to slim. */
    public static String markdown(Advice a) {
        StringBuilder b = new StringBuilder("# ").append(Advice.TITLE).append(": ").append(a.model()).append(" on ")
                .append(a.device()).append("\n\n").append(Character.toUpperCase(Advice.NOTICE.charAt(0)))
                .append(Advice.NOTICE.substring(1)).append(". Failing:");
        for (Check c : a.failing()) {
            b.append("\n- ").append(c.message());
        }
        b.append("\n\n| # | change | outcome |");
        for (Check c : a.failing().isEmpty() ? List.<Check>of() : first(a).checks()) {
            b.append(' ').append(c.metric().label).append(" (").append(c.unit()).append(") |");
        }
        b.append("\n|---:|---|---|");
        for (int i = 0; a.failing().size() > 0 && i < first(a).checks().size(); i++) {
            b.append("---:|");
        }
        b.append('\n');
        int rank = 1;
        for (Candidate c : a.candidates()) {
            b.append("| ").append(rank++).append(" | ").append(c.change()).append(c.note() == null ? "" : " (" + c.note()
                    + ")").append(" | ").append(outcome(c)).append(" |");
            for (Check k : c.checks()) {
                b.append(' ').append(Numbers.sig(k.value())).append(k.passed() ? "" : " ✗").append(" |");
            }
            b.append('\n');
        }
        if (!a.slim().isEmpty()) {
            b.append("\nLayers to slim, by ").append(a.slimBy()).append(":\n\n");
            for (LayerShare s : a.slim()) {
                b.append("- ").append(s.name()).append(" (").append(s.opType()).append("): ")
                        .append(Numbers.percent(s.share())).append('\n');
            }
        }
        return b.toString();
    }

    private static Candidate first(Advice a) {
        return a.candidates().isEmpty() ? new Candidate("", "", List.of(), 0, 0, 0, null, null, null, null)
                : a.candidates().get(0);
    }

    private static String outcome(Candidate c) {
        String s = c.meetsAll() ? "meets every limit" : c.gapClosed() >= 1 ? "closes the gap alone"
                : "closes " + Numbers.percent(Math.max(-9.99, c.gapClosed())) + " of the gap";
        return c.broken() > 0 ? s + ", breaks " + c.broken() + " other" : s;
    }

    /** A plain page with the same content as the Markdown. */
    public static String html(Advice a) {
        StringBuilder b = new StringBuilder("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n<title>")
                .append(Svg.esc("erg: " + Advice.TITLE.toLowerCase() + ", " + a.model() + " on " + a.device()))
                .append("</title>\n<style>\n").append(CSS).append("</style>\n</head>\n<body>\n<main>\n<section id=\"ways\">\n<h2>")
                .append(Svg.esc(Advice.TITLE)).append("</h2>\n<p class=\"notice\">").append(Svg.esc(a.model() + " on "
                        + a.device() + ": " + Advice.NOTICE)).append(".</p>\n<ul class=\"checks\">\n");
        for (Check c : a.failing()) {
            b.append("<li class=\"bad\">").append(Svg.esc(c.message())).append("</li>\n");
        }
        b.append("</ul>\n<div class=\"scroll\"><table class=\"grid\">\n<thead><tr><th>#</th><th class=\"l\">change</th>"
                + "<th class=\"l\">outcome</th>");
        for (Check c : first(a).checks()) {
            b.append("<th>").append(Svg.esc(c.metric().label + " (" + c.unit() + ")")).append("</th>");
        }
        b.append("</tr></thead>\n<tbody>\n");
        int rank = 1;
        for (Candidate c : a.candidates()) {
            b.append("<tr><td>").append(rank++).append("</td><td class=\"l\">").append(Svg.esc(c.change()
                    + (c.note() == null ? "" : " (" + c.note() + ")"))).append("</td><td class=\"l\">")
                    .append(Svg.esc(outcome(c))).append("</td>");
            for (Check k : c.checks()) {
                b.append("<td>").append(Svg.esc(Numbers.sig(k.value()) + (k.passed() ? "" : " ✗"))).append("</td>");
            }
            b.append("</tr>\n");
        }
        b.append("</tbody>\n</table></div>\n");
        if (!a.slim().isEmpty()) {
            b.append("<p class=\"muted\">").append(Svg.esc("Layers to slim, by " + a.slimBy() + ":")).append("</p>\n<ul>\n");
            for (LayerShare s : a.slim()) {
                b.append("<li>").append(Svg.esc(s.name() + " (" + s.opType() + "): " + Numbers.percent(s.share())))
                        .append("</li>\n");
            }
            b.append("</ul>\n");
        }
        return b.append("</section>\n</main>\n</body>\n</html>\n").toString();
    }

    private static final String CSS = resource("report.css");

    private static String resource(String name) {
        try (InputStream in = AdviceReport.class.getResourceAsStream(name)) {
            if (in == null) {
                throw new IllegalStateException("missing resource " + name);
            }
            return new String(in.readAllBytes(), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
