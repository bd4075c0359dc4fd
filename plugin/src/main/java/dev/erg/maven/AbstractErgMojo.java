package dev.erg.maven;

import dev.erg.budget.GateResult;
import dev.erg.device.DeviceLoader;
import dev.erg.error.BadInputException;
import dev.erg.graph.InputBindings;
import dev.erg.graph.UnboundDimException;
import dev.erg.report.Reports;
import dev.erg.run.DeviceSpec;
import dev.erg.run.ModelSpec;
import dev.erg.run.RunOutcome;
import dev.erg.run.RunRequest;
import dev.erg.run.Runner;
import dev.erg.workload.PrecisionOverrides;
import java.io.File;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.apache.maven.plugin.AbstractMojo;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugin.MojoFailureException;
import org.apache.maven.plugins.annotations.Parameter;

/**
 * The configuration every erg goal shares, and its translation into the library's {@link RunRequest}.
 * The goals hold no logic of their own: the library's {@link Runner} validates the whole request, runs
 * it, writes the reports and the baseline; the goals map its outcome to log lines and build outcomes.
 */
abstract class AbstractErgMojo extends AbstractMojo {
    static final String PREFIX = "erg: ";

    /**
     * The ONNX models to estimate. Each {@code <model>} has a {@code <file>} (relative to the project's
     * base directory), optional {@code <dimensions>} that bind symbolic dimensions, e.g.
     * {@code <batch>1</batch>}, an optional {@code <budget>} of its own, and optional {@code <precision>}
     * rules ({@code <rule>PATTERN[@OP]=wNaM</rule>}, the first that matches a node decides).
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
     * Makes an operator that erg has no rule for (or a node left unresolved downstream of one) a
     * policy violation, listed with the budget's, instead of a note. Unmodelled nodes are never priced,
     * so the totals of such a model are incomplete.
     */
    @Parameter(property = "erg.failOnUnmodelled", defaultValue = "false")
    boolean failOnUnmodelled;

    /**
     * Makes a budget check whose limit lies inside a calibrated profile's error band fail the build,
     * instead of passing with a warning (docs/calibration.md).
     */
    @Parameter(property = "erg.failWhenAtRisk", defaultValue = "false")
    boolean failWhenAtRisk;

    /**
     * Fails the build when a budget, the allowed growth or a policy does not hold. With {@code false}
     * the goal only reports (every verdict is still logged and written), e.g. on a branch.
     */
    @Parameter(property = "erg.failOnViolation", defaultValue = "true")
    boolean failOnViolation;

    /**
     * Logs every computed way to meet a failed budget (lower precision on the costliest layers or the
     * whole model, a higher clock, more SRAM, another engine or dataflow, a smaller swept dim); without
     * it the failure message lists the first three of each failing model and device. The reports list
     * them all either way.
     */
    @Parameter(property = "erg.advise", defaultValue = "false")
    boolean advise;

    /** Skips the goal. */
    @Parameter(property = "erg.skip", defaultValue = "false")
    boolean skip;

    /** The project's base directory, against which relative paths are resolved. */
    @Parameter(defaultValue = "${project.basedir}", readonly = true, required = true)
    File basedir;

    @Override
    public final void execute() throws MojoExecutionException, MojoFailureException {
        if (skip) {
            getLog().info(PREFIX + "skipped");
            return;
        }
        RunRequest req = request();
        RunOutcome outcome;
        try {
            outcome = Runner.run(req, line -> getLog().info(PREFIX + line));
        } catch (UnboundDimException e) {
            throw new MojoExecutionException(e.getMessage() + (e.dim() != null
                    ? "; bind it with <dimensions><" + e.dim() + ">N</" + e.dim() + "></dimensions> in the <model>"
                    : "; bind it with <shapes><" + e.input() + ">" + e.shapeExample() + "</"
                            + e.input() + "></shapes> in the <model>"), e);
        } catch (BadInputException e) {
            throw new MojoExecutionException(e.getMessage(), e);
        }
        done(outcome);
    }

    /** The goal's mapping of the outcome to log lines and the build's result. */
    abstract void done(RunOutcome outcome) throws MojoExecutionException, MojoFailureException;

    /**
     * The configuration as the library's request, validated as a whole before any model is read; every
     * fault is one line that names the element.
     */
    RunRequest request() throws MojoExecutionException {
        Path base = basedir.toPath();
        if (models == null || models.isEmpty()) {
            throw new MojoExecutionException("erg: no models configured; add <models><model><file>path/to/model.onnx"
                    + "</file></model></models> to the plugin configuration");
        }
        if (devices == null || devices.isEmpty()) {
            throw new MojoExecutionException("erg: no devices configured; add <devices><device>preset:ID</device>"
                    + "</devices> or a device profile file (presets: " + String.join(", ", DeviceLoader.presetIds())
                    + ")");
        }
        RunRequest.Builder b = RunRequest.builder().deviceBase(base).failOnUnmodelled(failOnUnmodelled)
                .failWhenAtRisk(failWhenAtRisk).failOnViolation(failOnViolation);
        try {
            for (int i = 0; i < models.size(); i++) {
                ModelConfig m = models.get(i);
                String where = "models[" + i + "]";
                if (m == null || m.getFile() == null || m.getFile().isBlank()) {
                    throw new MojoExecutionException("erg: " + where + ": no <file> given (the path of an ONNX model)");
                }
                String label = m.getFile().strip();
                where += " (" + label + ")";
                ModelSpec spec = new ModelSpec(label, resolve(base, label, where + ".file"))
                        .withBindings(bindings(where, m)).withPrecision(precision(where, m.getPrecision()));
                spec = spec.withSweep(sweep(where, m, spec));
                if (m.getBudget() != null && checksBudgets()) {
                    spec = spec.withBudget(m.getBudget().toBudget(where + ".budget"));
                }
                b.model(spec);
            }
            for (int i = 0; i < devices.size(); i++) {
                String d = devices.get(i);
                if (d == null || d.isBlank()) {
                    throw new MojoExecutionException("erg: devices[" + i + "]: empty; write preset:ID or a device"
                            + " profile file (presets: " + String.join(", ", DeviceLoader.presetIds()) + ")");
                }
                b.device(device(d.strip()));
            }
            String baselineLabel = baseline == null || baseline.isBlank() ? null : baseline.strip();
            if (baselineLabel != null) {
                b.baseline(baselineLabel, resolve(base, baselineLabel, "baseline"));
            }
            configure(b);
            return b.build().validate();
        } catch (BadInputException e) {
            throw new MojoExecutionException("erg: " + e.getMessage(), e);
        }
    }

