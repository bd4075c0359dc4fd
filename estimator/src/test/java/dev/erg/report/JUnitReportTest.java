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

/**
 * Every JUnit report is validated against the published schema of the common JUnit XML shape
 * (src/test/resources/schemas/ant-junit.xsd: the Apache Ant JUnit result schema, from the npm package
 * junit-xml 1.2.0; its source is written beside it), not against a schema of the project's own.
 */
class JUnitReportTest {
    @TempDir
    Path dir;

    private static Schema schema() throws SAXException {
        URL xsd = JUnitReportTest.class.getResource("/schemas/ant-junit.xsd");
        assertTrue(xsd != null, "the published schema is among the test resources");
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
        assertEquals("0", suite.getAttribute("time"));
        assertEquals("localhost", suite.getAttribute("hostname"));
        assertEquals(JUnitReport.TIMESTAMP, suite.getAttribute("timestamp"));
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
        assertEquals("estimate", cases.get(0).getAttribute("name"));
        assertEquals(0, cases.get(0).getChildNodes().getLength());
    }

    @Test
    void anIncompleteEstimateIsAWarningNotAFailure() throws Exception {
        Path file = dir.resolve("partial.onnx");
        ReportModels.incomplete(file);
        GateResult r = Gates.gate(file, Budget.none());
        PairResult p = r.pairs().get(0);
        assertTrue(!p.estimate().complete());
        String xml = xml(r);
        validate(xml);
        Document d = parse(xml);
        assertEquals("0", d.getDocumentElement().getAttribute("failures"));
        String err = d.getElementsByTagName("system-err").item(0).getTextContent();
        assertTrue(err.startsWith("the estimate is incomplete: 3 unmodelled and 1 unresolved"), err);
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
        String head = "<testsuite name=\"s\" timestamp=\"2026-01-02T03:04:05\" hostname=\"h\" tests=\"1\" failures=\"1\""
                + " errors=\"0\" time=\"0\"><properties/>";
        String tail = "<system-out/><system-err/></testsuite>";
        validate(head + "<testcase name=\"a\" classname=\"c\" time=\"0\"><failure type=\"t\">x</failure></testcase>"
                + tail);
        // A test case needs its class name; a failure its type; a suite its time stamp; output comes last.
        assertThrows(SAXException.class, () -> validate(head + "<testcase name=\"a\" time=\"0\"/>" + tail));
        assertThrows(SAXException.class, () -> validate(head
                + "<testcase name=\"a\" classname=\"c\" time=\"0\"><failure/></testcase>" + tail));
        assertThrows(SAXException.class, () -> validate(head.replace(" timestamp=\"2026-01-02T03:04:05\"", "")
                + tail));
        assertThrows(SAXException.class, () -> validate(head + tail.replace("</testsuite>", "")
                + "<testcase name=\"a\" classname=\"c\" time=\"0\"/></testsuite>"));
    }

    @Test
    void theSameResultGivesTheSameXml() {
        Path model = Gates.convRelu(dir.resolve("tiny.onnx"), "conv", "relu", 4);
        assertEquals(xml(Gates.gate(model, Gates.mixed())), xml(Gates.gate(model, Gates.mixed())));
    }
}
