package dev.erg.budget;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.erg.error.BadInputException;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.NodeEstimate;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * The committed record of a previous build's results, per model and device: the headline metrics and
 * every layer's MACs, energy and latency. Written by the baseline goal, read to catch growth.
 *
 * <pre>
 * { "format": "erg-baseline", "version": 1,
 *   "entries": [ { "model": "...", "device": "...",
 *                  "metrics": { "macs": 0, "energyPerFrameJoules": 0.0, "latencySeconds": 0.0,
 *                               "weightBytes": 0, "peakActivationBytes": 0 },
 *                  "layers": [ { "name": "...", "opType": "Conv", "macs": 0, "energyJoules": 0.0,
 *                                "latencySeconds": 0.0 } ] } ] }
 * </pre>
 */
public final class Baseline {
    public static final String FORMAT = "erg-baseline";
    public static final int VERSION = 1;
    private static final long MAX_BYTES = 64L << 20;

    /** One model on one device, as recorded. */
    public static final class Entry {
        final String model;
        final String device;
        final long macs;
        final double energyPerFrameJoules;
        final double latencySeconds;
        final long weightBytes;
        final long peakActivationBytes;
        final Map<String, Layer> layers;

        Entry(String model, String device, long macs, double energy, double latency, long weights, long peak,
              Map<String, Layer> layers) {
            this.model = model;
            this.device = device;
            this.macs = macs;
            this.energyPerFrameJoules = energy;
            this.latencySeconds = latency;
            this.weightBytes = weights;
            this.peakActivationBytes = peak;
            this.layers = layers;
        }

        public long macs() {
            return macs;
        }

        public double energyPerFrameJoules() {
            return energyPerFrameJoules;
        }

        public double latencySeconds() {
            return latencySeconds;
        }

        public long weightBytes() {
            return weightBytes;
        }

        public long peakActivationBytes() {
            return peakActivationBytes;
        }

        /** Layers by name, in the recorded order. */
        public Map<String, Layer> layers() {
            return Collections.unmodifiableMap(layers);
        }
    }

    /** One layer as recorded. */
    public static final class Layer {
        final String opType;
        final long macs;
        final double energyJoules;
        final double latencySeconds;

        Layer(String opType, long macs, double energyJoules, double latencySeconds) {
            this.opType = opType;
            this.macs = macs;
            this.energyJoules = energyJoules;
            this.latencySeconds = latencySeconds;
        }
    }

    private final Map<String, Entry> entries;

    private Baseline(Map<String, Entry> entries) {
        this.entries = entries;
    }

    private static String key(String model, String device) {
        return model + "\u0000" + device;
    }

    /** The recorded entry for a model on a device, or null. */
    public Entry entry(String model, String device) {
        return entries.get(key(model, device));
    }

    public int size() {
        return entries.size();
    }

    /** A baseline of the given results. */
    public static Baseline of(List<PairResult> pairs) {
        Map<String, Entry> m = new TreeMap<>();
        for (PairResult p : pairs) {
            DeviceEstimate e = p.estimate();
            Map<String, Layer> layers = new LinkedHashMap<>();
            for (NodeEstimate n : e.nodes()) {
                if (n.priced() || n.work().macs() > 0) {
                    layers.put(n.name(), new Layer(n.work().opType(), n.work().macs(), n.energy().total(),
                            n.latencySeconds()));
                }
            }
            m.put(key(p.model(), p.device()), new Entry(p.model(), p.device(), e.workload().macs(),
                    e.energyPerFrameJoules(), e.latencySeconds(), e.weightBytes(), e.activationPeakBytes(), layers));
        }
        return new Baseline(m);
    }

    /**
     * This baseline with the entries of {@code older} that it does not replace: refreshing some
     * models or devices keeps the others' records. {@code older} may be null.
     */
    public Baseline over(Baseline older) {
        if (older == null) {
            return this;
        }
        Map<String, Entry> m = new TreeMap<>(older.entries);
        m.putAll(entries);
        return new Baseline(m);
    }

    /** Reads a baseline file; returns null when the file does not exist. */
    public static Baseline read(Path file) {
        if (!Files.exists(file)) {
            return null;
        }
        JsonNode root;
        try {
            if (Files.size(file) > MAX_BYTES) {
                throw new BadInputException(file + ": the baseline file is larger than 64 MiB");
            }
            root = new ObjectMapper().readTree(Files.readAllBytes(file));
        } catch (JsonProcessingException e) {
            throw new BadInputException(file + ": not a valid baseline (JSON error at line "
                    + e.getLocation().getLineNr() + ": " + e.getOriginalMessage() + ")");
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read the baseline (" + e.getMessage() + ")");
        }
        if (root == null || !root.isObject() || !FORMAT.equals(root.path("format").asText())) {
            throw new BadInputException(file + ": not an erg baseline (no \"format\": \"" + FORMAT + "\")");
        }
        if (root.path("version").asInt() != VERSION) {
            throw new BadInputException(file + ": baseline version " + root.path("version").asText()
                    + " is not supported (expected " + VERSION + ")");
        }
        Map<String, Entry> m = new TreeMap<>();
        int i = 0;
        for (JsonNode e : root.path("entries")) {
            String where = file + ": entries[" + i++ + "]";
            String model = text(e, "model", where);
            String device = text(e, "device", where);
            JsonNode met = e.path("metrics");
            Map<String, Layer> layers = new LinkedHashMap<>();
            for (JsonNode l : e.path("layers")) {
                layers.put(text(l, "name", where + ".layers"), new Layer(l.path("opType").asText(),
                        l.path("macs").asLong(), l.path("energyJoules").asDouble(), l.path("latencySeconds").asDouble()));
            }
            m.put(key(model, device), new Entry(model, device, number(met, "macs", where).longValue(),
                    number(met, "energyPerFrameJoules", where).doubleValue(),
                    number(met, "latencySeconds", where).doubleValue(),
                    number(met, "weightBytes", where).longValue(),
                    number(met, "peakActivationBytes", where).longValue(), layers));
        }
        return new Baseline(m);
    }

