package dev.erg.onnx;

import static dev.erg.onnx.OnnxFields.*;

import com.google.protobuf.WireFormat;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Reads TensorProto and SparseTensorProto messages: dims, type, name and the payload. A payload up to
 * {@link OnnxReader#KEEP_PAYLOAD_BYTES} is decoded (shape constants, axes, scales); a larger one is
 * skipped with a seek. External data is never opened: its location is checked to stay inside the
 * model's folder as written.
 */
final class TensorReader {
    private final WireInput w;

    TensorReader(WireInput w) {
        this.w = w;
    }

    TensorDef readSparseTensor() throws IOException {
        TensorDef values = null;
        TensorDef indices = null;
        PrimitiveLists.LongList dims = new PrimitiveLists.LongList();
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            int old;
            switch (w.field(tag)) {
                case SPARSE_VALUES:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "sparse values");
                    old = w.enter("sparse values");
                    values = readTensor("sparse initializer");
                    w.leave(old);
                    break;
                case SPARSE_INDICES:
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "sparse indices");
                    old = w.enter("sparse indices");
                    indices = readTensor("sparse initializer");
                    w.leave(old);
                    break;
                case SPARSE_DIMS:
                    w.int64s(tag, "sparse dims", dims);
                    break;
                default:
                    w.skip(tag);
            }
        }
        if (values == null) {
            throw w.bad("a sparse tensor has no values");
        }
        long[] d = dims.toArray();
        long elements = elementCount("sparse initializer '" + values.name() + "'", d);
        // Stored size: the non-zero values plus their indices; the dense view is what the graph sees.
        String loc = values.externalLocation() != null ? values.externalLocation()
                : indices != null ? indices.externalLocation() : null;
        return new TensorDef(values.name(), values.type(), d, elements, null, loc);
    }

    long elementCount(String what, long[] dims) {
        long n = 1;
        for (long d : dims) {
            if (d < 0) {
                throw w.bad(what + " has a negative dim " + d);
            }
            try {
                n = Math.multiplyExact(n, d);
            } catch (ArithmeticException e) {
                throw w.bad(what + " has dims whose product overflows 64 bits");
            }
        }
        return n;
    }

    TensorDef readTensor(String role) throws IOException {
        PrimitiveLists.LongList dims = new PrimitiveLists.LongList();
        long typeCode = 0;
        String name = "";
        byte[] raw = null;
        long rawLength = -1;
        PrimitiveLists.LongList intData = null;
        PrimitiveLists.DoubleList realData = null;
        long packedCount = 0;
        int packedWidth = 0; // bytes per element of a skipped packed field, 0 when unknown
        long dataLocation = 0;
        Map<String, String> external = new LinkedHashMap<>();
        boolean hasStrings = false;
        while (!w.in.isAtEnd()) {
            int tag = w.in.readTag();
            int f = w.field(tag);
            switch (f) {
                case TENSOR_DIMS:
                    w.int64s(tag, "dims", dims);
                    break;
                case TENSOR_DATA_TYPE:
                    typeCode = w.varint(tag, "data_type");
                    break;
                case TENSOR_NAME:
                    name = w.string(tag, "tensor name");
                    break;
                case TENSOR_RAW_DATA: {
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "raw_data");
                    int len = w.length("raw_data of tensor '" + name + "'");
                    rawLength = len;
                    if (len <= OnnxReader.KEEP_PAYLOAD_BYTES) {
                        raw = w.in.readRawBytes(len);
                    } else {
                        w.in.skipRawBytes(len);
                    }
                    break;
                }
                case TENSOR_FLOAT_DATA: case TENSOR_DOUBLE_DATA: { // float_data (fixed32), double_data (fixed64)
                    int width = f == TENSOR_FLOAT_DATA ? 4 : 8;
                    if (realData == null) {
                        realData = new PrimitiveLists.DoubleList();
                    }
                    if (w.wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
                        int len = w.length("packed data of tensor '" + name + "'");
                        if (len % width != 0) {
                            throw w.bad("tensor '" + name + "' has packed data of " + len + " bytes, not a multiple of " + width);
                        }
                        if (len <= OnnxReader.KEEP_PAYLOAD_BYTES && realData != null) {
                            int old = w.in.pushLimit(len);
                            while (!w.in.isAtEnd()) {
                                realData.add(width == 4 ? w.in.readFloat() : w.in.readDouble());
                            }
                            w.in.popLimit(old);
                        } else {
                            w.in.skipRawBytes(len);
                            realData = null;
                            packedWidth = width;
                        }
                        packedCount += len / width;
                    } else {
                        w.expect(tag, width == 4 ? WireFormat.WIRETYPE_FIXED32 : WireFormat.WIRETYPE_FIXED64,
                                f == TENSOR_FLOAT_DATA ? "float_data" : "double_data");
                        double v = width == 4 ? w.in.readFloat() : w.in.readDouble();
                        if (realData != null && realData.size() * width < OnnxReader.KEEP_PAYLOAD_BYTES) {
                            realData.add(v);
                        } else {
                            realData = null;
                        }
                        packedCount++;
                    }
                    break;
                }
                case TENSOR_INT32_DATA: case TENSOR_INT64_DATA: case TENSOR_UINT64_DATA: { // int32_data, int64_data, uint64_data (varints)
                    if (intData == null) {
                        intData = new PrimitiveLists.LongList();
                    }
                    if (w.wire(tag) == WireFormat.WIRETYPE_LENGTH_DELIMITED) {
                        int len = w.length("packed data of tensor '" + name + "'");
                        if (len <= OnnxReader.KEEP_PAYLOAD_BYTES && intData != null) {
                            int old = w.in.pushLimit(len);
                            while (!w.in.isAtEnd()) {
                                intData.add(w.in.readRawVarint64());
                                packedCount++;
                            }
                            w.in.popLimit(old);
                        } else {
                            // Varints have no fixed width: count them without keeping them.
                            int old = w.in.pushLimit(len);
                            if (len > OnnxReader.KEEP_PAYLOAD_BYTES) {
                                w.in.skipRawBytes(len);
                                packedCount = -1;
                            }
                            w.in.popLimit(old);
                            intData = null;
                        }
                    } else {
                        long v = w.varint(tag, "integer data");
                        if (intData != null && intData.size() < OnnxReader.KEEP_PAYLOAD_BYTES / 8) {
                            intData.add(v);
                        } else {
                            intData = null;
                        }
                        if (packedCount >= 0) {
                            packedCount++;
                        }
                    }
                    break;
                }
                case TENSOR_STRING_DATA:
                    hasStrings = true;
                    w.skip(tag);
                    break;
                case TENSOR_EXTERNAL_DATA: {
                    w.expect(tag, WireFormat.WIRETYPE_LENGTH_DELIMITED, "external_data");
                    int old = w.enter("external_data");
                    String k = "";
                    String v = "";
                    while (!w.in.isAtEnd()) {
                        int t2 = w.in.readTag();
                        if (w.field(t2) == ENTRY_KEY) {
                            k = w.string(t2, "external_data key");
                        } else if (w.field(t2) == ENTRY_VALUE) {
                            v = w.string(t2, "external_data value");
                        } else {
                            w.skip(t2);
                        }
                    }
                    w.leave(old);
                    external.put(k, v);
                    break;
                }
                case TENSOR_DATA_LOCATION:
                    dataLocation = w.varint(tag, "data_location");
                    break;
                default:
                    w.skip(tag);
            }
        }
        String what = role + " '" + name + "'";
        ElemType type = ElemType.ofCode(typeCode);
        if (type == null || type == ElemType.UNDEFINED) {
            throw w.bad(what + " has element type code " + typeCode + ", which the standard does not define");
        }
        long[] d = dims.toArray();
        long elements = elementCount(what, d);
        long expectedBytes;
        try {
            expectedBytes = type.bytes(elements);
        } catch (ArithmeticException e) {
            throw w.bad(what + " has dims whose byte size overflows 64 bits");
        }
        String location = null;
        if (dataLocation == DATA_LOCATION_EXTERNAL || !external.isEmpty()) {
            location = checkExternal(what, external, expectedBytes, type);
        } else if (rawLength >= 0 && type.bits > 0 && rawLength != expectedBytes) {
            throw w.bad(what + " has " + rawLength + " bytes of raw_data but its dims " + java.util.Arrays.toString(d)
                    + " of " + type.label + " need " + expectedBytes);
        } else if (rawLength < 0 && packedCount > 0 && packedCount != elements && !hasStrings
                && !(type.bits < 8)) {
            throw w.bad(what + " holds " + packedCount + " values but its dims " + java.util.Arrays.toString(d)
                    + " need " + elements);
        }
        TensorValues values = null;
        if (location == null) {
            if (raw != null) {
                values = decodeRaw(type, d, raw);
            } else if (realData != null && realData.size() == elements && elements > 0) {
                values = TensorValues.ofDoubles(type, d, realData.toArray());
            } else if (intData != null && intData.size() == elements && elements > 0) {
                values = decodeInts(type, d, intData.toArray());
            } else if (elements == 0 && type != ElemType.STRING) {
                values = TensorValues.ofLongs(type, d, new long[0]);
            }
        }
        return new TensorDef(name, type, d, elements, values, location);
    }

    String checkExternal(String what, Map<String, String> external, long expectedBytes, ElemType type) {
        String loc = external.get("location");
        if (loc == null || loc.isEmpty()) {
            throw w.bad(what + " says its data is external but gives no location");
        }
        if (!loc.equals(lastSafeLocation)) {
            checkLocation(what, loc);
            lastSafeLocation = loc; // the next tensor in the same file skips the path work
        }
        for (String key : new String[] {"offset", "length"}) {
            String v = external.get(key);
            if (v != null) {
                long n;
                try {
                    n = Long.parseLong(v.trim());
                } catch (NumberFormatException e) {
                    throw w.bad(what + " has external data " + key + " '" + v + "', not a whole number");
                }
                if (n < 0) {
                    throw w.bad(what + " has a negative external data " + key + " " + n);
                }
                if (key.equals("length") && type.bits >= 8 && n < expectedBytes) {
                    throw w.bad(what + " has external data of " + n + " bytes but its dims need " + expectedBytes);
                }
            }
        }
        return loc;
    }

    /** The location stays inside the model's folder: relative, never climbing out. */
    private void checkLocation(String what, String loc) {
        if (loc.indexOf('\0') >= 0) {
            throw w.bad(what + " has an external data location with a NUL character");
        }
        String norm = loc.replace('\\', '/');
        if (norm.startsWith("/") || (norm.length() >= 2 && norm.charAt(1) == ':' && isAsciiLetter(norm.charAt(0))) || norm.startsWith("~")) {
            throw w.bad(what + " has external data at the absolute location '" + loc
                    + "'; external data must be a relative path inside the model's folder");
        }
        for (String part : norm.split("/")) {
            if (part.equals("..")) {
                throw w.bad(what + " has external data at '" + loc
                        + "', which climbs out of the model's folder; it must stay inside it");
            }
        }
        Path resolved = w.folder.resolve(norm).normalize();
        if (!resolved.startsWith(w.folder)) {
            throw w.bad(what + " has external data at '" + loc + "', outside the model's folder");
        }
    }

    /** The last external location that passed {@link #checkLocation}: tensors of one file share it. */
    private String lastSafeLocation;

    static boolean isAsciiLetter(char ch) {
        return (ch >= 'A' && ch <= 'Z') || (ch >= 'a' && ch <= 'z');
    }

    static TensorValues decodeRaw(ElemType type, long[] dims, byte[] raw) {
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        int n = type.bits >= 8 ? raw.length / (type.bits / 8) : 0;
        switch (type) {
            case FLOAT: {
                double[] v = new double[n];
                for (int i = 0; i < n; i++) {
                    v[i] = b.getFloat();
                }
                return TensorValues.ofDoubles(type, dims, v);
            }
            case DOUBLE: {
                double[] v = new double[n];
                for (int i = 0; i < n; i++) {
                    v[i] = b.getDouble();
                }
                return TensorValues.ofDoubles(type, dims, v);
            }
            case FLOAT16: case BFLOAT16: {
                double[] v = new double[n];
                for (int i = 0; i < n; i++) {
                    int bits = b.getShort() & 0xffff;
                    v[i] = type == ElemType.FLOAT16 ? halfToFloat(bits) : Float.intBitsToFloat(bits << 16);
                }
                return TensorValues.ofDoubles(type, dims, v);
            }
            case INT64: case UINT64: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    v[i] = b.getLong();
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            case INT32: case UINT32: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    int x = b.getInt();
                    v[i] = type == ElemType.INT32 ? x : Integer.toUnsignedLong(x);
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            case INT16: case UINT16: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    short x = b.getShort();
                    v[i] = type == ElemType.INT16 ? x : (x & 0xffff);
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            case INT8: case UINT8: case BOOL: {
                long[] v = new long[n];
                for (int i = 0; i < n; i++) {
                    byte x = b.get();
                    v[i] = type == ElemType.INT8 ? x : (x & 0xff);
                }
                return TensorValues.ofLongs(type, dims, v);
            }
            default:
                return null;
        }
    }

    static TensorValues decodeInts(ElemType type, long[] dims, long[] v) {
        switch (type) {
            case FLOAT16: case BFLOAT16: {
                double[] d = new double[v.length];
                for (int i = 0; i < v.length; i++) {
                    int bits = (int) (v[i] & 0xffff);
                    d[i] = type == ElemType.FLOAT16 ? halfToFloat(bits) : Float.intBitsToFloat(bits << 16);
                }
                return TensorValues.ofDoubles(type, dims, d);
            }
            case INT32: case INT16: case INT8:
                for (int i = 0; i < v.length; i++) {
                    v[i] = (int) v[i];
                }
                return TensorValues.ofLongs(type, dims, v);
            case INT64: case UINT64: case UINT32: case UINT16: case UINT8: case BOOL:
                return TensorValues.ofLongs(type, dims, v);
            default:
                return null;
        }
    }

    /** IEEE 754 half precision bits to a float. */
    static float halfToFloat(int h) {
        int sign = (h >>> 15) & 1;
        int exp = (h >>> 10) & 0x1f;
        int mant = h & 0x3ff;
        float v;
        if (exp == 0) {
            v = (float) (mant * Math.pow(2, -24));
        } else if (exp == 31) {
            v = mant == 0 ? Float.POSITIVE_INFINITY : Float.NaN;
        } else {
            v = (float) ((1 + mant / 1024.0) * Math.pow(2, exp - 15));
        }
        return sign == 1 ? -v : v;
    }
}
