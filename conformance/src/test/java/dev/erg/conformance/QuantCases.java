package dev.erg.conformance;

import static dev.erg.conformance.M.d;
import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.ints;

import dev.erg.onnx.ElemType;

/** The quantization set: (De)QuantizeLinear per tensor, per axis and blocked; QLinear and Integer products. */
final class QuantCases {
    private QuantCases() {
    }

    static final ElemType U8 = ElemType.UINT8;
    static final ElemType I8 = ElemType.INT8;

    static void register(Cases c) {
        c.add("QuantizeLinear", "per tensor uint8", m -> m.x("x", 2, 3, 4).fs("s", 0.02f).bytes("z", U8, d(), 128)
                .op("QuantizeLinear", "x,s,z", "y"), 10, 13, 19, 21);
        c.add("QuantizeLinear", "no zero point", m -> m.x("x", 2, 3).fs("s", 0.02f)
                .op("QuantizeLinear", "x,s", "y"), 10, 13, 21);
        c.add("QuantizeLinear", "per axis int8", m -> m.x("x", 2, 3, 4).f("s", d(3), 0.01f, 0.02f, 0.03f)
                .bytes("z", I8, d(3), 0, 1, -1).op("QuantizeLinear", "x,s,z", "y", attr("axis", 1)), 13, 19, 21);
        c.add("QuantizeLinear", "blocked", m -> m.x("x", 2, 6).f("s", d(2, 3), 0.01f, 0.02f, 0.03f, 0.01f, 0.02f, 0.03f)
                .bytes("z", I8, d(2, 3), 0, 0, 0, 0, 0, 0)
                .op("QuantizeLinear", "x,s,z", "y", attr("axis", 1), attr("block_size", 2)), 21);
        c.add("QuantizeLinear", "output_dtype", m -> m.x("x", 2, 3).fs("s", 0.02f)
                .op("QuantizeLinear", "x,s", "y", attr("output_dtype", ElemType.INT8.code)), 21);

        c.add("DequantizeLinear", "per tensor uint8", m -> m.in("x", U8, 2, 3, 4).fs("s", 0.02f).bytes("z", U8, d(), 128)
                .op("DequantizeLinear", "x,s,z", "y"), 10, 13, 19, 21);
        c.add("DequantizeLinear", "int32 no zero point", m -> m.in("x", ElemType.INT32, 5).fs("s", 0.5f)
                .op("DequantizeLinear", "x,s", "y"), 10, 13, 21);
        c.add("DequantizeLinear", "per axis int8", m -> m.randBytes("x", I8, 4, 3).f("s", d(4), 0.1f, 0.2f, 0.3f, 0.4f)
                .bytes("z", I8, d(4), 0, 0, 0, 0).op("DequantizeLinear", "x,s,z", "y", attr("axis", 0)), 13, 19, 21);
        c.add("DequantizeLinear", "blocked", m -> m.randBytes("x", I8, 4, 6).f("s", d(4, 2), 0.1f, 0.2f, 0.3f, 0.4f,
                0.1f, 0.2f, 0.3f, 0.4f).op("DequantizeLinear", "x,s", "y", attr("axis", 1), attr("block_size", 3)), 21);
        c.add("DequantizeLinear", "quantize-dequantize pair", m -> m.x("x", 1, 3, 4, 4).fs("s", 0.05f)
                .bytes("z", U8, d(), 10).op("QuantizeLinear", "x,s,z", "q").op("DequantizeLinear", "q,s,z", "y")
                .op("Relu", "y", "r"), 10, 13, 21);
        c.add("DynamicQuantizeLinear", "matrix", m -> m.x("x", 3, 4).op("DynamicQuantizeLinear", "x", "y,ys,yz"), 11, 21);

        c.add("QLinearConv", "uint8 per tensor, bias", m -> m.in("x", U8, 1, 2, 6, 6).fs("xs", 0.02f).bytes("xz", U8, d(), 128)
                .randBytes("w", U8, 3, 2, 3, 3).fs("ws", 0.01f).bytes("wz", U8, d(), 128).fs("ys", 0.05f)
                .bytes("yz", U8, d(), 100).i32t("b", d(3), 1, -2, 3)
                .op("QLinearConv", "x,xs,xz,w,ws,wz,ys,yz,b", "y", ints("pads", 1, 1, 1, 1), ints("strides", 2, 2)), 10, 21);
        c.add("QLinearConv", "int8 weights per channel", m -> m.in("x", U8, 1, 2, 5, 5).fs("xs", 0.02f)
                .bytes("xz", U8, d(), 128).randBytes("w", I8, 4, 2, 3, 3).f("ws", d(4), 0.01f, 0.02f, 0.03f, 0.04f)
                .bytes("wz", I8, d(4), 0, 0, 0, 0).fs("ys", 0.05f).bytes("yz", U8, d(), 100)
                .op("QLinearConv", "x,xs,xz,w,ws,wz,ys,yz", "y"), 10);
        c.add("QLinearConv", "int8 activations, groups", m -> m.in("x", I8, 1, 4, 5, 5).fs("xs", 0.02f)
                .bytes("xz", I8, d(), 0).randBytes("w", I8, 4, 2, 3, 3).fs("ws", 0.01f)
                .bytes("wz", I8, d(), 0).fs("ys", 0.05f).bytes("yz", I8, d(), 0)
                .op("QLinearConv", "x,xs,xz,w,ws,wz,ys,yz", "y", attr("group", 2), attr("auto_pad", "SAME_UPPER")), 10);
        c.add("QLinearMatMul", "2-D uint8", m -> m.in("a", U8, 2, 3).fs("as", 0.02f).bytes("az", U8, d(), 128)
                .randBytes("b", U8, 3, 4).fs("bs", 0.01f).bytes("bz", U8, d(), 128).fs("ys", 0.05f)
                .bytes("yz", U8, d(), 100).op("QLinearMatMul", "a,as,az,b,bs,bz,ys,yz", "y"), 10, 21);
        c.add("QLinearMatMul", "batched int8", m -> m.in("a", I8, 2, 2, 3).fs("as", 0.02f).bytes("az", I8, d(), 0)
                .randBytes("b", I8, 3, 5).fs("bs", 0.01f).bytes("bz", I8, d(), 0).fs("ys", 0.05f)
                .bytes("yz", I8, d(), 0).op("QLinearMatMul", "a,as,az,b,bs,bz,ys,yz", "y"), 10, 21);
        c.add("ConvInteger", "uint8 with zero point", m -> m.in("x", U8, 1, 2, 5, 5).randBytes("w", U8, 3, 2, 3, 3)
                .bytes("xz", U8, d(), 128).op("ConvInteger", "x,w,xz", "y", ints("pads", 1, 1, 1, 1)), 10, 21);
        c.add("ConvInteger", "strided, no zero point", m -> m.in("x", U8, 2, 2, 7, 6).randBytes("w", U8, 4, 2, 2, 2)
                .op("ConvInteger", "x,w", "y", ints("strides", 2, 2)), 10);
        c.add("MatMulInteger", "uint8", m -> m.in("a", U8, 2, 3).randBytes("b", U8, 3, 4).bytes("az", U8, d(), 128)
                .bytes("bz", U8, d(), 128).op("MatMulInteger", "a,b,az,bz", "y"), 10, 21);
        c.add("MatMulInteger", "uint8 by int8, batched", m -> m.in("a", U8, 2, 2, 3).randBytes("b", I8, 3, 4)
                .op("MatMulInteger", "a,b", "y"), 10, 21);
    }
}
