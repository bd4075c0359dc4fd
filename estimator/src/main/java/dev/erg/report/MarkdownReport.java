package dev.erg.report;

import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.LayerDiff;
import dev.erg.budget.PairResult;
import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import java.util.List;

/**
 * A Markdown summary of one model x device pair, fit for a pull-request comment (GitHub-flavoured
 * tables): the verdict, the checks, the totals, the ten layers of most energy, the baseline diff, the
 * assumptions and the notice. Names from the model and the profile are set in code spans with
 * {@code |} escaped; other text is backslash-escaped, so no name can open a link, an emphasis or an
 * HTML tag. Deterministic, "\n" line ends.
 */
public final class MarkdownReport {
    /** Layers in the table. */
    public static final int TOP = 10;
    /** Rows of the baseline diff table; the rest is counted. */
    public static final int DIFF_ROWS = 30;

    private MarkdownReport() {
    }

    /** The summary of one pair of a gate result. */
    public static String render(GateResult result, PairResult p) {
        return render(Figures.of(p), result);
    }

    static String render(Figures f, GateResult result) {
        StringBuilder b = new StringBuilder();
        pair(b, f, result);
        b.append("> ").append(text(AnalysisJson.NOTICE)).append('\n');
        return b.toString();
    }

    /** Every pair of a gate result in one document (one comment), the notice once at the end. */
    public static String render(GateResult result) {
        StringBuilder b = new StringBuilder();
        for (PairResult p : result.pairs()) {
            pair(b, Figures.of(p), result);
        }
        b.append("> ").append(text(AnalysisJson.NOTICE)).append('\n');
        return b.toString();
    }

