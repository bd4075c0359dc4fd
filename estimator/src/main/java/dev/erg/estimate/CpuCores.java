package dev.erg.estimate;

import dev.erg.device.Engine;
import dev.erg.error.BadInputException;

/**
 * A processor: {@code cores} cores that each retire a number of MACs per cycle at a precision (SIMD
 * lanes x FMA units), and run vector work on the same lanes (docs/method.md, section 10). The node is
 * taken as a blocked kernel: every operand passes through the caches once (inputs in the im2col view,
 * weights once, outputs once); registers are not priced. When the profile gives no energies, the MACs
 * are priced as unknown ({@link Energy#UNKNOWN}).
 */
final class CpuCores implements EngineModel {
    private final Engine engine;
    private final Engine.Cpu cpu;

    CpuCores(Engine engine) {
        this.engine = engine;
        this.cpu = engine.cpu();
    }

    @Override
    public Engine engine() {
        return engine;
    }

    @Override
    public void map(MacJob j, NodeEstimate e) {
        double lanes = cpu.cores() * macRate(j.precision);
        e.computeCycles = (long) Math.ceil(j.macs / lanes);
        e.utilization = e.computeCycles == 0 ? 0 : j.macs / (e.computeCycles * lanes);
        if (j.g == 0) { // no matrix view (a node that carries subgraphs): every MAC reads its operands
            e.sramReadBytes = Math.round(j.macs * (j.aB() + j.wB()));
            e.sramWriteBytes = 0;
            e.passes = 1;
            return;
        }
        double reads = j.aB() * j.g * j.m * j.k + j.wB() * j.g * j.k * j.n;
        double writes = j.writesOut ? j.oB() * j.g * j.m * j.n : 0;
        e.sramReadBytes = Math.round(reads);
        e.sramWriteBytes = Math.round(writes);
        e.passes = 1;
    }

    /** MACs per cycle per core at {@code precision}. */
    double macRate(String precision) {
        Engine.Rate r = cpu.macRate(precision);
        if (r == null) {
            throw new BadInputException("engine '" + engine.id() + "' lists no MAC rate from which " + precision
                    + " can be derived (it lists " + cpu.macsPerCycle().keySet() + ")");
        }
        return r.perCycle();
    }

    /** Cycles of {@code ops} vector operations at {@code precision} on every core. */
    long opCycles(long ops, String precision) {
        Engine.Rate r = cpu.opRate(precision);
        if (r == null) {
            throw new BadInputException("engine '" + engine.id() + "' lists no rate from which " + precision
                    + " vector ops can be derived");
        }
        return (long) Math.ceil(ops / (cpu.cores() * r.perCycle()));
    }

    /** The assumption a rate derived from another precision adds, or null when the rate is listed. */
    String derivedNote(String precision, boolean ops) {
        Engine.Rate r = ops ? cpu.opRate(precision) : cpu.macRate(precision);
        if (r == null || r.from().equals(precision)) {
            return null;
        }
        return (ops ? "vector ops" : "MACs") + " per cycle at " + precision + " on '" + engine.id()
                + "' are taken from " + r.from() + " (" + fmt(r.perCycle()) + " per core)";
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }

    @Override
    public Energy price(MacJob job, NodeEstimate e, Pricing pricing) {
        if (!engine.energyKnown()) {
            return Energy.UNKNOWN;
        }
        return DigitalArray.digitalMacs(engine, job, pricing, "MAC");
    }
}
