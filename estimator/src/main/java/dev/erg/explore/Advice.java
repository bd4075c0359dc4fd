package dev.erg.explore;

import dev.erg.budget.Check;
import dev.erg.budget.LayerShare;
import dev.erg.format.Numbers;
import java.util.ArrayList;
import java.util.List;

/**
 * Ways to meet the failed budget of one model on one device: the failing checks, the candidate
 * changes ranked (those that meet every limit first, then by how many failing limits they fix, then
 * by how much of the first failing limit's gap they close), and the layers to slim with their share
 * of the first failing metric. Every candidate is a computed estimate.
 */
public record Advice(String model, String device, List<Check> failing, List<Candidate> candidates,
                     List<LayerShare> slim, String slimBy) {
    /** The heading of the section in every report. */
    public static final String TITLE = "Ways to meet the budget";
    /** The sentence every place that shows candidates carries. */
    public static final String NOTICE = "each candidate is a computed estimate of the changed model or device,"
            + " not a measurement";

    public Advice {
        failing = List.copyOf(failing);
        candidates = List.copyOf(candidates);
        slim = List.copyOf(slim);
    }

    /** One line per candidate, the first {@code n} (all when n < 0), numbered, with every budgeted metric. */
    public List<String> lines(int n) {
        List<String> out = new ArrayList<>();
        out.add(TITLE.toLowerCase(java.util.Locale.ROOT) + ", " + model + " on " + device + " (" + NOTICE + "):");
        int k = n < 0 ? candidates.size() : Math.min(n, candidates.size());
        for (int i = 0; i < k; i++) {
            out.add("  " + (i + 1) + ". " + line(candidates.get(i), failing));
        }
        if (candidates.isEmpty()) {
            out.add("  no candidate change could be estimated");
        }
        if (n < 0 || k == candidates.size()) {
            if (!slim.isEmpty()) {
                StringBuilder b = new StringBuilder("  layers to slim, by " + slimBy + ": ");
                for (int i = 0; i < slim.size(); i++) {
                    LayerShare s = slim.get(i);
                    b.append(i == 0 ? "" : ", ").append(s.name()).append(' ').append(Numbers.percent(s.share()));
                }
                out.add(b.toString());
            }
        } else {
            out.add("  (" + (candidates.size() - k) + " more in the reports)");
        }
        return out;
    }

    /**
     * "CHANGE: closes the frame rate gap alone; frame rate 5.2 fps, average power 20.1 mW (fails) (NOTE)":
     * the gap is that of the first failing limit.
     */
    public static String line(Candidate c, List<Check> failing) {
        StringBuilder b = new StringBuilder(c.change()).append(": ");
        String gap = failing.isEmpty() ? "the gap" : "the " + failing.get(0).metric().label + " gap";
        if (c.meetsAll()) {
            b.append("meets every limit");
        } else {
            if (c.fixed() > 0) {
                b.append("fixes ").append(c.fixed()).append(" of ").append(failing.size()).append(" failing limits, ");
            }
            if (c.gapClosed() >= 1) {
                b.append("closes ").append(gap).append(" alone");
            } else {
                b.append("closes ").append(Numbers.percent(Math.max(-9.99, c.gapClosed()))).append(" of ").append(gap);
            }
        }
        if (c.broken() > 0) {
            b.append(", breaks ").append(c.broken()).append(c.broken() == 1 ? " other limit" : " other limits");
        }
        b.append(';');
        for (int i = 0; i < c.checks().size(); i++) {
            Check k = c.checks().get(i);
            b.append(i == 0 ? " " : ", ").append(k.metric().label).append(' ').append(Numbers.sig(k.value()))
                    .append(' ').append(k.unit()).append(k.passed() ? "" : " (fails)");
        }
        if (c.note() != null) {
            b.append(" (").append(c.note()).append(')');
        }
        return b.toString();
    }
}
