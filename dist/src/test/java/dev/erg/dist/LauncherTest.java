package dev.erg.dist;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeFalse;

import dev.erg.cli.Main;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.LinkOption;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.attribute.FileTime;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import java.util.stream.Stream;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Runs the unpacked distribution (target/erg-VERSION/, made in the package phase) through its POSIX
 * launcher, bin/erg, as a user would: the output must be what the command line prints in-process, the
 * exit codes those of docs/cli.md, and the class-data archive must be made once, used after, made again
 * when stale, and ignored without a word when broken.
 */
class LauncherTest {
    private static Path dist;
    private static Path models;

    @BeforeAll
    static void locate() {
        assumeFalse(System.getProperty("os.name", "").startsWith("Windows"), "bin/erg is the POSIX launcher");
        dist = Path.of(System.getProperty("erg.dist.dir", "target/erg-missing"));
        models = Path.of(System.getProperty("erg.models", "../estimator/src/test/resources/models"));
        assertTrue(Files.isExecutable(dist.resolve("bin/erg")), dist + "/bin/erg: missing or not executable");
    }

    /** An install of the distribution in a folder whose name has a space in it. */
    private static Path install(Path tmp) throws IOException {
        Path home = tmp.resolve("erg home");
        try (Stream<Path> files = Files.walk(dist)) {
            for (Path p : (Iterable<Path>) files::iterator) {
                Path to = home.resolve(dist.relativize(p).toString());
                if (Files.isDirectory(p)) {
                    Files.createDirectories(to);
                } else if (!p.getFileName().toString().startsWith("erg.jsa")) { // an archive a bench run made
                    Files.copy(p, to, StandardCopyOption.COPY_ATTRIBUTES, LinkOption.NOFOLLOW_LINKS);
                }
            }
        }
        return home;
    }

    private record Run(int code, String out, String err) {
    }

    private static Run launch(Path launcher, Map<String, String> env, String... args) throws Exception {
        List<String> cmd = new ArrayList<>(List.of(launcher.toString()));
        cmd.addAll(List.of(args));
        ProcessBuilder pb = new ProcessBuilder(cmd);
        pb.environment().put("JAVA_HOME", System.getProperty("java.home"));
        pb.environment().remove("ERG_JAVA_OPTS");
        pb.environment().remove("ERG_CDS");
        pb.environment().putAll(env);
        Path out = Files.createTempFile("erg-out", ".txt");
        Path err = Files.createTempFile("erg-err", ".txt");
        try {
            Process p = pb.redirectOutput(out.toFile()).redirectError(err.toFile()).start();
            assertTrue(p.waitFor(120, TimeUnit.SECONDS), "bin/erg did not finish in 120 s");
            return new Run(p.exitValue(), Files.readString(out, StandardCharsets.UTF_8),
                    Files.readString(err, StandardCharsets.UTF_8));
        } finally {
            Files.deleteIfExists(out);
            Files.deleteIfExists(err);
        }
    }

    private static String inProcess(String... args) {
        StringWriter out = new StringWriter();
        int code = Main.execute(args, new PrintWriter(out, true), new PrintWriter(new StringWriter(), true));
        assertEquals(0, code);
        return out.toString();
    }

    private static boolean hasClassList(Path home) {
        return Files.isRegularFile(home.resolve("lib/erg.classlist"));
    }

