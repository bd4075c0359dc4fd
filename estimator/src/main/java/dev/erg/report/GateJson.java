package dev.erg.report;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import java.io.IOException;
import java.io.UncheckedIOException;

/** The JSON report of one model x device pair: the analysis, the estimate totals and the verdicts. */
public final class GateJson {
    private GateJson() {
    }

    public static byte[] toBytes(GateResult result, PairResult p) {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        try {
            ObjectNode root = (ObjectNode) om.readTree(AnalysisJson.toBytes(p.workload()));
            ObjectNode dev = root.putObject("device");
            dev.put("id", p.device());
            dev.put("name", p.estimate().device().name());
            ObjectNode totals = (ObjectNode) root.get("totals");
            totals.put("latencySeconds", p.estimate().latencySeconds());
            totals.put("maxFps", p.estimate().maxFps());
            totals.put("energyPerFrameJoules", p.estimate().energyPerFrameJoules());
            totals.put("averagePowerWatts", p.estimate().averagePowerWatts(p.fps()));
            ArrayNode checks = root.putArray("checks");
            for (Check c : p.checks()) {
                ObjectNode o = checks.addObject();
                o.put("kind", c.kind().label);
                o.put("metric", c.metric().key);
                o.put("unit", c.metric().unit);
                o.put("value", c.value());
                o.put("limit", c.limit());
                o.put("passed", c.passed());
                o.put("message", c.message());
            }
            root.put("passed", p.passed());
            return (om.writeValueAsString(root).replace("\r\n", "\n") + "\n").getBytes(java.nio.charset.StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