    private static String text(JsonNode n, String field, String where) {
        JsonNode v = n.get(field);
        if (v == null || !v.isTextual()) {
            throw new BadInputException(where + "." + field + ": missing or not a string");
        }
        return v.asText();
    }

    private static Number number(JsonNode n, String field, String where) {
        JsonNode v = n.get(field);
        if (v == null || !v.isNumber()) {
            throw new BadInputException(where + ".metrics." + field + ": missing or not a number");
        }
        return v.numberValue();
    }

    /** The baseline as deterministic JSON text (entries sorted by model then device, "\n" line ends). */
    public String toJson() {
        ObjectMapper om = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = om.createObjectNode();
        root.put("format", FORMAT);
        root.put("version", VERSION);
        ArrayNode arr = root.putArray("entries");
        List<Entry> sorted = new ArrayList<>(entries.values());
        for (Entry e : sorted) {
            ObjectNode o = arr.addObject();
            o.put("model", e.model);
            o.put("device", e.device);
            ObjectNode met = o.putObject("metrics");
            met.put("macs", e.macs);
            met.put("energyPerFrameJoules", e.energyPerFrameJoules);
            met.put("latencySeconds", e.latencySeconds);
            met.put("weightBytes", e.weightBytes);
            met.put("peakActivationBytes", e.peakActivationBytes);
            ArrayNode ls = o.putArray("layers");
            for (Map.Entry<String, Layer> l : e.layers.entrySet()) {
                ObjectNode lo = ls.addObject();
                lo.put("name", l.getKey());
                lo.put("opType", l.getValue().opType);
                lo.put("macs", l.getValue().macs);
                lo.put("energyJoules", l.getValue().energyJoules);
                lo.put("latencySeconds", l.getValue().latencySeconds);
            }
        }
        try {
            return om.writer().withDefaultPrettyPrinter().writeValueAsString(root).replace("\r\n", "\n") + "\n";
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    public void write(Path file) {
        try {
            Path parent = file.toAbsolutePath().getParent();
            if (parent != null) {
                Files.createDirectories(parent);
            }
            Files.write(file, toJson().getBytes(StandardCharsets.UTF_8));
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot write the baseline (" + e.getMessage() + ")");
        }
    }

    /** Per-layer differences of a result against its entry: layers added, removed, or changed. */
    public static List<LayerDiff> diff(Entry base, DeviceEstimate current) {
        List<LayerDiff> out = new ArrayList<>();
        Map<String, NodeEstimate> now = new LinkedHashMap<>();
        for (NodeEstimate n : current.nodes()) {
            if (n.priced() || n.work().macs() > 0) {
                now.put(n.name(), n);
            }
        }
        for (Map.Entry<String, NodeEstimate> c : now.entrySet()) {
            NodeEstimate n = c.getValue();
            Layer b = base.layers.get(c.getKey());
            if (b == null) {
                out.add(new LayerDiff(c.getKey(), n.work().opType(), LayerDiff.Change.ADDED, n.work().macs(),
                        n.energy().total(), n.latencySeconds()));
            } else if (b.macs != n.work().macs() || differs(b.energyJoules, n.energy().total())
                    || differs(b.latencySeconds, n.latencySeconds()) || !b.opType.equals(n.work().opType())) {
                out.add(new LayerDiff(c.getKey(), n.work().opType(), LayerDiff.Change.CHANGED, n.work().macs() - b.macs,
                        n.energy().total() - b.energyJoules, n.latencySeconds() - b.latencySeconds));
            }
        }
        for (Map.Entry<String, Layer> b : base.layers.entrySet()) {
            if (!now.containsKey(b.getKey())) {
                Layer l = b.getValue();
                out.add(new LayerDiff(b.getKey(), l.opType, LayerDiff.Change.REMOVED, -l.macs, -l.energyJoules,
                        -l.latencySeconds));
            }
        }
        return out;
    }

    private static boolean differs(double a, double b) {
        double scale = Math.max(Math.abs(a), Math.abs(b));
        return scale > 0 && Math.abs(a - b) > 1e-9 * scale;
    }
}
