package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class MarkdownReportTest {
    @TempDir
    Path dir;

    private static String md(GateResult r) {
        return MarkdownReport.render(r, r.pairs().get(0));
    }

    /** Cell separators of a GFM table row: pipes not escaped with a backslash. */
    private static int pipes(String row) {
        int n = 0;
        for (int i = 0; i < row.length(); i++) {
            if (row.charAt(i) == '\\') {
                i++;
            } else if (row.charAt(i) == '|') {
                n++;
            }
        }
        return n;
    }

    /** The table that starts at the line {@code header}: header, delimiter and body rows. */
    private static List<String> table(String md, String header) {
        List<String> out = new ArrayList<>();
        boolean in = false;
        for (String line : md.split("\n", -1)) {
            if (line.equals(header)) {
                in = true;
            }
            if (in) {
                if (!line.startsWith("|")) {
                    break;
                }
                out.add(line);
            }
        }
        assertFalse(out.isEmpty(), "no table " + header + " in\n" + md);
        return out;
    }

    private static void assertRectangular(List<String> rows) {
        int cols = pipes(rows.get(0));
        for (String r : rows) {
            assertEquals(cols, pipes(r), r);
        }
    }

    @Test
    void verdictChecksTotalsLayersAndNotice() {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4), Gates.mixed());
        String md = md(r);
        assertTrue(md.startsWith("### erg: `tiny.onnx` on `test-device`: **FAIL**\n\n1 of 2 checks failed."), md);
        List<String> checks = table(md, "| | check | value | limit | message |");
        assertEquals(2 + 2, checks.size());
        assertRectangular(checks);
        List<Check> cs = r.pairs().get(0).checks();
        assertTrue(checks.get(2).startsWith("| **FAIL** | budget.frameRate | "), checks.get(2));
        assertTrue(checks.get(2).endsWith(" | " + MarkdownReport.text(cs.get(0).message()) + " |"));
        assertTrue(checks.get(3).startsWith("| ok | budget.latency | "), checks.get(3));
        assertRectangular(table(md, "| | | |"));
        assertTrue(md.contains("| latency | 0.00524 ms |"), md);
        List<String> layers = table(md, "| # | layer | op | precision | from | MACs | utilisation | latency µs | compute | registers | SRAM | DRAM"
                + " | static | total | share | bound |");
        assertEquals(2 + 2, layers.size());
        assertRectangular(layers);
        assertTrue(layers.get(2).startsWith("| 1 | `conv` | `Conv` | w8a8 | profile default | 6.91k | "), layers.get(2));
        assertTrue(md.contains("**Against the baseline**\n\nNo baseline is configured.\n"));
        assertTrue(md.endsWith("\n> " + MarkdownReport.text(AnalysisJson.NOTICE) + "\n"));
        assertFalse(md.contains("\r"));
    }

    @Test
    void topTenOfMore() {
        GateResult r = Gates.gate(Gates.chain(dir.resolve("chain.onnx"), 12), Budget.none());
        String md = md(r);
        assertTrue(md.contains("**Top 10 of 12 layers by energy**"), md);
        assertEquals(10 + 2, table(md, "| # | layer | op | precision | from | MACs | utilisation | latency µs | compute | registers | SRAM | DRAM"
                + " | static | total | share | bound |").size());
        assertTrue(md.startsWith("### erg: `chain.onnx` on `test-device`: **not checked**\n\nNo budget"), md);
    }

    @Test
    void pipesAndMarkupInNamesCannotBreakTheTables() {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("h.onnx"), Gates.HOSTILE, "relu", 4), Gates.mixed());
        String md = md(r);
        List<String> layers = table(md, "| # | layer | op | precision | from | MACs | utilisation | latency µs | compute | registers | SRAM | DRAM"
                + " | static | total | share | bound |");
        assertRectangular(layers);
        // In a code span: the pipe escaped, the backticks fenced by a longer run, markup shown as text.
        assertTrue(layers.get(2).startsWith("| 1 | `` <script>alert(1)</script> & \"q\" 'x' \\| `tick` `` | `Conv` |"),
                layers.get(2));
        List<String> checks = table(md, "| | check | value | limit | message |");
        assertRectangular(checks);
        // In prose (the check message): every markup character backslash-escaped.
        assertTrue(checks.get(2).contains("\\<script\\>alert(1)\\</script\\> \\& \"q\" 'x' \\| \\`tick\\`"),
                checks.get(2));
        for (String line : md.split("\n")) {
            assertFalse(line.contains("<script>") && !line.contains("`` <script>"), line);
        }
    }

    @Test
    void codeSpansAndEscapes() {
        assertEquals("`a`", MarkdownReport.code("a"));
        assertEquals("`a\\|b`", MarkdownReport.code("a|b"));
        assertEquals("`` a`b ``", MarkdownReport.code("a`b"));
        assertEquals("``` a``b ```", MarkdownReport.code("a``b"));
        assertEquals("a\\_b \\*c\\* \\[d\\](e) \\<f\\>", MarkdownReport.text("a_b *c* [d](e) <f>"));
        assertEquals("one two", MarkdownReport.text("one\ntwo"));
    }

    @Test
    void theBaselineDiffListsAddedRemovedAndChanged() throws Exception {
        Path before = Files.createDirectories(dir.resolve("a")).resolve("m.onnx");
        Path after = Files.createDirectories(dir.resolve("b")).resolve("m.onnx");
        GateResult base = Gates.gate(Gates.convRelu(before, "conv", "relu", 4), Budget.none());
        GateResult r = Gates.gate(Gates.convRelu(after, "conv", "act", 8), Budget.none(),
                Baseline.of(base.pairs()), "erg-baseline.json", 10.0);
        String md = md(r);
        assertTrue(md.contains("Since `erg-baseline.json`: 1 added, 1 removed, 1 changed (current minus baseline).\n"),
                md);
        List<String> diff = table(md, "| change | layer | op | MACs | energy µJ | latency µs |");
        assertEquals(3 + 2, diff.size());
        assertRectangular(diff);
        // conv: 4 -> 8 filters, MACs 1*K*8*8*3*3*3 = 1,728 K: +6,912; Relu had 0 MACs, so 0 either way.
        assertTrue(diff.get(2).startsWith("| changed | `conv` | `Conv` | +6,912 | +"), diff.get(2));
        assertTrue(diff.get(3).startsWith("| added | `act` | `Relu` | 0 | +"), diff.get(3));
        assertTrue(diff.get(4).startsWith("| removed | `relu` | `Relu` | 0 | -"), diff.get(4));
        assertTrue(md.contains("| **FAIL** | growth.macs | "), md);
    }

    @Test
    void aMissingBaselineIsNoted() {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4), Budget.none(), null,
                "src/erg/baseline.json", 5.0);
        assertTrue(md(r).contains("No baseline at src/erg/baseline.json: growth is not checked"), md(r));
    }

    @Test
    void theSameResultGivesTheSameText() {
        Path model = Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4);
        assertEquals(md(Gates.gate(model, Gates.mixed())), md(Gates.gate(model, Gates.mixed())));
    }
}
