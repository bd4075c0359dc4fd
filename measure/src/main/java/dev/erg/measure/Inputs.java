package dev.erg.measure;

import ai.onnxruntime.OnnxJavaType;
import ai.onnxruntime.OnnxTensor;
import ai.onnxruntime.OrtEnvironment;
import ai.onnxruntime.OrtException;
import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.Value;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.DoubleBuffer;
import java.nio.FloatBuffer;
import java.nio.IntBuffer;
import java.nio.LongBuffer;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

/**
 * Input tensors for a timing run, made from the shapes and element types that erg inferred for the
 * graph's inputs (with the same dim bindings as {@code analyze}). Values are seeded random: floats
 * uniform in [-1, 1), integers uniform in [0, 8) (small enough to be a valid index, a class or a
 * token id in most models), booleans fair coin flips.
 */
final class Inputs {
    /** One input may have at most this many elements (a guard against a binding typo such as batch=100000). */
    static final long MAX_ELEMENTS = 1L << 28;

    private Inputs() {
    }

    static Map<String, OnnxTensor> make(OrtEnvironment env, Graph g, long seed, List<String> described)
            throws OrtException {
        SplittableRandom r = new SplittableRandom(seed);
        Map<String, OnnxTensor> out = new LinkedHashMap<>();
        for (Value v : g.inputs()) {
            long[] dims = v.dims();
            if (dims == null || v.type() == null) {
                throw new BadInputException(g.fileLabel() + ": input '" + v.name()
                        + "' has no known shape; bind its symbolic dims with --dim NAME=VALUE");
            }
            long n = 1;
            for (long d : dims) {
                n = Math.multiplyExact(n, d);
            }
            if (n > MAX_ELEMENTS) {
                throw new BadInputException(g.fileLabel() + ": input '" + v.name() + "' would have " + n
                        + " elements (dims " + Arrays.toString(dims) + "), more than the " + MAX_ELEMENTS
                        + " erg measure generates; check the --dim bindings");
            }
            int count = (int) n;
            described.add(v.name() + ": " + v.type().label + Arrays.toString(dims));
            out.put(v.name(), tensor(env, g, v, dims, count, r));
        }
        return out;
    }

    private static OnnxTensor tensor(OrtEnvironment env, Graph g, Value v, long[] dims, int n, SplittableRandom r)
            throws OrtException {
        switch (v.type()) {
            case FLOAT: {
                FloatBuffer b = FloatBuffer.allocate(n);
                for (int i = 0; i < n; i++) {
                    b.put((float) (r.nextDouble() * 2 - 1));
                }
                return OnnxTensor.createTensor(env, b.flip(), dims);
            }
            case DOUBLE: {
                DoubleBuffer b = DoubleBuffer.allocate(n);
                for (int i = 0; i < n; i++) {
                    b.put(r.nextDouble() * 2 - 1);
                }
                return OnnxTensor.createTensor(env, b.flip(), dims);
            }
            case INT64: {
                LongBuffer b = LongBuffer.allocate(n);
                for (int i = 0; i < n; i++) {
                    b.put(r.nextInt(8));
                }
                return OnnxTensor.createTensor(env, b.flip(), dims);
            }
            case INT32: {
                IntBuffer b = IntBuffer.allocate(n);
                for (int i = 0; i < n; i++) {
                    b.put(r.nextInt(8));
                }
                return OnnxTensor.createTensor(env, b.flip(), dims);
            }
            case INT8:
            case UINT8:
            case BOOL: {
                ByteBuffer b = ByteBuffer.allocateDirect(n).order(ByteOrder.nativeOrder());
                int bound = v.type() == dev.erg.onnx.ElemType.BOOL ? 2 : 8;
                for (int i = 0; i < n; i++) {
                    b.put((byte) r.nextInt(bound));
                }
                OnnxJavaType t = v.type() == dev.erg.onnx.ElemType.INT8 ? OnnxJavaType.INT8
                        : v.type() == dev.erg.onnx.ElemType.UINT8 ? OnnxJavaType.UINT8 : OnnxJavaType.BOOL;
                return OnnxTensor.createTensor(env, b.flip(), dims, t);
            }
            case FLOAT16: {
                ByteBuffer b = ByteBuffer.allocateDirect(2 * n).order(ByteOrder.nativeOrder());
                for (int i = 0; i < n; i++) {
                    b.putShort(ai.onnxruntime.platform.Fp16Conversions.floatToFp16((float) (r.nextDouble() * 2 - 1)));
                }
                return OnnxTensor.createTensor(env, b.flip(), dims, OnnxJavaType.FLOAT16);
            }
            default:
                throw new BadInputException(g.fileLabel() + ": input '" + v.name() + "' has element type "
                        + v.type().label + ", for which erg measure cannot generate values");
        }
    }
}
