package dev.erg.cli;

import dev.erg.analysis.Analyzer;
import dev.erg.error.BadInputException;
import dev.erg.report.AnalysisJson;
import dev.erg.report.AnalysisTable;
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

/** {@code erg analyze MODEL.onnx}: the workload table on stdout, and optionally the JSON report. */
@Command(name = "analyze", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Reads an ONNX model and prints the MACs, vector ops and bytes of its nodes.")
final class AnalyzeCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "MODEL.onnx", description = "The ONNX model file.")
    Path model;

    @CommandLine.Mixin
    ModelOptions modelOptions = new ModelOptions();

    @Option(names = "--json", paramLabel = "FILE", description = "Also writes the analysis as JSON to FILE.")
    Path json;

    @Option(names = "--top", paramLabel = "N", defaultValue = "" + AnalysisTable.DEFAULT_TOP,
            description = "How many nodes the table lists, most MACs first (default: ${DEFAULT-VALUE}).")
    int top;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Map<String, Long> bound = modelOptions.bound(spec);
        if (top < 0) {
            throw Options.usage(spec, "--top must be 0 or more, not " + top);
        }
        ModelWorkload w = Analyzer.analyze(model, modelOptions.bindings(spec), dev.erg.analysis.AnalysisOptions.DEFAULTS);
        PrintWriter out = spec.commandLine().getOut();
        out.print(AnalysisTable.render(w, top));
        if (json != null) {
            try {
                AnalysisJson.write(w, json);
            } catch (IOException e) {
                throw new BadInputException(json + ": cannot write the JSON report (" + Options.why(e) + ")");
            }
            out.println("JSON written to " + json);
        }
        for (String n : Analyzer.unusedDimNotes(w, bound)) {
            out.println("note: " + n);
        }
        out.flush();
        return modelOptions.verdict(w, spec.commandLine().getErr());
    }
}
