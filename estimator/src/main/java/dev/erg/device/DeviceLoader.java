package dev.erg.device;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import dev.erg.error.BadInputException;
import dev.erg.error.InputFiles;
import dev.erg.device.ProfileTree.Node;
import java.io.BufferedReader;
import java.io.IOException;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.AccessDeniedException;
import java.nio.file.Files;
import java.nio.file.InvalidPathException;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Locale;
import java.util.regex.Pattern;

/**
 * Loads a device profile: a built-in preset ({@code preset:ID}) or a YAML / JSON file. Loading is
 * strict (see docs/profiles.md); any fault is a {@link BadInputException} whose message is one line
 * naming the file (or {@code preset:ID}), the line and the key path.
 */
public final class DeviceLoader {
    /** Profiles are small; anything larger is refused before it is read. */
    public static final int MAX_FILE_BYTES = 1 << 20;
    public static final String PRESET_PREFIX = "preset:";
    /** Faults listed in one message; the rest are counted. */
    static final int MAX_FAULTS_SHOWN = 20;
    private static final String PRESET_DIR = "dev/erg/device/presets/";
    private static final Pattern PRESET_ID = Pattern.compile("[a-z0-9][a-z0-9-]{0,63}");

    private static final JsonFactory JSON = new JsonFactory();
    private static volatile List<String> presets;

    private DeviceLoader() {
    }

    /**
     * Loads the profile named by {@code spec}: {@code preset:ID}, or a path ending in .yaml, .yml or
     * .json, resolved against {@code baseDir} when relative. The profile's id is {@code spec} as given.
     *
     * @throws BadInputException when the profile cannot be found, read or accepted
     */
    public static DeviceProfile load(String spec, Path baseDir) {
        if (spec == null || spec.isBlank()) {
            throw new BadInputException("device profile: none given (write preset:ID or a .yaml, .yml or .json file; "
                    + "presets: " + String.join(", ", presetIds()) + ")");
        }
        if (spec.startsWith(PRESET_PREFIX)) {
            return loadPreset(spec);
        }
        String label = ProfileTree.clip(spec);
        String lower = spec.toLowerCase(Locale.ROOT);
        boolean json = lower.endsWith(".json");
        if (!json && !lower.endsWith(".yaml") && !lower.endsWith(".yml")) {
            throw new BadInputException(label + ": not a device profile file name (it must end in .yaml, .yml or "
                    + ".json, or use preset:ID; presets: " + String.join(", ", presetIds()) + ")");
        }
        Path file;
        try {
            Path p = Path.of(spec);
            file = baseDir != null && !p.isAbsolute() ? baseDir.resolve(p) : p;
        } catch (InvalidPathException e) {
            throw new BadInputException(label + ": not a valid path (" + e.getReason() + ")");
        }
        return parse(label, readCapped(label, file), json);
    }

    /** The ids of the built-in presets, sorted. */
    public static List<String> presetIds() {
        List<String> p = presets;
        if (p == null) {
            List<String> ids = new ArrayList<>();
            try (InputStream in = DeviceLoader.class.getClassLoader().getResourceAsStream(PRESET_DIR + "index.txt")) {
                if (in != null) {
                    BufferedReader r = new BufferedReader(new InputStreamReader(in, StandardCharsets.UTF_8));
                    String line;
                    while ((line = r.readLine()) != null) {
                        line = line.strip();
                        if (!line.isEmpty() && !line.startsWith("#")) {
                            ids.add(line);
                        }
                    }
                }
            } catch (IOException e) {
                throw new IllegalStateException("the preset index cannot be read", e);
            }
            Collections.sort(ids);
            p = List.copyOf(ids);
            presets = p;
        }
        return p;
    }

    private static DeviceProfile loadPreset(String spec) {
        // presets pass the schema at build time (DeviceProfileSchemaTest)
        return parse(ProfileTree.clip(spec), presetBytes(spec), false, false);
    }

    /**
     * The text of a built-in preset ({@code preset:ID}) as packaged, comments and sources included.
     *
     * @throws BadInputException when there is no such preset
     */
    public static String presetText(String spec) {
        return new String(presetBytes(spec), StandardCharsets.UTF_8);
    }

