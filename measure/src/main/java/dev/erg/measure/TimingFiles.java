package dev.erg.measure;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;

/** Writes timings as a measurement file (the CSV that erg's calibration reads) and as JSON detail. */
final class TimingFiles {
    private TimingFiles() {
    }

    /**
     * The measurement file: comment lines naming the origin, the header {@code model,node,latency-ms},
     * per model one whole-model row (the median run) and one row per node (its median kernel time).
     */
    static String csv(List<ModelTiming> timings) {
        StringBuilder b = new StringBuilder();
        for (ModelTiming t : timings) {
            b.append("# ").append(t.model()).append(": erg measure, ").append(t.runtime()).append(", ")
                    .append(t.threads()).append(t.threads() == 1 ? " intra-op thread" : " intra-op threads")
                    .append(", graph optimisations off, ").append(t.warmups()).append(" warm-up + ")
                    .append(t.runMs().length).append(" timed runs, medians, whole runs by the ").append(t.clock())
                    .append(" clock; inputs seeded ").append(t.seed())
                    .append("; host ").append(t.host()).append("; ").append(t.measuredAt()).append('\n');
        }
        b.append("model,node,latency-ms\n");
        for (ModelTiming t : timings) {
            b.append(cell(t.model())).append(",,").append(ms(t.medianMs())).append('\n');
            for (NodeTiming n : t.nodes()) {
                b.append(cell(t.model())).append(',').append(cell(n.name())).append(',').append(ms(n.medianMs())).append('\n');
            }
        }
        return b.toString();
    }

    static void writeCsv(List<ModelTiming> timings, Path file) throws IOException {
        Files.writeString(file, csv(timings), StandardCharsets.UTF_8);
    }

    static String json(List<ModelTiming> timings) throws IOException {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        root.put("graph-optimisations", "off");
        ArrayNode models = root.putArray("models");
        for (ModelTiming t : timings) {
            ObjectNode o = models.addObject();
            o.put("model", t.model());
            o.put("runtime", t.runtime());
            o.put("host", t.host());
            o.put("measured-at", t.measuredAt());
            o.put("threads", t.threads());
            o.put("warm-up-runs", t.warmups());
            o.put("timed-runs", t.runMs().length);
            o.put("clock", t.clock());
            o.put("seed", t.seed());
            ArrayNode in = o.putArray("inputs");
            t.inputs().forEach(in::add);
            o.put("median-ms", round(t.medianMs()));
            o.put("p90-ms", round(t.p90Ms()));
            o.put("node-sum-ms", round(t.nodeSumMs()));
            ArrayNode runs = o.putArray("run-ms");
            for (double r : t.runMs()) {
                runs.add(round(r));
            }
            ArrayNode nodes = o.putArray("nodes");
            for (NodeTiming n : t.nodes()) {
                ObjectNode x = nodes.addObject();
                x.put("node", n.name());
                x.put("op-type", n.opType());
                x.put("median-ms", round(n.medianMs()));
                x.put("p90-ms", round(n.p90Ms()));
                x.put("samples", n.samples());
            }
            ArrayNode notRun = o.putArray("not-run");
            t.notRun().forEach(notRun::add);
        }
        return m.writeValueAsString(root).replace("\r\n", "\n") + "\n";
    }

    static void writeJson(List<ModelTiming> timings, Path file) throws IOException {
        Files.writeString(file, json(timings), StandardCharsets.UTF_8);
    }

    /** Milliseconds with a microsecond's resolution (the profiler's unit). */
    static String ms(double v) {
        return String.format(Locale.ROOT, "%.4f", v);
    }

    private static double round(double v) {
        return Math.round(v * 1e4) / 1e4;
    }

    private static String cell(String s) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.equals(s.strip()) && !s.startsWith("#")) {
            return s;
        }
        return '"' + s.replace("\"", "\"\"") + '"';
    }
}
