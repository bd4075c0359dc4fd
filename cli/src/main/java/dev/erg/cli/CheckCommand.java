package dev.erg.cli;

import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.Gate;
import dev.erg.budget.GateResult;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.report.ConsoleReport;
import dev.erg.report.Reports;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code erg check MODEL.onnx --device SPEC [budget options]}: gates the models on every device
 * against the budget and the baseline. Exit 0 when every check holds, 1 on a budget or growth
 * failure, 2 on bad input.
 */
@Command(name = "check", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Checks models against a budget and a baseline on one or more device profiles;"
                + " exits 1 when a limit is broken.")
final class CheckCommand implements Callable<Integer> {
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

    @Option(names = "--max-energy-uj", paramLabel = "E", description = "The most energy per frame, in µJ.")
    Double maxEnergyUj;

    @Option(names = "--max-latency-ms", paramLabel = "L", description = "The most latency per frame, in ms.")
    Double maxLatencyMs;

    @Option(names = "--max-weight-kib", paramLabel = "W", description = "The most weight bytes on the device, in KiB.")
    Double maxWeightKib;

    @Option(names = "--max-activation-kib", paramLabel = "A",
            description = "The most peak activation bytes on the device, in KiB.")
    Double maxActivationKib;

    @Option(names = "--baseline", paramLabel = "FILE",
            description = "The baseline file: its layers are compared; with --max-growth-percent, its metrics are limits.")
    Path baseline;

    @Option(names = "--max-growth-percent", paramLabel = "G",
            description = "The most each metric may grow over the baseline, in percent (needs --baseline).")
    Double maxGrowthPercent;

    @Option(names = "--write-baseline",
            description = "Writes this run's results to the --baseline file (growth is then not checked).")
    boolean writeBaseline;

    @Option(names = "--report-dir", paramLabel = "DIR", description = "Writes the report files into DIR.")
    Path reportDir;

    @Option(names = "--formats", paramLabel = "LIST", defaultValue = "json,html,markdown,junit",
            description = "Report formats for --report-dir, comma-separated (default: ${DEFAULT-VALUE}).")
    String formats;

    @CommandLine.Mixin
    ModelOptions modelOptions = new ModelOptions();

    @Option(names = "--top", paramLabel = "N", defaultValue = "" + ConsoleReport.DEFAULT_TOP,
            description = "How many layers the console lists per pair, most energy first (default: ${DEFAULT-VALUE}).")
    int top;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        dev.erg.graph.InputBindings bindings = modelOptions.bindings(spec);
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
        Options.positive(spec, "--max-energy-uj", maxEnergyUj);
        Options.positive(spec, "--max-latency-ms", maxLatencyMs);
        Options.positive(spec, "--max-weight-kib", maxWeightKib);
        Options.positive(spec, "--max-activation-kib", maxActivationKib);
        Set<String> formatSet = Reports.parseFormats(formats);
        Budget budget = Budget.builder().targetFps(targetFps).maxPowerMw(maxPowerMw).maxEnergyPerFrameUj(maxEnergyUj)
                .maxLatencyMs(maxLatencyMs).maxWeightKib(maxWeightKib).maxActivationKib(maxActivationKib).build();
        List<DeviceProfile> profiles = new ArrayList<>();
        for (String d : devices) {
            profiles.add(DeviceLoader.load(d, null));
        }
        List<Gate.ModelSpec> specs = new ArrayList<>();
        for (Path m : models) {
            specs.add(new Gate.ModelSpec(m.toString(), m, bindings));
        }
        Baseline base = baseline == null ? null : Baseline.read(baseline);
        GateResult result = Gate.evaluate(specs, profiles, budget, base, baseline == null ? null : baseline.toString(),
                writeBaseline ? null : maxGrowthPercent, line -> { }, modelOptions.analysis());
        PrintWriter out = spec.commandLine().getOut();
        for (String n : result.notes()) {
            out.println("note: " + n);
        }
        if (result.baselineNote() != null && !writeBaseline) {
            out.println("note: " + result.baselineNote());
            out.println();
        }
        out.print(Reports.console(result, top));
        if (reportDir != null) {
            List<Path> files = Reports.write(result, reportDir, formatSet);
            out.println("reports written to " + reportDir + " (" + files.size() + (files.size() == 1 ? " file)" : " files)"));
        }
        if (writeBaseline) {
            Baseline fresh = Baseline.of(result.pairs()).over(Baseline.read(baseline));
            fresh.write(baseline);
            out.println("baseline written to " + baseline + " (" + result.pairs().size()
                    + (result.pairs().size() == 1 ? " entry" : " entries") + " refreshed, " + fresh.size() + " in all)");
        }
        out.flush();
        return result.passed() ? Main.OK : Main.BUDGET_BREACH;
    }
}
