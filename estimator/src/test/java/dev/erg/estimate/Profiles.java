package dev.erg.estimate;

import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

/** Profiles written as text for the estimator's tests, loaded through the public loader. */
final class Profiles {
    private Profiles() {
    }

    /** Memories of the worked examples (invented round numbers): no registers, SRAM 50/60 fJ/B, DRAM 20 pJ/B. */
    static final String MEMORIES = String.join("\n",
            "memories:",
            "  - id: sram",
            "    capacity-kib: 256",
            "    read-energy-fj-per-byte: 50",
            "    write-energy-fj-per-byte: 60",
            "    bytes-per-cycle: 16",
            "  - id: dram",
            "    read-energy-pj-per-byte: 20",
            "    write-energy-pj-per-byte: 20",
            "    gbytes-per-second: 1",
            "");

    /** A profile from YAML text: name, clock 100 MHz, deploy int8, the given engines, {@link #MEMORIES}. */
    static DeviceProfile of(String engines) {
        return load("name: test\nclock-mhz: 100\ndeploy-precision: int8\nengines:\n" + engines + MEMORIES);
    }

    static DeviceProfile load(String yaml) {
        try {
            Path dir = Files.createTempDirectory("erg-prof");
            Path f = dir.resolve("p.yaml");
            Files.writeString(f, yaml, StandardCharsets.UTF_8);
            DeviceProfile p = DeviceLoader.load(f.toString(), null);
            Files.delete(f);
            Files.delete(dir);
            return p;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
