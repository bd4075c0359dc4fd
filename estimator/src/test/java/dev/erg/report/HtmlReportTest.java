package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import java.io.ByteArrayInputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import javax.xml.parsers.DocumentBuilderFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;

/**
 * The HTML page. Escaping is checked against the character references of the HTML standard (decoded
 * here, independently of the template engine): what a browser shows must be the name or message
 * verbatim, and no markup from a name may reach the page.
 */
class HtmlReportTest {
    @TempDir
    Path dir;

    private static String page(GateResult r) {
        return HtmlReport.render(r, r.pairs().get(0));
    }

    private static int count(String haystack, String needle) {
        int n = 0;
        for (int i = haystack.indexOf(needle); i >= 0; i = haystack.indexOf(needle, i + 1)) {
            n++;
        }
        return n;
    }

    /** The inline svg with {@code id}, parsed as XML: proves it is well formed (every name escaped). */
    private static Document svg(String html, String id) throws Exception {
        Matcher m = Pattern.compile("<svg id=\"" + id + "\".*?</svg>", Pattern.DOTALL).matcher(html);
        assertTrue(m.find(), "no svg " + id);
        String xml = m.group();
        assertFalse(m.find(), "two svgs with id " + id);
        return DocumentBuilderFactory.newInstance().newDocumentBuilder()
                .parse(new ByteArrayInputStream(xml.getBytes(StandardCharsets.UTF_8)));
    }

    /**
     * Text as a browser shows it: the character references of the HTML standard decoded (the five
     * named ones the page uses, decimal and hexadecimal numeric ones). Written here so that the test
     * does not take the writer's own escaping as its oracle.
     */
    static String decode(String html) {
        Matcher m = Pattern.compile("&(amp|lt|gt|quot|apos|#[0-9]+|#x[0-9a-fA-F]+);").matcher(html);
        StringBuilder b = new StringBuilder();
        while (m.find()) {
            String ref = m.group(1);
            String c;
            switch (ref) {
                case "amp" -> c = "&";
                case "lt" -> c = "<";
                case "gt" -> c = ">";
                case "quot" -> c = "\"";
                case "apos" -> c = "'";
                default -> c = new String(Character.toChars(ref.startsWith("#x")
                        ? Integer.parseInt(ref.substring(2), 16) : Integer.parseInt(ref.substring(1))));
            }
            m.appendReplacement(b, Matcher.quoteReplacement(c));
        }
        m.appendTail(b);
        return b.toString();
    }

    /** The decoded texts of every match of group 1 of {@code regex}. */
    private static java.util.List<String> texts(String html, String regex) {
        java.util.List<String> out = new java.util.ArrayList<>();
        Matcher m = Pattern.compile(regex, Pattern.DOTALL).matcher(html);
        while (m.find()) {
            out.add(decode(m.group(1)));
        }
        return out;
    }

    private static int bars(Document svg) {
        int n = 0;
        NodeList gs = svg.getElementsByTagName("g");
        for (int i = 0; i < gs.getLength(); i++) {
            if (((Element) gs.item(i)).getAttribute("class").startsWith("bar")) {
                n++;
            }
        }
        return n;
    }

