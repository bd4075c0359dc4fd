package dev.erg.device;

import static dev.erg.device.ProfileTree.clip;

import dev.erg.device.ProfileTree.Entry;
import dev.erg.device.ProfileTree.Node;
import dev.erg.device.ProfileTree.Type;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads the engines of a profile, one method per kind (docs/profiles.md, "Engines"), after the schema has
 * accepted the document: which keys an engine takes is the schema's to say, not this class's.
 */
final class EngineReader extends ProfileFields {
    static final String KINDS = "mac-array, vector, analog-sum-array, in-memory-macro, cpu";
    /** Upper bound for cores: far above any real processor. */
    static final int MAX_CORES = 4096;
    /** Upper bound for rows, columns and lanes: far above any real array, far below overflow. */
    static final int MAX_UNITS_SIDE = 65536;

    EngineReader(String label) {
        super(label);
    }

    List<Engine> engines(Obj top) {
        Entry list = requireEntry(top, "engines", "a profile needs name, clock-mhz, engines and memories");
        if (list.value.type != Type.LIST) {
            throw fail(list.value.line, "engines", "must be a list of engines (got " + list.value.describe() + ")");
        }
        if (list.value.list.isEmpty()) {
            throw fail(list.value.line, "engines", "must list at least one engine");
        }
        List<Engine> out = new ArrayList<>();
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < list.value.list.size(); i++) {
            Node n = list.value.list.get(i);
            String path = "engines[" + i + "]";
            if (n.type != Type.MAP) {
                throw fail(n.line, path, "must be a mapping of engine keys (got " + n.describe() + ")");
            }
            Obj o = new Obj(n, path);
            String id = id(o);
            String clash = ids.putIfAbsent(id, path);
            if (clash != null) {
                throw fail(o.get("id").value.line, o.sub("id"), "duplicate id \"" + id + "\" (also " + clash + ")");
            }
            Entry kindEntry = requireEntry(o, "kind", "an engine needs id and kind (" + KINDS + ")");
            String kind = text(o, "kind");
            if (kind.equals(Engine.Kind.MAC_ARRAY.key)) {
                out.add(macArray(o, id));
            } else if (kind.equals(Engine.Kind.VECTOR.key)) {
                out.add(vector(o, id));
            } else if (kind.equals(Engine.Kind.ANALOG_SUM_ARRAY.key)) {
                out.add(analog(o, id));
            } else if (kind.equals(Engine.Kind.IN_MEMORY_MACRO.key)) {
                out.add(macro(o, id));
            } else if (kind.equals(Engine.Kind.CPU.key)) {
                out.add(cpu(o, id));
            } else {
                throw fail(kindEntry.value.line, o.sub("kind"), "unknown kind \"" + clip(kind) + "\" (known: " + KINDS
                        + ")");
            }
        }
        return out;
    }

    private Engine macArray(Obj o, String id) {
        String needs = "a mac-array needs rows, columns, dataflow and mac-energy-fj or mac-energy-pj";
        int rows = (int) whole(o, requireEntry(o, "rows", needs), 1, MAX_UNITS_SIDE);
        int columns = (int) whole(o, requireEntry(o, "columns", needs), 1, MAX_UNITS_SIDE);
        Entry df = requireEntry(o, "dataflow", needs);
        String dfText = text(o, "dataflow");
        Dataflow dataflow = Dataflow.ofKey(dfText);
        if (dataflow == null) {
            throw fail(df.value.line, o.sub("dataflow"), "unknown dataflow \"" + clip(dfText)
                    + "\" (known: weight-stationary, output-stationary, no-reuse)");
        }
        Map<String, Double> energy = energyTable(o, "mac-energy");
        double mulFraction = o.get("multiply-fraction") != null
                ? fraction(o, o.get("multiply-fraction")) : Engine.DEFAULT_MAC_MULTIPLY_FRACTION;
        int accBits = accumulatorBits(o);
        long overhead = overhead(o, (long) rows + columns);
        Engine.Binary binary = null;
        Entry xnor = o.get("xnor-energy-fj");
        Entry pop = o.get("popcount-energy-fj");
        if (xnor != null || pop != null) {
            if (xnor == null || pop == null) {
                Entry given = xnor != null ? xnor : pop;
                throw fail(given.line, o.sub(xnor == null ? "xnor-energy-fj" : "popcount-energy-fj"),
                        "missing (a 1-bit MAC is priced from xnor-energy-fj and popcount-energy-fj together)");
            }
            binary = new Engine.Binary(nonNegative(o, xnor), nonNegative(o, pop));
        }
        return Engine.of(id, Engine.Kind.MAC_ARRAY, rows, columns, 0, dataflow, energy, mulFraction, accBits,
                overhead, binary, null, null);
    }

    private Engine vector(Obj o, String id) {
        String needs = "a vector engine needs lanes and op-energy-fj or op-energy-pj";
        int lanes = (int) whole(o, requireEntry(o, "lanes", needs), 1, MAX_UNITS_SIDE);
        Map<String, Double> energy = energyTable(o, "op-energy");
        double mulFraction = o.get("multiply-fraction") != null
                ? fraction(o, o.get("multiply-fraction")) : Engine.DEFAULT_VECTOR_MULTIPLY_FRACTION;
        long overhead = overhead(o, 0);
        return new Engine(id, Engine.Kind.VECTOR, 0, 0, lanes, null, energy, mulFraction, 0, overhead);
    }

    private Engine analog(Obj o, String id) {
        String needs = "an analog-sum-array needs rows, columns, multiply-energy-fj or multiply-energy-pj, "
                + "accumulation-energy-fj, conversion-energy-fj, converter-bits and partial-add-energy-fj";
        int rows = (int) whole(o, requireEntry(o, "rows", needs), 1, MAX_UNITS_SIDE);
        int columns = (int) whole(o, requireEntry(o, "columns", needs), 1, MAX_UNITS_SIDE);
        Map<String, Double> energy = energyTable(o, "multiply-energy");
        double mulFraction = o.get("multiply-fraction") != null ? fraction(o, o.get("multiply-fraction")) : 1;
        double acc = nonNegative(o, requireEntry(o, "accumulation-energy-fj", needs));
        double conv = nonNegative(o, requireEntry(o, "conversion-energy-fj", needs));
        int convBits = (int) whole(o, requireEntry(o, "converter-bits", needs), 1, 32);
        double add = nonNegative(o, requireEntry(o, "partial-add-energy-fj", needs));
        return Engine.of(id, Engine.Kind.ANALOG_SUM_ARRAY, rows, columns, 0, Dataflow.WEIGHT_STATIONARY, energy,
                mulFraction, accumulatorBits(o), overhead(o, (long) rows + columns), null,
                new Engine.AnalogSum(acc, conv, convBits, add), null);
    }

    private Engine macro(Obj o, String id) {
        String needs = "an in-memory-macro needs rows, columns, row-drive-energy-fj, column-energy-fj, "
                + "conversion-energy-fj, converter-bits, cell-write-energy-fj and shift-add-energy-fj";
        int rows = (int) whole(o, requireEntry(o, "rows", needs), 1, MAX_UNITS_SIDE);
        int columns = (int) whole(o, requireEntry(o, "columns", needs), 1, MAX_UNITS_SIDE);
        int count = o.get("macros") != null ? (int) whole(o, o.get("macros"), 1, MAX_UNITS_SIDE) : 1;
        int bitsPerCell = o.get("bits-per-cell") != null ? (int) whole(o, o.get("bits-per-cell"), 1, 8) : 1;
        int weightBits = o.get("weight-bits") != null ? (int) whole(o, o.get("weight-bits"), 1, 64) : 0;
        int active = o.get("rows-active") != null ? (int) whole(o, o.get("rows-active"), 1, rows) : rows;
        int inBits = o.get("input-bits-per-cycle") != null
                ? (int) whole(o, o.get("input-bits-per-cycle"), 1, 64) : 1;
        double row = nonNegative(o, requireEntry(o, "row-drive-energy-fj", needs));
        double col = nonNegative(o, requireEntry(o, "column-energy-fj", needs));
        double conv = nonNegative(o, requireEntry(o, "conversion-energy-fj", needs));
        int convBits = (int) whole(o, requireEntry(o, "converter-bits", needs), 1, 32);
        double write = nonNegative(o, requireEntry(o, "cell-write-energy-fj", needs));
        double shift = nonNegative(o, requireEntry(o, "shift-add-energy-fj", needs));
        double writeCycles = o.get("write-cycles-per-row") != null ? nonNegative(o, o.get("write-cycles-per-row")) : 1;
        Engine.Macro m = new Engine.Macro(bitsPerCell, weightBits, count, active, inBits, row, col, conv, convBits,
                write, shift, writeCycles);
        return Engine.of(id, Engine.Kind.IN_MEMORY_MACRO, rows, columns, 0, Dataflow.WEIGHT_STATIONARY, Map.of(), 1,
                accumulatorBits(o), overhead(o, 0), null, null, m);
    }

    private Engine cpu(Obj o, String id) {
        String needs = "a cpu needs cores and macs-per-cycle-per-core";
        int cores = (int) whole(o, requireEntry(o, "cores", needs), 1, MAX_CORES);
        Map<String, Double> macs = rateTable(o, requireEntry(o, "macs-per-cycle-per-core", needs));
        Map<String, Double> ops = o.get("ops-per-cycle-per-core") != null
                ? rateTable(o, o.get("ops-per-cycle-per-core")) : Map.of();
        Entry mac = oneOf(o, "mac-energy-fj", "mac-energy-pj", false);
        Entry op = oneOf(o, "op-energy-fj", "op-energy-pj", false);
        if ((mac == null) != (op == null)) {
            Entry given = mac != null ? mac : op;
            throw fail(given.line, o.sub(mac == null ? "mac-energy-fj" : "op-energy-fj"), "missing (a cpu gives "
                    + "mac-energy and op-energy together, or neither when its energy is unknown)");
        }
        Map<String, Double> macEnergy = mac != null ? energyTable(o, "mac-energy") : Map.of();
        Map<String, Double> opEnergy = op != null ? energyTable(o, "op-energy") : Map.of();
        double mulFraction = o.get("multiply-fraction") != null
                ? fraction(o, o.get("multiply-fraction")) : Engine.DEFAULT_MAC_MULTIPLY_FRACTION;
        return Engine.cpu(id, new Engine.Cpu(cores, macs, ops, opEnergy), macEnergy, mulFraction, overhead(o, 0));
    }

    private int accumulatorBits(Obj o) {
        return o.get("accumulator-bits") != null
                ? (int) whole(o, o.get("accumulator-bits"), 1, 64) : Engine.DEFAULT_ACCUMULATOR_BITS;
    }

    private long overhead(Obj o, long dflt) {
        return o.get("layer-overhead-cycles") != null ? whole(o, o.get("layer-overhead-cycles"), 0, 1L << 40) : dflt;
    }
}
