package dev.erg.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import java.io.ByteArrayInputStream;
import java.io.StringReader;
import java.net.URL;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import javax.xml.XMLConstants;
import javax.xml.parsers.DocumentBuilderFactory;
import javax.xml.transform.stream.StreamSource;
import javax.xml.validation.Schema;
import javax.xml.validation.SchemaFactory;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.w3c.dom.Document;
import org.w3c.dom.Element;
import org.w3c.dom.NodeList;
import org.xml.sax.SAXException;

class JUnitReportTest {
    @TempDir
    Path dir;

    private static Schema schema() throws SAXException {
        URL xsd = JUnitReport.class.getResource("junit.xsd");
        assertTrue(xsd != null, "junit.xsd is packaged beside the report classes");
        SchemaFactory f = SchemaFactory.newInstance(XMLConstants.W3C_XML_SCHEMA_NS_URI);
        return f.newSchema(xsd);
    }

    private static void validate(String xml) throws Exception {
        schema().newValidator().validate(new StreamSource(new StringReader(xml)));
    }

    private static Document parse(String xml) throws Exception {
        return DocumentBuilderFactory.newInstance().newDocumentBuilder()
                .parse(new ByteArrayInputStream(xml.getBytes(StandardCharsets.UTF_8)));
    }

    private static String xml(GateResult r) {
        return JUnitReport.render(r, r.pairs().get(0));
    }

    private static List<Element> cases(Document d) {
        NodeList l = d.getElementsByTagName("testcase");
        java.util.ArrayList<Element> out = new java.util.ArrayList<>();
        for (int i = 0; i < l.getLength(); i++) {
            out.add((Element) l.item(i));
        }
        return out;
    }

