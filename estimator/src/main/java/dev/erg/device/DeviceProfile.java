package dev.erg.device;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** A target device: clock, compute engines, memory hierarchy and static power. Immutable. */
public final class DeviceProfile {
    private final String id;
    private final String name;
    private final String description;
    private final double clockMhz;
    private final List<Engine> engines;
    private final Memory registers;
    private final Memory sram;
    private final Memory dram;
    private final double staticPowerMw;
    private final String deployPrecision;
    private final Map<String, String> sources;
    private final List<Memory> caches;
    private double maxClockMhz;
    private final ProfileCalibration calibration;

    public DeviceProfile(String id, String name, double clockMhz, List<Engine> engines, Memory registers, Memory sram,
                         Memory dram, double staticPowerMw, String deployPrecision, Map<String, String> sources) {
        this(id, name, null, clockMhz, engines, registers, sram, dram, staticPowerMw, deployPrecision, sources);
    }

    /** As above, with the profile's free-text description (or null). */
    public DeviceProfile(String id, String name, String description, double clockMhz, List<Engine> engines,
                         Memory registers, Memory sram, Memory dram, double staticPowerMw, String deployPrecision,
                         Map<String, String> sources) {
        this(id, name, description, clockMhz, engines, registers, sram, List.of(), dram, staticPowerMw,
                deployPrecision, sources);
    }

    /**
     * As above, with cache levels (nearest first) instead of an SRAM: {@code sram} null and
     * {@code caches} not empty, or the other way round.
     */
    public DeviceProfile(String id, String name, String description, double clockMhz, List<Engine> engines,
                         Memory registers, Memory sram, List<Memory> caches, Memory dram, double staticPowerMw,
                         String deployPrecision, Map<String, String> sources) {
        this(id, name, description, clockMhz, engines, registers, sram, caches, dram, staticPowerMw, deployPrecision,
                sources, null);
    }

    /** As above, with the profile's calibration (or null when it has none). */
    public DeviceProfile(String id, String name, String description, double clockMhz, List<Engine> engines,
                         Memory registers, Memory sram, List<Memory> caches, Memory dram, double staticPowerMw,
                         String deployPrecision, Map<String, String> sources, ProfileCalibration calibration) {
        if ((sram == null) == caches.isEmpty()) {
            throw new IllegalArgumentException("a profile has an sram level or cache levels, not both or neither");
        }
        this.caches = List.copyOf(caches);
        this.id = id;
        this.name = name;
        this.description = description;
        this.clockMhz = clockMhz;
        this.engines = List.copyOf(engines);
        this.registers = registers;
        this.sram = sram != null ? sram : this.caches.get(this.caches.size() - 1);
        this.dram = dram;
        this.staticPowerMw = staticPowerMw;
        this.deployPrecision = deployPrecision;
        this.sources = Collections.unmodifiableMap(new LinkedHashMap<>(sources));
        this.calibration = calibration;
        this.sramGiven = sram;
    }

    private final Memory sramGiven;

    /** The calibration the profile carries (factors the estimator applies, error bands), or null. */
    public ProfileCalibration calibration() {
        return calibration;
    }

    /** The same profile without its calibration: what a new calibration is fitted against. */
    public DeviceProfile withoutCalibration() {
        if (calibration == null) {
            return this;
        }
        DeviceProfile p = new DeviceProfile(id, name, description, clockMhz, engines, registers, sramGiven, caches, dram,
                staticPowerMw, deployPrecision, sources, null);
        p.maxClockMhz = maxClockMhz;
        return p;
    }

    /** Where the profile came from: "preset:ID" or the file path as given. */
    public String id() {
        return id;
    }

    public String name() {
        return name;
    }

    /** Free text from the profile, or null. */
    public String description() {
        return description;
    }

    public double clockMhz() {
        return clockMhz;
    }

    /** The highest clock the profile declares the part may run at ({@code max-clock-mhz}); the clock without one. */
    public double maxClockMhz() {
        return maxClockMhz > 0 ? maxClockMhz : clockMhz;
    }

