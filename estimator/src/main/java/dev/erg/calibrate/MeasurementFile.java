package dev.erg.calibrate;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Collection;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.TreeSet;

/**
 * A measurement file: comma-separated values with a header row.
 *
 * <p>Columns: {@code model} (the model's file name, required), {@code node} (an ONNX node name, or
 * empty for the whole model; optional column) and at least one of {@code latency-ms},
 * {@code energy-uj} and {@code power-mw}, or {@code chip-energy-uj} and {@code chip-power-mw} for
 * figures of the chip alone (DRAM energy not in them). An empty cell means "not measured". Other columns are
 * ignored, with a note. Lines that start with {@code #} are comments (origin, date, tool), and blank
 * lines are skipped. A cell may be quoted with double quotes (a quote inside is doubled). Numbers use
 * a dot for decimals and must be 0 or more; any fault names the file, line and column.
 */
public final class MeasurementFile {
    public static final String MODEL = "model";
    public static final String NODE = "node";
    public static final String LATENCY_MS = "latency-ms";
    public static final String ENERGY_UJ = "energy-uj";
    public static final String POWER_MW = "power-mw";
    /** Energy of the chip alone: DRAM energy is not in it. */
    public static final String CHIP_ENERGY_UJ = "chip-energy-uj";
    /** Power of the chip alone (its own supply): DRAM power is not in it. */
    public static final String CHIP_POWER_MW = "chip-power-mw";
    private static final List<String> MEASURED =
            List.of(LATENCY_MS, ENERGY_UJ, POWER_MW, CHIP_ENERGY_UJ, CHIP_POWER_MW);

    /** Larger files are refused rather than read into memory. */
    static final long MAX_BYTES = 64L << 20;

    private final Path file;
    private final String sha256;
    private final List<Measurement> rows;
    private final List<String> notes;

    private MeasurementFile(Path file, String sha256, List<Measurement> rows, List<String> notes) {
        this.file = file;
        this.sha256 = sha256;
        this.rows = List.copyOf(rows);
        this.notes = List.copyOf(notes);
    }

    public Path file() {
        return file;
    }

    /** The SHA-256 of the file's bytes, in lower-case hex. */
    public String sha256() {
        return sha256;
    }

    /** The rows, in file order. */
    public List<Measurement> rows() {
        return rows;
    }

    /** Notes about the file (ignored columns), one sentence each. */
    public List<String> notes() {
        return notes;
    }

    /** The distinct model names the file speaks of, sorted. */
    public List<String> models() {
        return List.copyOf(new TreeSet<>(rows.stream().map(Measurement::model).toList()));
    }

    /** The same file limited to the rows of {@code models} (for a fit on some models and a check on the others). */
    public MeasurementFile only(Collection<String> models) {
        List<Measurement> kept = rows.stream().filter(m -> models.contains(m.model())).toList();
        return new MeasurementFile(file, sha256, kept, notes);
    }

    /**
     * Reads and checks {@code file}.
     *
     * @throws BadInputException naming the file, line and column of the first fault
     */
    public static MeasurementFile read(Path file) {
        byte[] bytes;
        try {
            long size = Files.size(file);
            if (size > MAX_BYTES) {
                throw new BadInputException(file + ": the measurement file has " + size + " bytes, more than the "
                        + MAX_BYTES + " a measurement file may have");
            }
            bytes = Files.readAllBytes(file);
        } catch (NoSuchFileException e) {
            throw new BadInputException(file + ": no such measurement file");
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read the measurement file (" + e.getMessage() + ")");
        }
        String text;
        try {
            text = StandardCharsets.UTF_8.newDecoder().onMalformedInput(CodingErrorAction.REPORT)
                    .onUnmappableCharacter(CodingErrorAction.REPORT).decode(java.nio.ByteBuffer.wrap(bytes)).toString();
        } catch (CharacterCodingException e) {
            throw new BadInputException(file + ": the measurement file is not UTF-8 text");
        }
        if (text.startsWith("\uFEFF")) {
            text = text.substring(1);
        }
        return parse(file, text, sha256(bytes));
    }