    @Test
    void firstRunMakesTheArchiveAndLaterRunsMapIt(@TempDir Path tmp) throws Exception {
        Path home = install(tmp);
        String model = models.resolve("resnet18.graph.onnx").toAbsolutePath().toString();
        Run first = launch(home.resolve("bin/erg"), Map.of(), "analyze", model);
        assertEquals(new Run(0, inProcess("analyze", model), ""), first);
        if (!hasClassList(home)) {
            return; // a JDK that could not record the class list at build time: no archive to check
        }
        Path jsa = home.resolve("lib/erg.jsa");
        assertTrue(Files.isRegularFile(jsa), "the first run makes lib/erg.jsa");
        assertEquals(home.resolve("bin/erg").getFileSystem().getPath(System.getProperty("java.home"), "bin", "java")
                .toString(), Files.readString(home.resolve("lib/erg.jsa.java")).strip(), "the stamp names the java command");
        FileTime made = Files.getLastModifiedTime(jsa);
        // -Xshare:on makes the JVM fail rather than fall back when it cannot map the archive.
        Run mapped = launch(home.resolve("bin/erg"), Map.of("ERG_JAVA_OPTS", "-Xshare:on"), "analyze", model);
        assertEquals(first, mapped);
        assertEquals(made, Files.getLastModifiedTime(jsa), "a current archive is not made again");
        // Through a symbolic link from another folder, as when bin/erg is linked into ~/bin.
        Path link = Files.createSymbolicLink(tmp.resolve("erg-link"), home.resolve("bin/erg"));
        assertEquals(first, launch(link, Map.of("ERG_JAVA_OPTS", "-Xshare:on"), "analyze", model));
        assertEquals(made, Files.getLastModifiedTime(jsa));
    }

    @Test
    void aStaleArchiveIsMadeAgainAndABrokenOneIsIgnored(@TempDir Path tmp) throws Exception {
        Path home = install(tmp);
        assumeFalse(!hasClassList(home), "no class list in this build");
        Path jsa = home.resolve("lib/erg.jsa");
        String model = models.resolve("lstm_kws.graph.onnx").toAbsolutePath().toString();
        String expected = inProcess("analyze", model);
        // Broken: not an archive at all, but stamped as current. The JVM must fall back in silence.
        Files.write(jsa, new byte[] {1, 2, 3, 4, 5, 6, 7, 8});
        Files.writeString(home.resolve("lib/erg.jsa.java"), Path.of(System.getProperty("java.home"), "bin", "java") + "\n");
        // One minute past the newest jar, so that the launcher takes the archive as current.
        FileTime later = FileTime.from(Files.getLastModifiedTime(home.resolve("lib/erg.classlist")).toInstant().plusSeconds(60));
        Files.setLastModifiedTime(jsa, later);
        assertEquals(new Run(0, expected, ""), launch(home.resolve("bin/erg"), Map.of(), "analyze", model));
        assertEquals(8, Files.size(jsa), "an archive newer than the jars is taken as current");
        // Stale: a jar newer than the archive (a reinstall over the old one). It is made again.
        Path jar;
        try (Stream<Path> jars = Files.list(home.resolve("lib"))) {
            jar = jars.filter(p -> p.toString().endsWith(".jar")).findFirst().orElseThrow();
        }
        Files.setLastModifiedTime(jar, FileTime.fromMillis(later.toMillis() + 60_000));
        assertEquals(new Run(0, expected, ""), launch(home.resolve("bin/erg"), Map.of(), "analyze", model));
        assertTrue(Files.size(jsa) > 1 << 20, "the stale archive is made again");
        assertEquals(new Run(0, expected, ""),
                launch(home.resolve("bin/erg"), Map.of("ERG_JAVA_OPTS", "-Xshare:on"), "analyze", model));
    }

    @Test
    void withoutTheArchiveAndOnBadInput(@TempDir Path tmp) throws Exception {
        Path home = install(tmp);
        Map<String, String> off = Map.of("ERG_CDS", "0");
        Run version = launch(home.resolve("bin/erg"), off, "--version");
        assertEquals(new Run(0, inProcess("--version"), ""), version);
        assertFalse(Files.exists(home.resolve("lib/erg.jsa")), "ERG_CDS=0: no archive is made");
        Path missing = tmp.resolve("no-such-model.onnx");
        Run bad = launch(home.resolve("bin/erg"), off, "analyze", missing.toString());
        assertEquals(new Run(2, "", "erg: " + missing + ": no such model file\n"), bad);
        Run usage = launch(home.resolve("bin/erg"), off, "analyze");
        assertEquals(2, usage.code());
        assertEquals(1, usage.err().lines().count(), usage.err());
    }
}
