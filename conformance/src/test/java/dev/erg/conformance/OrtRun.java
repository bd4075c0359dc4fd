package dev.erg.conformance;

import ai.onnxruntime.OnnxJavaType;
import ai.onnxruntime.OnnxTensor;
import ai.onnxruntime.OnnxValue;
import ai.onnxruntime.OrtEnvironment;
import ai.onnxruntime.OrtException;
import ai.onnxruntime.OrtLoggingLevel;
import ai.onnxruntime.OrtSession;
import ai.onnxruntime.TensorInfo;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.ValueDef;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.DoubleBuffer;
import java.nio.FloatBuffer;
import java.nio.IntBuffer;
import java.nio.LongBuffer;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;

/** Runs a model in onnxruntime with random inputs of the declared shapes and types; returns what came out. */
final class OrtRun {
    private OrtRun() {
    }

    /** An output as the runtime produced it: element type (null when erg has no such type) and shape. */
    record Out(ElemType type, long[] shape, String kind) {
    }

    /** The runtime's element type by name (its Java enum numbers types its own way, not by the standard's codes). */
    static ElemType typeOf(TensorInfo.OnnxTensorType t) {
        String n = t.name().replace("ONNX_TENSOR_ELEMENT_DATA_TYPE_", "");
        try {
            return ElemType.valueOf(n);
        } catch (IllegalArgumentException e) {
            return null;
        }
    }

    /** The runtime refused or failed; {@code unsupported} when it says it has no kernel for an operator. */
    static final class Failure extends Exception {
        final boolean unsupported;

        Failure(String message, boolean unsupported) {
            super(message);
            this.unsupported = unsupported;
        }
    }

    private static OrtEnvironment env;

    static synchronized OrtEnvironment env() {
        if (env == null) {
            env = OrtEnvironment.getEnvironment(OrtLoggingLevel.ORT_LOGGING_LEVEL_FATAL, "erg-conformance");
        }
        return env;
    }

    /** Runs {@code model}; {@code inputs} are the runtime inputs (not initializers) with their declared shapes. */
    static Map<String, Out> run(byte[] model, List<ValueDef> inputs, Map<String, Long> dims, long seed)
            throws Failure {
        OrtEnvironment e = env();
        Random rnd = new Random(seed);
        List<OnnxTensor> made = new ArrayList<>();
        try (OrtSession.SessionOptions o = new OrtSession.SessionOptions()) {
            o.setIntraOpNumThreads(1);
            o.setInterOpNumThreads(1);
            o.setOptimizationLevel(OrtSession.SessionOptions.OptLevel.NO_OPT);
            o.setSessionLogLevel(OrtLoggingLevel.ORT_LOGGING_LEVEL_FATAL);
            try (OrtSession s = create(e, model, o)) {
                Map<String, OnnxTensor> feed = new LinkedHashMap<>();
                for (ValueDef in : inputs) {
                    long[] shape = new long[in.dims().size()];
                    for (int i = 0; i < shape.length; i++) {
                        ValueDef.Dim d = in.dims().get(i);
                        shape[i] = d.isFixed() ? d.value() : dims.getOrDefault(d.param(), 1L);
                    }
                    OnnxTensor t = random(e, in.type(), shape, rnd);
                    made.add(t);
                    feed.put(in.name(), t);
                }
                Map<String, Out> outs = new LinkedHashMap<>();
                try (OrtSession.Result r = s.run(feed)) {
                    for (Map.Entry<String, OnnxValue> x : r) {
                        OnnxValue v = x.getValue();
                        if (v instanceof OnnxTensor) {
                            TensorInfo info = ((OnnxTensor) v).getInfo();
                            outs.put(x.getKey(), new Out(typeOf(info.onnxType), info.getShape(), "tensor"));
                        } else {
                            outs.put(x.getKey(), new Out(null, null, v.getType().name()));
                        }
                    }
                } catch (OrtException ex) {
                    String m = oneLine(ex.getMessage());
                    throw new Failure("run: " + m, unsupported(m));
                }
                return outs;
            }
        } catch (OrtException ex) {
            throw new Failure(oneLine(ex.getMessage()), false);
        } finally {
            for (OnnxTensor t : made) {
                t.close();
            }
        }
    }

    private static OrtSession create(OrtEnvironment e, byte[] model, OrtSession.SessionOptions o) throws Failure {
        try {
            return e.createSession(model, o);
        } catch (OrtException ex) {
            String m = oneLine(ex.getMessage());
            throw new Failure("load: " + m, unsupported(m));
        }
    }

    /** The runtime's own words for a form it has no kernel or no support for. */
    static boolean unsupported(String m) {
        return m.contains("NOT_IMPLEMENTED") || m.contains("Could not find an implementation")
                || m.toLowerCase().contains("not supported");
    }

    static String oneLine(String s) {
        return s == null ? "" : s.replace('\n', ' ').replaceAll("\\s+", " ").trim();
    }

    private static OnnxTensor random(OrtEnvironment e, ElemType type, long[] shape, Random rnd) throws OrtException {
        long n = 1;
        for (long d : shape) {
            n *= d;
        }
        int k = (int) n;
        switch (type) {
            case FLOAT: {
                FloatBuffer b = FloatBuffer.allocate(k);
                for (int i = 0; i < k; i++) {
                    b.put(i, rnd.nextFloat() * 2 - 1);
                }
                return OnnxTensor.createTensor(e, b, shape);
            }
            case DOUBLE: {
                DoubleBuffer b = DoubleBuffer.allocate(k);
                for (int i = 0; i < k; i++) {
                    b.put(i, rnd.nextDouble() * 2 - 1);
                }
                return OnnxTensor.createTensor(e, b, shape);
            }
            case INT64: {
                LongBuffer b = LongBuffer.allocate(k);
                for (int i = 0; i < k; i++) {
                    b.put(i, rnd.nextInt(2));
                }
                return OnnxTensor.createTensor(e, b, shape);
            }
            case INT32: {
                IntBuffer b = IntBuffer.allocate(k);
                for (int i = 0; i < k; i++) {
                    b.put(i, rnd.nextInt(2));
                }
                return OnnxTensor.createTensor(e, b, shape);
            }
            case UINT8:
            case INT8:
            case BOOL: {
                ByteBuffer b = ByteBuffer.allocateDirect(k).order(ByteOrder.nativeOrder());
                for (int i = 0; i < k; i++) {
                    b.put(i, (byte) (type == ElemType.BOOL ? rnd.nextInt(2) : rnd.nextInt(256)));
                }
                OnnxJavaType jt = type == ElemType.UINT8 ? OnnxJavaType.UINT8
                        : type == ElemType.INT8 ? OnnxJavaType.INT8 : OnnxJavaType.BOOL;
                return OnnxTensor.createTensor(e, b, shape, jt);
            }
            default:
                throw new IllegalArgumentException("no random input for element type " + type);
        }
    }
}
