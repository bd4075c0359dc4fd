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

    public DeviceProfile(String id, String name, double clockMhz, List<Engine> engines, Memory registers, Memory sram,
                         Memory dram, double staticPowerMw, String deployPrecision, Map<String, String> sources) {
        this(id, name, null, clockMhz, engines, registers, sram, dram, staticPowerMw, deployPrecision, sources);
    }

    /** As above, with the profile's free-text description (or null). */
    public DeviceProfile(String id, String name, String description, double clockMhz, List<Engine> engines,
                         Memory registers, Memory sram, Memory dram, double staticPowerMw, String deployPrecision,
                         Map<String, String> sources) {
        this.id = id;
        this.name = name;
        this.description = description;
        this.clockMhz = clockMhz;
        this.engines = List.copyOf(engines);
        this.registers = registers;
        this.sram = sram;
        this.dram = dram;
        this.staticPowerMw = staticPowerMw;
        this.deployPrecision = deployPrecision;
        this.sources = Collections.unmodifiableMap(new LinkedHashMap<>(sources));
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

    public Memory sram() {
        return sram;
    }

    public Memory dram() {
        return dram;
    }

    public double staticPowerMw() {
        return staticPowerMw;
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
