package dev.erg.onnx;

import static dev.erg.onnx.OnnxFields.*;

import com.google.protobuf.CodedInputStream;
import com.google.protobuf.WireFormat;
import dev.erg.error.BadInputException;
import dev.erg.error.InputFiles;
import java.io.FileInputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads an ONNX file (a serialized ModelProto) straight off the protobuf wire format, field number
 * by field number as the ONNX standard defines them. The file is streamed: a weight payload is
 * skipped with a seek, never copied, so the cost of reading does not grow with the weight bytes.
 * External data is never opened; its location is only checked to stay inside the model's folder.
 *
 * <p>Every defect ends in a {@link BadInputException} whose one-line message names the file and the
 * part of the model at fault.
 */
public final class OnnxReader {
    /** Payloads up to this many bytes are kept: shape constants, axes, scales. Larger ones are skipped. */
    public static final int KEEP_PAYLOAD_BYTES = 4096;
    /**
     * The most nodes a model may hold, its subgraphs' nodes included. Analysis keeps about a kilobyte
     * per node, so this bounds the heap a model can take (docs/limitations.md); a larger graph is
     * refused as soon as the reader passes the limit.
     */
    public static final int MAX_NODES = 500_000;
    /** The largest model file: a protobuf message is at most 2^31 - 1 bytes (2 GiB less one byte). */
    public static final long MAX_MODEL_BYTES = Integer.MAX_VALUE;
    private static final int BUFFER = 64 * 1024;

    private final WireInput w;
    private final GraphReader graphs;
    private final List<String> warnings = new ArrayList<>();

    private OnnxReader(WireInput w) {
        this.w = w;
        this.graphs = new GraphReader(w, new TensorReader(w));
    }

    /** Reads the model in {@code file}. */
    public static OnnxModel read(Path file) {
        InputFiles.requireRegular(file, file.toString(), "model file");
        long size;
        try {
            size = Files.size(file);
        } catch (IOException e) {
            throw new BadInputException(file + ": cannot read the model file (" + e.getMessage() + ")");
        }
        if (size == 0) {
            throw new BadInputException(file + ": the file is empty, not an ONNX model");
        }
        if (size > MAX_MODEL_BYTES) {
            throw new BadInputException(file + ": the file is " + size
                    + " bytes; a protobuf ModelProto holds at most " + MAX_MODEL_BYTES + " bytes (large weights belong in external data)");
        }
        OnnxReader r = new OnnxReader(new WireInput(file, size));
        try (InputStream s = new FileInputStream(file.toFile())) {
            r.w.in = CodedInputStream.newInstance(s, BUFFER);
            r.w.in.setSizeLimit(Integer.MAX_VALUE);
            r.w.in.pushLimit((int) size);
            return r.readModel();
        } catch (IOException e) {
            throw r.w.bad("the file is not a valid protobuf message (" + WireInput.oneLine(e.getMessage()) + ")");
        } catch (RuntimeException e) {
            if (e instanceof BadInputException) {
                throw e;
            }
            throw r.w.bad("cannot decode the file (" + e.getClass().getSimpleName() + ": " + WireInput.oneLine(e.getMessage()) + ")");
        }
    }

    private OnnxModel readModel() throws IOException {
        long ir = 0;
        String producer = "";
        String producerVersion = "";
        Map<String, Long> opsets = new LinkedHashMap<>();
        GraphDef graph = null;
        boolean sawHeader = false;
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            switch (w.field(tag)) {
                case MODEL_IR_VERSION:
                    ir = w.varint(tag, "ir_version");
                    sawHeader = true;
                    break;
                case MODEL_PRODUCER_NAME:
                    producer = w.string(tag, "producer_name");
                    break;
                case MODEL_PRODUCER_VERSION:
                    producerVersion = w.string(tag, "producer_version");
                    break;
                case MODEL_GRAPH:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "graph");
                    if (graph != null) {
                        throw w.bad("the model holds two graphs");
                    }
                    int old = w.enter("graph");
                    w.where = new WireInput.Where(null, "graph", -1);
                    graph = graphs.readGraph();
                    w.where = new WireInput.Where(null, "model", -1);
                    w.leave(old);
                    break;
                case MODEL_OPSET_IMPORT:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "opset_import");
                    readOpset(opsets);
                    sawHeader = true;
                    break;
                case MODEL_DOMAIN: case MODEL_DOC_STRING:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, w.field(tag) == MODEL_DOMAIN ? "domain" : "doc_string");
                    w.skip(tag);
                    break;
                case MODEL_MODEL_VERSION:
                    w.varint(tag, "model_version");
                    break;
                default:
                    w.skip(tag);
            }
        }
        if (graph == null || !sawHeader) {
            throw w.badHere("not an ONNX model (or a truncated one): the file holds no "
                    + (graph == null ? "graph" : "ir_version or opset_import")
                    + " (ModelProto fields 7, 1 and 8)");
        }
        if (opsets.isEmpty()) {
            opsets.put("", 1L);
        }
        return new OnnxModel(w.file, ir, producer, producerVersion, opsets, graph, warnings);
    }

    private void readOpset(Map<String, Long> opsets) throws IOException {
        int old = w.enter("opset_import");
        String domain = "";
        long version = 0;
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            if (w.field(tag) == OPSET_DOMAIN) {
                domain = w.string(tag, "opset_import.domain");
            } else if (w.field(tag) == OPSET_VERSION) {
                version = w.varint(tag, "opset_import.version");
            } else {
                w.skip(tag);
            }
        }
        w.leave(old);
        if (domain.equals("ai.onnx")) {
            domain = "";
        }
        String shown = domain.isEmpty() ? "the default domain (ai.onnx)" : "domain '" + domain + "'";
        if (opsets.containsKey(domain)) {
            throw w.bad("the model imports " + shown + " twice (opsets " + opsets.get(domain) + " and " + version
                    + "); each domain is imported once");
        }
        boolean standard = domain.isEmpty() || domain.equals("ai.onnx.ml");
        if (version < 1 && standard || version < 0) {
            throw w.bad("the model imports " + shown + " at opset " + version + "; opset versions start at 1");
        }
        long newest = domain.isEmpty() ? OnnxModel.NEWEST_DEFAULT_OPSET
                : domain.equals("ai.onnx.ml") ? OnnxModel.NEWEST_ML_OPSET : Long.MAX_VALUE;
        if (version > newest) {
            warnings.add(w.label + ": the model imports " + shown + " at opset " + version + ", newer than the newest erg"
                    + " knows (" + newest + "); erg reads its operators by the opset " + newest + " definitions");
        }
        opsets.put(domain, version);
    }
}
