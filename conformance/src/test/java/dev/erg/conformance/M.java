package dev.erg.conformance;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.Arrays;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Random;
import java.util.Set;

/**
 * A small model under construction for one case at one opset, on top of {@link OnnxWriter}.
 * Initializers that feed arithmetic get real small values (uniform in [-0.5, 0.5), or in [0.5, 1.5)
 * where the operator needs positive ones), never the writer's byte pattern. Graph outputs are not
 * declared here: the harness exposes every node output.
 */
final class M {
    final long opset;
    final OnnxWriter.Graph g;
    /** Values for which erg gives an upper bound (data-dependent sizes): the runtime's dims may be smaller. */
    final Set<String> bounds = new LinkedHashSet<>();
    private final Random rnd;
    private int nodes;

    M(long opset, String name, long seed) {
        this.opset = opset;
        this.g = new OnnxWriter.Graph(name.replaceAll("[^A-Za-z0-9_]", "_"));
        this.rnd = new Random(seed);
    }

    static long[] d(long... v) {
        return v;
    }

    /** A float32 runtime input. */
    M x(String name, long... dims) {
        g.input(name, ElemType.FLOAT, dims);
        return this;
    }

    /** A runtime input of any type. */
    M in(String name, ElemType t, long... dims) {
        g.input(name, t, dims);
        return this;
    }

    private static long count(long[] dims) {
        long n = 1;
        for (long x : dims) {
            n *= x;
        }
        return n;
    }

    /** A float32 initializer with values in [-0.5, 0.5). */
    M w(String name, long... dims) {
        float[] v = new float[(int) count(dims)];
        for (int i = 0; i < v.length; i++) {
            v[i] = rnd.nextFloat() - 0.5f;
        }
        return f(name, dims, v);
    }

    /** A float32 initializer with values in [0.5, 1.5) (variances, scales). */
    M pos(String name, long... dims) {
        float[] v = new float[(int) count(dims)];
        for (int i = 0; i < v.length; i++) {
            v[i] = rnd.nextFloat() + 0.5f;
        }
        return f(name, dims, v);
    }

    M f(String name, long[] dims, float... values) {
        g.initializer(new OnnxWriter.Tensor(name, ElemType.FLOAT, dims).floats(values));
        return this;
    }

    /** A float32 scalar initializer. */
    M fs(String name, float v) {
        return f(name, new long[0], v);
    }

    /** A 1-D int64 initializer. */
    M i64(String name, long... values) {
        g.longs(name, values);
        return this;
    }

    M i64t(String name, long[] dims, long... values) {
        g.initializer(new OnnxWriter.Tensor(name, ElemType.INT64, dims).longs(values));
        return this;
    }

    /** An int64 scalar initializer. */
    M i64s(String name, long v) {
        return i64t(name, new long[0], v);
    }

    M i32t(String name, long[] dims, int... values) {
        ByteBuffer b = ByteBuffer.allocate(values.length * 4).order(ByteOrder.LITTLE_ENDIAN);
        for (int v : values) {
            b.putInt(v);
        }
        g.initializer(new OnnxWriter.Tensor(name, ElemType.INT32, dims).raw(b.array()));
        return this;
    }

    /** A uint8 or int8 initializer; values are taken modulo 256. */
    M bytes(String name, ElemType t, long[] dims, int... values) {
        byte[] b = new byte[values.length];
        for (int i = 0; i < b.length; i++) {
            b[i] = (byte) values[i];
        }
        g.initializer(new OnnxWriter.Tensor(name, t, dims).raw(b));
        return this;
    }

    /** A uint8 or int8 initializer of random values. */
    M randBytes(String name, ElemType t, long... dims) {
        int[] v = new int[(int) count(dims)];
        for (int i = 0; i < v.length; i++) {
            v[i] = t == ElemType.INT8 ? rnd.nextInt(21) - 10 : rnd.nextInt(256);
        }
        return bytes(name, t, dims, v);
    }

    M bool(String name, long[] dims, boolean... values) {
        byte[] b = new byte[values.length];
        for (int i = 0; i < b.length; i++) {
            b[i] = (byte) (values[i] ? 1 : 0);
        }
        g.initializer(new OnnxWriter.Tensor(name, ElemType.BOOL, dims).raw(b));
        return this;
    }

    private static List<String> names(String csv) {
        return Arrays.asList(csv.split(",", -1));
    }

    /**
     * A node. {@code ins} and {@code outs} are comma-separated value names; an empty name is an
     * omitted optional input or output ({@code "x,,b"}).
     */
    M op(String op, String ins, String outs, OnnxWriter.Attr... attrs) {
        g.node(op, op.toLowerCase() + "_" + (nodes++), ins.isEmpty() ? List.of() : names(ins), names(outs), attrs);
        return this;
    }

    /**
     * A node whose axes are an attribute before opset {@code inputSince} and an int64 input from it
     * on (Squeeze, Unsqueeze, ReduceX). {@code axes} null leaves them out.
     */
    M axesOp(String op, long inputSince, String data, long[] axes, String out, OnnxWriter.Attr... attrs) {
        if (axes == null) {
            return op(op, data, out, attrs);
        }
        if (opset < inputSince) {
            OnnxWriter.Attr[] all = Arrays.copyOf(attrs, attrs.length + 1);
            all[attrs.length] = OnnxWriter.ints("axes", axes);
            return op(op, data, out, all);
        }
        String a = out + "_axes";
        i64(a, axes);
        return op(op, data + "," + a, out, attrs);
    }

    /** Marks {@code value} as data-dependent: erg's dims are an upper bound of the runtime's. */
    M bound(String value) {
        bounds.add(value);
        return this;
    }
}
