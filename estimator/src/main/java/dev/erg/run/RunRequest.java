package dev.erg.run;

import dev.erg.budget.Budget;
import dev.erg.error.BadInputException;
import dev.erg.report.Reports;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;

/**
 * Everything one run needs, filled in the same way by the CLI and by the Maven goals: the models and
 * devices with their own limits, the run's budget, the baseline, the policies and the reports.
 * {@link #validate()} checks the whole of it before the first model is read.
 */
public final class RunRequest {
    private final List<ModelSpec> models;
    private final List<DeviceSpec> devices;
    private final Path deviceBase;
    private final Budget budget;
    private final String baselineLabel;
    private final Path baselineFile;
    private final Double maxGrowthPercent;
    private final boolean writeBaseline;
    private final boolean failOnUnmodelled;
    private final boolean failWhenAtRisk;
    private final boolean failOnViolation;
    private final Path reportDir;
    private final Set<String> formats;

    private RunRequest(Builder b) {
        this.models = List.copyOf(b.models);
        this.devices = List.copyOf(b.devices);
        this.deviceBase = b.deviceBase;
        this.budget = b.budget;
        this.baselineLabel = b.baselineLabel;
        this.baselineFile = b.baselineFile;
        this.maxGrowthPercent = b.maxGrowthPercent;
        this.writeBaseline = b.writeBaseline;
        this.failOnUnmodelled = b.failOnUnmodelled;
        this.failWhenAtRisk = b.failWhenAtRisk;
        this.failOnViolation = b.failOnViolation;
        this.reportDir = b.reportDir;
        this.formats = Set.copyOf(new TreeSet<>(b.formats));
    }

    public static Builder builder() {
        return new Builder();
    }

    public List<ModelSpec> models() {
        return models;
    }

    public List<DeviceSpec> devices() {
        return devices;
    }

    /** The folder a relative device profile path is resolved against (null: the working directory). */
    public Path deviceBase() {
        return deviceBase;
    }

    /** The run's budget: every model on every device, unless a model's or device's own limit overrides it. */
    public Budget budget() {
        return budget;
    }

    /** The baseline file as the user wrote it, or null when none is configured. */
    public String baselineLabel() {
        return baselineLabel;
    }

    public Path baselineFile() {
        return baselineFile;
    }

    /** The allowed growth per metric over the baseline, in percent, or null not to check growth. */
    public Double maxGrowthPercent() {
        return maxGrowthPercent;
    }

    /**
     * True when the run refreshes the baseline with its results (the entries of pairs not run are
     * kept); growth is then not checked.
     */
    public boolean writeBaseline() {
        return writeBaseline;
    }

    /** True when a node without a rule is a policy violation, listed with the budget's. */
    public boolean failOnUnmodelled() {
        return failOnUnmodelled;
    }

    /** True when a budget check whose limit lies inside a calibrated profile's error band fails the run. */
    public boolean failWhenAtRisk() {
        return failWhenAtRisk;
    }

    /** True when a violation fails the run; false for report-only runs that still list every verdict. */
    public boolean failOnViolation() {
        return failOnViolation;
    }

    /** Where the report files go, or null for none. */
    public Path reportDir() {
        return reportDir;
    }

    public Set<String> formats() {
        return formats;
    }

    /** True when the run writes report files. */
    public boolean writesReports() {
        return reportDir != null && !formats.isEmpty();
    }

    /** The growth the run checks: the allowed growth when a baseline is configured and not being written. */
    public Double growthChecked() {
        return baselineFile != null && !writeBaseline ? maxGrowthPercent : null;
    }

    /** The budget of one pair: the model's limits over the device's over the run's. */
    public Budget budgetOf(ModelSpec m, DeviceSpec d) {
        return m.budget().over(d.budget().over(budget));
    }

