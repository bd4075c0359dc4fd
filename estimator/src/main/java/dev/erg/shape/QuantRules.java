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
            c.out(0, type, c.dims(0));
        });
        t.add("DequantizeLinear", c -> {
            ElemType type = c.type(1);
            long dt = c.attrInt("output_dtype", 0);
            if (dt != 0) {
                type = ElemType.ofCode(dt);
            }
            c.out(0, type, c.dims(0));
        });
        t.add("DynamicQuantizeLinear", c -> {
            c.out(0, ElemType.UINT8, c.dims(0));
            c.out(1, ElemType.FLOAT, new long[0]);
            c.out(2, ElemType.UINT8, new long[0]);
        });
    }
}
