package dev.erg.conformance;

import dev.erg.conformance.Harness.NodeCheck;
import dev.erg.conformance.Harness.Result;
import dev.erg.conformance.Harness.Status;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

/** The Markdown report: operators x opsets, then every mismatch and every runtime refusal. */
final class Report {
    private Report() {
    }

    enum Cell { MISMATCH, OK, UNSUPPORTED }

    static String matrix(List<Result> results, String runtimeVersion) {
        Map<String, Map<Long, EnumSet<Cell>>> cells = new TreeMap<>();
        Set<Long> opsets = new TreeSet<>();
        int nodes = 0;
        int values = 0;
        int ok = 0;
        int mismatch = 0;
        int unsupported = 0;
        for (Result r : results) {
            switch (r.status()) {
                case OK: ok++; break;
                case MISMATCH: mismatch++; break;
                case RUNTIME_UNSUPPORTED: unsupported++; break;
                default: break;
            }
            if (r.status() == Status.RUNTIME_UNSUPPORTED || (r.status() != Status.OK && r.nodes().isEmpty())) {
                Cell cell = r.status() == Status.RUNTIME_UNSUPPORTED ? Cell.UNSUPPORTED : Cell.MISMATCH;
                long o = r.c().file != null ? r.opset() : r.c().opset;
                put(cells, opsets, r.c().subject, o, cell);
                continue;
            }
            for (NodeCheck n : r.nodes()) {
                if (n.unresolved()) {
                    continue; // downstream of a node erg has no rule for: not a verdict on this operator
                }
                nodes++;
                values += n.values();
                put(cells, opsets, n.opType(), n.opset(), n.ok() ? Cell.OK : Cell.MISMATCH);
            }
        }
        StringBuilder b = new StringBuilder();
        b.append("## Shapes verified against onnxruntime\n\n");
        b.append("The `conformance` module builds small models per operator family with erg's own writer, at the\n")
         .append("opsets where an operator's form changed, exposes every intermediate value as a graph output, runs\n")
         .append("each model in onnxruntime ").append(runtimeVersion).append(" (CPU) with random inputs of the declared\n")
         .append("shapes and types, and compares the shape and element type of every value with what erg infers.\n")
         .append("The two runnable shared models (`demo/feeder_cnn.onnx`, `demo/lstm_kws.onnx`) are checked the same\n")
         .append("way, every intermediate included. The source is the runtime's actual output tensors, not its static\n")
         .append("inference. Where erg can only give a bound (NonZero, Compress on runtime data) the runtime's dims\n")
         .append("must not exceed erg's and the rank must agree. Regenerate with `mvn -B -ntp verify` and copy\n")
         .append("`conformance/target/ort-verified.md`.\n\n");
        b.append("Cases: ").append(results.size()).append(" (").append(ok).append(" agree, ").append(mismatch)
         .append(" with a mismatch, ").append(unsupported).append(" not supported by the runtime); nodes compared: ")
         .append(nodes).append("; values compared: ").append(values).append(".\n\n");
        b.append("Cells: `ok` = every output of every node of that operator at that opset agrees in shape and type;\n")
         .append("`mismatch` = at least one disagrees (listed below); `rt n/s` = the runtime has no kernel for that\n")
         .append("form (listed below); blank = not tested. A cell may hold more than one word when forms differ.\n\n");
        b.append("| operator |");
        for (long o : opsets) {
            b.append(' ').append(o).append(" |");
        }
        b.append("\n|---|");
        for (int i = 0; i < opsets.size(); i++) {
            b.append("---|");
        }
        b.append('\n');
        for (Map.Entry<String, Map<Long, EnumSet<Cell>>> e : cells.entrySet()) {
            b.append("| ").append(e.getKey()).append(" |");
            for (long o : opsets) {
                EnumSet<Cell> s = e.getValue().get(o);
                b.append(' ');
                if (s != null) {
                    List<String> words = new ArrayList<>();
                    for (Cell c : s) {
                        words.add(c == Cell.OK ? "ok" : c == Cell.MISMATCH ? "**mismatch**" : "rt n/s");
                    }
                    b.append(String.join(" · ", words));
                }
                b.append(" |");
            }
            b.append('\n');
        }
        b.append("\n### Mismatches\n\n");
        int n = 0;
        for (Result r : results) {
            if (r.status() == Status.MISMATCH || r.status() == Status.RUNTIME_ERROR) {
                n++;
                String reason = Known.MISMATCHES.get(r.c().id());
                b.append("- `").append(r.c().id()).append("`").append(reason == null ? "" : ": " + reason).append('\n');
                for (String p : r.problems()) {
                    b.append("  - ").append(shorten(p)).append('\n');
                }
            }
        }
        if (n == 0) {
            b.append("None.\n");
        }
        b.append("\n### Not supported by the runtime\n\n");
        n = 0;
        for (Result r : results) {
            if (r.status() == Status.RUNTIME_UNSUPPORTED) {
                n++;
                b.append("- `").append(r.c().id()).append("`: ").append(shorten(r.message())).append('\n');
            }
        }
        if (n == 0) {
            b.append("None.\n");
        }
        return b.toString();
    }

    /** The runtime's message without its build paths and C++ signatures, cut to a readable length. */
    static String shorten(String s) {
        String t = s.replaceAll("Error code - ORT_[A-Z_]+ - message: ", "")
                .replaceAll("/onnxruntime_src/\\S+:\\d+ ", "")
                .replaceAll("onnxruntime::[\\w:<>]+\\([^)]*\\)( \\[with [^\\]]*\\])? ", "")
                .replace("|", "\\|");
        return t.length() > 400 ? t.substring(0, 400) + "..." : t;
    }

    private static void put(Map<String, Map<Long, EnumSet<Cell>>> cells, Set<Long> opsets, String op, long opset,
                            Cell c) {
        opsets.add(opset);
        cells.computeIfAbsent(op, k -> new TreeMap<>()).computeIfAbsent(opset, k -> EnumSet.noneOf(Cell.class)).add(c);
    }

    /** Every case, one line each. */
    static String caseList(List<Result> results) {
        StringBuilder b = new StringBuilder("# Cases run against onnxruntime\n\n| case | opset | nodes | values | result |\n|---|---|---|---|---|\n");
        for (Result r : results) {
            int values = 0;
            for (NodeCheck n : r.nodes()) {
                values += n.values();
            }
            b.append("| ").append(r.c().id()).append(" | ").append(r.opset()).append(" | ").append(r.nodes().size())
             .append(" | ").append(values).append(" | ").append(r.status().name().toLowerCase()).append(" |\n");
        }
        return b.toString();
    }

    static void write(Path file, String text) {
        try {
            Files.createDirectories(file.getParent());
            Files.writeString(file, text);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
