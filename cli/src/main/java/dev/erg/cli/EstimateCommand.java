package dev.erg.cli;

import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.report.ConsoleReport;
import dev.erg.report.EstimateJson;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code erg estimate MODEL.onnx --device SPEC}: energy and latency per layer on one device. */
@Command(name = "estimate", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Estimates a model's energy, latency and power per layer on a device profile.")
final class EstimateCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL.onnx", description = "The ONNX model file.")
    Path model;

    @Option(names = "--device", required = true, paramLabel = "FILE|preset:ID",
            description = "The device profile: a .yaml, .yml or .json file, or a built-in preset (preset:ID).")
    String device;

    @Option(names = "--fps", paramLabel = "F",
            description = "The frame rate that average power is taken at (default: frames back to back).")
    Double fps;

    @CommandLine.Mixin
    ModelOptions modelOptions = new ModelOptions();

    @CommandLine.Mixin
    PrecisionOptions precision = new PrecisionOptions();

    @Option(names = "--json", paramLabel = "FILE", description = "Also writes the estimate as JSON to FILE.")
    Path json;

    @Option(names = "--top", paramLabel = "N", defaultValue = "" + ConsoleReport.DEFAULT_TOP,
            description = "How many layers the table lists, most energy first (default: ${DEFAULT-VALUE}).")
    int top;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Map<String, Long> bound = modelOptions.bound(spec);
        Options.positive(spec, "--fps", fps);
        if (top < 0) {
            throw Options.usage(spec, "--top must be 0 or more, not " + top);
        }
        dev.erg.workload.PrecisionOverrides rules = precision.parsed(spec);
        DeviceProfile profile = DeviceLoader.load(device, null);
        ModelWorkload w = Analyzer.analyze(model, modelOptions.bindings(spec), dev.erg.analysis.AnalysisOptions.DEFAULTS);
        DeviceEstimate e = Estimator.estimate(w, profile, rules);
        PrintWriter out = spec.commandLine().getOut();
        out.print(ConsoleReport.estimate(e, fps, top));
        if (json != null) {
            try {
                EstimateJson.write(e, fps, json);
            } catch (IOException ex) {
                throw new BadInputException(json + ": cannot write the JSON report (" + Options.why(ex) + ")");
            }
            out.println("JSON written to " + json);
        }
        for (String n : Analyzer.unusedDimNotes(w, bound)) {
            out.println("note: " + n);
        }
        for (String n : dev.erg.run.Runner.unmatchedRules(new dev.erg.run.ModelSpec(model.toString(), model)
                .withPrecision(rules), w)) {
            out.println("note: " + n);
        }
        out.flush();
        return modelOptions.verdict(w, spec.commandLine().getErr());
    }
}