    @Test
    void thePageHasTheVerdictEveryCheckTheNoticeAndThreeCharts() throws Exception {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4), Gates.mixed());
        String html = page(r);
        assertTrue(html.startsWith("<!DOCTYPE html>\n<html lang=\"en\">"), html.substring(0, 40));
        assertTrue(html.endsWith("</html>\n"));
        assertTrue(html.contains("<div class=\"verdict fail\" id=\"verdict\">FAIL</div>"));
        java.util.List<String> shown = texts(html, "<li class=\"(?:ok|bad|risk)\"><span class=\"pill\">[^<]*</span>"
                + " <span class=\"kind\">[^<]*</span> ([^<]*)</li>");
        java.util.List<String> messages = new java.util.ArrayList<>();
        for (Check c : r.pairs().get(0).checks()) {
            messages.add(c.message());
        }
        assertEquals(messages, shown, "every check's message, verbatim once decoded, in order");
        assertEquals(java.util.List.of(AnalysisJson.NOTICE),
                texts(html, "<p class=\"notice\" id=\"notice\"><strong>Analytical estimate.</strong> ([^<]*)</p>"));
        for (String id : new String[] {"checks", "totals", "energy", "latency", "roofline", "layers", "diff",
                "assumptions"}) {
            assertEquals(1, count(html, "<section id=\"" + id + "\">"), id);
        }
        // Two layers: the Conv and its fused Relu, one bar each, no "others" bar.
        assertEquals(2, bars(svg(html, "chart-energy")));
        assertEquals(2, bars(svg(html, "chart-latency")));
        // One MAC layer on the roofline.
        assertEquals(1, svg(html, "chart-roofline").getElementsByTagName("circle").getLength());
        assertFalse(html.contains("others ("));
    }

    @Test
    void thePageLoadsNothingFromAnywhere() {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4), Gates.mixed());
        String html = page(r).toLowerCase(java.util.Locale.ROOT);
        for (String s : new String[] {"<script", "<link", "<img", "<iframe", "<object", "<embed", "src=", "href=",
                "url(", "@import", "http:", "https:", "//"}) {
            assertFalse(html.contains(s), "the page contains " + s);
        }
        // The style is the packaged report.css, set inline.
        assertTrue(html.contains(":root{--ink:"), "the stylesheet is inline");
    }

    @Test
    void namesFromTheModelAreEscaped() throws Exception {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("h.onnx"), Gates.HOSTILE, "relu", 4), Gates.mixed());
        String html = page(r);
        assertFalse(html.contains("<script"), "raw markup from a node name");
        assertFalse(html.contains("\"q\""), "a raw quote from a node name");
        // The layer table's title attribute shows the name verbatim once decoded.
        assertTrue(texts(html, "<td class=\"l name\" title=\"([^\"]*)\">").contains(Gates.HOSTILE));
        // Each chart is well-formed XML (parsed by the JDK's parser), and its tooltips carry the name
        // verbatim: the bar tooltips "NAME (Conv): ...", the roofline dot "NAME (Conv): ...".
        for (String id : new String[] {"chart-energy", "chart-latency", "chart-roofline"}) {
            NodeList titles = svg(html, id).getElementsByTagName("title");
            int carrying = 0;
            for (int i = 0; i < titles.getLength(); i++) {
                if (titles.item(i).getTextContent().startsWith(Gates.HOSTILE + " (Conv): ")) {
                    carrying++;
                }
            }
            assertTrue(carrying >= 1, id + ": no tooltip names the layer verbatim");
        }
    }

    @Test
    void oneLayerDrawsOneBarAndOneDot() throws Exception {
        GateResult r = Gates.gate(Gates.single(dir.resolve("one.onnx")), Budget.none());
        String html = page(r);
        assertEquals(1, bars(svg(html, "chart-energy")));
        assertEquals(1, bars(svg(html, "chart-latency")));
        assertEquals(1, svg(html, "chart-roofline").getElementsByTagName("circle").getLength());
        assertTrue(html.contains("All 1 layer, most energy first."));
        assertTrue(html.contains("id=\"verdict\">NOT CHECKED<"));
    }

    @Test
    void aThousandLayersAreCappedWithAnOthersBar() throws Exception {
        int n = 1200;
        GateResult r = Gates.gate(Gates.chain(dir.resolve("chain.onnx"), n), Budget.none());
        String html = page(r);
        int rest = n - HtmlReport.CHART_BARS;
        assertEquals(HtmlReport.CHART_BARS + 1, bars(svg(html, "chart-energy")));
        assertEquals(HtmlReport.CHART_BARS + 1, bars(svg(html, "chart-latency")));
        assertEquals(2, count(html, ">others (" + rest + " layers)</text>"));
        assertTrue(html.contains("The 20 layers of most energy out of 1200; the other 1180 are summed in the last bar."));
        assertEquals(HtmlReport.ROOFLINE_POINTS, svg(html, "chart-roofline").getElementsByTagName("circle").getLength());
        assertTrue(html.contains("The " + HtmlReport.ROOFLINE_POINTS + " layers with most MACs of 1200 are plotted."));
        assertEquals(HtmlReport.TABLE_ROWS, count(html.substring(html.indexOf("<section id=\"layers\">")), "<tr><td>"));
        assertTrue(html.length() < 400_000, "page of " + html.length() + " chars");
    }

    @Test
    void aModelWithNothingToRunStillRenders() throws Exception {
        GateResult r = Gates.gate(Gates.viewOnly(dir.resolve("v.onnx")), Budget.none());
        String html = page(r);
        assertEquals(0, bars(svg(html, "chart-energy")));
        assertTrue(html.contains("no MAC layer to plot"));
        assertTrue(html.contains("No layer runs on the device."));
    }

    @Test
    void theBaselineDiffIsListed() throws Exception {
        Path before = Files.createDirectories(dir.resolve("a")).resolve("m.onnx");
        Path after = Files.createDirectories(dir.resolve("b")).resolve("m.onnx");
        GateResult base = Gates.gate(Gates.convRelu(before, "conv", "relu", 4), Budget.none());
        GateResult r = Gates.gate(Gates.convRelu(after, "conv", "act", 8), Budget.none(),
                Baseline.of(base.pairs()), "erg-baseline.json", 10.0);
        String html = page(r);
        String diff = html.substring(html.indexOf("<section id=\"diff\">"), html.indexOf("<section id=\"assumptions\">"));
        assertTrue(diff.contains("Since erg-baseline.json: 1 added, 1 removed, 1 changed."), diff);
        // conv: 4 -> 8 filters, MACs 1*K*8*8*3*3*3 = 1,728 K: +6,912.
        assertTrue(diff.contains("<td class=\"l\">changed</td><td class=\"l name\" title=\"conv\">conv</td>"
                + "<td class=\"l\">Conv</td><td>+6,912</td>"), diff);
        assertTrue(diff.contains("<tr class=\"added\"><td class=\"l\">added</td><td class=\"l name\" title=\"act\">"));
        assertTrue(diff.contains("<tr class=\"removed\"><td class=\"l\">removed</td><td class=\"l name\" title=\"relu\">"));
        PairResult p = r.pairs().get(0);
        assertFalse(p.passed(), "MACs doubled against an allowed 10%");
    }

    @Test
    void theSameResultGivesTheSamePage() {
        Path model = Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4);
        String a = page(Gates.gate(model, Gates.mixed()));
        String b = page(Gates.gate(model, Gates.mixed()));
        assertEquals(a, b);
    }

    @Test
    void niceStepsAndDecades() {
        // 1-2-5 steps (common practice for chart axes, no single source).
        assertEquals(0.5, Svg.niceStep(0.31), 1e-12);
        assertEquals(2.0, Svg.niceStep(1.2), 1e-12);
        assertEquals(100.0, Svg.niceStep(71), 1e-9);
        assertEquals("0.01", Svg.decade(-2, ""));
        assertEquals("1", Svg.decade(0, ""));
        assertEquals("100", Svg.decade(2, ""));
        assertEquals("10G", Svg.decade(10, ""));
        assertEquals("12.5", Svg.px(12.46));
        assertEquals("3", Svg.px(2.96));
    }
}
