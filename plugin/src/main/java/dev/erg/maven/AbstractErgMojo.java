package dev.erg.maven;

import dev.erg.analysis.AnalysisOptions;
import dev.erg.error.BadInputException;
import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.Gate;
import dev.erg.graph.InputBindings;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.report.Reports;
import java.io.File;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;
import org.apache.maven.plugin.AbstractMojo;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugin.MojoFailureException;
import org.apache.maven.plugins.annotations.Parameter;

/**
 * The configuration every erg goal shares, and its translation into the library's terms. The goals
 * hold no logic of their own beyond mapping results to log lines and build outcomes.
 */
abstract class AbstractErgMojo extends AbstractMojo {
    static final String PREFIX = "erg: ";

    /**
     * The ONNX models to estimate. Each {@code <model>} has a {@code <file>} (relative to the project's
     * base directory) and optional {@code <dimensions>} that bind symbolic dimensions, e.g.
     * {@code <batch>1</batch>}.
     */
    @Parameter
    List<ModelConfig> models;

    /**
     * The target devices: {@code preset:ID} for a built-in profile, or a device profile file (.yaml,
     * .yml or .json) relative to the project's base directory. Every model is estimated on every device.
     */
    @Parameter
    List<String> devices;

    /**
     * The baseline file (relative to the project's base directory) that growth is measured against.
     * Written by the {@code baseline} goal and committed with the project. Without it no growth is checked.
     */
    @Parameter(property = "erg.baseline")
    String baseline;

    /**
     * Makes an operator that erg has no rule for (or a node left unresolved downstream of one) an
     * error instead of a line in the reports. Unmodelled nodes are never priced, so the totals of such
     * a model are incomplete.
     */
    @Parameter(property = "erg.failOnUnmodelled", defaultValue = "false")
    boolean failOnUnmodelled;

    /** Skips the goal. */
    @Parameter(property = "erg.skip", defaultValue = "false")
    boolean skip;

    /** The project's base directory, against which relative paths are resolved. */
    @Parameter(defaultValue = "${project.basedir}", readonly = true, required = true)
    File basedir;

    /** The configuration resolved into the library's terms. */
    static final class Settings {
        final List<Gate.ModelSpec> models;
        final List<String> devices;
        final Budget budget;
        final String baselineLabel;
        final Path baselineFile;
        final Double maxGrowthPercent;
        final Set<String> formats;
        final Path outputDirectory;

        Settings(List<Gate.ModelSpec> models, List<String> devices, Budget budget, String baselineLabel,
                 Path baselineFile, Double maxGrowthPercent, Set<String> formats, Path outputDirectory) {
            this.models = models;
            this.devices = devices;
            this.budget = budget;
            this.baselineLabel = baselineLabel;
            this.baselineFile = baselineFile;
            this.maxGrowthPercent = maxGrowthPercent;
            this.formats = formats;
            this.outputDirectory = outputDirectory;
        }
    }

    @Override
    public final void execute() throws MojoExecutionException, MojoFailureException {
        if (skip) {
            getLog().info(PREFIX + "skipped");
            return;
        }
        try {
            run(settings());
        } catch (BadInputException e) {
            throw new MojoExecutionException(e.getMessage(), e);
        }
    }

    /** The goal's work, on validated settings. */
    abstract void run(Settings s) throws MojoExecutionException, MojoFailureException;

    /** Validates the configuration and resolves it; every fault is one line that names the element. */
    Settings settings() throws MojoExecutionException {
        Path base = basedir.toPath();
        if (models == null || models.isEmpty()) {
            throw new MojoExecutionException("erg: no models configured; add <models><model><file>path/to/model.onnx"
                    + "</file></model></models> to the plugin configuration");
        }
        List<Gate.ModelSpec> specs = new ArrayList<>();
        Map<String, Integer> seen = new HashMap<>();
        for (int i = 0; i < models.size(); i++) {
            ModelConfig m = models.get(i);
            String where = "models[" + i + "]";
            if (m == null || m.getFile() == null || m.getFile().isBlank()) {
                throw new MojoExecutionException("erg: " + where + ": no <file> given (the path of an ONNX model)");
            }
            String label = m.getFile().strip();
            Integer before = seen.putIfAbsent(label, i);
            if (before != null) {
                throw new MojoExecutionException("erg: " + where + ": " + label + " is listed twice (also as models["
                        + before + "])");
            }
            specs.add(new Gate.ModelSpec(label, resolve(base, label, where + ".file"),
                    bindings(where + " (" + label + ")", m)));
        }
        if (devices == null || devices.isEmpty()) {
            throw new MojoExecutionException("erg: no devices configured; add <devices><device>preset:ID</device>"
                    + "</devices> or a device profile file (presets: " + String.join(", ", DeviceLoader.presetIds())
                    + ")");
        }
        List<String> devs = new ArrayList<>();
        for (int i = 0; i < devices.size(); i++) {
            String d = devices.get(i);
            if (d == null || d.isBlank()) {
                throw new MojoExecutionException("erg: devices[" + i + "]: empty; write preset:ID or a device profile"
                        + " file (presets: " + String.join(", ", DeviceLoader.presetIds()) + ")");
            }
            d = d.strip();
            if (devs.contains(d)) {
                throw new MojoExecutionException("erg: devices[" + i + "]: " + d + " is listed twice");
            }
            devs.add(d);
        }
        Budget b = budgetSetting();
        String baselineLabel = baseline == null || baseline.isBlank() ? null : baseline.strip();
        Path baselineFile = baselineLabel == null ? null : resolve(base, baselineLabel, "baseline");
        return new Settings(List.copyOf(specs), List.copyOf(devs), b, baselineLabel, baselineFile,
                growthSetting(), formatsSetting(), outputSetting());
    }

