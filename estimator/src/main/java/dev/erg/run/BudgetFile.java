package dev.erg.run;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import dev.erg.budget.Budget;
import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * A budget file: the run's budget and the limits of single models and devices, in YAML (.yaml, .yml)
 * or JSON (.json). Every block is optional; each holds budget keys ({@code targetFps},
 * {@code maxPowerMw}, ...). A model's own limit overrides its device's, which overrides the run's.
 *
 * <pre>
 * budget:                        # every model on every device
 *   targetFps: 4
 *   maxPowerMw: 25
 * models:                        # by the model as given to the run
 *   models/feeder.onnx:
 *     maxLatencyMs: 80
 * devices:                       # by the device as given to the run
 *   "preset:feeder-npu":
 *     maxPowerMw: 15
 * </pre>
 *
 * @param file    the file, as given
 * @param budget  the run's limits
 * @param models  limits per model label
 * @param devices limits per device label
 */
public record BudgetFile(Path file, Budget budget, Map<String, Budget> models, Map<String, Budget> devices) {
    private static final long MAX_BYTES = 1 << 20;
    private static final Set<String> TOP = Set.of("budget", "models", "devices");

    /** Reads and checks a budget file; every fault is one line naming the file and the key. */
    public static BudgetFile read(Path file) {
        JsonNode root;
        try {
            if (!Files.isRegularFile(file)) {
                throw new BadInputException(file + ": no such budget file");
            }
            if (Files.size(file) > MAX_BYTES) {
                throw new BadInputException(file + ": the budget file is larger than 1 MiB");
            }
            String name = file.getFileName().toString().toLowerCase(Locale.ROOT);
            ObjectMapper om = name.endsWith(".json") ? new ObjectMapper() : new ObjectMapper(new YAMLFactory());
            root = om.readTree(Files.readAllBytes(file));
        } catch (JsonProcessingException e) {
            throw new BadInputException(file + ": not a valid budget file (line " + e.getLocation().getLineNr() + ": "
                    + oneLine(e.getOriginalMessage()) + ")");
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read the budget file (" + oneLine(e.getMessage()) + ")");
        }
        if (root == null || root.isMissingNode() || root.isNull()) {
            return new BudgetFile(file, Budget.none(), Map.of(), Map.of());
        }
        if (!root.isObject()) {
            throw new BadInputException(file + ": a budget file is a map with the keys budget, models and devices");
        }
        for (Iterator<String> it = root.fieldNames(); it.hasNext(); ) {
            String k = it.next();
            if (!TOP.contains(k)) {
                throw new BadInputException(file + ": unknown key '" + k + "' (known: budget, models, devices)");
            }
        }
        Budget budget = root.has("budget") ? budget(file + ": budget", root.get("budget")) : Budget.none();
        return new BudgetFile(file, budget, blocks(file, "models", root.get("models")),
                blocks(file, "devices", root.get("devices")));
    }

    private static Map<String, Budget> blocks(Path file, String key, JsonNode n) {
        Map<String, Budget> out = new LinkedHashMap<>();
        if (n == null || n.isNull()) {
            return out;
        }
        if (!n.isObject()) {
            throw new BadInputException(file + ": " + key + ": a map from each " + key.substring(0, key.length() - 1)
                    + " to its limits");
        }
        for (Iterator<Map.Entry<String, JsonNode>> it = n.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            out.put(e.getKey(), budget(file + ": " + key + "." + e.getKey(), e.getValue()));
        }
        return out;
    }

    private static Budget budget(String where, JsonNode n) {
        if (n == null || n.isNull()) {
            return Budget.none();
        }
        if (!n.isObject()) {
            throw new BadInputException(where + ": a map of limits (e.g. maxPowerMw: 25)");
        }
        Budget.Builder b = Budget.builder(where);
        for (Iterator<Map.Entry<String, JsonNode>> it = n.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            if (!e.getValue().isNumber()) {
                b.limit(e.getKey(), null); // an unknown key is named first
                throw new BadInputException(where + " " + e.getKey() + ": must be a number greater than 0 (got '"
                        + oneLine(e.getValue().asText()) + "')");
            }
            b.limit(e.getKey(), e.getValue().doubleValue());
        }
        return b.build();
    }

    /**
     * Fills {@code req} with this file's limits: its run budget under {@code overrides} (limits given
     * elsewhere, e.g. on a command line), and each model's and device's own. A model or device the file
     * names that is not in {@code models} / {@code devices} is an error, since a typo would leave a
     * limit silently unused.
     */
    public void apply(RunRequest.Builder req, Budget overrides, List<ModelSpec> models, List<String> devices) {
        for (String m : this.models.keySet()) {
            if (models.stream().noneMatch(s -> s.label().equals(m))) {
                throw new BadInputException(file + ": models." + m + ": not one of the models of this run");
            }
        }
        for (String d : this.devices.keySet()) {
            if (!devices.contains(d)) {
                throw new BadInputException(file + ": devices." + d + ": not one of the devices of this run");
            }
        }
        req.budget(overrides.over(budget));
        for (ModelSpec m : models) {
            Budget own = this.models.get(m.label());
            req.model(own == null ? m : m.withBudget(own.over(m.budget())));
        }
        for (String d : devices) {
            Budget own = this.devices.get(d);
            req.device(own == null ? new DeviceSpec(d) : new DeviceSpec(d).withBudget(own));
        }
    }

    private static String oneLine(String s) {
        return s == null ? "" : s.replace('\n', ' ').replace('\r', ' ').strip();
    }
}
