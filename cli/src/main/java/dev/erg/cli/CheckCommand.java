package dev.erg.cli;

import dev.erg.budget.Budget;
import dev.erg.budget.GateResult;
import dev.erg.report.ConsoleReport;
import dev.erg.report.Reports;
import dev.erg.run.BudgetFile;
import dev.erg.run.DeviceSpec;
import dev.erg.run.ModelSpec;
import dev.erg.run.RunOutcome;
import dev.erg.run.RunRequest;
import dev.erg.run.Runner;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code erg check MODEL.onnx --device SPEC [budget options]}: gates the models on every device
 * against the budget, the baseline and the policies, through the library's runner (the same one the
 * Maven goals call). Exit 0 when every check holds (or violations do not fail the run), 1 on a
 * violation, 2 on bad input.
 */
@Command(name = "check", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Checks models against a budget and a baseline on one or more device profiles;"
                + " exits 1 when a limit is broken.")
class CheckCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "MODEL.onnx", description = "The ONNX model file(s).")
    List<Path> models;

    @Option(names = "--device", required = true, paramLabel = "FILE|preset:ID",
            description = "A device profile file or preset:ID (repeatable: every model is checked on every device).")
    List<String> devices;

    @Option(names = "--target-fps", paramLabel = "F", description = "The least frame rate, frames per second.")
    Double targetFps;

    @Option(names = "--max-power-mw", paramLabel = "P",
            description = "The most average power in mW, at the target frame rate (without one, back to back).")
    Double maxPowerMw;

    @Option(names = "--max-energy-per-frame-uj", paramLabel = "E", description = "The most energy per frame, in µJ.")
    Double maxEnergyPerFrameUj;

    @Option(names = "--max-latency-ms", paramLabel = "L", description = "The most latency per frame, in ms.")
    Double maxLatencyMs;

    @Option(names = "--max-weight-kib", paramLabel = "W", description = "The most weight bytes on the device, in KiB.")
    Double maxWeightKib;

    @Option(names = "--max-activation-kib", paramLabel = "A",
            description = "The most peak activation bytes on the device, in KiB.")
    Double maxActivationKib;

    @Option(names = "--budget-file", paramLabel = "FILE",
            description = "A YAML or JSON file with the budget and the limits of single models and devices;"
                    + " the limit options above override its budget block.")
    Path budgetFile;

    @Option(names = "--baseline", paramLabel = "FILE",
            description = "The baseline file: its layers are compared; with --max-growth-percent, its metrics are limits.")
    Path baseline;

    @Option(names = "--max-growth-percent", paramLabel = "G",
            description = "The most each metric may grow over the baseline, in percent (needs --baseline).")
    Double maxGrowthPercent;

    @Option(names = "--fail-when-at-risk",
            description = "Makes a check whose limit lies inside a calibrated profile's error band fail (exit 1)"
                    + " instead of passing with a warning.")
    boolean failWhenAtRisk;

    @Option(names = "--write-baseline",
            description = "Writes this run's results to the --baseline file, keeping the entries of other models"
                    + " and devices (growth is then not checked).")
    boolean writeBaseline;

    @Option(names = "--fail-on-violation", negatable = true, defaultValue = "true", fallbackValue = "true",
            description = "Exits 1 when a limit or policy is broken (default); --no-fail-on-violation only reports.")
    boolean failOnViolation;

    @Option(names = "--report-dir", paramLabel = "DIR", description = "Writes the report files into DIR.")
    Path reportDir;

    @Option(names = "--formats", paramLabel = "LIST", defaultValue = "json,html,markdown,junit",
            description = "Report formats for --report-dir, comma-separated (default: ${DEFAULT-VALUE}).")
    String formats;

    @CommandLine.Mixin
    ModelOptions modelOptions = new ModelOptions();

    @CommandLine.Mixin
    PrecisionOptions precision = new PrecisionOptions();
    SweepOption sweepOption = new SweepOption();

    @Option(names = "--top", paramLabel = "N", defaultValue = "" + ConsoleReport.DEFAULT_TOP,
            description = "How many layers the console lists per pair, most energy first (default: ${DEFAULT-VALUE}).")
    int top;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        RunRequest req = request();
        RunOutcome outcome = Runner.run(req, Runner.Progress.NONE);
        GateResult result = outcome.result();
        PrintWriter out = spec.commandLine().getOut();
        for (String n : result.notes()) {
            out.println("note: " + n);
        }
        for (String line : outcome.sweepLines()) {
            out.println(line);
        }
        if (!outcome.sweeps().isEmpty()) {
            out.println();
        }
        if (result.baselineNote() != null && !writeBaseline) {
            out.println("note: " + result.baselineNote() + "; create it with --write-baseline and commit it");
            out.println();
        }
        out.print(Reports.console(result, top));
        for (String line : outcome.adviceLines(adviceCount())) {
            out.println(line);
        }
        if (req.writesReports()) {
            int n = outcome.reports().size();
            out.println("reports written to " + reportDir + " (" + n + (n == 1 ? " file)" : " files)"));
        }
        if (outcome.baselineSummary() != null) {
            out.println(outcome.baselineSummary());
        }
        if (!result.passed() && !outcome.failed()) {
            int n = result.failures().size();
            out.println("note: " + n + (n == 1 ? " limit does" : " limits do")
                    + " not hold; --no-fail-on-violation keeps the exit status 0");
        }
        out.flush();
        return outcome.failed() ? Main.VIOLATION : Main.OK;
    }

    /** How many ways to meet a failed budget are printed per pair (all when negative). */
    int adviceCount() {
        return dev.erg.run.RunOutcome.MESSAGE_CANDIDATES;
    }

    /** The options as the library's run request; a malformed option is a usage error. */
    RunRequest request() {
        dev.erg.graph.InputBindings bindings = modelOptions.bindings(spec);
        dev.erg.workload.PrecisionOverrides rules = precision.parsed(spec);
        if (top < 0) {
            throw Options.usage(spec, "--top must be 0 or more, not " + top);
        }
        if (maxGrowthPercent != null && (maxGrowthPercent < 0 || maxGrowthPercent.isNaN()
                || maxGrowthPercent.isInfinite())) {
            throw Options.usage(spec, "--max-growth-percent must be a number of 0 or more, not " + maxGrowthPercent);
        }
        if (maxGrowthPercent != null && baseline == null) {
            throw Options.usage(spec, "--max-growth-percent needs --baseline FILE");
        }
        if (writeBaseline && baseline == null) {
            throw Options.usage(spec, "--write-baseline needs --baseline FILE");
        }
        Options.positive(spec, "--target-fps", targetFps);
        Options.positive(spec, "--max-power-mw", maxPowerMw);
        Options.positive(spec, "--max-energy-per-frame-uj", maxEnergyPerFrameUj);
        Options.positive(spec, "--max-latency-ms", maxLatencyMs);
        Options.positive(spec, "--max-weight-kib", maxWeightKib);
        Options.positive(spec, "--max-activation-kib", maxActivationKib);
        Budget options = Budget.builder().targetFps(targetFps).maxPowerMw(maxPowerMw)
                .maxEnergyPerFrameUj(maxEnergyPerFrameUj).maxLatencyMs(maxLatencyMs).maxWeightKib(maxWeightKib)
                .maxActivationKib(maxActivationKib).build();
        List<ModelSpec> specs = new ArrayList<>();
        dev.erg.explore.SweepRange sweep = sweepOption.range(spec);
        if (sweep != null && bindings.dims().containsKey(sweep.name())) {
            throw Options.usage(spec, "--sweep " + sweep.name() + " and --dim " + sweep.name()
                    + " bind the same dimension; give one of the two");
        }
        for (Path m : models) {
            specs.add(new ModelSpec(m.toString(), m).withBindings(bindings).withPrecision(rules).withSweep(sweep));
        }
        RunRequest.Builder b = RunRequest.builder().failOnUnmodelled(modelOptions.failOnUnmodelled)
                .failWhenAtRisk(failWhenAtRisk).failOnViolation(failOnViolation).writeBaseline(writeBaseline).maxGrowthPercent(maxGrowthPercent);
        if (baseline != null) {
            b.baseline(baseline.toString(), baseline);
        }
        java.util.Set<String> formatSet = Reports.parseFormats(formats);
        if (reportDir != null) {
            b.reports(reportDir, formatSet);
        }
        if (budgetFile != null) {
            BudgetFile.read(budgetFile).apply(b, options, specs, devices);
        } else {
            b.budget(options).models(specs);
            for (String d : devices) {
                b.device(new DeviceSpec(d));
            }
        }
        return b.build().validate();
    }
}
