package dev.erg.onnx;

import com.google.protobuf.CodedInputStream;
import com.google.protobuf.WireFormat;
import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.Map;

/**
 * The protobuf wire format under the ONNX reader: one stream over the model file, where in the
 * model the reader is (for messages), and the checked primitives every message reader uses. A
 * length prefix is checked against the enclosing message and the file before anything is read.
 */
final class WireInput {
    final Path file;
    final Path folder;
    final String label;
    final long fileSize;
    CodedInputStream in;
    Where where = new Where(null, "model", -1);

    /** Where the reader is, for messages: built into text only when a message needs it. */
    static final class Where {
        final Where parent;
        final String text;
        final int index;

        Where(Where parent, String text, int index) {
            this.parent = parent;
            this.text = text;
            this.index = index;
        }

        @Override
        public String toString() {
            String p = parent == null ? "" : parent.toString();
            return index < 0 ? p + text : p + text + index;
        }
    }

    WireInput(Path file, long fileSize) {
        this.file = file;
        this.folder = file.toAbsolutePath().normalize().getParent();
        this.label = file.toString();
        this.fileSize = fileSize;
    }

    static String oneLine(String s) {
        if (s == null) {
            return "no detail";
        }
        int nl = s.indexOf('\n');
        return nl < 0 ? s : s.substring(0, nl);
    }

    BadInputException bad(String what) {
        long pos = in == null ? 0 : in.getTotalBytesRead();
        return new BadInputException(label + ": " + what + " [in " + where + ", byte " + pos + "]");
    }

    BadInputException badHere(String what) {
        return new BadInputException(label + ": " + what);
    }

    // ---- wire helpers -------------------------------------------------------------------

    int field(int tag) {
        return WireFormat.getTagFieldNumber(tag);
    }

    int wire(int tag) {
        return WireFormat.getTagWireType(tag);
    }

    void expect(int tag, int wireType, String fieldName) {
        if (wire(tag) != wireType) {
            throw bad("field " + field(tag) + " (" + fieldName + ") has wire type " + wire(tag) + ", expected "
                    + wireType + ": not an ONNX model, or a corrupt one");
        }
    }

    /** Reads a length prefix and checks that it stays inside the enclosing message and the file. */
    int length(String what) throws IOException {
        long len = in.readRawVarint64();
        long left = in.getBytesUntilLimit();
        if (left < 0) {
            // No limit pushed, or one ending exactly at 2^31 - 1, which the stream reports as "no limit" (-1).
            left = fileSize - in.getTotalBytesRead();
        }
        if (len < 0 || len > left) {
            long pos = in.getTotalBytesRead();
            if (len < 0 || pos + len > fileSize) {
                throw bad("the length field of " + what + " says " + Long.toUnsignedString(len)
                        + " bytes, past the end of the file (" + fileSize + " bytes)");
            }
            throw bad("the length field of " + what + " says " + len + " bytes, more than the "
                    + left + " bytes left in the enclosing message");
        }
        return (int) len;
    }

    int enter(String what) throws IOException {
        int len = length(what);
        return in.pushLimit(len);
    }

    void leave(int old) {
        in.popLimit(old);
    }

    void skip(int tag) throws IOException {
        switch (wire(tag)) {
            case WireFormat.WIRETYPE_VARINT:
                in.readRawVarint64();
                break;
            case WireFormat.WIRETYPE_FIXED64:
                in.readRawLittleEndian64();
                break;
            case WireFormat.WIRETYPE_FIXED32:
                in.readRawLittleEndian32();
                break;
            case WireFormat.WIRETYPE_LENGTH_DELIMITED:
                in.skipRawBytes(length("field " + field(tag)));
                break;
            default:
                throw bad("field " + field(tag) + " has wire type " + wire(tag)
                        + ", which ONNX never uses: not an ONNX model, or a corrupt one");
        }
    }

    String string(int tag, String fieldName) throws IOException {
        expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, fieldName);
        int len = length(fieldName);
        return new String(in.readRawBytes(len), java.nio.charset.StandardCharsets.UTF_8);
    }

    long varint(int tag, String fieldName) throws IOException {
        expect(tag, WireFormat.WIRETYPE_VARINT, fieldName);
        return in.readRawVarint64();
    }

    /** A repeated int64 field, packed or not, appended to {@code out}. */
    void int64s(int tag, String fieldName, PrimitiveLists.LongList out) throws IOException {
        if (wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
            int old = enter(fieldName);
            while (!in.isAtEnd()) {
                out.add(in.readRawVarint64());
            }
            leave(old);
        } else {
            out.add(varint(tag, fieldName));
        }
    }

    /** Operator types and domains repeat over the nodes: one String each. */
    final Map<String, String> interned = new HashMap<>();

    String intern(String s) {
        String prev = interned.putIfAbsent(s, s);
        return prev != null ? prev : s;
    }
}
