package dev.erg.shape;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorValues;
import java.util.function.DoubleUnaryOperator;
import java.util.function.LongUnaryOperator;

/**
 * Elementwise operators: unary maps, binary and variadic ops with multidirectional broadcasting,
 * comparisons and logic, Where, Clip, Cast. Small constant inputs are evaluated.
 */
final class ElementwiseRules {
    private ElementwiseRules() {
    }

    static void register(RuleTable t) {
        // Unary maps that keep shape and type. Those used on shape arithmetic are evaluated too.
        String[] plain = {"Sigmoid", "Tanh", "Log", "Erf", "Sin", "Cos", "Tan", "Asin", "Acos",
            "Atan", "Sinh", "Cosh", "Asinh", "Acosh", "Atanh", "Softplus", "Softsign", "Elu", "Selu", "LeakyRelu",
            "HardSigmoid", "HardSwish", "Gelu", "Mish", "Celu", "ThresholdedRelu", "Shrink", "Softmax",
            "LogSoftmax", "Hardmax", "LpNormalization", "BitwiseNot", "Swish"};
        for (String op : plain) {
            t.add(op, unary(null, null));
        }
        t.add("Relu", unary(a -> Math.max(a, 0), a -> Math.max(a, 0)));
        t.add("Neg", unary(a -> -a, a -> -a));
        t.add("Abs", unary(Math::abs, Math::abs));
        t.add("Sign", unary(a -> Long.signum(a), Math::signum));
        t.add("Floor", unary(a -> a, Math::floor));
        t.add("Ceil", unary(a -> a, Math::ceil));
        t.add("Round", unary(a -> a, Math::rint));
        t.add("Sqrt", unary(null, Math::sqrt));
        t.add("Exp", unary(null, Math::exp));
        t.add("Reciprocal", unary(null, a -> 1 / a));
        t.add("Identity", unary(a -> a, a -> a));
        t.add("Not", c -> {
            c.out(0, ElemType.BOOL, c.dims(0));
            TensorValues d = c.data(0);
            if (d != null) {
                c.outData(0, Eval.unary(ElemType.BOOL, d, a -> a == 0 ? 1 : 0, null));
            }
        });
        t.add("IsNaN", c -> c.out(0, ElemType.BOOL, c.dims(0)));
        t.add("IsInf", c -> c.out(0, ElemType.BOOL, c.dims(0)));
        t.add("Dropout", c -> {
            c.out(0, c.type(0), c.dims(0));
            if (c.data(0) != null) {
                c.outData(0, c.data(0));
            }
            // The mask is boolean from Dropout-10; Dropout-7 gave it the input's type.
            c.out(1, c.opset() < 10 ? c.type(0) : ElemType.BOOL, c.dims(0));
        });
        t.add("Cast", c -> {
            long to = c.attrInt("to", -1);
            ElemType type = ElemType.ofCode(to);
            if (type == null || type == ElemType.UNDEFINED) {
                throw c.fail("has attribute 'to' = " + to + ", not an element type of the standard");
            }
            c.out(0, type, c.dims(0));
            if (c.data(0) != null) {
                c.outData(0, Eval.cast(c.data(0), type));
            }
        });
        t.add("CastLike", c -> {
            c.out(0, c.type(1), c.dims(0));
            if (c.data(0) != null) {
                c.outData(0, Eval.cast(c.data(0), c.type(1)));
            }
        });

        // Binary arithmetic with broadcasting.
        t.add("Add", binary((a, b) -> a + b, (a, b) -> a + b));
        t.add("Sub", binary((a, b) -> a - b, (a, b) -> a - b));
        t.add("Mul", binary((a, b) -> a * b, (a, b) -> a * b));
        t.add("Div", binary((a, b) -> b == 0 ? 0 : a / b, (a, b) -> a / b));
        t.add("Pow", c -> {
            long[] dims = Shapes.broadcast(c, c.dims(0), c.dims(1));
            c.out(0, c.type(0), dims);
            evalBinary(c, dims, c.type(0), (a, b) -> (long) Math.pow(a, b), Math::pow);
        });
        t.add("Mod", c -> {
            boolean fmod = c.attrInt("fmod", 0) == 1;
            long[] dims = Shapes.broadcast(c, c.dims(0), c.dims(1));
            c.out(0, c.type(0), dims);
            evalBinary(c, dims, c.type(0), (a, b) -> b == 0 ? 0 : fmod ? a % b : Math.floorMod(a, b),
                    (a, b) -> fmod ? a % b : a - Math.floor(a / b) * b);
        });
        t.add("PRelu", binary(null, null));
        t.add("BitShift", binary(null, null));
        t.add("BitwiseAnd", binary((a, b) -> a & b, null));
        t.add("BitwiseOr", binary((a, b) -> a | b, null));
        t.add("BitwiseXor", binary((a, b) -> a ^ b, null));

        // Comparisons and logic: boolean outputs.
        t.add("Equal", compare((a, b) -> a == b ? 1 : 0, (a, b) -> a == b ? 1 : 0));
        t.add("Less", compare((a, b) -> a < b ? 1 : 0, (a, b) -> a < b ? 1 : 0));
        t.add("Greater", compare((a, b) -> a > b ? 1 : 0, (a, b) -> a > b ? 1 : 0));
        t.add("LessOrEqual", compare((a, b) -> a <= b ? 1 : 0, (a, b) -> a <= b ? 1 : 0));
        t.add("GreaterOrEqual", compare((a, b) -> a >= b ? 1 : 0, (a, b) -> a >= b ? 1 : 0));
        t.add("And", compare((a, b) -> a != 0 && b != 0 ? 1 : 0, null));
        t.add("Or", compare((a, b) -> a != 0 || b != 0 ? 1 : 0, null));
        t.add("Xor", compare((a, b) -> (a != 0) ^ (b != 0) ? 1 : 0, null));

        // Variadic ops.
        t.add("Sum", variadic((a, b) -> a + b, (a, b) -> a + b));
        t.add("Max", variadic(Math::max, Math::max));
        t.add("Min", variadic(Math::min, Math::min));
        t.add("Mean", variadic(null, null));

        t.add("Where", c -> {
            long[] dims = Shapes.broadcast(c, c.dims(0), c.dims(1), c.dims(2));
            c.out(0, c.type(1), dims);
            TensorValues cond = c.data(0);
            TensorValues x = c.data(1);
            TensorValues y = c.data(2);
            if (cond != null && x != null && y != null && Eval.small(dims)) {
                TensorValues picked = Eval.binary(ElemType.INT64, cond, x, dims, (a, b) -> a, null);
                TensorValues xs = Eval.expand(x, dims);
                TensorValues ys = Eval.expand(y, dims);
                int n = picked.size();
                if (xs.isFloat()) {
                    double[] out = new double[n];
                    for (int i = 0; i < n; i++) {
                        out[i] = picked.longAt(i) != 0 ? xs.doubleAt(i) : ys.doubleAt(i);
                    }
                    c.outData(0, TensorValues.ofDoubles(c.type(1), dims, out));
                } else {
                    long[] out = new long[n];
                    for (int i = 0; i < n; i++) {
                        out[i] = picked.longAt(i) != 0 ? xs.longAt(i) : ys.longAt(i);
                    }
                    c.outData(0, TensorValues.ofLongs(c.type(1), dims, out));
                }
            }
        });
        t.add("Clip", c -> {
            c.out(0, c.type(0), c.dims(0));
            TensorValues x = c.data(0);
            if (x == null) {
                return;
            }
            double lo;
            double hi;
            if (c.opset() < 11) {
                lo = c.attrFloat("min", Float.NEGATIVE_INFINITY);
                hi = c.attrFloat("max", Float.POSITIVE_INFINITY);
            } else {
                if ((c.has(1) && c.data(1) == null) || (c.has(2) && c.data(2) == null)) {
                    return;
                }
                lo = c.has(1) ? c.data(1).doubleAt(0) : Double.NEGATIVE_INFINITY;
                hi = c.has(2) ? c.data(2).doubleAt(0) : Double.POSITIVE_INFINITY;
            }
            final double l = lo;
            final double h = hi;
            c.outData(0, Eval.unary(c.type(0), x,
                    a -> (long) Math.min(Math.max(a, l), h), a -> Math.min(Math.max(a, l), h)));
        });
    }

