package dev.erg.report;

import java.util.ArrayList;
import java.util.List;

/** Columns of text for the console; a header starting with '>' marks a right-aligned column. */
final class TextTable {
    private static final String GAP = "  ";

    private final String[] headers;
    private final boolean[] right;
    private final List<String[]> rows = new ArrayList<>();

    TextTable(String... headers) {
        this.headers = new String[headers.length];
        this.right = new boolean[headers.length];
        for (int i = 0; i < headers.length; i++) {
            right[i] = headers[i].startsWith(">");
            this.headers[i] = right[i] ? headers[i].substring(1) : headers[i];
        }
    }

    void row(String... cells) {
        rows.add(cells);
    }

    private int[] widths(boolean withHeader) {
        int[] w = new int[headers.length];
        for (int i = 0; i < w.length; i++) {
            w[i] = withHeader ? headers[i].length() : 0;
            for (String[] r : rows) {
                w[i] = Math.max(w[i], r[i].length());
            }
        }
        return w;
    }

    void appendTo(StringBuilder out, String indent) {
        int[] w = widths(true);
        line(out, indent, headers, w);
        for (String[] r : rows) {
            line(out, indent, r, w);
        }
    }

    void appendBodyTo(StringBuilder out, String indent) {
        int[] w = widths(false);
        for (String[] r : rows) {
            line(out, indent, r, w);
        }
    }

    private void line(StringBuilder out, String indent, String[] cells, int[] w) {
        StringBuilder b = new StringBuilder(indent);
        for (int i = 0; i < cells.length; i++) {
            if (i > 0) {
                b.append(GAP);
            }
            String pad = " ".repeat(w[i] - cells[i].length());
            b.append(right[i] ? pad + cells[i] : cells[i] + pad);
        }
        int end = b.length();
        while (end > 0 && b.charAt(end - 1) == ' ') {
            end--;
        }
        out.append(b, 0, end).append('\n');
    }
}
