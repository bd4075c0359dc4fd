package dev.erg.device;

import static dev.erg.device.ProfileTree.clip;

import dev.erg.error.BadInputException;
import dev.erg.device.ProfileTree.Entry;
import dev.erg.device.ProfileTree.Node;
import dev.erg.device.ProfileTree.Type;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Turns a profile document tree that the schema has accepted ({@link ProfileSchema}) into a
 * {@link DeviceProfile}. The keys, types and ranges are the schema's; this reads the values and checks
 * what the schema cannot say (ids used twice, a capacity that is no whole number of bytes, a rows-active
 * above the rows, energies given for some levels but not others, a source path that names no key). Such
 * a fault ends the read with one line naming the file, the line and the key path. Engines are read by
 * {@link EngineReader}.
 */
final class ProfileReader extends ProfileFields {
    ProfileReader(String label) {
        super(label);
    }

    DeviceProfile read(String id, Node root) {
        if (root == null) {
            throw new BadInputException(label + ": the file is empty; a device profile needs name, clock-mhz, engines "
                    + "and memories");
        }
        if (root.type != Type.MAP) {
            throw fail(root.line, "", "a device profile must be a mapping of keys (got " + root.describe() + ")");
        }
        Obj top = new Obj(root, "");
        if (top.get("$schema") != null) {
            text(top, "$schema");
        }
        String name = requireText(top, "name", "a profile needs name, clock-mhz, engines and memories");
        String description = top.get("description") != null ? text(top, "description") : null;
        double clockMhz = positive(top, requireEntry(top, "clock-mhz",
                "a profile needs name, clock-mhz, engines and memories"));
        double maxClockMhz = top.get("max-clock-mhz") != null ? positive(top, top.get("max-clock-mhz")) : 0;
        if (maxClockMhz > 0 && maxClockMhz < clockMhz) {
            throw fail(top.get("max-clock-mhz").value.line, top.sub("max-clock-mhz"), "must be at least clock-mhz ("
                    + clockMhz + "), not " + maxClockMhz);
        }
        double staticMw = top.get("static-power-mw") != null ? nonNegative(top, top.get("static-power-mw")) : 0;
        String deploy = null;
        if (top.get("deploy-precision") != null) {
            Entry e = top.get("deploy-precision");
            deploy = text(top, "deploy-precision");
        }
        List<Engine> engines = new EngineReader(label).engines(top);
        boolean allCpu = true;
        for (Engine e : engines) {
            allCpu &= e.kind() == Engine.Kind.CPU;
        }
        List<Memory> caches = new ArrayList<>();
        Memory[] levels = memories(top, allCpu, caches);
        energiesAllOrNone(top, engines, levels, caches);
        Map<String, String> sources = sources(top, root);
        DeviceProfile p = new DeviceProfile(id, name, description, clockMhz, engines, levels[0], levels[1], caches,
                levels[2], staticMw, deploy, sources, calibration(top));
        return maxClockMhz > 0 ? p.withMaxClockMhz(maxClockMhz) : p;
    }

    /**
     * A processor profile may leave every energy out (its estimates then report energy as unknown), but
     * not some: either every engine and memory level gives its energies, or none does.
     */
    private void energiesAllOrNone(Obj top, List<Engine> engines, Memory[] levels, List<Memory> caches) {
        List<Object> known = new ArrayList<>();
        List<Object> unknown = new ArrayList<>();
        for (Engine e : engines) {
            (e.energyKnown() ? known : unknown).add(e);
        }
        List<Memory> all = new ArrayList<>(caches);
        for (Memory m : levels) {
            if (m != null && !caches.contains(m)) {
                all.add(m);
            }
        }
        for (Memory m : all) {
            (m.energyKnown() ? known : unknown).add(m);
        }
        if (known.isEmpty() || unknown.isEmpty()) {
            return;
        }
        Object first = unknown.get(0);
        List<Node> memNodes = top.get("memories").value.list;
        if (first instanceof Engine) {
            int i = engines.indexOf(first);
            Node n = top.get("engines").value.list.get(i);
            throw fail(n.line, "engines[" + i + "].mac-energy-fj", "missing (give every energy of the profile or "
                    + "none: a processor profile without energies has its energy reported as unknown)");
        }
        Memory m = (Memory) first;
        for (int i = 0; i < memNodes.size(); i++) {
            Entry idEntry = memNodes.get(i).map.get("id");
            if (idEntry != null && m.id().equals(idEntry.value.text)) {
                throw fail(memNodes.get(i).line, "memories[" + i + "]." + (Double.isNaN(m.readFjPerByte())
                        ? "read-energy-fj-per-byte" : "write-energy-fj-per-byte"), "missing (give every energy of "
                        + "the profile or none: a processor profile without energies has its energy reported as "
                        + "unknown)");
            }
        }
        throw fail(top.node.line, "memories", "give every energy of the profile or none");
    }

