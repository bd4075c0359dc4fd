package dev.erg.report;

import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import java.util.ArrayList;
import java.util.List;

/**
 * Energy per layer in µJ, each bar stacked by where the energy goes: compute, registers, SRAM, DRAM,
 * static, and on analog and in-memory profiles conversion, cell writes and row drive
 * ({@link Figures#destinations()}).
 */
final class EnergyChart {
    private EnergyChart() {
    }

    private static double[] parts(Energy e, List<Energy.Destination> dests) {
        double[] out = new double[dests.size()];
        for (int i = 0; i < out.length; i++) {
            out[i] = e.of(dests.get(i)) * 1e6;
        }
        return out;
    }

    static Chart of(Figures f) {
        List<Energy.Destination> dests = f.destinations();
        String[] names = new String[dests.size()];
        String[] colours = new String[dests.size()];
        for (int i = 0; i < names.length; i++) {
            names[i] = Figures.label(dests.get(i));
            colours[i] = Palette.destination(dests.get(i));
        }
        List<NodeEstimate> ranked = f.byEnergy();
        List<BarChart.Bar> bars = new ArrayList<>();
        int top = Math.min(BarChart.BARS, ranked.size());
        for (int i = 0; i < top; i++) {
            NodeEstimate n = ranked.get(i);
            bars.add(new BarChart.Bar(n.name(), n.name() + " (" + n.work().opType() + ")", parts(n.energy(), dests),
                    colours, names, false));
        }
        if (ranked.size() > top) {
            Energy rest = Energy.ZERO;
            for (NodeEstimate n : ranked.subList(top, ranked.size())) {
                rest = rest.plus(n.energy());
            }
            int k = ranked.size() - top;
            bars.add(new BarChart.Bar("others (" + k + " layers)", "the other " + k + " layers together",
                    parts(rest, dests), colours, names, true));
        }
        List<Chart.Entry> legend = new ArrayList<>();
        for (int i = 0; i < names.length; i++) {
            legend.add(new Chart.Entry(names[i], colours[i]));
        }
        return new Chart("chart-energy", BarChart.caption(ranked.size(), top, "energy"), legend,
                BarChart.draw("chart-energy", "Energy per layer in µJ, stacked by destination", bars, "µJ"));
    }
}
