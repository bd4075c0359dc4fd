package dev.erg.report;

import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import dev.erg.workload.Kind;
import java.util.ArrayList;
import java.util.List;

/**
 * The plain-text rendering of an estimate and of a gate result: per pair, the layers that cost most
 * energy, the totals and every check. No colours, "\n" line ends, no trailing blanks, columns
 * aligned with spaces; check messages verbatim.
 */
public final class ConsoleReport {
    /** How many layers the console lists per pair unless told otherwise. */
    public static final int DEFAULT_TOP = 10;

    private ConsoleReport() {
    }

    /** The gate result: every pair's table, totals and checks, then the verdict. */
    public static String gate(GateResult result, int top) {
        checkTop(top);
        StringBuilder b = new StringBuilder();
        int checks = 0;
        for (PairResult p : result.pairs()) {
            b.append(pair(p, top)).append('\n');
            checks += p.checks().size();
        }
        b.append(ComparisonReport.console(result));
        if (checks == 0) {
            b.append("erg: no budget and no baseline growth to check\n");
        } else {
            b.append(result.passed() ? "erg: all budgets hold\n" : "erg: " + result.failureMessage() + "\n");
            int risk = result.atRisk().size();
            b.append(risk == 0 ? "" : "erg: warning: " + risk + (risk == 1 ? " check is" : " checks are")
                    + " at risk: the limit lies inside the calibrated error band\n");
        }
        b.append(AnalysisJson.NOTICE).append('\n');
        return b.toString();
    }

    /** One pair: its table, totals, checks and verdict line. */
    static String pair(PairResult p, int top) {
        return pair(Figures.of(p), top);
    }

    /** As {@link #pair(PairResult, int)}, from the pair's view. */
    static String pair(Figures f, int top) {
        PairResult p = f.pair;
        StringBuilder b = new StringBuilder();
        pair(b, f, top);
        for (Check c : p.checks()) {
            b.append("  ").append(!c.passed() ? "FAIL " : c.verdict() == dev.erg.budget.Verdict.AT_RISK ? "RISK " : "ok   ").append(c.message()).append('\n');
        }
        b.append(verdict(p)).append('\n');
        return b.toString();
    }

    /** An estimate alone ({@code erg estimate}): the table and the totals; power at {@code fps} (null: back to back). */
    public static String estimate(DeviceEstimate e, Double fps, int top) {
        checkTop(top);
        dev.erg.workload.ModelInfo m = Format.model(e.workload());
        StringBuilder b = new StringBuilder();
        pair(b, Figures.of(m.file() == null ? "?" : m.file().toString(), e.device().id(), e, fps), top);
        b.append('\n').append(AnalysisJson.NOTICE).append('\n');
        return b.toString();
    }

    private static void checkTop(int top) {
        if (top < 0) {
            throw new IllegalArgumentException("top must be 0 or more, not " + top);
        }
    }

    private static String verdict(PairResult p) {
        int failed = 0;
        for (Check c : p.checks()) {
            failed += c.passed() ? 0 : 1;
        }
        if (p.checks().isEmpty()) {
            return "verdict: nothing checked";
        }
        return failed == 0 ? "verdict: pass (" + plural(p.checks().size(), "check") + ")"
                : "verdict: FAIL (" + failed + " of " + plural(p.checks().size(), "check") + " failed)";
    }

    static String plural(int n, String word) {
        return n + " " + word + (n == 1 ? "" : "s");
    }