    // ---- memories ----

    /** Registers (or null), SRAM (or null when there are caches) and DRAM; cache levels go to {@code caches}. */
    private Memory[] memories(Obj top, boolean energyOptional, List<Memory> caches) {
        Entry list = requireEntry(top, "memories", "a profile needs name, clock-mhz, engines and memories");
        if (list.value.type != Type.LIST) {
            throw fail(list.value.line, "memories", "must be a list of memory levels (got "
                    + list.value.describe() + ")");
        }
        Memory[] levels = new Memory[3];
        String[] where = new String[3]; // "memories[i], line n" of each level
        Map<String, String> ids = new HashMap<>();
        for (int i = 0; i < list.value.list.size(); i++) {
            Node n = list.value.list.get(i);
            String path = "memories[" + i + "]";
            if (n.type != Type.MAP) {
                throw fail(n.line, path, "must be a mapping of memory keys (got " + n.describe() + ")");
            }
            Obj o = new Obj(n, path);
            String id = id(o);
            String clash = ids.putIfAbsent(id, path);
            if (clash != null) {
                throw fail(o.get("id").value.line, o.sub("id"), "duplicate id \"" + id + "\" (also " + clash + ")");
            }
            Memory.Level level;
            Entry levelEntry = o.get("level");
            if (levelEntry != null) {
                String l = text(o, "level");
                level = levelOf(l);
                if (level == null) {
                    throw fail(levelEntry.value.line, o.sub("level"), "unknown level \"" + clip(l)
                            + "\" (known: registers, sram, cache, dram)");
                }
            } else {
                level = levelOf(id);
                if (level == null) {
                    throw fail(n.line, o.sub("level"), "missing (the id \"" + id + "\" names no level; add level: "
                            + "registers, sram, cache or dram)");
                }
            }
            if (level == Memory.Level.CACHE) {
                if (levels[Memory.Level.SRAM.ordinal()] != null) {
                    throw fail(n.line, path, "a cache level beside an sram level (the sram is " + where[1]
                            + "; a profile has one sram or cache levels)");
                }
                caches.add(memory(o, id, level, energyOptional));
                continue;
            }
            int k = level.ordinal();
            if (levels[k] != null) {
                throw fail(n.line, path, "a second " + level.key + " level (the first is " + where[k] + ")");
            }
            if (level == Memory.Level.SRAM && !caches.isEmpty()) {
                throw fail(n.line, path, "an sram level beside cache levels (a profile has one sram or cache levels)");
            }
            where[k] = path + " on line " + n.line;
            levels[k] = memory(o, id, level, energyOptional);
        }
        boolean onChip = levels[Memory.Level.SRAM.ordinal()] != null || !caches.isEmpty();
        if (!onChip || levels[Memory.Level.DRAM.ordinal()] == null) {
            String missing = !onChip ? "sram" : "dram";
            throw fail(list.value.line, "memories", "no " + missing + " level (a profile needs sram and dram, or "
                    + "cache levels and dram; registers are optional)");
        }
        return levels;
    }

    private static Memory.Level levelOf(String key) {
        for (Memory.Level l : Memory.Level.values()) {
            if (l.key.equals(key)) {
                return l;
            }
        }
        return null;
    }

    private Memory memory(Obj o, String id, Memory.Level level, boolean energyOptional) {
        long capacity = -1;
        if (level == Memory.Level.SRAM || level == Memory.Level.CACHE) {
            capacity = capacity(o, level);
        }
        double read = energyPerByte(o, "read-energy", energyOptional);
        double write = energyPerByte(o, "write-energy", energyOptional);
        double perCycle = 0;
        double perSecond = 0;
        if (level != Memory.Level.REGISTERS) {
            Entry bw = oneOf(o, "bytes-per-cycle", "gbytes-per-second", false);
            if (bw != null && bw.key.equals("bytes-per-cycle")) {
                perCycle = positive(o, bw);
            } else if (bw != null) {
                perSecond = positive(o, bw) * 1e9;
            }
        }
        return new Memory(id, level, capacity, read, write, perCycle, perSecond);
    }

