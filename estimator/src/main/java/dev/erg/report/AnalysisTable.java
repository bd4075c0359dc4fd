package dev.erg.report;

import dev.erg.workload.ModelInfo;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Map;

/**
 * A plain-text console rendering of a {@link ModelWorkload}: a header with the model, the nodes with
 * the most MACs, the totals and what erg could not model. No colours, "\n" line ends, no trailing
 * blanks, columns aligned with spaces.
 */
public final class AnalysisTable {
    /** How many nodes the table lists unless told otherwise. */
    public static final int DEFAULT_TOP = 15;
    /** Node names longer than this are shortened in the middle with "...". */
    static final int NAME_WIDTH = 32;

    private AnalysisTable() {
    }

    public static String render(ModelWorkload w) {
        return render(w, DEFAULT_TOP);
    }

    /** The table with the {@code top} nodes of most MACs (ties in topological order). */
    public static String render(ModelWorkload w, int top) {
        if (top < 0) {
            throw new IllegalArgumentException("top must be 0 or more, not " + top);
        }
        StringBuilder out = new StringBuilder();
        header(out, w);
        out.append('\n');
        nodes(out, w, top);
        out.append('\n');
        totals(out, w);
        out.append('\n').append(AnalysisJson.NOTICE).append('\n');
        return out.toString();
    }

    private static void header(StringBuilder out, ModelWorkload w) {
        ModelInfo m = Format.model(w);
        String producer = (m.producer() + " " + m.producerVersion()).trim();
        out.append("model: ").append(m.file() == null ? "?" : m.file().toString())
                .append("  ").append("producer: ").append(producer.isEmpty() ? "(none)" : producer)
                .append("  ").append("opset: ").append(m.defaultOpset());
        if (m != null) {
            out.append("  ").append("IR: ").append(m.irVersion());
        }
        out.append('\n');
        Map<String, Long> dims = Format.dims(w);
        if (!dims.isEmpty()) {
            StringBuilder d = new StringBuilder();
            for (Map.Entry<String, Long> e : dims.entrySet()) {
                d.append(d.length() == 0 ? "" : ", ").append(e.getKey()).append('=').append(e.getValue());
            }
            out.append("dims: ").append(d).append('\n');
        }
        dev.erg.graph.InputBindings b = w.graph() == null ? dev.erg.graph.InputBindings.NONE : w.graph().bindings();
        if (!b.shapes().isEmpty() || !b.values().isEmpty()) {
            out.append("inputs bound: ").append(new dev.erg.graph.InputBindings(Map.of(), b.shapes(), b.values()).describe())
                    .append('\n');
        }
    }

    /** The nodes ranked by MACs, most first; the sort is stable, so ties keep their topological order. */
    static List<NodeWork> ranked(ModelWorkload w, int top) {
        List<NodeWork> all = new ArrayList<>(w.nodes());
        all.sort(Comparator.comparingLong(NodeWork::macs).reversed());
        return all.subList(0, Math.min(top, all.size()));
    }

    private static void nodes(StringBuilder out, ModelWorkload w, int top) {
        List<NodeWork> shown = ranked(w, top);
        int total = w.nodes().size();
        if (shown.isEmpty()) {
            out.append(total == 0 ? "The graph has no nodes.\n" : "No nodes listed (top 0 of " + total + ").\n");
            return;
        }
        out.append(shown.size() == total ? "All " + total + " nodes" : "Top " + shown.size() + " of " + total + " nodes")
                .append(" by MACs\n");
        TextTable t = new TextTable(">#", "node", "op", "output shape", ">MACs", ">vector ops", ">weights", ">in", ">out",
                "precision");
        int rank = 0;
        for (NodeWork n : shown) {
            t.row(Integer.toString(++rank), shorten(n.name(), NAME_WIDTH), n.opType(), outputShape(n),
                    Format.count(n.macs()), Format.count(n.vectorOps()), Format.bytes(n.weightBytes()),
                    Format.bytes(n.inputBytes()), Format.bytes(n.outputBytes()), n.precision());
        }
        t.appendTo(out, "");
    }

    private static void totals(StringBuilder out, ModelWorkload w) {
        out.append("Totals\n");
        TextTable t = new TextTable("", ">", "");
        t.row("MACs", Format.count(w.macs()), "(" + Format.exact(w.macs()) + ")");
        t.row("vector ops", Format.count(w.vectorOps()), "(" + Format.exact(w.vectorOps()) + ")");
        t.row("weights", Format.bytes(w.weightBytes()), "(" + Format.exact(w.weightBytes()) + " bytes)");
        t.row("peak activations", Format.bytes(w.peakActivationBytes()),
                "(" + Format.exact(w.peakActivationBytes()) + " bytes)");
        t.row("nodes", Integer.toString(w.nodes().size()),
                "(" + Format.countKind(w, Kind.FOLDED) + " folded, " + plural(Format.countKind(w, Kind.VIEW), "view") + ")");
        t.appendBodyTo(out, "  ");
        out.append("Unmodelled operators: ").append(opCounts(w.unmodelled())).append('\n');
        out.append("Unresolved operators: ").append(opCounts(w.unresolved())).append('\n');
    }

    private static String plural(int n, String word) {
        return n + " " + word + (n == 1 ? "" : "s");
    }

    private static String opCounts(Map<String, Integer> sorted) {
        if (sorted.isEmpty()) {
            return "none";
        }
        StringBuilder b = new StringBuilder();
        for (Map.Entry<String, Integer> e : sorted.entrySet()) {
            b.append(b.length() == 0 ? "" : ", ").append(e.getKey()).append(" x").append(e.getValue());
        }
        return b.toString();
    }

    /** The first output's shape, with "+N" when the node has N more outputs. */
    private static String outputShape(NodeWork n) {
        List<long[]> s = n.outputShapes();
        if (s.isEmpty()) {
            return "-";
        }
        String first = Format.shape(s.get(0));
        return s.size() == 1 ? first : first + " +" + (s.size() - 1);
    }

    /** {@code s} cut to {@code width} characters by replacing its middle with "...". */
    static String shorten(String s, int width) {
        if (s.length() <= width) {
            return s;
        }
        int keep = width - 3;
        int head = keep / 3;
        int tail = keep - head;
        return s.substring(0, head) + "..." + s.substring(s.length() - tail);
    }
}