    private static void pair(StringBuilder b, Figures f, int top) {
        DeviceEstimate e = f.estimate;
        b.append(f.model).append(" on ").append(f.device).append(" (").append(f.profile().name()).append(", ")
                .append(Format.sig(f.profile().clockMhz())).append(" MHz)\n");
        String bound = Format.bindings(e.workload());
        if (!bound.isEmpty()) {
            b.append("inputs bound: ").append(bound).append('\n');
        }
        List<NodeEstimate> ranked = f.byEnergy();
        List<NodeEstimate> shown = ranked.subList(0, Math.min(top, ranked.size()));
        if (f.layers.isEmpty()) {
            b.append("No layer runs on the device.\n");
        } else if (shown.isEmpty()) {
            b.append("No layers listed (top 0 of ").append(f.layers.size()).append(").\n");
        } else {
            b.append(shown.size() == ranked.size() ? "All " + plural(ranked.size(), "layer")
                    : "Top " + shown.size() + " of " + ranked.size() + " layers").append(" by energy (energy in µJ)\n");
            List<Energy.Destination> dests = f.destinations();
            boolean reload = e.weightsReloadedEachFrame();
            List<String> heads = new ArrayList<>(List.of(">#", "layer", "op", "precision", "from", ">MACs",
                    ">utilisation", ">latency µs"));
            for (Energy.Destination d : dests) {
                heads.add(">" + Figures.label(d));
            }
            heads.addAll(List.of(">total", ">share", "bound"));
            if (reload) {
                heads.add("weights");
            }
            TextTable t = new TextTable(heads.toArray(new String[0]));
            int rank = 0;
            for (NodeEstimate n : shown) {
                Energy en = n.energy();
                List<String> cells = new ArrayList<>(List.of(Integer.toString(++rank),
                        plain(AnalysisTable.shorten(n.name(), AnalysisTable.NAME_WIDTH)), plain(n.work().opType()),
                        precision(n), origin(n), Format.count(n.work().macs()), utilisation(n),
                        Format.sig(n.latencySeconds() * 1e6)));
                for (Energy.Destination d : dests) {
                    cells.add(uj(en.of(d)));
                }
                cells.addAll(List.of(uj(en.total()), Format.percent(f.energyShare(n)), bound(n)));
                if (reload) {
                    cells.add(n.weightsReloaded() ? "reloaded" : "");
                }
                t.row(cells.toArray(new String[0]));
            }
            t.appendTo(b, "");
        }
        b.append("Totals: latency ").append(Format.sig(e.latencySeconds() * 1e3)).append(" ms, max ")
                .append(Format.sig(e.maxFps())).append(" fps, ").append(Format.joules(e.energyPerFrameJoules()))
                .append(" per frame, ").append(Format.sig(f.averagePowerWatts() * 1e3)).append(" mW at ")
                .append(Format.sig(f.fps)).append(" fps\n");
        b.append("Energy: ").append(f.energySplit()).append('\n');
        long cap = f.profile().sram().capacityBytes();
        b.append("Memory: weights ").append(Format.bytes(e.weightBytes()))
                .append(e.weightsReloadedEachFrame() ? " reloaded into the in-memory macros every frame"
                        : f.weightsInCells() ? " in the in-memory macro cells"
                                + (e.weightsResident() ? "" : ", the rest streamed per frame")
                        : e.weightsResident() ? " resident" : " streamed per frame").append(", peak activations ")
                .append(Format.bytes(e.activationPeakBytes())).append(", SRAM ").append(Format.bytes(cap))
                .append("; DRAM ").append(Format.bytes(e.dramBytesPerFrame())).append(" per frame\n");
        for (String a : e.assumptions()) {
            b.append("Assumed: ").append(a).append('\n');
        }
        if (!e.complete()) {
            b.append("Incomplete: ").append(Format.countKind(e.workload(), Kind.UNMODELLED)).append(" unmodelled and ")
                    .append(Format.countKind(e.workload(), Kind.UNRESOLVED))
                    .append(" unresolved nodes are not priced: the totals are a lower bound\n");
        }
    }

    /** A name for a terminal: control characters (a terminal escape in a node name) become '?'. */
    static String plain(String s) {
        StringBuilder b = new StringBuilder(s.length());
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            b.append(c < 0x20 || (c >= 0x7f && c < 0xa0) ? '?' : c);
        }
        return b.toString();
    }

    static String utilisation(NodeEstimate n) {
        return n.work().macs() > 0 ? Format.percent(n.utilization()) : "-";
    }

    /** The node's deployed precision, {@code w4a8}; "-" when it is not priced. */
    static String precision(NodeEstimate n) {
        return n.deployed() == null ? "-" : n.deployed().label();
    }

    /** Where the node's precision came from: "model", "override" or "profile default"; "-" when not priced. */
    static String origin(NodeEstimate n) {
        return n.deployed() == null ? "-" : n.deployed().origin().label;
    }

    static String bound(NodeEstimate n) {
        return n.fusedInto() != null ? n.bound().label + " (fused)" : n.bound().label;
    }

    private static String uj(double joules) {
        return Format.sig(joules * 1e6);
    }
}
