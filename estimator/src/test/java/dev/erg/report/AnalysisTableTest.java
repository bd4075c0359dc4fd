package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.analysis.Analyzer;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class AnalysisTableTest {
    @TempDir
    Path dir;

    private static List<String> lines(String s) {
        return Arrays.asList(s.split("\n", -1));
    }

    /** The node table: from the header row ("#  node ...") to the first blank line. */
    private static List<String> nodeTable(String s) {
        List<String> all = lines(s);
        int start = 0;
        while (!all.get(start).trim().startsWith("#")) {
            start++;
        }
        int end = start;
        while (!all.get(end).isEmpty()) {
            end++;
        }
        return all.subList(start, end);
    }

    @Test
    void sameModelGivesSameText() {
        Path model = ReportModels.convRelu(dir.resolve("tiny.onnx"));
        String a = AnalysisTable.render(Analyzer.analyze(model, Map.of("batch", 1L)));
        String b = AnalysisTable.render(Analyzer.analyze(model, Map.of("batch", 1L)));
        assertEquals(a, b);
    }

    @Test
    void plainTextWithoutTrailingBlanks() {
        String s = AnalysisTable.render(ReportModels.analyzeConvRelu(dir.resolve("tiny.onnx")));
        assertFalse(s.contains("\r"));
        assertFalse(s.contains("\u001b"), "no terminal colour codes");
        assertFalse(s.contains("\t"));
        for (String line : lines(s)) {
            assertFalse(line.endsWith(" "), "'" + line + "'");
        }
        assertTrue(s.endsWith("\n"));
    }

    @Test
    void headerTableAndTotals() {
        Path model = dir.resolve("tiny.onnx");
        String s = AnalysisTable.render(ReportModels.analyzeConvRelu(model));
        String first = lines(s).get(0);
        assertTrue(first.contains(model.toString()), first);
        assertTrue(first.contains("producer: erg-writer 0.1"), first);
        assertTrue(first.contains("opset: 13"), first);
        assertTrue(s.contains("dims: batch=1\n"), s);
        assertTrue(s.contains("All 2 nodes by MACs"), s);
        List<String> table = nodeTable(s);
        String header = table.get(0);
        for (String col : new String[] {"node", "op", "output shape", "MACs", "vector ops", "weights", "in", "out",
            "precision"}) {
            assertTrue(header.contains(col), header);
        }
        // Rank 1 is the Conv: 6,912 MACs (see ReportModels), 432 B of weights, 768 B in, 1 KiB out.
        String conv = table.get(1);
        assertTrue(conv.matches("\\s*1\\s+conv\\s+Conv\\s+1x4x8x8\\s+6\\.91k\\s+0\\s+432 B\\s+768 B\\s+1 KiB\\s+fp32"),
                conv);
        String relu = table.get(2);
        assertTrue(relu.matches("\\s*2\\s+relu\\s+Relu\\s+1x4x8x8\\s+0\\s+256\\s+0 B\\s+1 KiB\\s+1 KiB\\s+fp32"),
                relu);
        assertTrue(s.contains("(6,912)"), s);
        assertTrue(s.matches("(?s).*\\n  nodes\\s+2  \\(0 folded, 0 views\\)\\n.*"), s);
        assertTrue(s.contains("Unmodelled operators: none\n"), s);
        assertTrue(s.contains("Unresolved operators: none\n"), s);
        assertTrue(s.contains(AnalysisJson.NOTICE), s);
    }

    @Test
    void columnsAreAligned() {
        ModelWorkload w = ReportModels.chain(dir.resolve("chain.onnx"), 12, 5, null);
        List<String> table = nodeTable(AnalysisTable.render(w));
        String header = table.get(0);
        int macsEnd = header.indexOf("MACs") + "MACs".length();
        int precision = header.indexOf("precision");
        int node = header.indexOf("node");
        for (String row : table.subList(1, table.size())) {
            assertEquals(' ', row.charAt(macsEnd), row); // right-aligned: each count ends under "MACs"
            assertTrue(row.charAt(macsEnd - 1) != ' ', row);
            assertEquals("fp32", row.substring(precision), row); // left-aligned under "precision"
            assertTrue(row.charAt(node) != ' ' && row.charAt(node - 1) == ' ', row);
        }
    }

    @Test
    void topNodesByMacsWithTiesInTopologicalOrder() {
        ModelWorkload w = ReportModels.chain(dir.resolve("chain.onnx"), 20, 7, null);
        String s = AnalysisTable.render(w);
        assertTrue(s.contains("Top 15 of 20 nodes by MACs"), s);
        List<String> table = nodeTable(s);
        assertEquals(1 + AnalysisTable.DEFAULT_TOP, table.size());
        // mm7 has 2*8*8 = 128 MACs, the others 1*8*8 = 64: mm7 first, then mm0, mm1, ... in file order.
        List<String> names = table.subList(1, table.size()).stream().map(r -> r.trim().split("\\s+")[1]).toList();
        assertEquals(List.of("mm7", "mm0", "mm1", "mm2", "mm3", "mm4", "mm5", "mm6", "mm8", "mm9", "mm10", "mm11",
                "mm12", "mm13", "mm14"), names);
        assertTrue(table.get(1).contains(" 128 "), table.get(1));

        String three = AnalysisTable.render(w, 3);
        assertTrue(three.contains("Top 3 of 20 nodes by MACs"), three);
        assertEquals(4, nodeTable(three).size());
        assertTrue(AnalysisTable.render(w, 0).contains("No nodes listed (top 0 of 20)."));
        assertTrue(AnalysisTable.render(w, 100).contains("All 20 nodes by MACs"));
        assertThrows(IllegalArgumentException.class, () -> AnalysisTable.render(w, -1));
    }

    @Test
    void longNamesAreShortenedWithAnEllipsis() {
        String longName = "/encoder/layers.11/self_attention/query_projection/MatMul_with_a_long_tail";
        ModelWorkload w = ReportModels.chain(dir.resolve("chain.onnx"), 2, -1, longName);
        String s = AnalysisTable.render(w);
        assertFalse(s.contains(longName));
        String shown = AnalysisTable.shorten(longName, AnalysisTable.NAME_WIDTH);
        assertEquals(AnalysisTable.NAME_WIDTH, shown.length());
        assertTrue(shown.contains("..."), shown);
        assertTrue(longName.startsWith(shown.substring(0, shown.indexOf("..."))), shown);
        assertTrue(longName.endsWith(shown.substring(shown.indexOf("...") + 3)), shown);
        assertTrue(s.contains(shown), s);
        assertEquals("short", AnalysisTable.shorten("short", AnalysisTable.NAME_WIDTH));
    }

    @Test
    void unmodelledAndUnresolvedAreListed() {
        String s = AnalysisTable.render(ReportModels.incomplete(dir.resolve("partial.onnx")));
        assertTrue(s.contains("Unmodelled operators: Alpha x1, Zeta x1, com.example.Custom x1\n"), s);
        assertTrue(s.contains("Unresolved operators: Relu x1\n"), s);
        assertTrue(s.contains(" ? "), "an unknown output shape shows as ?: " + s);
    }

    @Test
    void humanUnits() {
        // Decimal prefixes for counts (SI: k = 10^3, M = 10^6, G = 10^9); binary prefixes for bytes
        // (IEC 80000-13: KiB = 2^10, MiB = 2^20 bytes).
        // One rule for every number (dev.erg.format.Numbers): three significant digits, trailing
        // zeros dropped, the whole part never rounded away; counts and sizes take their prefix first.
        assertEquals("0", Format.count(0));
        assertEquals("999", Format.count(999));
        assertEquals("1k", Format.count(1000));
        assertEquals("6.91k", Format.count(6912));
        assertEquals("1M", Format.count(999_999)); // 999.999k would need four digits: the next unit
        assertEquals("116M", Format.count(115_605_504));
        assertEquals("1.81G", Format.count(1_814_073_344L));
        assertEquals("9.22E", Format.count(Long.MAX_VALUE));
        assertEquals("1023 B", Format.bytes(1023));
        assertEquals("1 KiB", Format.bytes(1024));
        assertEquals("1.5 KiB", Format.bytes(1536));
        assertEquals("0.977 MiB", Format.bytes(1000 * 1024 + 512)); // 1000.5 KiB would need four digits
        assertEquals("44.6 MiB", Format.bytes(46_723_488)); // 46,723,488 / 2^20 = 44.56
        assertEquals("2 GiB", Format.bytes(1L << 31));
        assertEquals("1,814,073,344", Format.exact(1_814_073_344L));
        assertEquals("999", Format.exact(999));
        assertEquals("1,000", Format.exact(1000));
        assertEquals("-1,000", Format.exact(-1000));
        assertEquals("9,223,372,036,854,775,807", Format.exact(Long.MAX_VALUE));
        assertEquals("0.05", Format.sig(0.049999)); // rounds half up to three significant digits
        assertEquals("1.05", Format.sig(1.05));
        assertEquals("10", Format.sig(9.996)); // 9.996 rounds up into the next width
        assertEquals("100", Format.sig(99.96));
        assertEquals("286", Format.sig(286.136));
        assertEquals("13383", Format.sig(13383.3)); // the whole part is kept
        assertEquals("unbounded", Format.sig(Double.POSITIVE_INFINITY));
        assertEquals("1x64x56x56", Format.shape(new long[] {1, 64, 56, 56}));
        assertEquals("scalar", Format.shape(new long[0]));
        assertEquals("?", Format.shape(null));
    }
}
