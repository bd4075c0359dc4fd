package dev.erg.shape;

import dev.erg.onnx.ElemType;
import java.util.Arrays;

/** Operators that make tensors: random generators and window functions. */
final class GeneratorRules {
    private GeneratorRules() {
    }

    static void register(RuleTable t) {
        // RandomNormal / RandomUniform (opset 1): shape and dtype (default float) from attributes.
        t.add("RandomNormal", GeneratorRules::random);
        t.add("RandomUniform", GeneratorRules::random);
        // The *Like forms take the input's shape, and its type unless dtype is given.
        t.add("RandomNormalLike", GeneratorRules::randomLike);
        t.add("RandomUniformLike", GeneratorRules::randomLike);
        t.add("Bernoulli", GeneratorRules::randomLike);
        // Multinomial (opset 7): input [batch, classes] -> [batch, sample_size], dtype default int32.
        t.add("Multinomial", c -> {
            long[] d = c.dims(0);
            if (d.length != 2) {
                throw c.fail("needs a 2-D input [batch, classes], got " + Arrays.toString(d));
            }
            c.out(0, dtype(c, ElemType.INT32), new long[] {d[0], c.attrInt("sample_size", 1)});
        });
        // Window functions (opset 17): a scalar size -> [size], output_datatype default float.
        for (String op : new String[] {"HannWindow", "HammingWindow", "BlackmanWindow"}) {
            t.add(op, c -> {
                long size = c.ints(0, "size")[0];
                if (size < 0) {
                    throw c.fail("has a negative size " + size);
                }
                long code = c.attrInt("output_datatype", ElemType.FLOAT.code);
                ElemType type = ElemType.ofCode(code);
                if (type == null) {
                    throw c.fail("has output_datatype " + code + ", not an element type of the standard");
                }
                c.out(0, type, new long[] {size});
            });
        }
    }

    static ElemType dtype(InferContext c, ElemType dflt) {
        if (!c.hasAttr("dtype")) {
            return dflt;
        }
        long code = c.attrInt("dtype", 0);
        ElemType type = ElemType.ofCode(code);
        if (type == null || type == ElemType.UNDEFINED) {
            throw c.fail("has dtype " + code + ", not an element type of the standard");
        }
        return type;
    }

    static void random(InferContext c) {
        long[] shape = c.attrInts("shape");
        if (shape == null) {
            throw c.fail("has no shape attribute");
        }
        c.out(0, dtype(c, ElemType.FLOAT), shape);
    }

    static void randomLike(InferContext c) {
        c.out(0, dtype(c, c.type(0)), c.dims(0));
    }
}
