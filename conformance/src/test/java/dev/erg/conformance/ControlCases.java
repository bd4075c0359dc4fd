package dev.erg.conformance;

import static dev.erg.conformance.M.d;
import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.graph;
import static dev.erg.onnx.OnnxWriter.ints;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;

/** If with a constant condition, Loop with a constant trip count, Scan. */
final class ControlCases {
    private ControlCases() {
    }

    static void register(Cases c) {
        for (boolean cond : new boolean[] {true, false}) {
            c.add("If", "constant " + cond + ", branches of different shapes", m -> {
                OnnxWriter.Graph then = new OnnxWriter.Graph("then_g")
                        .node("Relu", "then_relu", List.of("x"), List.of("t"))
                        .output("t", ElemType.FLOAT);
                OnnxWriter.Graph els = new OnnxWriter.Graph("else_g")
                        .node("Transpose", "else_tr", List.of("x"), List.of("e"))
                        .output("e", ElemType.FLOAT);
                m.x("x", 2, 3).bool("c", d(), cond)
                        .op("If", "c", "y", graph("then_branch", then), graph("else_branch", els))
                        .op("Sigmoid", "y", "z");
            }, 11, 13, 16, 21);
        }
        c.add("If", "condition from a shape comparison", m -> {
            OnnxWriter.Graph then = new OnnxWriter.Graph("then_g")
                    .node("Flatten", "then_fl", List.of("x"), List.of("t"))
                    .output("t", ElemType.FLOAT);
            OnnxWriter.Graph els = new OnnxWriter.Graph("else_g")
                    .node("Identity", "else_id", List.of("x"), List.of("e"))
                    .output("e", ElemType.FLOAT);
            m.x("x", 2, 3, 4).op("Shape", "x", "s").i64s("i0", 0).op("Gather", "s,i0", "n", attr("axis", 0))
                    .i64s("two", 2).op("Equal", "n,two", "c")
                    .op("If", "c", "y", graph("then_branch", then), graph("else_branch", els));
        }, 11, 13);
        c.add("Loop", "trip count 3 with a scan output", m -> {
            OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                    .input("i", ElemType.INT64).input("cin", ElemType.BOOL).input("v", ElemType.FLOAT, 2, 3)
                    .initializer(new OnnxWriter.Tensor("one", ElemType.FLOAT).floats(1f))
                    .node("Identity", "b_id", List.of("cin"), List.of("cout"))
                    .node("Add", "b_add", List.of("v", "one"), List.of("vout"))
                    .node("Mul", "b_mul", List.of("vout", "vout"), List.of("sout"))
                    .output("cout", ElemType.BOOL).output("vout", ElemType.FLOAT).output("sout", ElemType.FLOAT);
            m.x("x", 2, 3).i64s("trip", 3).bool("go", d(), true)
                    .op("Loop", "trip,go,x", "vf,scan", graph("body", body))
                    .op("Relu", "vf", "r");
        }, 11, 13, 16, 21);
        c.add("Loop", "trip count only", m -> {
            OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                    .input("i", ElemType.INT64).input("cin", ElemType.BOOL).input("v", ElemType.FLOAT, 4)
                    .node("Identity", "b_id", List.of("cin"), List.of("cout"))
                    .node("Neg", "b_neg", List.of("v"), List.of("vout"))
                    .output("cout", ElemType.BOOL).output("vout", ElemType.FLOAT);
            m.x("x", 4).i64s("trip", 2).op("Loop", "trip,,x", "vf", graph("body", body));
        }, 11, 13);
        c.add("Scan", "running sum over axis 0", m -> {
            OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                    .input("s", ElemType.FLOAT, 3).input("xi", ElemType.FLOAT, 3)
                    .node("Add", "b_add", List.of("s", "xi"), List.of("sout"))
                    .node("Identity", "b_id", List.of("sout"), List.of("yout"))
                    .output("sout", ElemType.FLOAT).output("yout", ElemType.FLOAT);
            m.w("s0", 3).x("xs", 4, 3).op("Scan", "s0,xs", "sf,ys", graph("body", body), attr("num_scan_inputs", 1));
        }, 9, 11, 16, 21);
        c.add("Scan", "scan axis 1, output axis 1", m -> {
            OnnxWriter.Graph body = new OnnxWriter.Graph("body")
                    .input("s", ElemType.FLOAT, 2).input("xi", ElemType.FLOAT, 2)
                    .node("Add", "b_add", List.of("s", "xi"), List.of("sout"))
                    .node("Identity", "b_id", List.of("sout"), List.of("yout"))
                    .output("sout", ElemType.FLOAT).output("yout", ElemType.FLOAT);
            m.w("s0", 2).x("xs", 2, 5).op("Scan", "s0,xs", "sf,ys", graph("body", body), attr("num_scan_inputs", 1),
                    ints("scan_input_axes", 1), ints("scan_output_axes", 1));
        }, 11, 16);
    }
}
