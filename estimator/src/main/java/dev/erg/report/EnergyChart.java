package dev.erg.report;

import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import java.util.ArrayList;
import java.util.List;

/** Energy per layer in µJ, each bar stacked by where the energy goes (compute, registers, SRAM, DRAM, static). */
final class EnergyChart {
    private EnergyChart() {
    }

    private static double[] parts(Energy e) {
        return new double[] {e.compute() * 1e6, e.registers() * 1e6, e.sram() * 1e6, e.dram() * 1e6,
                e.staticEnergy() * 1e6};
    }

    static Chart of(Figures f) {
        List<NodeEstimate> ranked = f.byEnergy();
        List<BarChart.Bar> bars = new ArrayList<>();
        int top = Math.min(BarChart.BARS, ranked.size());
        for (int i = 0; i < top; i++) {
            NodeEstimate n = ranked.get(i);
            bars.add(new BarChart.Bar(n.name(), n.name() + " (" + n.work().opType() + ")", parts(n.energy()),
                    Palette.DESTINATION_COLOURS, Palette.DESTINATIONS, false));
        }
        if (ranked.size() > top) {
            Energy rest = Energy.ZERO;
            for (NodeEstimate n : ranked.subList(top, ranked.size())) {
                rest = rest.plus(n.energy());
            }
            int k = ranked.size() - top;
            bars.add(new BarChart.Bar("others (" + k + " layers)", "the other " + k + " layers together", parts(rest),
                    Palette.DESTINATION_COLOURS, Palette.DESTINATIONS, true));
        }
        List<Chart.Entry> legend = new ArrayList<>();
        for (int i = 0; i < Palette.DESTINATIONS.length; i++) {
            legend.add(new Chart.Entry(Palette.DESTINATIONS[i], Palette.DESTINATION_COLOURS[i]));
        }
        return new Chart("chart-energy", BarChart.caption(ranked.size(), top, "energy"), legend,
                BarChart.draw("chart-energy", "Energy per layer in µJ, stacked by destination", bars, "µJ"));
    }
}
