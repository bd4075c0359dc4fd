package dev.erg.measure;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;

/** The console table of {@code erg measure}: the slowest nodes of a model, then its totals. */
final class TimingTable {
    private TimingTable() {
    }

    static String render(ModelTiming t, int top) {
        StringBuilder b = new StringBuilder();
        b.append(t.model()).append(" on ").append(t.host()).append(" (").append(t.runtime()).append(", ")
                .append(t.threads()).append(t.threads() == 1 ? " thread" : " threads")
                .append(", graph optimisations off)\n");
        List<NodeTiming> slow = new ArrayList<>(t.nodes());
        slow.sort(Comparator.comparingDouble(NodeTiming::medianMs).reversed().thenComparing(NodeTiming::name));
        int shown = Math.min(top, slow.size());
        if (shown > 0) {
            int w = "node".length();
            for (int i = 0; i < shown; i++) {
                w = Math.max(w, slow.get(i).name().length());
            }
            w = Math.min(w, 60);
            b.append(String.format(Locale.ROOT, "  %-" + w + "s  %-18s %11s %11s %7s%n", "node", "op", "median ms",
                    "p90 ms", "share"));
            double sum = t.nodeSumMs();
            for (int i = 0; i < shown; i++) {
                NodeTiming n = slow.get(i);
                String name = n.name().length() > w ? "..." + n.name().substring(n.name().length() - w + 3) : n.name();
                b.append(String.format(Locale.ROOT, "  %-" + w + "s  %-18s %11.4f %11.4f %6.1f%%%n", name, n.opType(),
                        n.medianMs(), n.p90Ms(), sum > 0 ? 100 * n.medianMs() / sum : 0));
            }
            if (slow.size() > shown) {
                b.append("  ... ").append(slow.size() - shown).append(" more nodes (all of them in --csv / --json)\n");
            }
        }
        b.append(String.format(Locale.ROOT, "  model: median %.3f ms, p90 %.3f ms over %d runs (after %d warm-up, %s clock);"
                + " %d nodes timed, their medians sum to %.3f ms%n", t.medianMs(), t.p90Ms(), t.runMs().length,
                t.warmups(), t.clock(), t.nodes().size(), t.nodeSumMs()));
        if (t.nodeSumMs() > 1.2 * t.medianMs()) {
            b.append(String.format(Locale.ROOT, "  note: the node medians sum to %.0f%% of the model's median: the"
                    + " machine was busier while the nodes were profiled; measure again on a quieter machine%n",
                    100 * t.nodeSumMs() / t.medianMs()));
        }
        return b.toString();
    }
}
