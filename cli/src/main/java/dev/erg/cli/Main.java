package dev.erg.cli;

import dev.erg.error.BadInputException;
import dev.erg.graph.UnboundDimException;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.util.Properties;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/**
 * The {@code erg} command. Exit codes: 0 success; 1 a violation: a budget, growth or policy limit
 * broken (unless {@code --no-fail-on-violation}); 2 bad input or bad options, with one line on stderr;
 * 3 an internal error, with one line on stderr.
 */
@Command(name = "erg", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Counts the multiply-accumulates and bytes of an ONNX model, node by node, estimates its"
                + " energy and latency on a device profile, and checks it against a budget.")
public final class Main implements Callable<Integer> {
    public static final int OK = 0;
    /** A budget, growth or policy limit is broken. */
    public static final int VIOLATION = 1;
    public static final int BAD_INPUT = 2;
    public static final int INTERNAL_ERROR = 3;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        throw new CommandLine.ParameterException(spec.commandLine(), "no command given");
    }

    public static void main(String[] args) {
        PrintWriter out = new PrintWriter(System.out, true);
        PrintWriter err = new PrintWriter(System.err, true);
        int code = execute(args, out, err);
        out.flush();
        err.flush();
        System.exit(code);
    }

    /** Runs {@code erg} with {@code args}, printing to {@code out} and {@code err}; returns the exit code. */
    public static int execute(String[] args, PrintWriter out, PrintWriter err) {
        try {
            CommandLine cl = withCommands(new CommandLine(new Main()), args.length > 0 ? args[0] : "");
            cl.setOut(out);
            cl.setErr(err);
            cl.setParameterExceptionHandler((e, a) -> {
                err.println("erg: " + oneLine(e.getMessage()) + usageHint(e.getCommandLine()));
                return BAD_INPUT;
            });
            cl.setExecutionExceptionHandler((e, c, parsed) -> failure(e, err));
            return cl.execute(args);
        } catch (Throwable t) { // e.g. an Error outside picocli's handlers: still one line, never a trace
            return failure(t, err);
        } finally {
            out.flush();
            err.flush();
        }
    }

    /**
     * Adds the subcommands to {@code cl}: only the one {@code first} names, or all of them (for help,
     * the version, a missing or an unknown command). picocli reads a command's options by reflection
     * when it is added, which is the largest part of a short run's start-up (docs/benchmark.md).
     */
    static CommandLine withCommands(CommandLine cl, String first) {
        switch (first) {
            case "analyze" -> cl.addSubcommand(new AnalyzeCommand());
            case "estimate" -> cl.addSubcommand(new EstimateCommand());
            case "check" -> cl.addSubcommand(new CheckCommand());
            case "advise" -> cl.addSubcommand(new AdviseCommand());
            case "calibrate" -> cl.addSubcommand(new CalibrateCommand());
            case "measure", "host-profile" -> addOptionalCommands(cl, first);
            default -> {
                cl.addSubcommand(new AnalyzeCommand()).addSubcommand(new EstimateCommand())
                        .addSubcommand(new CheckCommand()).addSubcommand(new AdviseCommand())
                        .addSubcommand(new CalibrateCommand());
                addOptionalCommands(cl, null);
                cl.addSubcommand(new CommandLine.HelpCommand());
            }
        }
        return cl;
    }

    /**
     * Commands that live in the optional erg-measure jar, the only one with onnxruntime: name and
     * class. Without that jar each name stays a command that says in one line where to get it.
     */
    private static final String[][] OPTIONAL_COMMANDS = {
        {"measure", "dev.erg.measure.MeasureCommand"},
        {"host-profile", "dev.erg.measure.HostProfileCommand"},
    };

    /** Adds the optional commands: the one named {@code only}, or all of them when it is null. */
    private static void addOptionalCommands(CommandLine cl, String only) {
        for (String[] c : OPTIONAL_COMMANDS) {
            if (only != null && !only.equals(c[0])) {
                continue;
            }
            Object command;
            try {
                command = Class.forName(c[1], false, Main.class.getClassLoader()).getDeclaredConstructor().newInstance();
            } catch (ReflectiveOperationException | LinkageError absent) {
                String name = c[0];
                CommandLine.Model.CommandSpec spec = CommandLine.Model.CommandSpec.wrapWithoutInspection(
                        (Callable<Integer>) () -> {
                            throw new BadInputException("'erg " + name + "' runs models in onnxruntime and comes in the"
                                    + " erg-measure jar: java -jar erg-measure.jar " + name + " ... (see docs/measure.md)");
                        });
                spec.parser().unmatchedArgumentsAllowed(true);
                spec.usageMessage().description("Needs the erg-measure jar (with onnxruntime); see docs/measure.md.");
                command = spec;
            }
            cl.addSubcommand(c[0], command);
        }
    }

    /** Prints the one line for {@code e} and returns its exit code. */
    static int failure(Throwable e, PrintWriter err) {
        if (e instanceof UnboundDimException u) {
            err.println("erg: " + oneLine(e.getMessage()) + (u.dim() != null ? "; bind it with --dim " + u.dim() + "=N"
                    : "; bind it with --shape " + u.input() + "=" + u.shapeExample()));
            return BAD_INPUT;
        }
        if (e instanceof BadInputException) {
            err.println("erg: " + oneLine(e.getMessage()));
            return BAD_INPUT;
        }
        if (e instanceof OutOfMemoryError) {
            err.println("erg: the Java heap was too small for this model (out of memory); raise it, e.g."
                    + " java -Xmx4g -jar erg.jar ..., or JAVA_TOOL_OPTIONS=-Xmx4g for the erg script");
            return INTERNAL_ERROR;
        }
        err.println("erg: internal error: " + e.getClass().getSimpleName()
                + (e.getMessage() == null ? "" : ": " + oneLine(e.getMessage())));
        return INTERNAL_ERROR;
    }

    private static String usageHint(CommandLine c) {
        String name = c == null ? "erg" : c.getCommandSpec().qualifiedName();
        return name.equals("erg") ? " (see 'erg --help')" : " (see '" + name + " --help')";
    }

    static String oneLine(String s) {
        if (s == null || s.isBlank()) {
            return "no detail";
        }
        String t = s.strip();
        int nl = t.indexOf('\n');
        return (nl < 0 ? t : t.substring(0, nl)).replace('\r', ' ').strip();
    }

    /** The version from the filtered resource written at build time. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() throws IOException {
            Properties p = new Properties();
            try (InputStream in = Main.class.getResourceAsStream("version.properties")) {
                if (in != null) {
                    p.load(new java.io.InputStreamReader(in, StandardCharsets.UTF_8));
                }
            }
            return new String[] {"erg " + p.getProperty("version", "unknown")};
        }
    }
}
