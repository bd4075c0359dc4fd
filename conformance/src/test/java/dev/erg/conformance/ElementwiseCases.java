package dev.erg.conformance;

import static dev.erg.conformance.M.d;
import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.tensor;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;

/** Unary maps, binary and variadic arithmetic with broadcasting, comparisons and logic, Where, Clip, Cast. */
final class ElementwiseCases {
    private ElementwiseCases() {
    }

    /** Unary float maps with the opset they appeared in. */
    private static final Object[][] UNARY = {
        {"Relu", 6}, {"Sigmoid", 6}, {"Tanh", 6}, {"Exp", 6}, {"Log", 6}, {"Sqrt", 6}, {"Abs", 6}, {"Neg", 6},
        {"Floor", 6}, {"Ceil", 6}, {"Reciprocal", 6}, {"Identity", 1}, {"Softplus", 1}, {"Softsign", 1},
        {"Elu", 6}, {"Selu", 6}, {"LeakyRelu", 6}, {"HardSigmoid", 6}, {"Sin", 7}, {"Cos", 7}, {"Tan", 7},
        {"Asin", 7}, {"Acos", 7}, {"Atan", 7}, {"Sinh", 9}, {"Cosh", 9}, {"Asinh", 9}, {"Acosh", 9},
        {"Atanh", 9}, {"Erf", 9}, {"Sign", 9}, {"Shrink", 9}, {"ThresholdedRelu", 10}, {"Round", 11},
        {"Celu", 12}, {"HardSwish", 14}, {"Mish", 18}, {"Gelu", 20},
    };

