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

    /**
     * The engine that runs the MAC layers and that the roofline's compute roof describes: the first
     * array of any kind (mac-array, analog-sum-array, in-memory-macro), as the estimator picks it; the
     * vector unit without one.
     */
    Engine macEngine() {
        for (Engine e : profile().engines()) {
            if (e.isArray()) {
                return e;
            }
        }
        return profile().first(Engine.Kind.VECTOR);
    }

    /**
     * Peak MACs per second of {@link #macEngine()}. A mac-array or analog-sum-array does one MAC per cell
     * per cycle, a vector unit one per lane. An in-memory macro does {@code count x rows-active x columns
     * / (s x c_in)} MACs per cycle: the rows driven at once, the weight bits sliced over {@code s} columns,
     * inputs applied over {@code c_in} cycles (docs/method.md, section 7), at the precision of
     * {@link #peakPrecision()}.
     */
    double peakMacsPerSecond() {
        Engine e = macEngine();
        if (e == null) {
            return 0;
        }
        if (e.kind() == Engine.Kind.IN_MEMORY_MACRO) {
            int[] wa = peakPrecision();
            Engine.Macro mc = e.macro();
            long slices = Math.max(1, (wa[0] + mc.bitsPerCell() - 1) / mc.bitsPerCell());
            long inCycles = Math.max(1, (wa[1] + mc.inputBitsPerCycle() - 1) / mc.inputBitsPerCycle());
            long rowsAtOnce = Math.min(mc.rowsActive(), e.rows());
            return (double) mc.count() * rowsAtOnce * e.columns() / (slices * inCycles) * profile().clockHz();
        }
        return e.units() * profile().clockHz();
    }

    /**
     * The weight and activation bits an in-memory macro's peak is taken at: those of the MAC layer with
     * most MACs on it, or the macro's weight bits and 8-bit activations when no layer runs there.
     */
    int[] peakPrecision() {
        Engine e = macEngine();
        NodeEstimate best = null;
        for (NodeEstimate n : layers) {
            if (n.work().macs() > 0 && e != null && e.id().equals(n.engine()) && n.deployed() != null
                    && (best == null || n.work().macs() > best.work().macs())) {
                best = n;
            }
        }
        if (best == null) {
            int w = e != null && e.macro() != null ? e.macro().weightBits() : 8;
            return new int[] {w, 8};
        }
        return new int[] {Math.max(1, best.deployed().weightBits()), Math.max(1, best.deployed().activationBits())};
    }

    /** The MAC engine in words: "a 64×64 weight-stationary MAC array", "12 in-memory macros of 256×256 cells". */
    String macEngineWords() {
        Engine a = macEngine();
        if (a == null) {
            return "no engine";
        }
        switch (a.kind()) {
            case MAC_ARRAY:
                return "a " + a.rows() + "×" + a.columns() + " " + a.dataflow().key + " MAC array";
            case ANALOG_SUM_ARRAY:
                return "a " + a.rows() + "×" + a.columns() + " analog-sum array";
            case IN_MEMORY_MACRO:
                int n = a.macro().count();
                return n + " in-memory macro" + (n == 1 ? "" : "s") + " of " + a.rows() + "×" + a.columns()
                        + " cells, " + a.macro().bitsPerCell() + " bit" + (a.macro().bitsPerCell() == 1 ? "" : "s")
                        + " per cell";
            case VECTOR:
                return "a " + a.lanes() + "-lane vector unit";
            default:
                return "the " + a.kind().key + " engine '" + a.id() + "'";
        }
    }

    /**
     * The destinations the reports of this pair list, in report order: compute, registers, SRAM, DRAM
     * and static always; conversion, cell writes and row drive when the profile has an engine that
     * spends them (analog-sum-array, in-memory-macro) or they are not zero.
     */
    List<Energy.Destination> destinations() {
        boolean analog = false;
        boolean macro = false;
        for (Engine e : profile().engines()) {
            analog |= e.kind() == Engine.Kind.ANALOG_SUM_ARRAY;
            macro |= e.kind() == Engine.Kind.IN_MEMORY_MACRO;
        }
        Energy t = estimate.energy();
        List<Energy.Destination> out = new ArrayList<>();
        for (Energy.Destination d : Energy.Destination.values()) {
            boolean shown;
            switch (d) {
                case CONVERSION:
                    shown = analog || macro || t.conversion() != 0;
                    break;
                case CELL_WRITES:
                case ROW_DRIVE:
                    shown = macro || t.of(d) != 0;
                    break;
                default:
                    shown = true;
            }
            if (shown) {
                out.add(d);
            }
        }
        return out;
    }

    /** True when the reports show the accumulation part of compute apart: on analog and in-memory profiles. */
    boolean showsAccumulation() {
        return destinations().size() > 5;
    }

    /** A destination as reports label it: "compute", "SRAM", "cell writes"... */
    static String label(Energy.Destination d) {
        switch (d) {
            case SRAM:
                return "SRAM";
            case DRAM:
                return "DRAM";
            default:
                return d.key.replace('-', ' ');
        }
    }

    /** The destination with the most dynamic energy in the frame. */
    Energy.Destination dominant() {
        return estimate.energy().dominant();
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

    /**
     * Where the frame energy goes, every destination of {@link #destinations()}, as "compute 8.20,
     * registers 1.05, SRAM 12.4, DRAM 0.72, static 10.5 µJ"; the parts add up to the frame's energy. On
     * analog and in-memory profiles compute says how much of it is accumulation: "compute 3.1 (of it
     * accumulation 2.9), ...".
     */
    String energySplit() {
        Energy e = estimate.energy();
        StringBuilder b = new StringBuilder();
        for (Energy.Destination d : destinations()) {
            b.append(b.length() == 0 ? "" : ", ").append(label(d)).append(' ').append(Format.sig(e.of(d) * 1e6));
            if (d == Energy.Destination.COMPUTE && showsAccumulation()) {
                b.append(" (of it accumulation ").append(Format.sig(e.accumulation() * 1e6)).append(')');
            }
        }
        return b.append(" µJ").toString();
    }

    /** True when an in-memory macro of the profile holds MAC weights in its cells. */
    boolean weightsInCells() {
        for (NodeEstimate n : layers) {
            if (n.work().macs() > 0 && n.engine() != null) {
                Engine e = engineById(n.engine());
                if (e != null && e.kind() == Engine.Kind.IN_MEMORY_MACRO) {
                    return true;
                }
            }
        }
        return false;
    }

    private Engine engineById(String id) {
        for (Engine e : profile().engines()) {
            if (e.id().equals(id)) {
                return e;
            }
        }
        return null;
    }

    /** How the weights sit on the device, in words. */
    String weightPlacement() {
        if (estimate.weightsReloadedEachFrame()) {
            return "reloaded every frame: the in-memory macros cannot hold them, so they are read from DRAM and"
                    + " written into the cells";
        }
        String rest = estimate.weightsResident() ? "resident in SRAM (loaded once, not per frame)"
                : "streamed from DRAM every frame";
        return weightsInCells() ? "MAC weights held in the in-memory macro cells (written once); the rest " + rest
                : rest;
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
