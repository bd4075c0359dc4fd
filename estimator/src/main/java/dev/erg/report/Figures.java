package dev.erg.report;

import dev.erg.budget.PairResult;
import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Energy;
import dev.erg.estimate.NodeEstimate;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.function.ToDoubleFunction;

/**
 * What every report of one model x device pair shows, worked out once from the result model: the
 * layers that run on the device, their rankings, and the device's roofs. Read-only.
 */
final class Figures {
    /** The pair's result, or null for an estimate without a gate ({@code erg estimate}). */
    final PairResult pair;
    final String model;
    final String device;
    final DeviceEstimate estimate;
    /** The frame rate that power is taken at. */
    final double fps;
    /** The nodes that run on the device, in topological order. */
    final List<NodeEstimate> layers;

    private Figures(PairResult pair, String model, String device, DeviceEstimate estimate, double fps) {
        this.pair = pair;
        this.model = model;
        this.device = device;
        this.estimate = estimate;
        this.fps = fps;
        List<NodeEstimate> run = new ArrayList<>();
        for (NodeEstimate n : estimate.nodes()) {
            if (n.priced()) {
                run.add(n);
            }
        }
        this.layers = List.copyOf(run);
    }

    static Figures of(PairResult p) {
        return new Figures(p, p.model(), p.device(), p.estimate(), p.fps());
    }

    /** An estimate on its own; {@code fps} null takes power with frames back to back. */
    static Figures of(String model, String device, DeviceEstimate e, Double fps) {
        return new Figures(null, model, device, e, fps != null ? fps : e.maxFps());
    }

    DeviceProfile profile() {
        return estimate.device();
    }

    /** The model's file name, without folders. */
    String modelName() {
        Path f = Path.of(model).getFileName();
        return f == null ? model : f.toString();
    }

    /** The layers ranked by {@code f}, largest first; the sort is stable (ties in topological order). */
    List<NodeEstimate> ranked(ToDoubleFunction<NodeEstimate> f) {
        List<NodeEstimate> out = new ArrayList<>(layers);
        out.sort(Comparator.comparingDouble(f).reversed());
        return out;
    }

    List<NodeEstimate> byEnergy() {
        return ranked(n -> n.energy().total());
    }

    List<NodeEstimate> byLatency() {
        return ranked(NodeEstimate::latencySeconds);
    }

    double averagePowerWatts() {
        return estimate.averagePowerWatts(fps);
    }

    /** The share of the frame energy that {@code n} takes (0 when the frame costs nothing). */
    double energyShare(NodeEstimate n) {
        double t = estimate.energyPerFrameJoules();
        return t > 0 ? n.energy().total() / t : 0;
    }

    /** The MAC array (or, without one, the vector unit) that the roofline's compute roof describes. */
    Engine macEngine() {
        Engine a = profile().first(Engine.Kind.MAC_ARRAY);
        return a != null ? a : profile().first(Engine.Kind.VECTOR);
    }

    /** Peak MACs per second: the engine's units times the clock. */
    double peakMacsPerSecond() {
        Engine e = macEngine();
        return e == null ? 0 : e.units() * profile().clockHz();
    }

    /** DRAM bandwidth in bytes per second (infinite when the profile gives none). */
    double dramBytesPerSecond() {
        return profile().dram().bandwidth(profile().clockHz());
    }

    double sramBytesPerSecond() {
        return profile().sram().bandwidth(profile().clockHz());
    }

    /** True when the pair was gated and every check holds (an estimate alone has no verdict). */
    boolean passed() {
        return pair == null || pair.passed();
    }

    /** Where the frame energy goes, as "compute 8.20, registers 1.05, SRAM 12.4, DRAM 0.72, static 10.5 µJ". */
    String energySplit() {
        Energy e = estimate.energy();
        return "compute " + Format.sig(e.compute() * 1e6) + ", registers " + Format.sig(e.registers() * 1e6)
                + ", SRAM " + Format.sig(e.sram() * 1e6) + ", DRAM " + Format.sig(e.dram() * 1e6) + ", static "
                + Format.sig(e.staticEnergy() * 1e6) + " µJ";
    }

    /** How the weights sit on the device, in words. */
    String weightPlacement() {
        return estimate.weightsResident() ? "resident in SRAM (loaded once, not per frame)"
                : "streamed from DRAM every frame";
    }

    /**
     * The headline figures, each as {label, value, detail}, in the order every report shows them.
     * Times in ms, energy in µJ, power in mW, memory in binary units.
     */
    List<String[]> summary() {
        DeviceEstimate e = estimate;
        List<String[]> out = new ArrayList<>();
        out.add(new String[] {"latency", Format.sig(e.latencySeconds() * 1e3) + " ms", "per frame, layers run one after another"});
        out.add(new String[] {"max frame rate", Format.sig(e.maxFps()) + " fps", "frames back to back"});
        out.add(new String[] {"energy per frame", Format.sig(e.energyPerFrameJoules() * 1e6) + " µJ", energySplit()});
        out.add(new String[] {"average power", Format.sig(averagePowerWatts() * 1e3) + " mW",
                "at " + Format.sig(fps) + " fps (static " + Format.sig(profile().staticPowerMw()) + " mW)"});
        out.add(new String[] {"MACs", Format.count(e.workload().macs()), Format.exact(e.workload().macs())
                + " per frame"});
        out.add(new String[] {"weights", Format.bytes(e.weightBytes()), weightPlacement()});
        out.add(new String[] {"peak activations", Format.bytes(e.activationPeakBytes()), "live at once, on the device"});
        long cap = profile().sram().capacityBytes();
        long used = e.weightBytes() + e.activationPeakBytes();
        out.add(new String[] {"SRAM", Format.bytes(cap), cap > 0 ? "weights + peak activations need "
                + Format.bytes(used) + " (" + Format.percent((double) used / cap) + ")" : ""});
        out.add(new String[] {"DRAM traffic", Format.bytes(e.dramBytesPerFrame()), "per frame"});
        return out;
    }
}
