package dev.erg.calibrate;

import dev.erg.analysis.AnalysisOptions;
import dev.erg.analysis.Analyzer;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.error.BadInputException;
import dev.erg.error.InputFiles;
import dev.erg.estimate.Estimator;
import dev.erg.graph.InputBindings;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * One calibration, the same for every front end: estimate each model on the profile as given (an
 * earlier calibration left out), read the measurement files, check their model and node names, fit
 * the factors and write the calibrated profile (the input profile's text plus a {@code calibration}
 * section). Broken input ends in one {@link BadInputException} line.
 */
public final class CalibrationRun {
    private CalibrationRun() {
    }

    /**
     * Calibrates {@code profileFile} on {@code models} and writes {@code out}.
     *
     * @return the fit, for the front end to summarise
     */
    public static Calibration run(List<Path> models, InputBindings bindings, Path profileFile, List<Path> measured,
                                  Path out) {
        List<InputBindings> each = new ArrayList<>();
        for (int i = 0; i < models.size(); i++) {
            each.add(bindings);
        }
        return run(models, each, profileFile, measured, out);
    }

    /** As above, with the input bindings of each model. */
    public static Calibration run(List<Path> models, List<InputBindings> bindings, Path profileFile,
                                  List<Path> measured, Path out) {
        return run(models, bindings, profileFile.toString(), measured, out);
    }

    /**
     * As above, with the profile given as {@code erg} names one: a YAML file, or a built-in preset
     * ({@code preset:ID}), whose packaged text (comments and sources included) the calibrated profile
     * then starts with.
     */
    public static Calibration run(List<Path> models, List<InputBindings> bindings, String profileSpec,
                                  List<Path> measured, Path out) {
        if (models.isEmpty()) {
            throw new BadInputException("calibrate: no model given");
        }
        if (measured.isEmpty()) {
            throw new BadInputException("calibrate: no measurement file given");
        }
        boolean preset = profileSpec.startsWith(DeviceLoader.PRESET_PREFIX);
        String lower = profileSpec.toLowerCase(Locale.ROOT);
        if (!preset && !lower.endsWith(".yaml") && !lower.endsWith(".yml")) {
            throw new BadInputException(profileSpec + ": a calibration extends a YAML profile (.yaml or .yml) or a"
                    + " preset (preset:ID); this one is neither");
        }
        String outLower = out.toString().toLowerCase(Locale.ROOT);
        if (!outLower.endsWith(".yaml") && !outLower.endsWith(".yml")) {
            throw new BadInputException(out + ": the calibrated profile is YAML; name it .yaml or .yml");
        }
        DeviceProfile profile = DeviceLoader.load(profileSpec, null).withoutCalibration();
        String text;
        try {
            text = preset ? DeviceLoader.presetText(profileSpec)
                    : Files.readString(Path.of(profileSpec), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new BadInputException(profileSpec + ": cannot read the profile (" + e.getMessage() + ")");
        }
        Map<String, List<String>> names = new LinkedHashMap<>();
        List<ModelCosts> costs = new ArrayList<>();
        for (int i = 0; i < models.size(); i++) {
            Path m = models.get(i);
            InputFiles.requireRegular(m, m.toString(), "model file");
            ModelWorkload w = Analyzer.analyze(m, bindings.get(i), AnalysisOptions.DEFAULTS);
            String key = String.valueOf(m.getFileName());
            if (names.containsKey(key)) {
                throw new BadInputException(m + ": a second model named " + key + "; measurement files name models"
                        + " by file name, so each must be unique");
            }
            names.put(key, w.nodes().stream().map(NodeWork::name).toList());
            costs.add(ModelCosts.of(key, Estimator.estimate(w, profile)));
        }
        List<MeasurementFile> files = new ArrayList<>();
        for (Path f : new LinkedHashSet<>(measured)) {
            MeasurementFile mf = MeasurementFile.read(f);
            mf.checkNames(names);
            files.add(mf);
        }
        Calibration c = Calibrator.fit(costs, files, profile.staticPowerMw() * 1e-3);
        try {
            Path parent = out.toAbsolutePath().getParent();
            if (parent != null) {
                Files.createDirectories(parent);
            }
            Files.writeString(out, CalibratedProfile.of(text, c), StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new BadInputException(out + ": cannot write the calibrated profile (" + e.getMessage() + ")");
        }
        // what was written must load like any profile
        DeviceLoader.load(out.toString(), null);
        return c;
    }

    /** A few lines for the console: the factors, the error before and after, the band. */
    public static List<String> summary(Calibration c) {
        List<String> out = new ArrayList<>();
        for (FactorValue f : c.factors().values()) {
            out.add(String.format(Locale.ROOT, "  %-33s %s", f.factor().key,
                    f.fitted() ? CalibratedProfile.num(f.shown()) + " " + f.factor().unit
                            : "not fitted: " + f.note()));
        }
        for (Factor.Metric m : Factor.Metric.values()) {
            ErrorSummary before = c.errorBefore(m, Calibration.Scope.ALL);
            if (before.count() == 0) {
                continue;
            }
            ErrorSummary after = c.errorAfter(m, Calibration.Scope.ALL);
            String line = String.format(Locale.ROOT, "  %s error over %d %s: median %s before, %s after; worst %s"
                    + " before, %s after", m.label, after.count(), after.count() == 1 ? "value" : "values",
                    pct(before.median()), pct(after.median()), pct(before.worst()), pct(after.worst()));
            ErrorSummary lo = c.leaveOneModelOut(m, Calibration.Scope.ALL);
            if (lo != null) {
                line += String.format(Locale.ROOT, "; each model predicted from the others: median %s, worst %s",
                        pct(lo.median()), pct(lo.worst()));
            }
            out.add(line);
            CalibratedProfile.Band b = CalibratedProfile.band(c, m);
            if (b != null) {
                out.add(String.format(Locale.ROOT, "  %s band in verdicts: %+.0f%% ... %+.0f%% (%s)", m.label,
                        100 * b.low(), 100 * b.high(), b.from()));
            }
        }
        for (String n : c.notes()) {
            out.add("  note: " + n);
        }
        return out;
    }

    private static String pct(double v) {
        return Double.isFinite(v) ? String.format(Locale.ROOT, "%.0f%%", 100 * v) : "-";
    }
}
