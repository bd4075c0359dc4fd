package dev.erg.report;

import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.LayerShare;
import dev.erg.budget.Metric;
import dev.erg.budget.PairResult;
import dev.erg.workload.Kind;
import java.io.StringWriter;
import javax.xml.stream.XMLOutputFactory;
import javax.xml.stream.XMLStreamException;
import javax.xml.stream.XMLStreamWriter;

/**
 * A JUnit-style XML report of one model x device pair, so that CI servers list every limit as a test
 * case, written with the JDK's {@link XMLStreamWriter}. The document has the common shape that Apache
 * Ant's JUnit task writes (and the published schema of it describes): one
 * {@code <testsuite name="erg.STEM">} with a {@code <properties>} block (model, device, device name,
 * frame rate, notice), one {@code <testcase classname="erg.STEM" name="KIND.SUBJECT">} per check
 * (e.g. {@code budget.frameRate}, {@code growth.macs}, {@code policy.modelled}), the pair's console
 * text as {@code <system-out>} and the pair's warnings as {@code <system-err>}. A failed check holds
 * {@code <failure message="THE CHECK'S MESSAGE" type="budget|growth|policy">} with the layers that
 * contribute most as its text.
 *
 * <p>A pair with no check still gets one test case, {@code estimate}, which passes: an incomplete
 * estimate is a warning, not a verdict (unless a policy makes it one), and it is written to
 * {@code <system-err>}. Times are 0 and the timestamp is the epoch: a check is a computation, not a
 * timed test, and fixed values keep the file byte-identical for the same inputs; the host name is
 * {@code localhost}, the shape's own fallback.
 */
public final class JUnitReport {
    /** The fixed timestamp (ISO 8601 without zone, as the shape requires). */
    static final String TIMESTAMP = "1970-01-01T00:00:00";

    private JUnitReport() {
    }

    /** The XML document of one pair. */
    public static String render(GateResult result, PairResult p) {
        return render(Figures.of(p), result, Reports.stem(p));
    }

    static String render(Figures f, GateResult result, String stem) {
        StringWriter out = new StringWriter();
        try {
            XMLStreamWriter x = XMLOutputFactory.newFactory().createXMLStreamWriter(out);
            write(x, result, f, "erg." + stem);
            x.flush();
            x.close();
        } catch (XMLStreamException e) {
            throw new IllegalStateException("cannot write the JUnit report", e);
        }
        return out.toString();
    }

    private static void write(XMLStreamWriter x, GateResult result, Figures f, String suite)
            throws XMLStreamException {
        PairResult p = f.pair;
        int failures = 0;
        for (Check c : p.checks()) {
            failures += c.passed() ? 0 : 1;
        }
        int tests = Math.max(1, p.checks().size());
        x.writeStartDocument("UTF-8", "1.0");
        x.writeCharacters("\n");
        x.writeStartElement("testsuite");
        x.writeAttribute("name", clean(suite));
        x.writeAttribute("timestamp", TIMESTAMP);
        x.writeAttribute("hostname", "localhost");
        x.writeAttribute("tests", Integer.toString(tests));
        x.writeAttribute("failures", Integer.toString(failures));
        x.writeAttribute("errors", "0");
        x.writeAttribute("time", "0");
        x.writeCharacters("\n  ");
        x.writeStartElement("properties");
        property(x, "model", p.model());
        property(x, "device", p.device());
        property(x, "deviceName", p.estimate().device().name());
        property(x, "fps", Format.sig(p.fps()));
        property(x, "complete", Boolean.toString(p.estimate().complete()));
        if (result.baselineFile() != null) {
            property(x, "baseline", result.baselineFile());
        }
        property(x, "notice", AnalysisJson.NOTICE);
        x.writeCharacters("\n  ");
        x.writeEndElement();
        for (Check c : p.checks()) {
            x.writeCharacters("\n  ");
            testcase(x, suite, c.key());
            if (c.verdict() == dev.erg.budget.Verdict.AT_RISK) { // passes with a warning: the limit lies inside the error band
                x.writeCharacters("\n    ");
                x.writeStartElement("system-err");
                x.writeCharacters(clean("at risk: " + c.message()));
                x.writeEndElement();
                x.writeCharacters("\n  ");
            }
            if (!c.passed()) {
                x.writeCharacters("\n    ");
                x.writeStartElement("failure");
                x.writeAttribute("message", clean(c.message()));
                x.writeAttribute("type", c.kind().label);
                x.writeCharacters(clean(failureText(c)));
                x.writeEndElement();
                x.writeCharacters("\n  ");
            }
            x.writeEndElement();
        }
        if (p.checks().isEmpty()) {
            x.writeCharacters("\n  ");
            testcase(x, suite, "estimate");
            x.writeEndElement();
        }
        x.writeCharacters("\n  ");
        x.writeStartElement("system-out");
        x.writeCharacters(clean(ConsoleReport.pair(f, ConsoleReport.DEFAULT_TOP)));
        x.writeEndElement();
        x.writeCharacters("\n  ");
        x.writeStartElement("system-err");
        x.writeCharacters(p.estimate().complete() ? "" : clean(incomplete(p)));
        x.writeEndElement();
        x.writeCharacters("\n");
        x.writeEndElement();
        x.writeCharacters("\n");
        x.writeEndDocument();
    }

    private static void testcase(XMLStreamWriter x, String suite, String name) throws XMLStreamException {
        x.writeStartElement("testcase");
        x.writeAttribute("name", clean(name));
        x.writeAttribute("classname", clean(suite));
        x.writeAttribute("time", "0");
    }

    private static void property(XMLStreamWriter x, String name, String value) throws XMLStreamException {
        x.writeCharacters("\n    ");
        x.writeEmptyElement("property");
        x.writeAttribute("name", clean(name));
        x.writeAttribute("value", clean(value));
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

    /**
     * {@code s} with every character XML 1.0 does not allow (control characters, lone surrogates,
     * U+FFFE, U+FFFF) as U+FFFD; the stream writer escapes the markup characters itself.
     */
    static String clean(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder b = new StringBuilder(s.length());
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            if (c == '\n' || c == '\t') {
                b.append(c);
            } else if (c < 0x20 || c == '\uFFFE' || c == '\uFFFF') {
                b.append('\uFFFD');
            } else if (Character.isHighSurrogate(c) && i + 1 < s.length() && Character.isLowSurrogate(s.charAt(i + 1))) {
                b.append(c).append(s.charAt(++i));
            } else if (Character.isSurrogate(c)) {
                b.append('\uFFFD');
            } else {
                b.append(c);
            }
        }
        return b.toString();
    }
}