    private static byte[] presetBytes(String spec) {
        String id = spec.substring(PRESET_PREFIX.length());
        String label = ProfileTree.clip(spec);
        if (!PRESET_ID.matcher(id).matches() || !presetIds().contains(id)) {
            throw new BadInputException(label + ": no such preset (presets: " + String.join(", ", presetIds()) + ")");
        }
        try (InputStream in = DeviceLoader.class.getClassLoader().getResourceAsStream(PRESET_DIR + id + ".yaml")) {
            if (in == null) {
                throw new IllegalStateException("preset " + id + " is listed but not packaged");
            }
            return in.readNBytes(MAX_FILE_BYTES);
        } catch (IOException e) {
            throw new BadInputException(label + ": cannot read the preset (" + e.getMessage() + ")");
        }
    }

    private static byte[] readCapped(String label, Path file) {
        InputFiles.requireRegular(file, label, "device profile file");
        try (InputStream in = Files.newInputStream(file)) {
            byte[] data = in.readNBytes(MAX_FILE_BYTES + 1);
            if (data.length > MAX_FILE_BYTES) {
                throw new BadInputException(label + ": too large for a device profile (more than "
                        + (MAX_FILE_BYTES >> 20) + " MiB)");
            }
            return data;
        } catch (NoSuchFileException e) {
            throw new BadInputException(label + ": no such device profile file");
        } catch (AccessDeniedException e) {
            throw new BadInputException(label + ": cannot read the device profile file (permission denied)");
        } catch (IOException e) {
            throw new BadInputException(label + ": cannot read the device profile file (" + oneLine(e.getMessage())
                    + ")");
        }
    }

    /** Parses and validates profile text; {@code label} names it in messages and becomes its id. */
    static DeviceProfile parse(String label, byte[] data, boolean json) {
        return parse(label, data, json, true);
    }

    /** As above; {@code checkSchema} false skips the schema (for the built-in presets, checked by the build). */
    static DeviceProfile parse(String label, byte[] data, boolean json, boolean checkSchema) {
        Node root;
        try (JsonParser p = json ? JSON.createParser(data) : Yaml.parser(data)) {
            root = ProfileTree.read(p, label);
        } catch (JsonProcessingException e) {
            throw new BadInputException(ProfileTree.syntaxError(label, e, json ? "JSON" : "YAML"));
        } catch (IOException e) {
            throw new BadInputException(label + ": cannot read (" + oneLine(e.getMessage()) + ")");
        } catch (BadInputException e) {
            throw e;
        } catch (RuntimeException e) {
            // the YAML scanner reports some faults (bad characters, limits) as unchecked exceptions
            throw new BadInputException(label + ": not valid " + (json ? "JSON" : "YAML") + ": "
                    + oneLine(e.getMessage() != null ? e.getMessage() : e.getClass().getSimpleName()));
        }
        if (checkSchema && root != null && root.type == ProfileTree.Type.MAP) {
            List<ProfileSchema.Fault> faults = ProfileSchema.check(label, root);
            if (!faults.isEmpty()) {
                throw new BadInputException(faultLine(label, faults));
            }
        }
        return new ProfileReader(label).read(label, root);
    }

    /**
     * The YAML parser, loaded on first use, so that reading a JSON profile never loads the YAML stack
     * (about 160 classes). No YAML type appears in DeviceLoader's own code, so verifying it loads none.
     */
    private static final class Yaml {
        private static final YAMLFactory FACTORY = new YAMLFactory();

        static JsonParser parser(byte[] data) throws IOException {
            return FACTORY.createParser(data);
        }
    }

    /** One fault as its line; several as {@code N faults: a; b; c} (the first 20, then how many more). */
    static String faultLine(String label, List<ProfileSchema.Fault> faults) {
        if (faults.size() == 1) {
            return faults.get(0).format(label);
        }
        StringBuilder b = new StringBuilder().append(faults.size()).append(" faults: ");
        int shown = Math.min(faults.size(), MAX_FAULTS_SHOWN);
        for (int i = 0; i < shown; i++) {
            b.append(i == 0 ? "" : "; ").append(faults.get(i).format(label));
        }
        if (faults.size() > shown) {
            b.append("; and ").append(faults.size() - shown).append(" more");
        }
        return b.toString();
    }

    private static String oneLine(String s) {
        if (s == null) {
            return "unknown error";
        }
        int nl = s.indexOf('\n');
        return ProfileTree.clip(nl >= 0 ? s.substring(0, nl) : s);
    }
}
