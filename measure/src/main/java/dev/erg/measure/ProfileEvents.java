package dev.erg.measure;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The node events of an onnxruntime profile (a JSON array of trace events). Every node that runs
 * writes one event per run whose name is its node name followed by {@code _kernel_time}, with its
 * duration in microseconds and its operator in {@code args.op_name}.
 */
final class ProfileEvents {
    static final String SUFFIX = "_kernel_time";

    /** Per node name, in the order of first appearance: its operator and every duration (microseconds) in run order. */
    final Map<String, List<Double>> durations = new LinkedHashMap<>();
    final Map<String, String> opTypes = new LinkedHashMap<>();
    /** How many whole runs the profile recorded. */
    int runs;

    static ProfileEvents read(Path json) throws IOException {
        return parse(new ObjectMapper().readTree(json.toFile()));
    }

    static ProfileEvents parse(JsonNode root) {
        ProfileEvents p = new ProfileEvents();
        for (JsonNode e : root) {
            String cat = e.path("cat").asText("");
            String name = e.path("name").asText("");
            if (cat.equals("Session") && name.equals("model_run")) {
                p.runs++;
            }
            if (!cat.equals("Node") || !name.endsWith(SUFFIX)) {
                continue;
            }
            String node = name.substring(0, name.length() - SUFFIX.length());
            p.durations.computeIfAbsent(node, k -> new ArrayList<>()).add(e.path("dur").asDouble());
            p.opTypes.putIfAbsent(node, e.path("args").path("op_name").asText(""));
        }
        return p;
    }
}
