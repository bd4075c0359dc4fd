package dev.erg.report;

import com.fasterxml.jackson.core.JsonGenerator;
import dev.erg.budget.Budget;
import dev.erg.budget.BudgetRules;
import dev.erg.budget.Check;
import dev.erg.budget.GateResult;
import dev.erg.budget.LayerDiff;
import dev.erg.budget.LayerShare;
import dev.erg.budget.PairResult;
import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.device.Memory;
import dev.erg.estimate.DeployedPrecision;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import dev.erg.workload.ModelInfo;
import dev.erg.workload.NodeWork;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * The JSON of a model's estimate on one device ({@code erg estimate --json}): the analysis document
 * of {@link AnalysisJson}, every field of it kept in its order, extended with the estimate.
 *
 * <pre>
 * { "model": {...}, "totals": { ...analysis..., then
 *       "latencySeconds", "maxFps", "energyPerFrameJoules", "averagePowerWatts", "fps",
 *       "energyJoules": { "compute", "registers", "sram", "dram", "conversion", "cellWrites", "rowDrive",
 *                         "static", "total", "accumulation" (the part of compute spent summing) },
 *       "weightsResident", "residentWeightBytes", "deviceWeightBytes", "deviceActivationPeakBytes",
 *       "dramBytesPerFrame", "weightsReloadedEachFrame", "energyPerMacJoules", "opsPerWatt",
 *       "macUtilisation", "dominantDestination" },
 *   "nodes": [ { ...analysis..., then, for a node that runs on the device,
 *       "estimate": { "engine", "precision",
 *                     "deployed": { "label", "weightBits", "activationBits", "origin" }, "weightsReloaded",
 *                     "latencySeconds", "utilisation", "bound", "computeCycles",
 *                     "bytes": { "registerRead", "registerWrite", "sramRead", "sramWrite", "dramRead", "dramWrite" },
 *                     "energyJoules": { ...as in the totals... },
 *                     "fusedInto"?, "tiling"?,
 *                     "seconds": { "compute", "sram", "dram", "overhead" } } } ],
 *   "unmodelled", "unresolved", "notice",
 *   then "device": { "id", "name", "description", "clockMhz", "staticPowerMw", "deployPrecision",
 *                    "peakMacsPerSecond", "engines": [...], "sram": {...}, "dram": {...} },
 *        "assumptions": [ "..." ] }
 * </pre>
 *
 * <p>{@link GateJson} writes the same document with the gate's fields after these: "budget",
 * "baseline", "checks", "diff", "passed". SI units throughout (seconds, joules, watts, bytes,
 * frames per second). A quantity that has no finite value (the frame rate of a model with no
 * work) is {@code null}. Deterministic like the analysis: the same input gives the same bytes.
 */
public final class EstimateJson {
    private EstimateJson() {
    }

    /** The estimate document; power is taken at {@code fps}, or with frames back to back when null. */
    public static byte[] toBytes(DeviceEstimate e, Double fps) {
        ModelInfo m = Format.model(e.workload());
        return bytes(Figures.of(m.file() == null ? "" : m.file().toString(), e.device().id(), e, fps), null);
    }

    /** Writes the estimate document to {@code file}, creating its parent folders. */
    public static void write(DeviceEstimate e, Double fps, Path file) throws IOException {
        Path parent = file.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        Files.write(file, toBytes(e, fps));
    }

    /** The document for {@code f}; with a gate result, the gate's fields too. */
    static byte[] bytes(Figures f, GateResult gate) {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try {
            write(f, gate, out);
        } catch (IOException ex) {
            throw new UncheckedIOException(ex);
        }
        return out.toByteArray();
    }

    static void write(Figures f, GateResult gate, OutputStream out) throws IOException {
        AnalysisJson.write(f.estimate.workload(), out, new Extension(f, gate));
    }

    /** Writes a double, or null when it has no finite value. */
    static void num(JsonGenerator g, String field, double v) throws IOException {
        if (Double.isNaN(v) || Double.isInfinite(v)) {
            g.writeNullField(field);
        } else {
            g.writeNumberField(field, v);
        }
    }

    private static void nullableString(JsonGenerator g, String field, String v) throws IOException {
        if (v == null) {
            g.writeNullField(field);
        } else {
            g.writeStringField(field, v);
        }
    }

