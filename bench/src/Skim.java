import com.google.protobuf.CodedInputStream;
import com.google.protobuf.WireFormat;
import java.io.FileInputStream;
import java.io.IOException;
import java.io.InputStream;

/**
 * The start-up floor of bench/run.sh: a bare JVM that walks an ONNX file's protobuf fields the way
 * erg's reader does, with protobuf-java's CodedInputStream over a FileInputStream, and skips every
 * payload with a seek. It reads the model's graph, each node's inputs, outputs, name and operator
 * type, and each initializer's name, dims and type, and skips everything else (attributes, weight
 * bytes, docs). It builds no graph and infers nothing: what is left of erg's time above this is
 * start-up and work. Prints the counts, so that the walk cannot be skipped.
 *
 * Usage: java -cp protobuf-java.jar:CLASSES Skim MODEL.onnx
 */
public final class Skim {
    private static final int GRAPH = 7; // ModelProto.graph
    private static final int NODE = 1, INITIALIZER = 5; // GraphProto
    private static final int NODE_INPUT = 1, NODE_OUTPUT = 2, NODE_NAME = 3, NODE_OP = 4; // NodeProto
    private static final int DIMS = 1, DATA_TYPE = 2, TENSOR_NAME = 8; // TensorProto

    private long nodes;
    private long initializers;
    private long strings;
    private long skipped;
    private final CodedInputStream in;

    private Skim(CodedInputStream in) {
        this.in = in;
    }

    public static void main(String[] args) throws IOException {
        try (InputStream s = new FileInputStream(args[0])) {
            CodedInputStream in = CodedInputStream.newInstance(s, 1 << 16);
            in.setSizeLimit(Integer.MAX_VALUE);
            Skim k = new Skim(in);
            k.model();
            System.out.println(k.nodes + " nodes, " + k.initializers + " initializers, " + k.strings + " strings, "
                    + k.skipped + " bytes skipped");
        }
    }

    private void model() throws IOException {
        int tag;
        while ((tag = in.readTag()) != 0) {
            if (WireFormat.getTagFieldNumber(tag) == GRAPH) {
                int old = in.pushLimit(in.readRawVarint32());
                graph();
                in.popLimit(old);
            } else {
                skip(tag);
            }
        }
    }

    private void graph() throws IOException {
        int tag;
        while ((tag = in.readTag()) != 0) {
            int field = WireFormat.getTagFieldNumber(tag);
            if (field == NODE || field == INITIALIZER) {
                int old = in.pushLimit(in.readRawVarint32());
                if (field == NODE) {
                    node();
                } else {
                    tensor();
                }
                in.popLimit(old);
            } else {
                skip(tag);
            }
        }
    }

    private void node() throws IOException {
        nodes++;
        int tag;
        while ((tag = in.readTag()) != 0) {
            int field = WireFormat.getTagFieldNumber(tag);
            if (field == NODE_INPUT || field == NODE_OUTPUT || field == NODE_NAME || field == NODE_OP) {
                in.readStringRequireUtf8();
                strings++;
            } else {
                skip(tag);
            }
        }
    }

    private void tensor() throws IOException {
        initializers++;
        int tag;
        while ((tag = in.readTag()) != 0) {
            int field = WireFormat.getTagFieldNumber(tag);
            if (field == TENSOR_NAME) {
                in.readStringRequireUtf8();
                strings++;
            } else if ((field == DIMS || field == DATA_TYPE) && WireFormat.getTagWireType(tag) == WireFormat.WIRETYPE_VARINT) {
                in.readRawVarint64();
            } else {
                skip(tag);
            }
        }
    }

    private void skip(int tag) throws IOException {
        if (WireFormat.getTagWireType(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
            int n = in.readRawVarint32();
            in.skipRawBytes(n); // FileInputStream.skip: a seek past the payload
            skipped += n;
        } else {
            in.skipField(tag);
        }
    }
}
