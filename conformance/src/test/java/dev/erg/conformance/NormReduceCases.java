package dev.erg.conformance;

import static dev.erg.conformance.M.d;
import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.ints;

/** Normalisations, every ReduceX form, ArgMax and ArgMin. */
final class NormReduceCases {
    private NormReduceCases() {
    }

    private static void bnParams(M m, long ch) {
        m.pos("scale", ch).w("bias", ch).w("mean", ch).pos("var", ch);
    }

    static void register(Cases c) {
        c.add("BatchNormalization", "4-D", m -> {
            m.x("x", 2, 3, 4, 5);
            bnParams(m, 3);
            m.op("BatchNormalization", "x,scale,bias,mean,var", "y", attr("epsilon", 1e-5f));
        }, 7, 9, 14, 15, 17, 21);
        c.add("BatchNormalization", "statistics outputs (opsets 7-9)", m -> {
            m.x("x", 2, 3, 4, 5);
            bnParams(m, 3);
            m.op("BatchNormalization", "x,scale,bias,mean,var", "y,om,ov,sm,sv");
        }, 7, 9);
        c.add("BatchNormalization", "2-D", m -> {
            m.x("x", 4, 3);
            bnParams(m, 3);
            m.op("BatchNormalization", "x,scale,bias,mean,var", "y");
        }, 7, 9, 15);
        c.add("BatchNormalization", "3-D", m -> {
            m.x("x", 2, 6, 7);
            bnParams(m, 6);
            m.op("BatchNormalization", "x,scale,bias,mean,var", "y");
        }, 9, 15);
        c.add("BatchNormalization", "training outputs", m -> {
            m.x("x", 2, 3, 4, 5);
            bnParams(m, 3);
            m.op("BatchNormalization", "x,scale,bias,mean,var", "y,rm,rv", attr("training_mode", 1));
        }, 14, 15);
        c.add("InstanceNormalization", "4-D and 3-D", m -> m.x("x", 2, 3, 4, 5).pos("s", 3).w("b", 3)
                .x("z", 2, 3, 6).op("InstanceNormalization", "x,s,b", "y")
                .op("InstanceNormalization", "z,s,b", "y3"), 7, 13, 21);
        c.add("LayerNormalization", "last axis with statistics", m -> m.x("x", 2, 3, 8).pos("s", 8).w("b", 8)
                .op("LayerNormalization", "x,s,b", "y,mean,inv"), 17, 21);
        c.add("LayerNormalization", "axis 1", m -> m.x("x", 2, 3, 4).pos("s", 3, 4).w("b", 3, 4)
                .op("LayerNormalization", "x,s,b", "y,mean,inv", attr("axis", 1)), 17);
        c.add("LayerNormalization", "no bias, negative axis", m -> m.x("x", 2, 3, 4, 5).pos("s", 4, 5)
                .op("LayerNormalization", "x,s", "y,,inv", attr("axis", -2)), 17);
        c.add("GroupNormalization", "3 groups", m -> {
            m.x("x", 2, 6, 4, 4);
            if (m.opset < 21) {
                m.pos("s", 3).w("b", 3);
            } else {
                m.pos("s", 6).w("b", 6);
            }
            m.op("GroupNormalization", "x,s,b", "y", attr("num_groups", 3));
        }, 18, 21);
        c.add("LRN", "size 3", m -> m.x("x", 2, 5, 4, 4).op("LRN", "x", "y", attr("size", 3)), 7, 13);
        c.add("MeanVarianceNormalization", "default axes", m -> m.x("x", 2, 3, 4, 5)
                .op("MeanVarianceNormalization", "x", "y"), 9, 13);
        c.add("MeanVarianceNormalization", "axes 2 3", m -> m.x("x", 2, 3, 4, 5)
                .op("MeanVarianceNormalization", "x", "y", ints("axes", 2, 3)), 9, 13);

        // Reductions: axes attribute until opset 13 (ReduceSum) or 18 (the others), then an input.
        String[] reduces = {"ReduceSum", "ReduceMean", "ReduceMax", "ReduceMin", "ReduceProd", "ReduceL1", "ReduceL2",
            "ReduceLogSum", "ReduceLogSumExp", "ReduceSumSquare"};
        for (String op : reduces) {
            long since = op.equals("ReduceSum") ? 13 : 18;
            long[] opsets = d(7, 11, 13, 17, 18, 21);
            c.add(op, "axes keepdims", m -> m.x("x", 2, 3, 4).axesOp(op, since, "x", d(1), "y"), opsets);
            c.add(op, "axes no keepdims", m -> m.x("x", 2, 3, 4, 5)
                    .axesOp(op, since, "x", d(0, 2), "y", attr("keepdims", 0)), opsets);
            c.add(op, "negative axes", m -> m.x("x", 2, 3, 4)
                    .axesOp(op, since, "x", d(-1, -3), "y", attr("keepdims", 0)), 11, 13, 18);
            c.add(op, "all axes", m -> m.x("x", 2, 3, 4).axesOp(op, since, "x", null, "y")
                    .axesOp(op, since, "x", null, "z", attr("keepdims", 0)), opsets);
            c.add(op, "noop_with_empty_axes, empty axes", m -> m.x("x", 2, 3, 4).i64("ax")
                    .op(op, "x,ax", "y", attr("noop_with_empty_axes", 1)), op.equals("ReduceSum") ? d(13, 18) : d(18));
            c.add(op, "noop_with_empty_axes, axes omitted", m -> m.x("x", 2, 3, 4).op(op, "x", "y",
                    attr("noop_with_empty_axes", 1)), op.equals("ReduceSum") ? d(13, 18) : d(18));
        }
        for (String op : new String[] {"ArgMax", "ArgMin"}) {
            c.add(op, "axis 1 keepdims", m -> m.x("x", 2, 3, 4).op(op, "x", "y", attr("axis", 1)), 7, 11, 13);
            c.add(op, "default axis no keepdims", m -> m.x("x", 2, 3, 4).op(op, "x", "y", attr("keepdims", 0)), 7, 13);
            c.add(op, "negative axis", m -> m.x("x", 2, 3, 4).op(op, "x", "y", attr("axis", -1), attr("keepdims", 0)),
                    11, 13);
            c.add(op, "1-D to scalar", m -> m.x("x", 5).op(op, "x", "y", attr("keepdims", 0)), 7, 13);
            c.add(op, "select_last_index", m -> m.x("x", 2, 3, 4).op(op, "x", "y", attr("axis", 2),
                    attr("select_last_index", 1)), 12, 13);
        }
    }
}