    static void energy(JsonGenerator g, String field, Energy e) throws IOException {
        g.writeObjectFieldStart(field);
        num(g, "compute", e.compute());
        num(g, "registers", e.registers());
        num(g, "sram", e.sram());
        num(g, "dram", e.dram());
        num(g, "conversion", e.conversion());
        num(g, "cellWrites", e.cellWrites());
        num(g, "rowDrive", e.rowDrive());
        num(g, "static", e.staticEnergy());
        num(g, "total", e.total());
        num(g, "accumulation", e.accumulation());
        g.writeEndObject();
    }

    private static final class Extension implements AnalysisJson.Extension {
        private final Figures f;
        private final GateResult gate;

        Extension(Figures f, GateResult gate) {
            this.f = f;
            this.gate = gate;
        }

        @Override
        public void totals(JsonGenerator g) throws IOException {
            DeviceEstimate e = f.estimate;
            num(g, "latencySeconds", e.latencySeconds());
            num(g, "maxFps", e.maxFps());
            num(g, "energyPerFrameJoules", e.energyPerFrameJoules());
            num(g, "averagePowerWatts", f.averagePowerWatts());
            num(g, "fps", f.fps);
            energy(g, "energyJoules", e.energy());
            g.writeBooleanField("weightsResident", e.weightsResident());
            g.writeNumberField("residentWeightBytes", e.residentWeightBytes());
            g.writeNumberField("deviceWeightBytes", e.weightBytes());
            g.writeNumberField("deviceActivationPeakBytes", e.activationPeakBytes());
            g.writeNumberField("dramBytesPerFrame", e.dramBytesPerFrame());
            g.writeBooleanField("weightsReloadedEachFrame", e.weightsReloadedEachFrame());
            num(g, "energyPerMacJoules", e.energyPerMacJoules());
            num(g, "opsPerWatt", e.opsPerWatt());
            num(g, "macUtilisation", e.macUtilization());
            g.writeStringField("dominantDestination", e.energy().dominant().key);
        }

        @Override
        public void node(JsonGenerator g, int index, NodeWork w) throws IOException {
            NodeEstimate n = f.estimate.nodes().get(index);
            if (n.work() != w) {
                throw new IllegalStateException("estimate and workload disagree on node " + index);
            }
            if (!n.priced()) {
                return;
            }
            g.writeObjectFieldStart("estimate");
            g.writeStringField("engine", n.engine());
            g.writeStringField("precision", n.precision());
            if (n.deployed() != null) {
                DeployedPrecision dp = n.deployed();
                g.writeObjectFieldStart("deployed");
                g.writeStringField("label", dp.label());
                g.writeNumberField("weightBits", dp.weightBits());
                g.writeNumberField("activationBits", dp.activationBits());
                g.writeStringField("origin", dp.origin().label);
                g.writeEndObject();
            }
            g.writeBooleanField("weightsReloaded", n.weightsReloaded());
            num(g, "latencySeconds", n.latencySeconds());
            num(g, "utilisation", n.utilization());
            g.writeStringField("bound", n.bound().label);
            g.writeNumberField("computeCycles", n.computeCycles());
            g.writeObjectFieldStart("bytes");
            g.writeNumberField("registerRead", n.registerReadBytes());
            g.writeNumberField("registerWrite", n.registerWriteBytes());
            g.writeNumberField("sramRead", n.sramReadBytes());
            g.writeNumberField("sramWrite", n.sramWriteBytes());
            g.writeNumberField("dramRead", n.dramReadBytes());
            g.writeNumberField("dramWrite", n.dramWriteBytes());
            g.writeEndObject();
            energy(g, "energyJoules", n.energy());
            if (n.fusedInto() != null) {
                g.writeStringField("fusedInto", n.fusedInto());
            }
            if (n.tiling() != null) {
                g.writeStringField("tiling", n.tiling());
            }
            g.writeObjectFieldStart("seconds");
            num(g, "compute", n.computeSeconds());
            num(g, "sram", n.sramSeconds());
            num(g, "dram", n.dramSeconds());
            num(g, "overhead", n.overheadSeconds());
            g.writeEndObject();
            g.writeEndObject();
        }

        @Override
        public void tail(JsonGenerator g) throws IOException {
            device(g);
            g.writeArrayFieldStart("assumptions");
            for (String a : f.estimate.assumptions()) {
                g.writeString(a);
            }
            g.writeEndArray();
            if (gate != null) {
                gate(g);
            }
        }