    private long capacity(Obj o, Memory.Level level) {
        Entry found = null;
        for (String k : List.of("capacity-kib", "capacity-mib", "capacity-bytes")) {
            Entry e = o.get(k);
            if (e != null && found != null) {
                throw fail(e.line, o.sub(k), "give one capacity, not both " + found.key + " (line " + found.line
                        + ") and " + k);
            }
            if (e != null) {
                found = e;
            }
        }
        if (found == null) {
            throw fail(o.node.line, o.sub("capacity-kib"), "missing (" + (level == Memory.Level.SRAM ? "an sram" : "a cache") + " level needs capacity-kib, capacity-mib "
                    + "or capacity-bytes)");
        }
        double v = positive(o, found);
        double unit = found.key.equals("capacity-kib") ? 1024 : found.key.equals("capacity-mib") ? 1024 * 1024 : 1;
        double bytes = v * unit;
        if (bytes != Math.rint(bytes)) {
            throw fail(found.value.line, o.sub(found.key), "must come to a whole number of bytes (got "
                    + found.value.text + ")");
        }
        if (bytes > 1L << 50) {
            throw fail(found.value.line, o.sub(found.key), "must be at most 2^50 bytes (got " + found.value.text + ")");
        }
        return (long) bytes;
    }

    private double energyPerByte(Obj o, String stem, boolean optional) {
        Entry e = oneOf(o, stem + "-fj-per-byte", stem + "-pj-per-byte", !optional);
        if (e == null) {
            return Double.NaN;
        }
        return nonNegative(o, e) * (e.key.contains("-pj-") ? 1000 : 1);
    }

    // ---- calibration ----

    /** The factors and error bands of the calibration section (the schema has checked its shape), or null. */
    private ProfileCalibration calibration(Obj top) {
        Entry c = top.get("calibration");
        if (c == null) {
            return null;
        }
        Obj cal = new Obj(c.value, "calibration");
        Map<String, Double> factors = new LinkedHashMap<>();
        Entry f = cal.get("factors");
        if (f != null) {
            Obj fo = new Obj(f.value, cal.sub("factors"));
            for (Entry e : f.value.map.values()) {
                double v = nonNegative(fo, e);
                if (!e.key.equals(ProfileCalibration.STATIC_POWER_MW) && !e.key.equals(ProfileCalibration.LAYER_OVERHEAD_US)
                        && !(v > 0)) {
                    throw fail(e.value.line, fo.sub(e.key), "must be greater than 0 (got " + e.value.text + ")");
                }
                factors.put(e.key, v);
            }
        }
        ProfileCalibration.Band latency = null;
        ProfileCalibration.Band energy = null;
        Entry err = cal.get("error");
        if (err != null) {
            Obj eo = new Obj(err.value, cal.sub("error"));
            latency = band(eo, "latency");
            energy = band(eo, "energy");
        }
        return new ProfileCalibration(factors, latency, energy);
    }

    private ProfileCalibration.Band band(Obj error, String metric) {
        Entry m = error.get(metric);
        if (m == null) {
            return null;
        }
        Obj o = new Obj(m.value, error.sub(metric));
        double low = number(o, o.get("band-low"));
        double high = number(o, o.get("band-high"));
        if (low > 0 || high < 0 || low <= -1) {
            throw fail(m.value.line, o.path, "band-low must lie in (-1, 0] and band-high at or above 0 (got "
                    + low + " and " + high + ")");
        }
        return new ProfileCalibration.Band(low, high, (int) number(o, o.get("layers")), (int) number(o, o.get("models")),
                text(o, "band-from"));
    }

    // ---- sources ----

    private Map<String, String> sources(Obj top, Node root) {
        Entry e = top.get("sources");
        if (e == null) {
            return Map.of();
        }
        if (e.value.type != Type.MAP) {
            throw fail(e.value.line, "sources", "must be a mapping of key path to source (got "
                    + e.value.describe() + ")");
        }
        Set<String> paths = new LinkedHashSet<>();
        collectPaths(root, "", paths);
        Obj src = new Obj(e.value, "sources");
        Map<String, String> out = new LinkedHashMap<>();
        for (Entry s : e.value.map.values()) {
            if (!paths.contains(s.key)) {
                throw fail(s.line, src.sub(s.key), "names no key of this profile (write key paths as in messages, "
                        + "e.g. engines[0].rows)");
            }
            String text = text(src, s.key);
            if (text.isBlank()) {
                throw fail(s.value.line, src.sub(s.key), "must name a source (got empty text)");
            }
            out.put(s.key, text);
        }
        return out;
    }

    /** Every key path of the document (mappings, lists and leaves), sources and $schema left out. */
    static void collectPaths(Node n, String path, Set<String> out) {
        if (n.type == Type.MAP) {
            for (Entry e : n.map.values()) {
                if (path.isEmpty() && (e.key.equals("sources") || e.key.equals("$schema"))) {
                    continue;
                }
                String p = path.isEmpty() ? e.key : path + "." + e.key;
                out.add(p);
                collectPaths(e.value, p, out);
            }
        } else if (n.type == Type.LIST) {
            for (int i = 0; i < n.list.size(); i++) {
                String p = path + "[" + i + "]";
                out.add(p);
                collectPaths(n.list.get(i), p, out);
            }
        }
    }
}