    static ShapeRule unary(LongUnaryOperator li, DoubleUnaryOperator ri) {
        return c -> {
            c.out(0, c.type(0), c.dims(0));
            TensorValues d = c.data(0);
            if (d != null && ri != null && (li != null || d.isFloat())) {
                c.outData(0, Eval.unary(c.type(0), d, li, ri));
            }
        };
    }

    static ShapeRule binary(Eval.LongOp li, Eval.RealOp ri) {
        return c -> {
            long[] dims = Shapes.broadcast(c, c.dims(0), c.dims(1));
            c.out(0, c.type(0), dims);
            if (li != null) {
                evalBinary(c, dims, c.type(0), li, ri);
            }
        };
    }

    static ShapeRule compare(Eval.LongOp li, Eval.RealOp ri) {
        return c -> {
            long[] dims = Shapes.broadcast(c, c.dims(0), c.dims(1));
            c.out(0, ElemType.BOOL, dims);
            TensorValues a = c.data(0);
            TensorValues b = c.data(1);
            if (a != null && b != null && Eval.small(dims)) {
                if ((a.isFloat() || b.isFloat()) && ri != null) {
                    TensorValues r = Eval.binary(ElemType.FLOAT, a, b, dims, null, ri);
                    c.outData(0, Eval.cast(r, ElemType.BOOL));
                } else {
                    c.outData(0, Eval.binary(ElemType.BOOL, a, b, dims, li, null));
                }
            }
        };
    }

    private static void evalBinary(InferContext c, long[] dims, ElemType type, Eval.LongOp li, Eval.RealOp ri) {
        TensorValues a = c.data(0);
        TensorValues b = c.data(1);
        if (a == null || b == null || !Eval.small(dims)) {
            return;
        }
        if ((a.isFloat() || b.isFloat()) && ri == null) {
            return;
        }
        c.outData(0, Eval.binary(type, a, b, dims, li, ri));
    }

    static ShapeRule variadic(Eval.LongOp li, Eval.RealOp ri) {
        return c -> {
            long[][] shapes = new long[c.inputCount()][];
            for (int i = 0; i < shapes.length; i++) {
                shapes[i] = c.dims(i);
            }
            long[] dims = Shapes.broadcast(c, shapes);
            c.out(0, c.type(0), dims);
            if (li == null || !Eval.small(dims)) {
                return;
            }
            TensorValues acc = c.data(0);
            for (int i = 1; i < shapes.length && acc != null; i++) {
                TensorValues next = c.data(i);
                acc = next == null ? null : Eval.binary(c.type(0), acc, next, dims, li, ri);
            }
            if (acc != null) {
                c.outData(0, shapes.length == 1 ? acc : acc);
            }
        };
    }
}
