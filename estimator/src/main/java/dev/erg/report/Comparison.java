package dev.erg.report;

import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import dev.erg.budget.Verdict;
import dev.erg.device.Engine;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Energy;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * One model on every device of a run, side by side: the view that the comparison reports read
 * ({@link ComparisonReport}). Built from the pairs' own views ({@link Figures}), in the run's device
 * order. Read-only.
 */
final class Comparison {
    /** The model as configured. */
    final String model;
    /** One view per device the model ran on, in run order. */
    final List<Figures> pairs;

    private Comparison(String model, List<Figures> pairs) {
        this.model = model;
        this.pairs = List.copyOf(pairs);
    }

    /** Every model of {@code result} that ran on two devices or more, in run order. */
    static List<Comparison> of(GateResult result) {
        Map<String, List<Figures>> byModel = new LinkedHashMap<>();
        for (PairResult p : result.pairs()) {
            byModel.computeIfAbsent(p.model(), k -> new ArrayList<>()).add(Figures.of(p));
        }
        List<Comparison> out = new ArrayList<>();
        for (Map.Entry<String, List<Figures>> e : byModel.entrySet()) {
            if (e.getValue().size() > 1) {
                out.add(new Comparison(e.getKey(), e.getValue()));
            }
        }
        return out;
    }

    /** The model's file name, without folders. */
    String modelName() {
        return pairs.get(0).modelName();
    }

    /** The file-name stem of the comparison files: the model's stem and {@code compare}. */
    String stem() {
        return Reports.compareStem(model);
    }

    /** The destinations any of the devices lists, in report order. */
    List<Energy.Destination> destinations() {
        List<Energy.Destination> out = new ArrayList<>();
        for (Energy.Destination d : Energy.Destination.values()) {
            for (Figures f : pairs) {
                if (f.destinations().contains(d)) {
                    out.add(d);
                    break;
                }
            }
        }
        return out;
    }

    /** The row of one device: its figures as text, keyed by column. */
    static Map<String, String> row(Figures f) {
        DeviceEstimate e = f.estimate;
        Map<String, String> r = new LinkedHashMap<>();
        r.put("device", f.device);
        r.put("name", f.profile().name());
        Engine a = f.macEngine();
        r.put("engine", a == null ? "-" : a.kind().key);
        // A profile that prices no energy gives NaN energies: those cells say "n/a", as Numbers.sig does.
        boolean priced = !Double.isNaN(e.energyPerFrameJoules());
        boolean macs = e.workload().macs() > 0;
        r.put("energyPerMac", !macs ? "-" : priced ? Format.sig(e.energyPerMacJoules() * 1e15) + " fJ" : "n/a");
        r.put("topsPerWatt", !macs ? "-" : priced ? Format.sig(e.opsPerWatt() / 1e12) : "n/a");
        r.put("utilisation", macs ? Format.percent(e.macUtilization()) : "-");
        r.put("dominant", priced ? Figures.label(e.energy().dominant()) : "n/a");
        r.put("maxFps", Format.sig(e.maxFps()) + " fps");
        r.put("power", priced ? Format.sig(f.averagePowerWatts() * 1e3) + " mW at " + Format.sig(f.fps) + " fps" : "n/a");
        r.put("energyPerFrame", priced ? Format.sig(e.energyPerFrameJoules() * 1e6) + " µJ" : "n/a");
        r.put("weights", f.estimate.weightsReloadedEachFrame() ? "reloaded every frame"
                : f.weightsInCells() ? "in the macro cells" : e.weightsResident() ? "resident in SRAM"
                : "streamed from DRAM");
        r.put("verdict", verdict(f));
        return r;
    }

    /** An energy in µJ ("n/a" when the profile prices none). */
    static String uj(double joules) {
        return Format.sig(joules * 1e6);
    }

    /** The pair's verdict in a word: PASS, AT RISK, FAIL, or "not checked". */
    static String verdict(Figures f) {
        if (f.pair == null || f.pair.checks().isEmpty()) {
            return "not checked";
        }
        Verdict v = f.pair.verdict();
        return v == Verdict.FAIL ? "FAIL" : v == Verdict.AT_RISK ? "AT RISK" : "PASS";
    }

    /** The column headings of {@link #row}, in order. */
    static final String[][] COLUMNS = {{"device", "device"}, {"engine", "MAC engine"},
        {"energyPerMac", "energy per MAC"}, {"topsPerWatt", "TOPS/W"}, {"utilisation", "utilisation"},
        {"dominant", "dominant"}, {"maxFps", "max frame rate"}, {"power", "average power"},
        {"energyPerFrame", "energy per frame"}, {"weights", "weights"}, {"verdict", "verdict"}};
}
