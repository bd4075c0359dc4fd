package dev.erg.report;

import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.LayerShare;
import dev.erg.budget.Metric;
import dev.erg.budget.PairResult;
import dev.erg.workload.Kind;
import java.util.ArrayList;
import java.util.List;

/**
 * A JUnit-style XML report of one model x device pair, so that CI servers list every limit as a test
 * case. The document is one {@code <testsuite name="erg.STEM">} with a {@code <properties>} block
 * (model, device, device name, frame rate, notice), one {@code <testcase classname="erg.STEM"
 * name="KIND.SUBJECT">} per check (e.g. {@code budget.frameRate}, {@code growth.macs}), and the
 * pair's console text as {@code <system-out>}. A failed check holds {@code <failure message="THE
 * CHECK'S MESSAGE" type="budget|growth|policy">} with the layers that contribute most as its text.
 *
 * <p>A pair with no check still gets one test case, {@code estimate.complete}: it passes when every
 * node was priced and is skipped (with the unpriced operators as its message) when the estimate is
 * incomplete, since an incomplete estimate is a warning, not a verdict. Times are 0: a check is a
 * comparison, not a timed test, and a fixed time keeps the file deterministic. The shape is the one
 * in {@code dev/erg/report/junit.xsd}.
 */
public final class JUnitReport {
    private JUnitReport() {
    }

    /** The XML document of one pair. */
    public static String render(GateResult result, PairResult p) {
        String stem = Reports.stem(p);
        return render(result, p, stem);
    }

    static String render(GateResult result, PairResult p, String stem) {
        String suite = "erg." + stem;
        List<String> cases = new ArrayList<>();
        int failures = 0;
        int skipped = 0;
        for (Check c : p.checks()) {
            StringBuilder t = new StringBuilder();
            t.append("  <testcase name=\"").append(xml(c.key())).append("\" classname=\"")
                    .append(xml(suite)).append("\" time=\"0\"");
            if (c.passed()) {
                t.append("/>\n");
            } else {
                failures++;
                t.append(">\n    <failure message=\"").append(attr(c.message())).append("\" type=\"")
                        .append(c.kind().label).append("\">")
                        .append(xml(failureText(c))).append("</failure>\n  </testcase>\n");
            }
            cases.add(t.toString());
        }
        if (p.checks().isEmpty()) {
            StringBuilder t = new StringBuilder();
            t.append("  <testcase name=\"estimate.complete\" classname=\"").append(xml(suite)).append("\" time=\"0\"");
            if (p.estimate().complete()) {
                t.append("/>\n");
            } else {
                skipped++;
                t.append(">\n    <skipped message=\"").append(attr(incomplete(p))).append("\"/>\n  </testcase>\n");
            }
            cases.add(t.toString());
        }
        StringBuilder x = new StringBuilder();
        x.append("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<testsuite name=\"").append(xml(suite))
                .append("\" tests=\"").append(cases.size()).append("\" failures=\"").append(failures)
                .append("\" errors=\"0\" skipped=\"").append(skipped).append("\" time=\"0\">\n  <properties>\n");
        property(x, "model", p.model());
        property(x, "device", p.device());
        property(x, "deviceName", p.estimate().device().name());
        property(x, "fps", Format.sig(p.fps()));
        property(x, "complete", Boolean.toString(p.estimate().complete()));
        if (result.baselineFile() != null) {
            property(x, "baseline", result.baselineFile());
        }
        property(x, "notice", AnalysisJson.NOTICE);
        x.append("  </properties>\n");
        for (String c : cases) {
            x.append(c);
        }
        x.append("  <system-out>").append(xml(ConsoleReport.pair(p, ConsoleReport.DEFAULT_TOP)))
                .append("</system-out>\n</testsuite>\n");
        return x.toString();
    }

    private static void property(StringBuilder x, String name, String value) {
        x.append("    <property name=\"").append(attr(name)).append("\" value=\"").append(attr(value)).append("\"/>\n");
    }

    private static String failureText(Check c) {
        StringBuilder b = new StringBuilder(c.message());
        if (!c.topLayers().isEmpty()) {
            b.append('\n').append(c.kind() == Check.Kind.GROWTH ? "layers that grew most:" : "layers that contribute most:");
            for (LayerShare s : c.topLayers()) {
                b.append("\n  ").append(s.name()).append(" (").append(s.opType()).append(") ");
                if (c.kind() == Check.Kind.GROWTH) {
                    b.append(c.metric() == Metric.MACS ? Format.signedExact(Math.round(s.value()))
                            : Format.signed(s.value())).append(' ').append(c.unit());
                } else {
                    b.append(Format.percent(s.share()));
                }
            }
        }
        return b.toString();
    }

    private static String incomplete(PairResult p) {
        return "the estimate is incomplete: " + Format.countKind(p.workload(), Kind.UNMODELLED) + " unmodelled and "
                + Format.countKind(p.workload(), Kind.UNRESOLVED) + " unresolved nodes are not priced (unmodelled: "
                + p.workload().unmodelled().keySet() + ")";
    }

    /** Text for a double-quoted attribute: as {@link #xml}, line feeds as character references. */
    static String attr(String s) {
        return xml(s).replace("\n", "&#10;");
    }

    /**
     * Text for XML content and double-quoted attributes. Characters XML 1.0 does not allow become
     * U+FFFD; tab, line feed and carriage return in attributes are written as character references
     * so that they survive attribute normalisation.
     */
    static String xml(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&':
                    b.append("&amp;");
                    break;
                case '<':
                    b.append("&lt;");
                    break;
                case '>':
                    b.append("&gt;");
                    break;
                case '"':
                    b.append("&quot;");
                    break;
                case '\'':
                    b.append("&apos;");
                    break;
                case '\t':
                    b.append("&#9;");
                    break;
                case '\r':
                    b.append("&#13;");
                    break;
                case '\n':
                    b.append('\n');
                    break;
                default:
                    if (c < 0x20 || c == '\uFFFE' || c == '\uFFFF') {
                        b.append('\uFFFD');
                    } else if (Character.isHighSurrogate(c) && i + 1 < s.length()
                            && Character.isLowSurrogate(s.charAt(i + 1))) {
                        b.append(c).append(s.charAt(++i));
                    } else if (Character.isSurrogate(c)) {
                        b.append('\uFFFD');
                    } else {
                        b.append(c);
                    }
            }
        }
        return b.toString();
    }
}
