package dev.erg.maven;

import dev.erg.calibrate.Calibration;
import dev.erg.calibrate.CalibrationRun;
import dev.erg.device.DeviceLoader;
import dev.erg.error.BadInputException;
import dev.erg.graph.InputBindings;
import java.io.File;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import org.apache.maven.plugin.AbstractMojo;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugins.annotations.Mojo;
import org.apache.maven.plugins.annotations.Parameter;

/**
 * Calibrates each device profile file of {@code <devices>} on the models that have a
 * {@code <measured>} file, and writes the calibrated profile next to the one it read
 * ({@code NAME.calibrated.yaml}) for the user to commit; a listed {@code NAME.calibrated.yaml} is
 * written from {@code NAME.yaml} next to it. Bound to no phase: run {@code mvn erg:calibrate}.
 * The {@code check} and {@code report} goals use a calibrated profile like any profile.
 */
@Mojo(name = "calibrate", threadSafe = true)
public class CalibrateMojo extends AbstractMojo {
    static final String PREFIX = AbstractErgMojo.PREFIX;

    /** The models, as for the other goals; those with a {@code <measured>} file are calibrated on. */
    @Parameter
    List<ModelConfig> models;

    /** The devices, as for the other goals; each profile file among them is calibrated (presets are left out). */
    @Parameter
    List<String> devices;

    /** Skips the goal. */
    @Parameter(property = "erg.skip", defaultValue = "false")
    boolean skip;

    @Parameter(defaultValue = "${project.basedir}", readonly = true, required = true)
    File basedir;

    @Override
    public void execute() throws MojoExecutionException {
        if (skip) {
            getLog().info(PREFIX + "skipped");
            return;
        }
        Path base = basedir.toPath();
        List<Path> files = new ArrayList<>();
        List<InputBindings> bindings = new ArrayList<>();
        LinkedHashSet<Path> measured = new LinkedHashSet<>();
        if (models != null) {
            for (int i = 0; i < models.size(); i++) {
                ModelConfig m = models.get(i);
                if (m == null || m.getFile() == null || m.getFile().isBlank() || m.getMeasured() == null
                        || m.getMeasured().isBlank()) {
                    continue;
                }
                String where = "models[" + i + "] (" + m.getFile().strip() + ")";
                files.add(AbstractErgMojo.resolve(base, m.getFile().strip(), where + ".file"));
                bindings.add(AbstractErgMojo.bindings(where, m));
                measured.add(AbstractErgMojo.resolve(base, m.getMeasured().strip(), where + ".measured"));
            }
        }
        if (files.isEmpty()) {
            throw new MojoExecutionException("erg: calibrate: no model has a measurement file; add"
                    + " <measured>path/to/measurements.csv</measured> to a <model>");
        }
        List<Path> profiles = new ArrayList<>();
        if (devices != null) {
            for (String d : devices) {
                if (d != null && !d.isBlank() && !d.strip().startsWith(DeviceLoader.PRESET_PREFIX)) {
                    profiles.add(AbstractErgMojo.resolve(base, d.strip(), "devices"));
                }
            }
        }
        if (profiles.isEmpty()) {
            throw new MojoExecutionException("erg: calibrate: no device profile file among <devices> (a preset"
                    + " cannot be calibrated in place; write it to a file and list that file)");
        }
        for (Path listed : profiles) {
            Path out = calibratedName(listed);
            Path p = sourceOf(listed);
            try {
                Calibration c = CalibrationRun.run(files, bindings, p, new ArrayList<>(measured), out);
                getLog().info(PREFIX + "calibrated " + base.relativize(p) + " on " + files.size()
                        + (files.size() == 1 ? " model:" : " models:"));
                for (String l : CalibrationRun.summary(c)) {
                    getLog().info(PREFIX + l);
                }
                getLog().info(PREFIX + "calibrated profile written to " + out + "; commit it and list it in <devices>");
            } catch (BadInputException e) {
                throw new MojoExecutionException("erg: " + e.getMessage(), e);
            }
        }
    }

    /**
     * The profile a listed device is calibrated from: for NAME.calibrated.yaml, NAME.yaml next to it
     * when it exists (the build lists the calibrated profile, the user edits the original); otherwise
     * the listed file itself.
     */
    static Path sourceOf(Path listed) {
        String name = listed.getFileName().toString();
        int at = name.indexOf(".calibrated.");
        if (at < 0) {
            return listed;
        }
        Path original = listed.resolveSibling(name.substring(0, at) + name.substring(at + ".calibrated".length()));
        return java.nio.file.Files.isRegularFile(original) ? original : listed;
    }

    /** NAME.yaml -> NAME.calibrated.yaml next to it; a calibrated profile is recalibrated in place. */
    static Path calibratedName(Path profile) {
        String name = profile.getFileName().toString();
        if (name.contains(".calibrated.")) {
            return profile;
        }
        int dot = name.lastIndexOf('.');
        String stem = dot < 0 ? name : name.substring(0, dot);
        String ext = dot < 0 ? ".yaml" : name.substring(dot);
        return profile.resolveSibling(stem + ".calibrated" + ext);
    }
}