    private static MeasurementFile parse(Path file, String text, String sha) {
        String[] lines = text.split("\r?\n|\r", -1);
        Map<String, Integer> columns = null;
        List<String> notes = new ArrayList<>();
        List<Measurement> rows = new ArrayList<>();
        Map<String, Integer> seen = new HashMap<>();
        int width = 0;
        for (int i = 0; i < lines.length; i++) {
            int lineNo = i + 1;
            String line = lines[i];
            if (line.isBlank() || line.stripLeading().startsWith("#")) {
                continue;
            }
            List<String> cells = cells(file, lineNo, line);
            if (columns == null) {
                columns = header(file, lineNo, cells, notes);
                width = cells.size();
                continue;
            }
            if (cells.size() != width) {
                throw new BadInputException(file + ":" + lineNo + ": the row has " + cells.size()
                        + " cells but the header has " + width);
            }
            String model = cells.get(columns.get(MODEL)).strip();
            if (model.isEmpty()) {
                throw new BadInputException(file + ":" + lineNo + ": " + MODEL + ": empty; every row names its model file");
            }
            Integer nc = columns.get(NODE);
            String node = nc == null ? "" : cells.get(nc).strip();
            Double lat = number(file, lineNo, LATENCY_MS, columns, cells, 1e-3);
            Double en = number(file, lineNo, ENERGY_UJ, columns, cells, 1e-6);
            Double pw = number(file, lineNo, POWER_MW, columns, cells, 1e-3);
            Double chipEn = number(file, lineNo, CHIP_ENERGY_UJ, columns, cells, 1e-6);
            Double chipPw = number(file, lineNo, CHIP_POWER_MW, columns, cells, 1e-3);
            boolean chip = chipEn != null || chipPw != null;
            if (chip && (en != null || pw != null)) {
                throw new BadInputException(file + ":" + lineNo + ": the row gives both "
                        + (en != null ? ENERGY_UJ : POWER_MW)
                        + " (DRAM included) and " + (chipEn != null ? CHIP_ENERGY_UJ : CHIP_POWER_MW)
                        + " (the chip alone); give one of the two kinds per row");
            }
            if (chip) {
                en = chipEn;
                pw = chipPw;
            }
            if (lat == null && en == null && pw == null) {
                throw new BadInputException(file + ":" + lineNo + ": the row gives no value: fill at least one of "
                        + measuredColumns(columns));
            }
            String key = model + "\u0000" + node;
            Integer before = seen.putIfAbsent(key, lineNo);
            if (before != null) {
                throw new BadInputException(file + ":" + lineNo + ": " + (node.isEmpty() ? "the whole model '" + model + "'"
                        : "node '" + node + "' of '" + model + "'") + " was already measured on line " + before
                        + "; give one row per model and node (put repeated runs' median in it)");
            }
            rows.add(new Measurement(model, node.isEmpty() ? null : node, lineNo, lat, en, pw, chip));
        }
        if (columns == null) {
            throw new BadInputException(file + ": the measurement file is empty: it needs a header row ("
                    + MODEL + "," + NODE + "," + LATENCY_MS + ") and at least one row");
        }
        if (rows.isEmpty()) {
            throw new BadInputException(file + ": the measurement file has a header but no rows");
        }
        return new MeasurementFile(file, sha, rows, notes);
    }

    private static Map<String, Integer> header(Path file, int lineNo, List<String> cells, List<String> notes) {
        Map<String, Integer> columns = new LinkedHashMap<>();
        List<String> ignored = new ArrayList<>();
        for (int c = 0; c < cells.size(); c++) {
            String name = cells.get(c).strip().toLowerCase(Locale.ROOT);
            switch (name) {
                case MODEL, NODE, LATENCY_MS, ENERGY_UJ, POWER_MW, CHIP_ENERGY_UJ, CHIP_POWER_MW -> {
                    if (columns.put(name, c) != null) {
                        throw new BadInputException(file + ":" + lineNo + ": " + name + ": the column appears twice in the header");
                    }
                }
                default -> ignored.add(name.isEmpty() ? "(column " + (c + 1) + ", no name)" : "'" + cells.get(c).strip() + "'");
            }
        }
        if (!columns.containsKey(MODEL)) {
            throw new BadInputException(file + ":" + lineNo + ": the header has no '" + MODEL
                    + "' column; the first row must name the columns, e.g. " + MODEL + "," + NODE + "," + LATENCY_MS);
        }
        if (MEASURED.stream().noneMatch(columns::containsKey)) {
            throw new BadInputException(file + ":" + lineNo + ": the header has no measured column: give at least one of "
                    + LATENCY_MS + ", " + ENERGY_UJ + ", " + POWER_MW + " (or " + CHIP_ENERGY_UJ + ", " + CHIP_POWER_MW
                    + " for the chip alone)");
        }
        if (!ignored.isEmpty()) {
            notes.add(file + ":" + lineNo + ": ignored " + (ignored.size() == 1 ? "column " : "columns ")
                    + String.join(", ", ignored) + " (erg reads " + MODEL + ", " + NODE + ", "
                    + String.join(", ", MEASURED) + ")");
        }
        return columns;
    }

    private static String measuredColumns(Map<String, Integer> columns) {
        List<String> m = new ArrayList<>();
        for (String c : MEASURED) {
            if (columns.containsKey(c)) {
                m.add(c);
            }
        }
        return String.join(", ", m);
    }

