package dev.erg.dist;

import java.io.File;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import java.util.concurrent.TimeUnit;
import java.util.stream.Collectors;
import java.util.stream.Stream;

/**
 * A build step of the distribution (not shipped): runs erg's commands on small models, each in a fresh
 * JVM that records the classes it loads ({@code -XX:DumpLoadedClassList}), and merges the records, in
 * first-load order, into {@code erg.classlist}. The launcher turns that list into a class-data-sharing
 * archive on its first run, on the user's own JDK and in the user's own install folder (an archive made
 * here would name this machine's paths and JDK build, and the JVM would refuse it elsewhere).
 *
 * <p>It then checks that this JDK accepts the list: it dumps an archive from it ({@code -Xshare:dump})
 * and starts erg with that archive required ({@code -Xshare:on}). A JDK that cannot record or dump
 * gets a warning and a distribution without the list; the launcher then runs without an archive. An
 * erg command that fails in training fails the build.
 *
 * <p>Usage: {@code ClassListTraining JAVA_HOME LIB_DIR OUT_DIR MODEL.onnx...}
 */
public final class ClassListTraining {
    /** The JVM flags the launcher starts erg with (bin/erg): the training JVMs run with the same. */
    static final List<String> LAUNCHER_FLAGS = List.of("-XX:TieredStopAtLevel=1", "-XX:+UseParallelGC", "-XX:-UsePerfData");
    private static final long TIMEOUT_SECONDS = 120;

    private ClassListTraining() {
    }

    public static void main(String[] args) throws IOException, InterruptedException {
        if (args.length < 4) {
            throw new IllegalArgumentException("usage: ClassListTraining JAVA_HOME LIB_DIR OUT_DIR MODEL.onnx...");
        }
        Path java = Path.of(args[0], "bin", System.getProperty("os.name", "").startsWith("Windows") ? "java.exe" : "java");
        Path lib = Path.of(args[1]);
        Path out = Path.of(args[2]);
        Files.createDirectories(out);
        String classpath;
        try (Stream<Path> jars = Files.list(lib)) {
            classpath = jars.filter(p -> p.toString().endsWith(".jar")).sorted().map(Path::toString)
                    .collect(Collectors.joining(File.pathSeparator));
        }
        List<List<String>> commands = new ArrayList<>();
        for (int i = 3; i < args.length; i++) {
            String model = args[i];
            commands.add(List.of("analyze", model, "--json", out.resolve("analysis.json").toString()));
            commands.add(List.of("estimate", model, "--device", "preset:generic-45nm", "--json",
                    out.resolve("estimate.json").toString()));
            commands.add(List.of("check", model, "--device", "preset:generic-45nm", "--target-fps", "1",
                    "--report-dir", out.resolve("reports").toString()));
        }
        Path list = out.resolve("erg.classlist");
        Files.deleteIfExists(list);
        Set<String> lines = new LinkedHashSet<>();
        long t0 = System.nanoTime();
        for (int i = 0; i < commands.size(); i++) {
            Path part = out.resolve("run" + i + ".classlist");
            Files.deleteIfExists(part);
            List<String> cmd = new ArrayList<>(List.of(java.toString(), "-XX:DumpLoadedClassList=" + part));
            cmd.addAll(LAUNCHER_FLAGS);
            cmd.addAll(List.of("-cp", classpath, "dev.erg.cli.Main"));
            cmd.addAll(commands.get(i));
            int code = run(cmd, out.resolve("run" + i + ".log"));
            if (!Files.isRegularFile(part) || Files.size(part) == 0) {
                warn("this JVM does not record loaded classes (-XX:DumpLoadedClassList); the distribution ships"
                        + " without erg.classlist and its launcher without a class-data archive (see " + out
                        .resolve("run" + i + ".log") + ")");
                return;
            }
            if (code != 0 && code != 1) { // 1: a budget broken in 'check', which is fine here
                throw new IllegalStateException("training run failed with exit code " + code + ": erg "
                        + String.join(" ", commands.get(i)) + " (see " + out.resolve("run" + i + ".log") + ")");
            }
            lines.addAll(Files.readAllLines(part, StandardCharsets.UTF_8));
        }
        Path candidate = out.resolve("erg.classlist.tmp");
        Files.write(candidate, lines, StandardCharsets.UTF_8);
        // Does this JDK make an archive from the list, and does erg start with it required?
        Path archive = out.resolve("check.jsa");
        Files.deleteIfExists(archive);
        int dumped = run(List.of(java.toString(), "-Xshare:dump", "-XX:SharedClassListFile=" + candidate,
                "-XX:SharedArchiveFile=" + archive, "-cp", classpath), out.resolve("dump.log"));
        List<String> check = new ArrayList<>(List.of(java.toString(), "-Xshare:on", "-XX:SharedArchiveFile=" + archive));
        check.addAll(LAUNCHER_FLAGS);
        check.addAll(List.of("-cp", classpath, "dev.erg.cli.Main", "--version"));
        if (dumped != 0 || !Files.isRegularFile(archive) || run(check, out.resolve("check.log")) != 0) {
            warn("this JDK could not make or map a class-data archive from the class list (see " + out.resolve("dump.log")
                    + " and " + out.resolve("check.log") + "); the list ships anyway, and the launcher falls back"
                    + " to a plain start where the user's JDK cannot use it either");
        }
        Files.move(candidate, list, StandardCopyOption.REPLACE_EXISTING);
        System.out.printf("[INFO] erg.classlist: %d classes from %d training runs, archive checked (%.1f s)%n",
                lines.stream().filter(l -> !l.startsWith("#") && !l.startsWith("@")).count(), commands.size(),
                (System.nanoTime() - t0) / 1e9);
    }

    private static int run(List<String> cmd, Path log) throws IOException, InterruptedException {
        Process p = new ProcessBuilder(cmd).redirectErrorStream(true).redirectOutput(log.toFile()).start();
        if (!p.waitFor(TIMEOUT_SECONDS, TimeUnit.SECONDS)) {
            p.destroyForcibly();
            throw new IllegalStateException("training step took more than " + TIMEOUT_SECONDS + " s: "
                    + String.join(" ", cmd.subList(0, Math.min(cmd.size(), 3))) + "... (see " + log + ")");
        }
        return p.exitValue();
    }

    private static void warn(String message) {
        System.out.println("[WARNING] " + message);
    }
}
