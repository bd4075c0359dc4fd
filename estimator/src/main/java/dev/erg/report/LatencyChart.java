package dev.erg.report;

import dev.erg.estimate.Bound;
import dev.erg.estimate.NodeEstimate;
import java.util.ArrayList;
import java.util.List;

/** Latency per layer in µs, each bar coloured by what bounds the layer (compute, SRAM, DRAM). */
final class LatencyChart {
    private static final Bound[] BOUNDS = Bound.values();

    private LatencyChart() {
    }

    static Chart of(Figures f) {
        List<NodeEstimate> ranked = f.byLatency();
        String[] names = new String[BOUNDS.length];
        String[] colours = new String[BOUNDS.length];
        for (int i = 0; i < BOUNDS.length; i++) {
            names[i] = BOUNDS[i].label + "-bound";
            colours[i] = Palette.bound(BOUNDS[i]);
        }
        List<BarChart.Bar> bars = new ArrayList<>();
        int top = Math.min(BarChart.BARS, ranked.size());
        for (int i = 0; i < top; i++) {
            NodeEstimate n = ranked.get(i);
            double[] v = new double[BOUNDS.length];
            v[n.bound().ordinal()] = n.latencySeconds() * 1e6;
            bars.add(new BarChart.Bar(n.name(), n.name() + " (" + n.work().opType() + ")", v, colours, names, false));
        }
        if (ranked.size() > top) {
            double[] v = new double[BOUNDS.length];
            for (NodeEstimate n : ranked.subList(top, ranked.size())) {
                v[n.bound().ordinal()] += n.latencySeconds() * 1e6;
            }
            int k = ranked.size() - top;
            bars.add(new BarChart.Bar("others (" + k + " layers)", "the other " + k + " layers together, by bound", v,
                    colours, names, true));
        }
        // the legend names the bounds that occur
        List<Chart.Entry> legend = new ArrayList<>();
        for (int i = 0; i < BOUNDS.length; i++) {
            for (BarChart.Bar b : bars) {
                if (b.values()[i] > 0) {
                    legend.add(new Chart.Entry(names[i], colours[i]));
                    break;
                }
            }
        }
        return new Chart("chart-latency", BarChart.caption(ranked.size(), top, "latency"), legend,
                BarChart.draw("chart-latency", "Latency per layer in µs, coloured by its bound", bars, "µs"));
    }
}
