package dev.erg.conformance;

import static dev.erg.conformance.M.d;
import static dev.erg.onnx.OnnxWriter.attr;

/** Unary maps, binary and variadic arithmetic with broadcasting, comparisons and logic, Where, Clip, Cast. */
final class ElementwiseCases {
    private ElementwiseCases() {
    }

    static void register(Cases c) {
        c.add("Relu", "chain", m -> m.x("x", 2, 3, 4).op("Relu", "x", "a").op("Sigmoid", "a", "b")
                .op("Tanh", "b", "c"), 7, 13, 21);
    }
}