    /** The cell of {@code column} as a number in SI units ({@code scale} per file unit), or null when empty or absent. */
    private static Double number(Path file, int lineNo, String column, Map<String, Integer> columns, List<String> cells,
                                 double scale) {
        Integer c = columns.get(column);
        if (c == null) {
            return null;
        }
        String s = cells.get(c).strip();
        if (s.isEmpty()) {
            return null;
        }
        double v;
        try {
            if (!s.matches("[+-]?(\\d+(\\.\\d*)?|\\.\\d+)([eE][+-]?\\d+)?")) {
                throw new NumberFormatException();
            }
            v = Double.parseDouble(s);
        } catch (NumberFormatException e) {
            throw new BadInputException(file + ":" + lineNo + ": " + column + ": '" + s
                    + "' is not a number (write e.g. 12.5, with a dot for decimals)");
        }
        if (Double.isInfinite(v)) {
            throw new BadInputException(file + ":" + lineNo + ": " + column + ": '" + s + "' is too large");
        }
        if (v < 0) {
            throw new BadInputException(file + ":" + lineNo + ": " + column + ": " + s
                    + " is negative; a measurement is 0 or more");
        }
        return v * scale;
    }

    /** Splits one line into cells; double quotes group a cell, a doubled quote inside is one quote. */
    private static List<String> cells(Path file, int lineNo, String line) {
        List<String> out = new ArrayList<>();
        StringBuilder b = new StringBuilder();
        boolean quoted = false;
        boolean wasQuoted = false;
        for (int i = 0; i < line.length(); i++) {
            char ch = line.charAt(i);
            if (quoted) {
                if (ch == '"') {
                    if (i + 1 < line.length() && line.charAt(i + 1) == '"') {
                        b.append('"');
                        i++;
                    } else {
                        quoted = false;
                    }
                } else {
                    b.append(ch);
                }
            } else if (ch == '"' && b.toString().isBlank() && !wasQuoted) {
                quoted = true;
                wasQuoted = true;
                b.setLength(0);
            } else if (ch == ',') {
                out.add(b.toString());
                b.setLength(0);
                wasQuoted = false;
            } else if (wasQuoted && !Character.isWhitespace(ch)) {
                throw new BadInputException(file + ":" + lineNo + ": column " + (out.size() + 1)
                        + ": text after a closing quote");
            } else if (!wasQuoted) {
                b.append(ch);
            }
        }
        if (quoted) {
            throw new BadInputException(file + ":" + lineNo + ": column " + (out.size() + 1) + ": a quote is not closed");
        }
        out.add(b.toString());
        return out;
    }

    /**
     * Checks that every row names a known model and, for node rows, a node of that model. Every
     * unknown node name is listed in one error, with the closest names of its model suggested.
     *
     * @param nodeNames per model file name, the names of its nodes (as erg names them)
     * @throws BadInputException listing every unknown model or node name of the file
     */
    public void checkNames(Map<String, ? extends Collection<String>> nodeNames) {
        Map<String, List<String>> unknownNodes = new TreeMap<>();
        Map<String, Integer> unknownModels = new TreeMap<>();
        for (Measurement m : rows) {
            Collection<String> names = nodeNames.get(m.model());
            if (names == null) {
                unknownModels.putIfAbsent(m.model(), m.line());
                continue;
            }
            if (m.node() != null && !names.contains(m.node())) {
                unknownNodes.computeIfAbsent(m.model(), k -> new ArrayList<>()).add(m.line() + ":" + m.node());
            }
        }
        if (!unknownModels.isEmpty()) {
            List<String> parts = new ArrayList<>();
            unknownModels.forEach((k, v) -> parts.add("'" + k + "' (line " + v + ")"));
            throw new BadInputException(file + ": " + (parts.size() == 1 ? "model " : "models ") + String.join(", ", parts)
                    + (parts.size() == 1 ? " is" : " are") + " not among the models given ("
                    + String.join(", ", new TreeSet<>(nodeNames.keySet())) + "); the model column holds the model's file name");
        }
        if (unknownNodes.isEmpty()) {
            return;
        }
        List<String> parts = new ArrayList<>();
        int count = 0;
        for (Map.Entry<String, List<String>> e : unknownNodes.entrySet()) {
            Collection<String> names = nodeNames.get(e.getKey());
            for (String s : e.getValue()) {
                int colon = s.indexOf(':');
                String name = s.substring(colon + 1);
                List<String> near = Names.closest(name, names, 3);
                parts.add("line " + s.substring(0, colon) + " '" + name + "' in " + e.getKey()
                        + (near.isEmpty() ? "" : " (closest: " + String.join(", ", near) + ")"));
                count++;
            }
        }
        throw new BadInputException(file + ": " + count + (count == 1 ? " node name is" : " node names are")
                + " not in the model: " + String.join("; ", parts));
    }

    private static String sha256(byte[] bytes) {
        try {
            byte[] d = MessageDigest.getInstance("SHA-256").digest(bytes);
            StringBuilder b = new StringBuilder(64);
            for (byte x : d) {
                b.append(String.format("%02x", x & 0xff));
            }
            return b.toString();
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is missing from this Java runtime", e);
        }
    }
}
