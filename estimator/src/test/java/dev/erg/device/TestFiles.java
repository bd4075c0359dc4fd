package dev.erg.device;

import java.nio.file.Files;
import java.nio.file.Path;

/** Locates files of the repository (docs/) from the module directory the tests run in. */
final class TestFiles {
    private TestFiles() {
    }

    static Path repoRoot() {
        Path p = Path.of("").toAbsolutePath();
        while (p != null && !Files.exists(p.resolve("docs/device-profile.schema.json"))) {
            p = p.getParent();
        }
        if (p == null) {
            throw new IllegalStateException("docs/device-profile.schema.json not found above the working directory");
        }
        return p;
    }

    static String presetText(String id) throws Exception {
        try (var in = DeviceLoader.class.getClassLoader().getResourceAsStream("dev/erg/device/presets/" + id + ".yaml")) {
            return new String(in.readAllBytes(), java.nio.charset.StandardCharsets.UTF_8);
        }
    }
}
