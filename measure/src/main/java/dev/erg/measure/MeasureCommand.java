package dev.erg.measure;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.io.PrintWriter;
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

/**
 * {@code erg measure MODEL...}: runs each model in onnxruntime on this host's CPU and prints its
 * per-node and whole-model latency. It lives in the erg-measure jar; the erg command finds it there.
 * No onnxruntime type appears in this class, so the command can be listed without loading the runtime.
 */
@Command(name = "measure", mixinStandardHelpOptions = true,
        description = "Runs models in onnxruntime on this machine's CPU (graph optimisations off) and prints the"
                + " median latency of every node, matched to erg's node names, and of the whole model.")
public final class MeasureCommand implements Callable<Integer> {
    @Parameters(arity = "1..*", paramLabel = "MODEL.onnx", description = "The models to run (with their weights).")
    List<Path> models = new ArrayList<>();

    @Option(names = "--dim", paramLabel = "NAME=VALUE",
            description = "Binds a symbolic input dim, as for analyze (repeatable; applies to every model).")
    List<String> dims = new ArrayList<>();

    @Option(names = "--runs", paramLabel = "N", defaultValue = "20", description = "Timed runs (default: ${DEFAULT-VALUE}).")
    int runs;

    @Option(names = "--warmup", paramLabel = "N", defaultValue = "5",
            description = "Untimed runs first (default: ${DEFAULT-VALUE}).")
    int warmups;

    @Option(names = "--threads", paramLabel = "T", defaultValue = "1",
            description = "Intra-op threads (default: ${DEFAULT-VALUE}, for stable figures).")
    int threads;

    @Option(names = "--seed", paramLabel = "S", defaultValue = "1",
            description = "Seed of the generated inputs (default: ${DEFAULT-VALUE}).")
    long seed;

    @Option(names = "--clock", paramLabel = "wall|cpu", defaultValue = "wall",
            description = "What times whole runs: wall (default) or cpu, the calling thread's CPU time, which leaves out"
                    + " the waits of a busy machine (needs --threads 1).")
    String clock;

    @Option(names = "--csv", paramLabel = "FILE", description = "Writes the measurement file (model,node,latency-ms).")
    Path csv;

    @Option(names = "--json", paramLabel = "FILE", description = "Writes every run and node figure as JSON.")
    Path json;

    @Option(names = "--top", paramLabel = "N", defaultValue = "10",
            description = "How many of the slowest nodes the table lists (default: ${DEFAULT-VALUE}).")
    int top;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        check(runs >= 1 && runs <= 100_000, "--runs must be from 1 to 100000, not " + runs);
        check(warmups >= 0 && warmups <= 100_000, "--warmup must be from 0 to 100000, not " + warmups);
        check(threads >= 1 && threads <= 1024, "--threads must be from 1 to 1024, not " + threads);
        check(top >= 0, "--top must be 0 or more, not " + top);
        check(clock.equals("wall") || clock.equals("cpu"), "--clock must be wall or cpu, not '" + clock + "'");
        check(clock.equals("wall") || threads == 1, "--clock cpu times one thread: use it with --threads 1");
        Map<String, Long> bound = dims(dims);
        PrintWriter out = spec.commandLine().getOut();
        List<ModelTiming> timings = new ArrayList<>();
        for (Path m : models) {
            ModelTiming t = ModelRunner.measure(m, bound, threads, warmups, runs, seed,
                    clock.equals("cpu") ? ModelRunner.Clock.CPU : ModelRunner.Clock.WALL);
            timings.add(t);
            out.print(TimingTable.render(t, top));
            out.flush();
        }
        try {
            if (csv != null) {
                TimingFiles.writeCsv(timings, csv);
                out.println("measurement file written to " + csv);
            }
            if (json != null) {
                TimingFiles.writeJson(timings, json);
                out.println("JSON written to " + json);
            }
        } catch (IOException e) {
            throw new BadInputException("cannot write the results: " + e.getMessage());
        }
        out.flush();
        return 0;
    }

    private void check(boolean ok, String message) {
        if (!ok) {
            throw new CommandLine.ParameterException(spec.commandLine(), message);
        }
    }

    /** NAME=VALUE pairs, as {@code analyze} reads them. */
    private Map<String, Long> dims(List<String> specs) {
        Map<String, Long> out = new LinkedHashMap<>();
        for (String s : specs) {
            int eq = s.indexOf('=');
            check(eq > 0, "--dim '" + s + "' is not NAME=VALUE (e.g. --dim batch=1)");
            String name = s.substring(0, eq).trim();
            long v;
            try {
                v = Long.parseLong(s.substring(eq + 1).trim());
            } catch (NumberFormatException e) {
                throw new CommandLine.ParameterException(spec.commandLine(),
                        "--dim " + name + ": '" + s.substring(eq + 1).trim() + "' is not a whole number");
            }
            check(v >= 1, "--dim " + name + ": the value " + v + " is below 1; a dim must be at least 1");
            check(out.put(name, v) == null, "--dim " + name + " is given twice");
        }
        return out;
    }
}