    /** True for the goals that hold budgets (check, report); the baseline goal only records. */
    boolean checksBudgets() {
        return false;
    }

    /** A device as configured, with the limits the goal gives it. */
    DeviceSpec device(String label) throws MojoExecutionException {
        return new DeviceSpec(label);
    }

    /** The goal's own settings: budgets, growth, reports, baseline writing. */
    abstract void configure(RunRequest.Builder b) throws MojoExecutionException;

    static Path resolve(Path base, String path, String where) throws MojoExecutionException {
        try {
            Path p = Path.of(path);
            return p.isAbsolute() ? p : base.resolve(p).normalize();
        } catch (java.nio.file.InvalidPathException e) {
            throw new MojoExecutionException("erg: " + where + ": not a valid path: " + path + " (" + e.getReason()
                    + ")");
        }
    }

    /** The model's {@code <precision>} rules, parsed in order; a malformed one names its element. */
    private static PrecisionOverrides precision(String where, List<String> rules) throws MojoExecutionException {
        List<PrecisionOverrides.Rule> out = new java.util.ArrayList<>();
        if (rules != null) {
            for (int i = 0; i < rules.size(); i++) {
                String r = rules.get(i);
                try {
                    if (r == null || r.isBlank()) {
                        throw new BadInputException("empty; write PATTERN[@OP]=wNaM, e.g. /backbone/*@Conv=w4a8");
                    }
                    out.add(PrecisionOverrides.parseRule(r));
                } catch (BadInputException e) {
                    throw new MojoExecutionException("erg: " + where + ": precision[" + i + "]: " + e.getMessage(), e);
                }
            }
        }
        return new PrecisionOverrides(out);
    }

    /** The model's {@code <sweeps>} (at most one), or null; it must not bind a dim {@code <dimensions>} binds. */
    private static dev.erg.explore.SweepRange sweep(String where, ModelConfig m, ModelSpec spec)
            throws MojoExecutionException {
        List<String> sweeps = m.getSweeps();
        if (sweeps == null || sweeps.isEmpty()) {
            return null;
        }
        if (sweeps.size() > 1) {
            throw new MojoExecutionException("erg: " + where + ".sweeps: one sweep per model (got " + sweeps.size()
                    + "); the other symbolic dims are bound with <dimensions>");
        }
        dev.erg.explore.SweepRange r = dev.erg.explore.SweepRange.parse("erg: " + where + ".sweeps", sweeps.get(0));
        if (spec.dims().containsKey(r.name())) {
            throw new MojoExecutionException("erg: " + where + ": <sweeps> and <dimensions> both bind '" + r.name()
                    + "'; give one of the two");
        }
        return r;
    }

    /** The model's input bindings: {@code <dimensions>}, {@code <shapes>} and {@code <values>}. */
    static InputBindings bindings(String where, ModelConfig m) throws MojoExecutionException {
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
        if (dims != null) {
            for (Map.Entry<String, String> e : dims.entrySet()) {
                out.put(e.getKey(), ModelSpec.parseDim(where + ": dimensions." + e.getKey(), e.getValue()));
            }
        }
        return out;
    }

    /** Logs the console rendering, the report files and the notes. */
    void log(RunOutcome o, boolean baselineNote) {
        GateResult r = o.result();
        for (String line : Reports.console(r).split("\n")) {
            getLog().info(line);
        }
        for (Path f : o.reports()) {
            String name = f.getFileName().toString().toLowerCase(Locale.ROOT);
            getLog().info(PREFIX + (name.endsWith(".html") ? "HTML report: " : "report: ") + f);
        }
        String note = r.baselineNote();
        if (baselineNote && note != null) {
            getLog().warn(PREFIX + note + "; create it with 'mvn erg:baseline' and commit it");
        }
        for (String n : r.notes()) {
            getLog().warn(PREFIX + n);
        }
        for (dev.erg.budget.Check c : r.atRisk()) {
            getLog().warn(PREFIX + "at risk: " + c.message());
        }
        if (advise || (!o.failed() && !o.advice().isEmpty())) {
            for (String line : o.adviceLines(advise ? -1 : RunOutcome.MESSAGE_CANDIDATES)) {
                getLog().info(PREFIX + line);
            }
        }
    }

    /**
     * Fails the build once, listing every violation, when some check failed and violations fail the
     * build; otherwise warns that they do not.
     */
    void verdict(RunOutcome o, String reportOnlyHint) throws MojoFailureException {
        GateResult r = o.result();
        if (r.passed()) {
            return;
        }
        if (o.failed()) {
            throw new MojoFailureException(o.failureMessage());
        }
        int n = r.failures().size();
        getLog().warn(PREFIX + n + (n == 1 ? " limit does" : " limits do") + " not hold; " + reportOnlyHint);
    }
}