    @Test
    void oneTestCasePerCheckWithTheMessageVerbatim() throws Exception {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4), Gates.mixed());
        String xml = xml(r);
        validate(xml);
        Document d = parse(xml);
        Element suite = d.getDocumentElement();
        assertEquals("testsuite", suite.getTagName());
        assertEquals("erg.tiny.test-device", suite.getAttribute("name"));
        assertEquals("2", suite.getAttribute("tests"));
        assertEquals("1", suite.getAttribute("failures"));
        assertEquals("0", suite.getAttribute("errors"));
        assertEquals("0", suite.getAttribute("skipped"));
        assertEquals("0", suite.getAttribute("time"));
        List<Element> cases = cases(d);
        assertEquals(2, cases.size());
        List<Check> checks = r.pairs().get(0).checks();
        assertEquals("budget.frameRate", cases.get(0).getAttribute("name"));
        assertEquals("erg.tiny.test-device", cases.get(0).getAttribute("classname"));
        Element failure = (Element) cases.get(0).getElementsByTagName("failure").item(0);
        assertEquals(checks.get(0).message(), failure.getAttribute("message"));
        assertEquals("budget", failure.getAttribute("type"));
        assertTrue(failure.getTextContent().startsWith(checks.get(0).message() + "\nlayers that contribute most:\n"));
        assertEquals("budget.latency", cases.get(1).getAttribute("name"));
        assertEquals(0, cases.get(1).getChildNodes().getLength(), "a passing case is empty");
        NodeList props = d.getElementsByTagName("property");
        assertEquals("model", ((Element) props.item(0)).getAttribute("name"));
        assertEquals("tiny.onnx", ((Element) props.item(0)).getAttribute("value"));
        assertEquals("device", ((Element) props.item(1)).getAttribute("name"));
        assertEquals("test-device", ((Element) props.item(1)).getAttribute("value"));
        assertTrue(d.getElementsByTagName("system-out").item(0).getTextContent().contains("verdict: FAIL"));
    }

    @Test
    void growthFailuresAreTypedGrowth() throws Exception {
        Path before = Files.createDirectories(dir.resolve("a")).resolve("m.onnx");
        Path after = Files.createDirectories(dir.resolve("b")).resolve("m.onnx");
        GateResult base = Gates.gate(Gates.convRelu(before, "conv", "relu", 4), Budget.none());
        GateResult r = Gates.gate(Gates.convRelu(after, "conv", "act", 8), Budget.none(),
                Baseline.of(base.pairs()), "erg-baseline.json", 10.0);
        String xml = xml(r);
        validate(xml);
        Document d = parse(xml);
        List<Element> cases = cases(d);
        // Five growth metrics (Gate: MACs, energy per frame, latency, weights, peak activations).
        assertEquals(5, cases.size());
        assertEquals("growth.macs", cases.get(0).getAttribute("name"));
        Element failure = (Element) cases.get(0).getElementsByTagName("failure").item(0);
        assertEquals("growth", failure.getAttribute("type"));
        assertEquals(r.pairs().get(0).checks().get(0).message(), failure.getAttribute("message"));
        // conv grew by 6,912 MACs (4 -> 8 filters, 1,728 MACs each).
        assertTrue(failure.getTextContent().contains("layers that grew most:\n  conv (Conv) +6,912 MACs"),
                failure.getTextContent());
    }

    @Test
    void aPairWithoutChecksGetsOneCaseForTheEstimate() throws Exception {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4), Budget.none());
        String xml = xml(r);
        validate(xml);
        List<Element> cases = cases(parse(xml));
        assertEquals(1, cases.size());
        assertEquals("estimate.complete", cases.get(0).getAttribute("name"));
        assertEquals(0, cases.get(0).getChildNodes().getLength());
    }

    @Test
    void anIncompleteEstimateIsSkippedNotFailed() throws Exception {
        Path file = dir.resolve("partial.onnx");
        ReportModels.incomplete(file);
        GateResult r = Gates.gate(file, Budget.none());
        PairResult p = r.pairs().get(0);
        assertTrue(!p.estimate().complete());
        String xml = xml(r);
        validate(xml);
        Document d = parse(xml);
        assertEquals("1", d.getDocumentElement().getAttribute("skipped"));
        assertEquals("0", d.getDocumentElement().getAttribute("failures"));
        Element skipped = (Element) d.getElementsByTagName("skipped").item(0);
        assertTrue(skipped.getAttribute("message").startsWith("the estimate is incomplete: 3 unmodelled and 1 unresolved"),
                skipped.getAttribute("message"));
    }

    @Test
    void hostileNamesAreEscapedAndTheFileStaysValid() throws Exception {
        GateResult r = Gates.gate(Gates.convRelu(dir.resolve("h.onnx"), Gates.HOSTILE + "\u0001", "relu", 4),
                Gates.mixed());
        String xml = xml(r);
        validate(xml);
        Element failure = (Element) parse(xml).getElementsByTagName("failure").item(0);
        // The control character is not allowed in XML 1.0 and becomes U+FFFD; the rest survives verbatim.
        assertEquals(r.pairs().get(0).checks().get(0).message().replace('\u0001', '\uFFFD'),
                failure.getAttribute("message"));
        assertTrue(failure.getAttribute("message").contains(Gates.HOSTILE));
    }

    @Test
    void theSchemaRejectsWhatCiServersWouldNotRead() throws Exception {
        // A test case needs a name; a suite needs its name and test count.
        assertThrows(SAXException.class, () -> validate("<testsuite name=\"s\" tests=\"1\"><testcase/></testsuite>"));
        assertThrows(SAXException.class, () -> validate("<testsuite tests=\"1\"/>"));
        assertThrows(SAXException.class, () -> validate("<testsuite name=\"s\" tests=\"-1\"/>"));
        assertThrows(SAXException.class, () -> validate("<testsuite name=\"s\" tests=\"1\"><testcase name=\"a\">"
                + "<skipped/><failure/></testcase></testsuite>"));
        validate("<testsuites><testsuite name=\"s\" tests=\"1\"><testcase name=\"a\"><failure message=\"m\" type=\"t\">"
                + "x</failure></testcase><system-out>o</system-out></testsuite></testsuites>");
    }

    @Test
    void theSameResultGivesTheSameXml() {
        Path model = Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4);
        assertEquals(xml(Gates.gate(model, Gates.mixed())), xml(Gates.gate(model, Gates.mixed())));
    }
}
