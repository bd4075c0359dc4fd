package dev.erg.cli;

import dev.erg.AnalysisOptions;
import dev.erg.Analyzer;
import dev.erg.BadInputException;
import dev.erg.report.AnalysisJson;
import dev.erg.report.AnalysisTable;
import dev.erg.workload.ModelWorkload;
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.AccessDeniedException;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.FileSystemException;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
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

    @Option(names = "--dim", paramLabel = "NAME=VALUE",
            description = "Binds a symbolic input dim, e.g. --dim batch=1 (repeatable).")
    List<String> dims = new ArrayList<>();

    @Option(names = "--json", paramLabel = "FILE", description = "Also writes the analysis as JSON to FILE.")
    Path json;

    @Option(names = "--top", paramLabel = "N", defaultValue = "" + AnalysisTable.DEFAULT_TOP,
            description = "How many nodes the table lists, most MACs first (default: ${DEFAULT-VALUE}).")
    int top;

    @Option(names = "--fail-on-unmodelled",
            description = "Fails (exit 2, one line listing them) when some operator has no rule, instead of listing it.")
    boolean failOnUnmodelled;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Map<String, Long> bound = parseDims(dims);
        if (top < 0) {
            throw usage("--top must be 0 or more, not " + top);
        }
        ModelWorkload w = Analyzer.analyze(model, bound, new AnalysisOptions(failOnUnmodelled));
        PrintWriter out = spec.commandLine().getOut();
        out.print(AnalysisTable.render(w, top));
        if (json != null) {
            try {
                AnalysisJson.write(w, json);
            } catch (IOException e) {
                throw new BadInputException(json + ": cannot write the JSON report (" + why(e) + ")");
            }
            out.println("JSON written to " + json);
        }
        out.flush();
        return Main.OK;
    }

    private static String why(IOException e) {
        if (e instanceof AccessDeniedException) {
            return "permission denied on " + ((AccessDeniedException) e).getFile();
        }
        if (e instanceof FileAlreadyExistsException) {
            return ((FileAlreadyExistsException) e).getFile() + " is in the way";
        }
        if (e instanceof NoSuchFileException) {
            return "no such file or folder: " + ((NoSuchFileException) e).getFile();
        }
        if (e instanceof FileSystemException && ((FileSystemException) e).getReason() != null) {
            return ((FileSystemException) e).getReason();
        }
        return Main.oneLine(e.getMessage());
    }

    /** NAME=VALUE pairs into a map; a malformed pair is a usage error. */
    private Map<String, Long> parseDims(List<String> specs) {
        Map<String, Long> out = new LinkedHashMap<>();
        for (String s : specs) {
            int eq = s.indexOf('=');
            if (eq <= 0) {
                throw usage("--dim '" + s + "' is not NAME=VALUE (e.g. --dim batch=1)");
            }
            String name = s.substring(0, eq).trim();
            String value = s.substring(eq + 1).trim();
            long v;
            try {
                v = Long.parseLong(value);
            } catch (NumberFormatException e) {
                throw usage("--dim " + name + ": '" + value + "' is not a whole number");
            }
            if (v < 0) {
                throw usage("--dim " + name + ": the value " + v + " is negative");
            }
            if (out.put(name, v) != null) {
                throw usage("--dim " + name + " is given twice");
            }
        }
        return out;
    }

    private CommandLine.ParameterException usage(String message) {
        return new CommandLine.ParameterException(spec.commandLine(), message);
    }
}