    /** Markdown text with every character that could start markup backslash-escaped; line breaks become spaces. */
    static String text(String s) {
        StringBuilder b = new StringBuilder(s.length() + 8);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c == '\n' || c == '\r' || c == '\t') {
                b.append(' ');
            } else if ("\\`*_[]<>|#&~!".indexOf(c) >= 0) {
                b.append('\\').append(c);
            } else if (c < 0x20 || c == 0x7f) {
                b.append('\uFFFD');
            } else {
                b.append(c);
            }
        }
        return b.toString();
    }

    /** A name as an inline code span, safe inside a table cell: {@code |} escaped, a fence longer than any backtick run. */
    static String code(String s) {
        String t = s.replace('\n', ' ').replace('\r', ' ').replace("|", "\\|");
        StringBuilder clean = new StringBuilder(t.length());
        int run = 0;
        int longest = 0;
        for (int i = 0; i < t.length(); i++) {
            char c = t.charAt(i);
            clean.append(c < 0x20 || c == 0x7f ? '\uFFFD' : c);
            run = c == '`' ? run + 1 : 0;
            longest = Math.max(longest, run);
        }
        String fence = "`".repeat(longest + 1);
        boolean pad = t.isEmpty() || t.startsWith("`") || t.endsWith("`") || longest > 0;
        return pad ? fence + " " + clean + " " + fence : fence + clean + fence;
    }

    private static void pair(StringBuilder b, Figures f, GateResult result) {
        PairResult p = f.pair;
        int failed = 0;
        for (Check c : p.checks()) {
            failed += c.passed() ? 0 : 1;
        }
        String verdict = p.checks().isEmpty() ? "not checked" : failed == 0 ? "PASS" : "FAIL";
        b.append("### erg: ").append(code(f.modelName())).append(" on ").append(code(f.device)).append(": **")
                .append(verdict).append("**\n\n");
        if (p.checks().isEmpty()) {
            b.append("No budget and no baseline growth were checked.");
        } else if (failed == 0) {
            b.append("All ").append(ConsoleReport.plural(p.checks().size(), "check")).append(" hold.");
        } else {
            b.append(failed).append(" of ").append(ConsoleReport.plural(p.checks().size(), "check")).append(" failed.");
        }
        b.append(" Model ").append(code(f.model)).append(", device ").append(text(f.profile().name())).append(", ")
                .append(Format.sig(f.profile().clockMhz())).append(" MHz.");
        String bound = Format.bindings(p.workload());
        if (!bound.isEmpty()) {
            b.append(" Inputs bound: ").append(text(bound)).append('.');
        }
        b.append("\n\n");
        if (!p.checks().isEmpty()) {
            b.append("| | check | value | limit | message |\n|---|---|---:|---:|---|\n");
            for (Check c : p.checks()) {
                String unit = c.metric() == null ? "" : " " + c.unit();
                String value = c.metric() == null ? "-" : Format.sig(c.value()) + unit;
                String limit = c.metric() == null ? "-" : Format.sig(c.limit()) + unit;
                b.append("| ").append(!c.passed() ? "**FAIL**" : c.verdict() == dev.erg.budget.Verdict.AT_RISK ? "*at risk*" : "ok").append(" | ").append(c.key())
                        .append(" | ").append(text(value)).append(" | ")
                        .append(text(limit)).append(" | ").append(text(c.message()))
                        .append(" |\n");
            }
            b.append('\n');
        }
        b.append("**Totals per frame**\n\n| | | |\n|---|---:|---|\n");
        for (String[] row : f.summary()) {
            b.append("| ").append(text(row[0])).append(" | ").append(text(row[1])).append(" | ").append(text(row[2]))
                    .append(" |\n");
        }
        b.append('\n');
        layers(b, f);
        diff(b, p, result);
        List<String> assumptions = f.estimate.assumptions();
        b.append("**Assumptions**\n\n- Power is taken at ").append(text(Format.sig(f.fps))).append(" fps")
                .append(f.fps == f.estimate.maxFps() ? " (frames back to back)" : "").append(".\n");
        for (String a : assumptions) {
            b.append("- ").append(text(a)).append('\n');
        }
        if (!f.estimate.complete()) {
            b.append("- Some nodes have no rule and are not priced: the totals are a lower bound.\n");
        }
        b.append('\n');
    }

    private static void layers(StringBuilder b, Figures f) {
        List<NodeEstimate> ranked = f.byEnergy();
        int shown = Math.min(TOP, ranked.size());
        if (shown == 0) {
            b.append("No layer runs on the device.\n\n");
            return;
        }
        b.append("**").append(shown == ranked.size() ? "All " + ConsoleReport.plural(shown, "layer")
                : "Top " + shown + " of " + ranked.size() + " layers").append(" by energy** (µJ; latency in µs)\n\n");
        List<Energy.Destination> dests = f.destinations();
        boolean reload = f.estimate.weightsReloadedEachFrame();
        StringBuilder head = new StringBuilder("| # | layer | op | precision | from | MACs | utilisation | latency µs |");
        StringBuilder rule = new StringBuilder("|---:|---|---|---|---|---:|---:|---:|");
        for (Energy.Destination d : dests) {
            head.append(' ').append(Figures.label(d)).append(" |");
            rule.append("---:|");
        }
        head.append(" total | share | bound |").append(reload ? " weights |" : "");
        rule.append("---:|---:|---|").append(reload ? "---|" : "");
        b.append(head).append('\n').append(rule).append('\n');
        for (int i = 0; i < shown; i++) {
            NodeEstimate n = ranked.get(i);
            Energy e = n.energy();
            b.append("| ").append(i + 1).append(" | ").append(code(n.name())).append(" | ").append(code(n.work().opType()))
                    .append(" | ").append(ConsoleReport.precision(n)).append(" | ").append(ConsoleReport.origin(n))
                    .append(" | ").append(Format.count(n.work().macs())).append(" | ")
                    .append(ConsoleReport.utilisation(n)).append(" | ")
                    .append(Format.sig(n.latencySeconds() * 1e6)).append(" |");
            for (Energy.Destination d : dests) {
                b.append(' ').append(uj(e.of(d))).append(" |");
            }
            b.append(' ').append(uj(e.total())).append(" | ")
                    .append(Format.percent(f.energyShare(n))).append(" | ").append(text(ConsoleReport.bound(n)))
                    .append(" |");
            if (reload) {
                b.append(n.weightsReloaded() ? " reloaded |" : " |");
            }
            b.append('\n');
        }
        b.append('\n');
    }

    private static void diff(StringBuilder b, PairResult p, GateResult result) {
        b.append("**Against the baseline**\n\n");
        if (!p.hasBaseline()) {
            String why = result.baselineFile() == null ? "No baseline is configured."
                    : !result.baselineFound() ? Format.sentence(result.baselineNote())
                    : "The baseline " + result.baselineFile() + " has no entry for this model and device.";
            b.append(text(why)).append("\n\n");
            return;
        }
        if (p.diff().isEmpty()) {
            b.append("No layer changed since ").append(code(result.baselineFile())).append(".\n\n");
            return;
        }
        int added = 0;
        int removed = 0;
        for (LayerDiff d : p.diff()) {
            added += d.change() == LayerDiff.Change.ADDED ? 1 : 0;
            removed += d.change() == LayerDiff.Change.REMOVED ? 1 : 0;
        }
        int changed = p.diff().size() - added - removed;
        b.append("Since ").append(code(result.baselineFile())).append(": ").append(added).append(" added, ")
                .append(removed).append(" removed, ").append(changed).append(" changed (current minus baseline).\n\n")
                .append("| change | layer | op | MACs | energy µJ | latency µs |\n|---|---|---|---:|---:|---:|\n");
        int shown = Math.min(DIFF_ROWS, p.diff().size());
        for (int i = 0; i < shown; i++) {
            LayerDiff d = p.diff().get(i);
            b.append("| ").append(d.change().label).append(" | ").append(code(d.name())).append(" | ")
                    .append(code(d.opType())).append(" | ").append(Format.signedExact(d.macsDelta())).append(" | ")
                    .append(Format.signed(d.energyDeltaJoules() * 1e6)).append(" | ")
                    .append(Format.signed(d.latencyDeltaSeconds() * 1e6)).append(" |\n");
        }
        if (shown < p.diff().size()) {
            b.append("\n…and ").append(p.diff().size() - shown).append(" more layers (see the JSON or HTML report).\n");
        }
        b.append('\n');
    }

    private static String uj(double joules) {
        return Format.sig(joules * 1e6);
    }
}