    /**
     * Checks the whole request; the first fault is a one-line {@link BadInputException} naming the
     * setting. Nothing is read: the model and profile files are opened only by the run.
     */
    public RunRequest validate() {
        if (models.isEmpty()) {
            throw new BadInputException("models: none given");
        }
        Map<String, Integer> seen = new HashMap<>();
        for (int i = 0; i < models.size(); i++) {
            ModelSpec m = models.get(i);
            Integer before = seen.putIfAbsent(m.label(), i);
            if (before != null) {
                throw new BadInputException("models[" + i + "]: " + m.label() + " is listed twice (also as models["
                        + before + "])");
            }
            for (Map.Entry<String, Long> d : m.dims().entrySet()) {
                if (d.getValue() == null || d.getValue() < 1) {
                    throw new BadInputException("models[" + i + "] (" + m.label() + "): dimensions." + d.getKey()
                            + ": must be a whole number of 1 or more (got '" + d.getValue() + "')");
                }
            }
        }
        if (devices.isEmpty()) {
            throw new BadInputException("devices: none given");
        }
        List<String> labels = new ArrayList<>();
        for (int i = 0; i < devices.size(); i++) {
            String d = devices.get(i).label();
            if (labels.contains(d)) {
                throw new BadInputException("devices[" + i + "]: " + d + " is listed twice");
            }
            labels.add(d);
        }
        if (maxGrowthPercent != null && (maxGrowthPercent.isNaN() || maxGrowthPercent.isInfinite()
                || maxGrowthPercent < 0)) {
            throw new BadInputException("maxGrowthPercent: must be a number of 0 or more (got " + maxGrowthPercent + ")");
        }
        if (writeBaseline && baselineFile == null) {
            throw new BadInputException("baseline: no baseline file configured");
        }
        Reports.checkFormats(formats);
        if (writesReports()) {
            List<String> modelLabels = new ArrayList<>();
            for (ModelSpec m : models) {
                modelLabels.add(m.label());
            }
            Reports.checkStems(modelLabels, labels);
        }
        return this;
    }

    /** Fills a request; every setting but the models and devices has a default. */
    public static final class Builder {
        private final List<ModelSpec> models = new ArrayList<>();
        private final List<DeviceSpec> devices = new ArrayList<>();
        private Path deviceBase;
        private Budget budget = Budget.none();
        private String baselineLabel;
        private Path baselineFile;
        private Double maxGrowthPercent;
        private boolean writeBaseline;
        private boolean failOnUnmodelled;
        private boolean failWhenAtRisk;
        private boolean failOnViolation = true;
        private Path reportDir;
        private Set<String> formats = Set.of();

        public Builder model(ModelSpec m) {
            models.add(m);
            return this;
        }

        public Builder models(List<ModelSpec> ms) {
            models.addAll(ms);
            return this;
        }

        public Builder device(DeviceSpec d) {
            devices.add(d);
            return this;
        }

        /** A device without limits of its own. */
        public Builder device(String label) {
            return device(new DeviceSpec(label));
        }

        public Builder deviceBase(Path dir) {
            deviceBase = dir;
            return this;
        }

        public Builder budget(Budget b) {
            budget = b == null ? Budget.none() : b;
            return this;
        }

        /** The baseline file: {@code label} as the user wrote it, {@code file} resolved. */
        public Builder baseline(String label, Path file) {
            baselineLabel = label;
            baselineFile = file;
            return this;
        }

        public Builder maxGrowthPercent(Double percent) {
            maxGrowthPercent = percent;
            return this;
        }

        public Builder writeBaseline(boolean b) {
            writeBaseline = b;
            return this;
        }

        public Builder failOnUnmodelled(boolean b) {
            failOnUnmodelled = b;
            return this;
        }

        public Builder failWhenAtRisk(boolean b) {
            failWhenAtRisk = b;
            return this;
        }

        public Builder failOnViolation(boolean b) {
            failOnViolation = b;
            return this;
        }

        /** Writes {@code formats} (see {@link Reports#FORMATS}) into {@code dir}. */
        public Builder reports(Path dir, Set<String> formats) {
            reportDir = dir;
            this.formats = formats == null ? Set.of() : formats;
            return this;
        }

        public RunRequest build() {
            return new RunRequest(this);
        }
    }
}
