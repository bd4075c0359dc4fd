package dev.erg.cli;

import java.io.PrintWriter;
import java.io.StringWriter;
import java.util.Arrays;
import java.util.List;

/** One in-process run of {@link Main#execute}: exit code, stdout and stderr. */
final class CliRun {
    final int code;
    final String out;
    final String err;

    private CliRun(int code, String out, String err) {
        this.code = code;
        this.out = out;
        this.err = err;
    }

    static CliRun of(String... args) {
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.execute(args, new PrintWriter(out, true), new PrintWriter(err, true));
        return new CliRun(code, out.toString(), err.toString());
    }

    /** The non-empty lines of stderr. */
    List<String> errLines() {
        return Arrays.stream(err.split("\\R")).filter(l -> !l.isEmpty()).toList();
    }

    @Override
    public String toString() {
        return "exit " + code + "\n--- stdout\n" + out + "--- stderr\n" + err;
    }
}