    /** The budget of the goals that check one; none here. */
    Budget budgetSetting() throws MojoExecutionException {
        return Budget.none();
    }

    /** The allowed growth of the goals that check it; none here. */
    Double growthSetting() throws MojoExecutionException {
        return null;
    }

    /** The report formats of the goals that write reports; none here. */
    Set<String> formatsSetting() throws MojoExecutionException {
        return Set.of();
    }

    /** The report directory of the goals that write reports; none here. */
    Path outputSetting() throws MojoExecutionException {
        return null;
    }

    private static Path resolve(Path base, String path, String where) throws MojoExecutionException {
        try {
            Path p = Path.of(path);
            return p.isAbsolute() ? p : base.resolve(p).normalize();
        } catch (java.nio.file.InvalidPathException e) {
            throw new MojoExecutionException("erg: " + where + ": not a valid path: " + path + " (" + e.getReason()
                    + ")");
        }
    }

    /** The model's input bindings: {@code <dimensions>}, {@code <shapes>} and {@code <values>}. */
    private static InputBindings bindings(String where, ModelConfig m) throws MojoExecutionException {
        Map<String, Long> dims = dimensions(where, m.getDimensions());
        try {
            return InputBindings.parse(dims, m.getShapes() == null ? Map.of() : m.getShapes(),
                    m.getValues() == null ? Map.of() : m.getValues(), "erg: " + where);
        } catch (BadInputException e) {
            throw new MojoExecutionException(e.getMessage(), e);
        }
    }

    private static Map<String, Long> dimensions(String where, Map<String, String> dims)
            throws MojoExecutionException {
        Map<String, Long> out = new LinkedHashMap<>();
        if (dims == null) {
            return out;
        }
        for (Map.Entry<String, String> e : dims.entrySet()) {
            String v = e.getValue() == null ? "" : e.getValue().strip();
            long n;
            try {
                n = Long.parseLong(v);
            } catch (NumberFormatException x) {
                n = -1;
            }
            if (n < 1) {
                throw new MojoExecutionException("erg: " + where + ": dimensions." + e.getKey()
                        + ": must be a whole number of 1 or more (got '" + v + "')");
            }
            out.put(e.getKey(), n);
        }
        return out;
    }

    /** Loads the devices; a fault is the library's one-line message. */
    List<DeviceProfile> loadDevices(Settings s) {
        List<DeviceProfile> out = new ArrayList<>();
        for (String d : s.devices) {
            out.add(DeviceLoader.load(d, basedir.toPath()));
        }
        return out;
    }

    /**
     * Estimates every model on every device; with {@code useBaseline}, reads the configured baseline
     * (absent is fine) and checks growth against it.
     */
    GateResult evaluate(Settings s, Budget budget, boolean useBaseline) throws MojoExecutionException {
        List<DeviceProfile> profiles = loadDevices(s);
        Baseline base = useBaseline && s.baselineFile != null ? Baseline.read(s.baselineFile) : null;
        GateResult r = Gate.evaluate(s.models, profiles, budget, base, useBaseline ? s.baselineLabel : null,
                useBaseline && s.baselineLabel != null ? s.maxGrowthPercent : null,
                line -> getLog().info(PREFIX + line), new AnalysisOptions(failOnUnmodelled));
        Map<String, String> stems = new HashMap<>();
        for (PairResult p : r.pairs()) {
            String who = p.model() + " on " + p.device();
            String other = stems.put(Reports.stem(p), who);
            if (other != null) {
                throw new MojoExecutionException("erg: " + other + " and " + who + " would write the same report"
                        + " files (" + Reports.stem(p) + ".*); give the models or device files distinct names");
            }
        }
        return r;
    }

    /** Logs the console rendering, writes the reports and logs where they went. */
    void logAndWrite(GateResult r, Settings s) {
        for (String line : Reports.console(r).split("\n")) {
            getLog().info(line);
        }
        List<Path> files = Reports.write(r, s.outputDirectory, s.formats);
        for (Path f : files) {
            String name = f.getFileName().toString().toLowerCase(Locale.ROOT);
            getLog().info(PREFIX + (name.endsWith(".html") ? "HTML report: " : "report: ") + f);
        }
        String note = r.baselineNote();
        if (note != null) {
            getLog().warn(PREFIX + note);
        }
        for (String n : r.notes()) {
            getLog().warn(PREFIX + n);
        }
    }
}
