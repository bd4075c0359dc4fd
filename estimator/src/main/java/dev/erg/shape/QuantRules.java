package dev.erg.shape;

import dev.erg.onnx.ElemType;

/** The quantization set: QuantizeLinear, DequantizeLinear and DynamicQuantizeLinear. */
final class QuantRules {
    private QuantRules() {
    }

    static void register(RuleTable t) {
        t.add("QuantizeLinear", c -> {
            ElemType type = c.has(2) ? c.type(2) : ElemType.UINT8;
            long dt = c.attrInt("output_dtype", 0);
            if (dt != 0) {
                type = ElemType.ofCode(dt);
                if (type == null) {
                    throw c.fail("has output_dtype " + dt + ", not an element type of the standard");
                }
            }
            checkScale(c);
            c.out(0, type, c.dims(0));
        });
        t.add("DequantizeLinear", c -> {
            checkScale(c);
            ElemType type = c.type(1);
            long dt = c.attrInt("output_dtype", 0);
            if (dt != 0) {
                type = ElemType.ofCode(dt);
            }
            c.out(0, type, c.dims(0));
        });
        t.add("DynamicQuantizeLinear", c -> {
            if (c.type(0) != ElemType.FLOAT) {
                throw c.fail("quantizes " + c.type(0).label + "; the operator definition takes fp32");
            }
            c.out(0, ElemType.UINT8, c.dims(0));
            c.out(1, ElemType.FLOAT, new long[0]);
            c.out(2, ElemType.UINT8, new long[0]);
        });
    }

    /**
     * The scale's shape against x (ONNX operator definitions: QuantizeLinear and DequantizeLinear,
     * opsets 10, 13, 19, 21): a scalar (or a 1-element vector) quantizes per tensor; a 1-D scale of
     * x.shape[axis] values per axis (opset 13); a scale of x's rank whose dims equal x's except
     * ceil(x.shape[axis] / block_size) on the axis, blocked (opset 21). A zero point, when given, has
     * the scale's shape.
     */
    static void checkScale(InferContext c) {
        long[] x = c.dims(0);
        long[] s = c.dims(1);
        long block = c.attrInt("block_size", 0);
        boolean ok;
        String form;
        if (block > 0) {
            int axis = c.axis(c.attrInt("axis", 1), x.length);
            form = "blocked (block_size " + block + " on axis " + axis + ")";
            ok = c.opset() >= 21 && s.length == x.length;
            for (int i = 0; i < x.length && ok; i++) {
                ok = s[i] == (i == axis ? Shapes.ceilDiv(x[i], block) : x[i]);
            }
        } else if (Shapes.product(s) == 1 && s.length <= 1) {
            form = null;
            ok = true;
        } else {
            int axis = c.axis(c.attrInt("axis", 1), Math.max(x.length, 1));
            form = "per axis " + axis;
            ok = c.opset() >= 13 && s.length == 1 && x.length > 0 && s[0] == x[axis];
        }
        if (!ok) {
            throw c.fail("has scale " + java.util.Arrays.toString(s) + " that does not fit x "
                    + java.util.Arrays.toString(x) + " " + form + " at opset " + c.opset());
        }
        long[] z = c.has(2) ? c.dims(2) : null;
        boolean scalars = z != null && z.length <= 1 && s.length <= 1 && Shapes.product(z) == 1 && Shapes.product(s) == 1;
        if (z != null && !scalars && !java.util.Arrays.equals(z, s)) {
            throw c.fail("has zero point " + java.util.Arrays.toString(c.dims(2)) + " of another shape than its scale "
                    + java.util.Arrays.toString(s));
        }
    }
}