        private void device(JsonGenerator g) throws IOException {
            DeviceProfile d = f.profile();
            g.writeObjectFieldStart("device");
            g.writeStringField("id", f.device);
            g.writeStringField("name", d.name());
            nullableString(g, "description", d.description());
            num(g, "clockMhz", d.clockMhz());
            num(g, "staticPowerMw", d.staticPowerMw());
            nullableString(g, "deployPrecision", d.deployPrecision());
            num(g, "peakMacsPerSecond", f.peakMacsPerSecond());
            g.writeArrayFieldStart("engines");
            for (Engine e : d.engines()) {
                g.writeStartObject();
                g.writeStringField("id", e.id());
                g.writeStringField("kind", e.kind().key);
                if (e.isArray()) {
                    g.writeNumberField("rows", e.rows());
                    g.writeNumberField("columns", e.columns());
                    if (e.kind() == Engine.Kind.MAC_ARRAY) {
                        g.writeStringField("dataflow", e.dataflow() == null ? null : e.dataflow().key);
                    }
                    if (e.macro() != null) {
                        g.writeNumberField("macros", e.macro().count());
                    }
                } else {
                    g.writeNumberField("lanes", e.lanes());
                }
                g.writeNumberField("layerOverheadCycles", e.layerOverheadCycles());
                g.writeEndObject();
            }
            g.writeEndArray();
            memory(g, "sram", d.sram());
            memory(g, "dram", d.dram());
            g.writeEndObject();
        }

        private void memory(JsonGenerator g, String field, Memory m) throws IOException {
            g.writeObjectFieldStart(field);
            if (m.capacityBytes() >= 0) {
                g.writeNumberField("capacityBytes", m.capacityBytes());
            } else {
                g.writeNullField("capacityBytes");
            }
            num(g, "bytesPerSecond", m.bandwidth(f.profile().clockHz()));
            g.writeEndObject();
        }

        private void gate(JsonGenerator g) throws IOException {
            PairResult p = f.pair;
            Budget b = p.budget();
            g.writeObjectFieldStart("budget");
            for (String key : BudgetRules.keys()) {
                optional(g, key, b.limit(key));
            }
            g.writeEndObject();
            g.writeObjectFieldStart("baseline");
            nullableString(g, "file", gate.baselineFile());
            g.writeBooleanField("found", gate.baselineFound());
            g.writeBooleanField("hasEntry", p.hasBaseline());
            optional(g, "maxGrowthPercent", gate.maxGrowthPercent());
            g.writeEndObject();
            g.writeArrayFieldStart("checks");
            for (Check c : p.checks()) {
                g.writeStartObject();
                g.writeStringField("kind", c.kind().label);
                g.writeStringField("metric", c.subject());
                g.writeStringField("unit", c.unit());
                num(g, "value", c.value());
                num(g, "limit", c.limit());
                if (c.kind() == Check.Kind.GROWTH) {
                    num(g, "baseline", c.baseline());
                }
                g.writeBooleanField("passed", c.passed());
                g.writeStringField("verdict", c.verdict().label);
                g.writeStringField("message", c.message());
                g.writeArrayFieldStart("topLayers");
                for (LayerShare s : c.topLayers()) {
                    g.writeStartObject();
                    g.writeStringField("name", s.name());
                    g.writeStringField("opType", s.opType());
                    num(g, "value", s.value());
                    num(g, "share", s.share());
                    g.writeEndObject();
                }
                g.writeEndArray();
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeArrayFieldStart("diff");
            for (LayerDiff d : p.diff()) {
                g.writeStartObject();
                g.writeStringField("name", d.name());
                g.writeStringField("opType", d.opType());
                g.writeStringField("change", d.change().label);
                g.writeNumberField("macsDelta", d.macsDelta());
                num(g, "energyDeltaJoules", d.energyDeltaJoules());
                num(g, "latencyDeltaSeconds", d.latencyDeltaSeconds());
                g.writeEndObject();
            }
            g.writeEndArray();
            g.writeBooleanField("passed", p.passed());
        }

        private static void optional(JsonGenerator g, String field, Double v) throws IOException {
            if (v == null) {
                g.writeNullField(field);
            } else {
                num(g, field, v);
            }
        }
    }
}