    static void register(Cases c) {
        for (Object[] u : UNARY) {
            String op = (String) u[0];
            int since = (Integer) u[1];
            long first = Math.max(7, since);
            long[] opsets = first < 13 ? new long[] {first, 13, 21} : first < 21 ? new long[] {first, 21} : new long[] {first};
            c.add(op, "[2,3,4]", m -> m.x("x", 2, 3, 4).op(op, "x", "y"), opsets);
        }
        c.add("Gelu", "tanh approximation", m -> m.x("x", 3, 5).op("Gelu", "x", "y", attr("approximate", "tanh")), 20, 21);
        c.add("IsNaN", "float to bool", m -> m.x("x", 2, 3).op("IsNaN", "x", "y"), 9, 13, 20);
        c.add("IsInf", "float to bool", m -> m.x("x", 2, 3).op("IsInf", "x", "y"), 10, 20);
        c.add("Not", "bool", m -> m.in("x", ElemType.BOOL, 2, 3).op("Not", "x", "y"), 7, 13);
        c.add("BitwiseNot", "int32", m -> m.in("x", ElemType.INT32, 2, 3).op("BitwiseNot", "x", "y"), 18);

        for (String op : new String[] {"Softmax", "LogSoftmax", "Hardmax"}) {
            c.add(op, "default axis", m -> m.x("x", 2, 3, 4).op(op, "x", "y"), 7, 11, 13, 17, 21);
            c.add(op, "axis 1", m -> m.x("x", 2, 3, 4).op(op, "x", "y", attr("axis", 1)), 7, 11, 13, 21);
            c.add(op, "negative axis", m -> m.x("x", 2, 3, 4).op(op, "x", "y", attr("axis", -2)), 11, 13);
        }
        c.add("LpNormalization", "p 2 axis 1", m -> m.x("x", 2, 3, 4)
                .op("LpNormalization", "x", "y", attr("axis", 1), attr("p", 2)), 7, 13);

        c.add("Dropout", "with mask", m -> {
            m.x("x", 2, 3, 4);
            if (m.opset < 12) {
                m.op("Dropout", "x", "y,mask", attr("ratio", 0.5f));
            } else {
                m.fs("ratio", 0.5f).op("Dropout", "x,ratio", "y,mask");
            }
        }, 7, 9, 10, 12, 13, 22);

        c.add("Cast", "float to int64, bool, double", m -> m.x("x", 2, 3)
                .op("Cast", "x", "a", attr("to", ElemType.INT64.code))
                .op("Cast", "x", "b", attr("to", ElemType.BOOL.code))
                .op("Cast", "x", "c", attr("to", ElemType.DOUBLE.code))
                .op("Cast", "a", "d", attr("to", ElemType.FLOAT.code)), 7, 13, 21);
        c.add("CastLike", "float like int64", m -> m.x("x", 2, 3).i64("t", 1)
                .op("CastLike", "x,t", "y"), 15, 21);

        c.add("Clip", "min and max", m -> {
            m.x("x", 2, 3, 4);
            if (m.opset < 11) {
                m.op("Clip", "x", "y", attr("min", -0.5f), attr("max", 0.5f));
            } else {
                m.fs("lo", -0.5f).fs("hi", 0.5f).op("Clip", "x,lo,hi", "y");
            }
        }, 7, 11, 13);
        c.add("Clip", "min only", m -> {
            m.x("x", 2, 3);
            if (m.opset < 11) {
                m.op("Clip", "x", "y", attr("min", 0f));
            } else {
                m.fs("lo", 0f).op("Clip", "x,lo", "y");
            }
        }, 7, 13);
        c.add("Clip", "no bounds", m -> m.x("x", 4).op("Clip", "x", "y"), 7, 13);

        // Binary arithmetic with multidirectional broadcasting.
        for (String op : new String[] {"Add", "Sub", "Mul", "Div"}) {
            c.add(op, "[2,3,4] and [3,1]", m -> m.x("a", 2, 3, 4).x("b", 3, 1).op(op, "a,b", "y"), 7, 13, 14, 17, 21);
            c.add(op, "[1,4] and [2,3,1]", m -> m.x("a", 1, 4).x("b", 2, 3, 1).op(op, "a,b", "y"), 7, 14);
            c.add(op, "with scalar", m -> m.x("a", 2, 3).fs("s", 2f).op(op, "a,s", "y"), 7, 14);
            c.add(op, "int64", m -> m.in("a", ElemType.INT64, 2, 3).i64t("b", d(3), 1, 2, 3).op(op, "a,b", "y"), 7, 14);
        }
        c.add("Pow", "[2,3] and [3]", m -> m.x("a", 2, 3).x("b", 3).op("Pow", "a,b", "y"), 7, 13, 15);
        c.add("Pow", "float base int64 exponent", m -> m.x("a", 2, 3).i64t("e", d(1), 2).op("Pow", "a,e", "y"), 12, 15);
        c.add("Mod", "int64 broadcast", m -> m.in("a", ElemType.INT64, 2, 3).i64t("b", d(2, 1), 2, 3)
                .op("Mod", "a,b", "y"), 10, 13);
        c.add("Mod", "fmod float", m -> m.x("a", 2, 3).pos("b", 3).op("Mod", "a,b", "y", attr("fmod", 1)), 10, 13);
        c.add("PRelu", "slope per channel", m -> m.x("x", 2, 3, 4, 4).w("s", 3, 1, 1).op("PRelu", "x,s", "y"), 7, 9, 16);
        c.add("BitShift", "uint8 broadcast", m -> m.in("a", ElemType.UINT8, 2, 3)
                .bytes("b", ElemType.UINT8, d(3), 1, 2, 3).op("BitShift", "a,b", "y", attr("direction", "LEFT")), 11);
        for (String op : new String[] {"BitwiseAnd", "BitwiseOr", "BitwiseXor"}) {
            c.add(op, "int32 broadcast", m -> m.in("a", ElemType.INT32, 2, 3).in("b", ElemType.INT32, 3)
                    .op(op, "a,b", "y"), 18);
        }

        // Comparisons and logic.
        c.add("Equal", "int64 broadcast", m -> m.in("a", ElemType.INT64, 2, 3).in("b", ElemType.INT64, 1, 3)
                .op("Equal", "a,b", "y"), 7, 11, 13, 19);
        c.add("Equal", "float", m -> m.x("a", 2, 3).x("b", 3).op("Equal", "a,b", "y"), 11, 19);
        for (String op : new String[] {"Less", "Greater"}) {
            c.add(op, "float broadcast", m -> m.x("a", 2, 3, 4).x("b", 4).op(op, "a,b", "y"), 7, 9, 13);
        }
        for (String op : new String[] {"LessOrEqual", "GreaterOrEqual"}) {
            c.add(op, "float broadcast", m -> m.x("a", 2, 3, 4).x("b", 3, 1).op(op, "a,b", "y"), 12, 16);
        }
        for (String op : new String[] {"And", "Or", "Xor"}) {
            c.add(op, "bool broadcast", m -> m.in("a", ElemType.BOOL, 2, 3).in("b", ElemType.BOOL, 3)
                    .op(op, "a,b", "y"), 7, 13);
        }
        c.add("Where", "three-way broadcast", m -> m.in("c", ElemType.BOOL, 2, 1, 4).x("a", 3, 1).x("b", 1)
                .op("Where", "c,a,b", "y"), 9, 16);
        c.add("Where", "int64 values", m -> m.in("c", ElemType.BOOL, 3).in("a", ElemType.INT64, 2, 3)
                .i64s("b", 7).op("Where", "c,a,b", "y"), 9, 16);

        // Variadic (broadcasting since opset 8).
        for (String op : new String[] {"Sum", "Max", "Min", "Mean"}) {
            c.add(op, "three inputs broadcast", m -> m.x("a", 2, 3, 4).x("b", 3, 1).x("c", 4)
                    .op(op, "a,b,c", "y"), 9, 13);
            c.add(op, "one input", m -> m.x("a", 2, 3).op(op, "a", "y"), 7, 13);
        }
        c.add("Max", "int64", m -> m.in("a", ElemType.INT64, 2, 3).i64("b", 1, 2, 3).op("Max", "a,b", "y"), 12, 13);

        c.add("Constant", "value tensor and value_ints", m -> {
            m.x("x", 2, 3);
            m.op("Constant", "", "k", tensor("value", new OnnxWriter.Tensor("kv", ElemType.FLOAT, 3)
                    .floats(1f, 2f, 3f)));
            m.op("Add", "x,k", "y");
            if (m.opset >= 12) {
                m.op("Constant", "", "s", OnnxWriter.ints("value_ints", 2, 3));
                m.op("Constant", "", "f", attr("value_float", 1.5f));
                m.op("Reshape", "y,s", "z");
            }
        }, 9, 13, 21);
    }
}
