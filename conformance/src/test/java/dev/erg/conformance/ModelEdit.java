package dev.erg.conformance;

import com.google.protobuf.CodedInputStream;
import com.google.protobuf.CodedOutputStream;
import com.google.protobuf.WireFormat;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.Collection;

/**
 * Edits a serialized ModelProto on the protobuf wire without decoding payloads: appends graph
 * outputs (GraphProto field 12, ValueInfoProto) to the main graph (ModelProto field 7). A
 * repeated field may be continued anywhere in a message, so the graph's bytes are kept as they
 * are and the new outputs follow them; only the graph's length prefix changes. Weights stay
 * untouched, which is what the reader alone (it skips large payloads) cannot give back.
 */
final class ModelEdit {
    private ModelEdit() {
    }

    /** The model with {@code names} added as graph outputs; each ValueInfoProto carries the name only. */
    static byte[] addOutputs(byte[] model, Collection<String> names) {
        try {
            ByteArrayOutputStream extra = new ByteArrayOutputStream();
            CodedOutputStream eo = CodedOutputStream.newInstance(extra);
            for (String n : names) {
                byte[] info = valueInfo(n);
                eo.writeByteArray(12, info);
            }
            eo.flush();
            byte[] add = extra.toByteArray();

            CodedInputStream in = CodedInputStream.newInstance(model);
            in.setSizeLimit(Integer.MAX_VALUE);
            ByteArrayOutputStream bos = new ByteArrayOutputStream(model.length + add.length + 16);
            CodedOutputStream out = CodedOutputStream.newInstance(bos);
            boolean done = false;
            while (true) {
                int start = in.getTotalBytesRead();
                int tag = in.readTag();
                if (tag == 0) {
                    break;
                }
                int field = WireFormat.getTagFieldNumber(tag);
                if (field == 7 && WireFormat.getTagWireType(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED && !done) {
                    byte[] graph = in.readByteArray();
                    out.writeTag(7, WireFormat.WIRETYPE_LENGTH_DELIMITED);
                    out.writeUInt32NoTag(graph.length + add.length);
                    out.writeRawBytes(graph);
                    out.writeRawBytes(add);
                    done = true;
                } else {
                    in.skipField(tag);
                    out.writeRawBytes(model, start, in.getTotalBytesRead() - start); // the field as it was
                }
            }
            out.flush();
            if (!done) {
                throw new IllegalArgumentException("model has no graph (field 7)");
            }
            return bos.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private static byte[] valueInfo(String name) throws IOException {
        ByteArrayOutputStream b = new ByteArrayOutputStream();
        CodedOutputStream o = CodedOutputStream.newInstance(b);
        o.writeString(1, name);
        o.flush();
        return b.toByteArray();
    }
}