    /** This profile with a declared maximum clock (0: none). */
    public DeviceProfile withMaxClockMhz(double mhz) {
        DeviceProfile p = copy(clockMhz, engines, sram);
        p.maxClockMhz = mhz;
        return p;
    }

    /** This profile at another clock; static power, energies and the maximum are kept. */
    public DeviceProfile withClockMhz(double mhz) {
        return copy(mhz, engines, sram);
    }

    /** This profile with another SRAM. */
    public DeviceProfile withSram(Memory s) {
        return copy(clockMhz, engines, s);
    }

    /** This profile with engine {@code i} moved first, so that the estimator maps MAC layers onto it. */
    public DeviceProfile withArrayFirst(int i) {
        java.util.List<Engine> es = new java.util.ArrayList<>(engines);
        es.add(0, es.remove(i));
        return copy(clockMhz, es, sram);
    }

    /** This profile with engine {@code i} using dataflow {@code d}. */
    public DeviceProfile withDataflow(int i, Dataflow d) {
        java.util.List<Engine> es = new java.util.ArrayList<>(engines);
        es.set(i, es.get(i).withDataflow(d));
        return copy(clockMhz, es, sram);
    }

    private DeviceProfile copy(double clock, List<Engine> es, Memory s) {
        DeviceProfile p;
        if (caches.isEmpty()) {
            p = new DeviceProfile(id, name, description, clock, es, registers, s, List.of(), dram, staticPowerMw,
                    deployPrecision, sources, calibration);
        } else { // a processor: the last cache level is the one that holds weights and activations
            List<Memory> cs = new java.util.ArrayList<>(caches);
            cs.set(cs.size() - 1, s);
            p = new DeviceProfile(id, name, description, clock, es, registers, null, cs, dram, staticPowerMw,
                    deployPrecision, sources, calibration);
        }
        p.maxClockMhz = maxClockMhz;
        return p;
    }

    public double clockHz() {
        return clockMhz * 1e6;
    }

    public List<Engine> engines() {
        return engines;
    }

    /** The register level, or null when the profile prices none. */
    public Memory registers() {
        return registers;
    }

    /**
     * The on-chip level that holds weights and activations: the SRAM, or on a processor the last (largest)
     * cache level. Placement sizes residency, spills and tiles by its capacity.
     */
    public Memory sram() {
        return sram;
    }

    /** The cache levels of a processor, nearest first (L1, L2, ...); empty for a profile with an SRAM. */
    public List<Memory> caches() {
        return caches;
    }

    /**
     * True when the profile prices energy: every engine and every memory level gives its energies. Only a
     * processor profile may leave them out; its estimates then report energy as unknown.
     */
    public boolean energyKnown() {
        for (Engine e : engines) {
            if (!e.energyKnown()) {
                return false;
            }
        }
        for (Memory m : caches) {
            if (!m.energyKnown()) {
                return false;
            }
        }
        return (registers == null || registers.energyKnown()) && sram.energyKnown() && dram.energyKnown();
    }

    public Memory dram() {
        return dram;
    }

    /** Static power: the calibration's fitted value when it has one, else the profile's. */
    public double staticPowerMw() {
        return calibration == null ? staticPowerMw
                : calibration.factor(ProfileCalibration.STATIC_POWER_MW, staticPowerMw);
    }

    /** The precision the device's compiler deploys float tensors at (e.g. "int8"), or null to follow the model. */
    public String deployPrecision() {
        return deployPrecision;
    }

    /**
     * Sources of the profile's numbers, by key path as written in the file (e.g. {@code engines[0].rows}),
     * in file order. Presets name one for every number.
     */
    public Map<String, String> sources() {
        return sources;
    }

    /** The first engine of a kind, or null. */
    public Engine first(Engine.Kind kind) {
        for (Engine e : engines) {
            if (e.kind() == kind) {
                return e;
            }
        }
        return null;
    }
}
