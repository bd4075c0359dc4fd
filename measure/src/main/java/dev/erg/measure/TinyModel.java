package dev.erg.measure;

import com.google.protobuf.CodedOutputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;

/**
 * A one-node ONNX model with fp32 inputs and output, written with the field numbers of the ONNX
 * standard (onnx.proto: ModelProto, GraphProto, NodeProto, ValueInfoProto, TypeProto,
 * TensorShapeProto, OperatorSetIdProto). Used by the host microbenchmarks; no weights.
 */
final class TinyModel {
    private static final int FLOAT = 1;

    private TinyModel() {
    }

    /**
     * The bytes of a model running {@code op} on inputs {@code a} and {@code b} of the given dims, with
     * one output {@code y} of {@code outDims}, at opset 13.
     */
    static byte[] binary(String op, long[] aDims, long[] bDims, long[] outDims) {
        return model(aDims, bDims, outDims, o -> o.writeByteArray(1, node(op, "a", "b", "y", "bench")));
    }

    /**
     * The bytes of a model of {@code k} fp32 Adds in a chain over vectors of {@code n} elements, at opset
     * 13: {@code y1 = a + b}, {@code y(i) = y(i-1) + b}, output {@code y(k)}. Each Add reads two operands
     * and writes one result; the runtime reuses the buffers of finished links, so the working set stays
     * at about four vectors whatever {@code k} is.
     */
    static byte[] addChain(long n, int k) {
        long[] dims = {n};
        return model(dims, dims, dims, o -> {
            for (int i = 1; i <= k; i++) {
                o.writeByteArray(1, node("Add", i == 1 ? "a" : "y" + (i - 1), "b", i == k ? "y" : "y" + i, "add" + i));
            }
        });
    }

    private static byte[] node(String op, String a, String b, String y, String name) {
        return msg(o -> {
            o.writeString(1, a);
            o.writeString(1, b);
            o.writeString(2, y);
            o.writeString(3, name);
            o.writeString(4, op);
        });
    }

    /** A model at opset 13 with inputs {@code a}, {@code b} and output {@code y}, whose nodes {@code nodes} writes. */
    private static byte[] model(long[] aDims, long[] bDims, long[] outDims, Body nodes) {
        byte[] graph = msg(o -> {
            nodes.write(o);
            o.writeString(2, "host-bench");
            o.writeByteArray(11, valueInfo("a", aDims));
            o.writeByteArray(11, valueInfo("b", bDims));
            o.writeByteArray(12, valueInfo("y", outDims));
        });
        byte[] opset = msg(o -> {
            o.writeString(1, "");
            o.writeInt64(2, 13);
        });
        return msg(o -> {
            o.writeInt64(1, 7);
            o.writeByteArray(7, graph);
            o.writeByteArray(8, opset);
        });
    }

    private static byte[] valueInfo(String name, long[] dims) {
        byte[] shape = msg(o -> {
            for (long d : dims) {
                o.writeByteArray(1, msg(x -> x.writeInt64(1, d)));
            }
        });
        byte[] tensor = msg(o -> {
            o.writeInt32(1, FLOAT);
            o.writeByteArray(2, shape);
        });
        byte[] type = msg(o -> o.writeByteArray(1, tensor));
        return msg(o -> {
            o.writeString(1, name);
            o.writeByteArray(2, type);
        });
    }

    private interface Body {
        void write(CodedOutputStream o) throws IOException;
    }

    private static byte[] msg(Body body) {
        try {
            ByteArrayOutputStream bytes = new ByteArrayOutputStream();
            CodedOutputStream o = CodedOutputStream.newInstance(bytes);
            body.write(o);
            o.flush();
            return bytes.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}
