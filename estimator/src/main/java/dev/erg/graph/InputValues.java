package dev.erg.graph;

import dev.erg.error.BadInputException;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorValues;
import dev.erg.onnx.ValueDef;
import java.util.Arrays;
import java.util.List;

/** Gives a runtime graph input its shape and, when the user bound one, its constant value. */
final class InputValues {
    private InputValues() {
    }

    /**
     * Sets {@code v}'s type and shape. {@code dims} is null when the input declares no shape, and holds
     * -1 for an axis the bound value has to give; both happen only when a value is bound.
     */
    static void bind(String file, ValueDef in, Value v, long[] dims, InputBindings bindings) {
        List<String> given = bindings.values().get(in.name());
        if (given == null) {
            v.setType(in.type(), dims);
            return;
        }
        ElemType type = in.type();
        String what = file + ": graph input '" + in.name() + "' (" + type.label + ")";
        long[] shape = shapeFor(what, dims, given.size());
        TensorValues data;
        if (type.isFloat() && type.bits >= 16) {
            double[] d = new double[given.size()];
            for (int i = 0; i < d.length; i++) {
                d[i] = real(what, given.get(i));
            }
            data = TensorValues.ofDoubles(type, shape, d);
        } else if (type.isInteger() || type == ElemType.BOOL) {
            long[] d = new long[given.size()];
            for (int i = 0; i < d.length; i++) {
                d[i] = whole(what, type, given.get(i));
            }
            data = TensorValues.ofLongs(type, shape, d);
        } else {
            throw new BadInputException(what + " is bound to a value, but erg binds values only to integer, bool and"
                    + " floating-point inputs");
        }
        v.setType(type, shape);
        v.setData(data);
        v.setConstant(true);
    }

    private static long[] shapeFor(String what, long[] dims, int n) {
        if (dims == null) {
            return n == 1 ? new long[0] : new long[] {n};
        }
        long known = 1;
        int open = -1;
        for (int k = 0; k < dims.length; k++) {
            if (dims[k] < 0) {
                if (open >= 0) {
                    throw new BadInputException(what + " has more than one axis without a size; bind its shape too (--shape)"
                            + " so that the " + n + " values can be placed");
                }
                open = k;
            } else {
                known *= dims[k];
            }
        }
        long[] out = dims.clone();
        if (open >= 0) {
            if (known == 0 || n % known != 0) {
                throw new BadInputException(what + " is bound to " + n + " values, which do not fill its shape "
                        + text(dims));
            }
            out[open] = n / known;
            return out;
        }
        if (known != n) {
            throw new BadInputException(what + " has the shape " + text(dims) + " of " + known + " elements but is bound to "
                    + n + " value" + (n == 1 ? "" : "s"));
        }
        return out;
    }

    private static String text(long[] dims) {
        return Arrays.toString(dims).replace("-1", "?");
    }

    private static double real(String what, String s) {
        if (s.equalsIgnoreCase("true") || s.equalsIgnoreCase("false")) {
            throw new BadInputException(what + " is bound to '" + s + "', which is not a number");
        }
        return Double.parseDouble(s);
    }

    private static long whole(String what, ElemType type, String s) {
        if (type == ElemType.BOOL) {
            if (s.equalsIgnoreCase("true") || s.equals("1")) {
                return 1;
            }
            if (s.equalsIgnoreCase("false") || s.equals("0")) {
                return 0;
            }
            throw new BadInputException(what + " is bound to '" + s + "'; a bool takes true, false, 1 or 0");
        }
        long x;
        try {
            x = Long.parseLong(s);
        } catch (NumberFormatException e) {
            throw new BadInputException(what + " is bound to '" + s + "', which is not a whole number");
        }
        long lo;
        long hi;
        switch (type) {
            case INT8: lo = Byte.MIN_VALUE; hi = Byte.MAX_VALUE; break;
            case UINT8: lo = 0; hi = 255; break;
            case INT16: lo = Short.MIN_VALUE; hi = Short.MAX_VALUE; break;
            case UINT16: lo = 0; hi = 65535; break;
            case INT32: lo = Integer.MIN_VALUE; hi = Integer.MAX_VALUE; break;
            case UINT32: lo = 0; hi = 0xffffffffL; break;
            case UINT64: case UINT4: lo = 0; hi = type == ElemType.UINT4 ? 15 : Long.MAX_VALUE; break;
            case INT4: lo = -8; hi = 7; break;
            default: lo = Long.MIN_VALUE; hi = Long.MAX_VALUE;
        }
        if (x < lo || x > hi) {
            throw new BadInputException(what + " is bound to " + x + ", outside the range " + lo + " to " + hi + " of its type");
        }
        return x;
    }
}
