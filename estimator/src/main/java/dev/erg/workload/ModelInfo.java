package dev.erg.workload;

import dev.erg.graph.Graph;
import dev.erg.onnx.OnnxModel;
import java.nio.file.Path;
import java.util.Collections;
import java.util.Map;
import java.util.TreeMap;

/**
 * What reports say about the model itself, copied out of the analysis once: immutable, so that no
 * writer holds the analysis's graph.
 *
 * @param file            the model file as read
 * @param fileLabel       the file as messages name it
 * @param defaultOpset    the opset of the default ONNX domain
 * @param producer        the exporter's name ("" when not recorded)
 * @param producerVersion the exporter's version ("" when not recorded)
 * @param irVersion       the ONNX IR version
 * @param graphName       the main graph's name
 * @param opsets          opset per domain, sorted by domain ("" is the default domain)
 * @param boundDims       the symbolic dims bound for this analysis, sorted by name
 */
public record ModelInfo(Path file, String fileLabel, long defaultOpset, String producer, String producerVersion,
                        long irVersion, String graphName, Map<String, Long> opsets, Map<String, Long> boundDims) {
    public ModelInfo {
        opsets = Collections.unmodifiableMap(new TreeMap<>(opsets));
        boundDims = Collections.unmodifiableMap(new TreeMap<>(boundDims));
    }

    static ModelInfo of(Graph g) {
        OnnxModel m = g == null ? null : g.model();
        if (m == null) {
            return new ModelInfo(null, "?", 0, "", "", 0, "", Map.of(), g == null ? Map.of() : g.boundDims());
        }
        return new ModelInfo(m.file(), g.fileLabel(), m.defaultOpset(), nz(m.producerName()), nz(m.producerVersion()),
                m.irVersion(), m.graph() == null ? "" : nz(m.graph().name()), m.opsets(), g.boundDims());
    }

    private static String nz(String s) {
        return s == null ? "" : s;
    }
}
