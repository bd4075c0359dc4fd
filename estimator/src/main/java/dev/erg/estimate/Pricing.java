package dev.erg.estimate;

import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.device.Precisions;
import dev.erg.error.BadInputException;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Energy per operation at a precision, looked up in an engine's table (or derived by the bit-width
 * rule, with a note), remembered across the nodes of one estimate.
 */
public final class Pricing {
    /** One femtojoule in joules. */
    public static final double FJ = 1e-15;

    private final DeviceProfile device;
    private final List<String> assumptions;

    Pricing(DeviceProfile device, List<String> assumptions) {
        this.device = device;
        this.assumptions = assumptions;
    }

    /** Records an assumption the estimate made; reports list each once. */
    public void note(String assumption) {
        assumptions.add(assumption);
    }

    /** Energies already looked up: every node of one precision on one engine asks the same question. */
    private record Key(Engine engine, String precision, String what) {
    }

    private final Map<Key, Double> cache = new HashMap<>();

    /** A few recent lookups, checked before the map: most nodes ask one of two or three questions. */
    private final Engine[] memoEngine = new Engine[4];
    private final String[] memoPrecision = new String[4];
    private final String[] memoWhat = new String[4];
    private final double[] memoEnergy = new double[4];
    private int memoNext;

    /**
     * Energy in fJ of one operation ({@code what}: "MAC", "multiply", "vector op") at {@code precision}
     * on {@code engine}: the listed value or the bit-width rule from the nearest listed precision.
     *
     * @throws BadInputException when the engine lists nothing the precision can be derived from
     */
    public double fj(Engine engine, String precision, String what) {
        for (int i = 0; i < memoEngine.length; i++) {
            if (memoEngine[i] == engine && precision.equals(memoPrecision[i]) && what.equals(memoWhat[i])) {
                return memoEnergy[i];
            }
        }
        Key key = new Key(engine, precision, what);
        Double known = cache.get(key);
        double fj = known != null ? known : lookup(engine, precision, what);
        if (known == null) {
            cache.put(key, fj);
        }
        int slot = memoNext++ & 3;
        memoEngine[slot] = engine;
        memoPrecision[slot] = precision;
        memoWhat[slot] = what;
        memoEnergy[slot] = fj;
        return fj;
    }

    private double lookup(Engine engine, String precision, String what) {
        boolean cpuOps = engine.cpu() != null && what.equals("vector op");
        java.util.Map<String, Double> table = cpuOps ? engine.cpu().opEnergyFj() : engine.energyFj();
        Precisions.Lookup l = Precisions.lookup(table, precision, cpuOps ? 0 : engine.multiplyFraction());
        if (l == null) {
            throw new BadInputException(device.id() + ": engine '" + engine.id() + "' lists no " + what
                    + " energy from which " + precision + " can be derived (it lists " + table.keySet() + ")");
        }
        if (l.derived) {
            assumptions.add(what + " energy at " + precision + " on '" + engine.id() + "' is derived from " + l.from
                    + " by the bit-width rule (multiplier ~ bits^2, adder ~ bits; Nagel et al. 2021)");
        }
        return l.fj;
    }
}
