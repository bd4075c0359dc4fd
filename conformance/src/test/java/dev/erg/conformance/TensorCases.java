package dev.erg.conformance;

import static dev.erg.conformance.M.d;
import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.floats;
import static dev.erg.onnx.OnnxWriter.ints;
import static dev.erg.onnx.OnnxWriter.tensor;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;

/** Operators that view, move, pick or make tensors. */
final class TensorCases {
    private TensorCases() {
    }

    static void register(Cases c) {
        // Reshape: 0 copies a dim (unless allowzero), -1 is inferred.
        c.add("Reshape", "0 and -1", m -> m.x("x", 2, 3, 4).i64("s", 0, -1).op("Reshape", "x,s", "y"), 7, 13, 14, 17, 21);
        c.add("Reshape", "-1 first", m -> m.x("x", 2, 3, 4).i64("s", -1, 4, 1).op("Reshape", "x,s", "y"), 7, 14);
        c.add("Reshape", "0 beyond a -1", m -> m.x("x", 2, 3, 4).i64("s", -1, 0, 2, 2).op("Reshape", "x,s", "y"), 13, 21);
        c.add("Reshape", "allowzero keeps a literal 0", m -> m.x("x", 0, 3).i64("s", 3, 0)
                .op("Reshape", "x,s", "y", attr("allowzero", 1)), 14, 21);
        c.add("Reshape", "allowzero 0 with a 0 copy", m -> m.x("x", 2, 0, 4).i64("s", 0, 0, 4, 1)
                .op("Reshape", "x,s", "y", attr("allowzero", 0)), 14);

        for (long axis : new long[] {0, 1, 2, 3}) {
            c.add("Flatten", "axis " + axis, m -> m.x("x", 2, 3, 4).op("Flatten", "x", "y", attr("axis", axis)), 7, 13, 21);
        }
        c.add("Flatten", "negative axis", m -> m.x("x", 2, 3, 4).op("Flatten", "x", "y", attr("axis", -1)), 11, 13);

        c.add("Squeeze", "given axes", m -> m.x("x", 1, 3, 1, 4).axesOp("Squeeze", 13, "x", d(0, 2), "y"), 7, 11, 13, 21);
        c.add("Squeeze", "negative axis", m -> m.x("x", 3, 1, 4, 1).axesOp("Squeeze", 13, "x", d(-1), "y"), 11, 13, 21);
        c.add("Squeeze", "no axes", m -> m.x("x", 1, 3, 1, 4).axesOp("Squeeze", 13, "x", null, "y"), 7, 13, 21);
        c.add("Unsqueeze", "axes 0 and 3", m -> m.x("x", 3, 4).axesOp("Unsqueeze", 13, "x", d(0, 3), "y"), 7, 11, 13, 21);
        c.add("Unsqueeze", "negative, unordered", m -> m.x("x", 3, 4).axesOp("Unsqueeze", 13, "x", d(-1, 0), "y"), 11, 13, 21);
        c.add("Unsqueeze", "scalar", m -> m.fs("s", 1f).x("x", 2).op("Mul", "x,s", "p")
                .axesOp("Unsqueeze", 13, "s", d(0), "y"), 11, 13);

        c.add("Transpose", "perm", m -> m.x("x", 2, 3, 4, 5).op("Transpose", "x", "y", ints("perm", 0, 2, 3, 1)), 7, 13, 17, 21);
        c.add("Transpose", "default perm", m -> m.x("x", 2, 3, 4).op("Transpose", "x", "y"), 7, 13, 21);

        c.add("Concat", "three inputs axis 1", m -> m.x("a", 2, 1, 4).x("b", 2, 3, 4).x("c", 2, 2, 4)
                .op("Concat", "a,b,c", "y", attr("axis", 1)), 7, 11, 13, 17, 21);
        c.add("Concat", "negative axis", m -> m.x("a", 2, 3).x("b", 2, 5).op("Concat", "a,b", "y", attr("axis", -1)), 11, 13);
        c.add("Concat", "int64 vectors", m -> m.in("a", ElemType.INT64, 2).i64("b", 5, 6, 7)
                .op("Concat", "a,b", "y", attr("axis", 0)), 7, 13);

        c.add("Split", "given sizes", m -> {
            m.x("x", 2, 7, 3);
            if (m.opset < 13) {
                m.op("Split", "x", "a,b,c", attr("axis", 1), ints("split", 2, 4, 1));
            } else {
                m.i64("sp", 2, 4, 1).op("Split", "x,sp", "a,b,c", attr("axis", 1));
            }
        }, 7, 11, 13, 18, 21);
        c.add("Split", "equal parts", m -> m.x("x", 6, 4).op("Split", "x", "a,b,c", attr("axis", 0)), 7, 13);
        c.add("Split", "negative axis", m -> m.x("x", 2, 3, 8).op("Split", "x", "a,b", attr("axis", -1)), 11, 13);
        c.add("Split", "num_outputs uneven", m -> m.x("x", 2, 7).op("Split", "x", "a,b,c", attr("axis", 1),
                attr("num_outputs", 3)), 18, 21);
        c.add("Split", "num_outputs even", m -> m.x("x", 2, 8).op("Split", "x", "a,b", attr("axis", 1),
                attr("num_outputs", 2)), 18);

        c.add("Slice", "starts ends axes", m -> {
            m.x("x", 4, 6, 5);
            if (m.opset < 10) {
                m.op("Slice", "x", "y", ints("starts", 1, 0), ints("ends", 3, 4), ints("axes", 0, 2));
            } else {
                m.i64("st", 1, 0).i64("en", 3, 4).i64("ax", 0, 2).op("Slice", "x,st,en,ax", "y");
            }
        }, 7, 10, 11, 13, 17, 21);
        c.add("Slice", "no axes, clamped ends", m -> {
            m.x("x", 4, 6);
            if (m.opset < 10) {
                m.op("Slice", "x", "y", ints("starts", 1, -3), ints("ends", 1000, Long.MAX_VALUE));
            } else {
                m.i64("st", 1, -3).i64("en", 1000, Long.MAX_VALUE).op("Slice", "x,st,en", "y");
            }
        }, 7, 13);
        c.add("Slice", "steps", m -> m.x("x", 10, 6).i64("st", 1, 0).i64("en", 9, 6).i64("ax", 0, 1).i64("sp", 3, 2)
                .op("Slice", "x,st,en,ax,sp", "y"), 10, 13);
        c.add("Slice", "negative step reverses", m -> m.x("x", 5, 6).i64("st", -1).i64("en", Long.MIN_VALUE)
                .i64("ax", 1).i64("sp", -1).op("Slice", "x,st,en,ax,sp", "y"), 11, 13);
        c.add("Slice", "negative step partial", m -> m.x("x", 7, 3).i64("st", 5).i64("en", 0).i64("ax", 0).i64("sp", -2)
                .op("Slice", "x,st,en,ax,sp", "y"), 11, 13);
        c.add("Slice", "negative axes, empty result", m -> m.x("x", 4, 6).i64("st", 4).i64("en", 2).i64("ax", -1)
                .op("Slice", "x,st,en,ax", "y"), 11, 13);

        c.add("Gather", "axis 0 matrix indices", m -> m.x("x", 5, 3).i64t("i", d(2, 2), 0, 4, 1, 1)
                .op("Gather", "x,i", "y"), 7, 11, 13, 17, 21);
        c.add("Gather", "axis 1 vector indices", m -> m.x("x", 2, 5, 3).i64("i", 4, 0, 2)
                .op("Gather", "x,i", "y", attr("axis", 1)), 7, 13);
        c.add("Gather", "scalar index", m -> m.x("x", 2, 5, 3).i64s("i", 3)
                .op("Gather", "x,i", "y", attr("axis", 1)), 7, 13);
        c.add("Gather", "negative axis and index", m -> m.x("x", 2, 5, 3).i64("i", -1, 0)
                .op("Gather", "x,i", "y", attr("axis", -1)), 11, 13);
        c.add("GatherElements", "axis 1", m -> m.x("x", 2, 3).i64t("i", d(2, 2), 0, 2, 1, 0)
                .op("GatherElements", "x,i", "y", attr("axis", 1)), 11, 13);
        c.add("GatherElements", "axis 0 larger index", m -> m.x("x", 2, 3).i64t("i", d(3, 3), 0, 1, 0, 1, 1, 0, 0, 0, 1)
                .op("GatherElements", "x,i", "y", attr("axis", 0)), 11, 13);
        c.add("GatherND", "whole slices", m -> m.x("x", 3, 4, 5).i64t("i", d(2, 1), 0, 2)
                .op("GatherND", "x,i", "y"), 11, 12, 13);
        c.add("GatherND", "elements", m -> m.x("x", 3, 4).i64t("i", d(2, 2), 0, 1, 2, 3)
                .op("GatherND", "x,i", "y"), 11, 13);
        c.add("GatherND", "batch_dims 1", m -> m.x("x", 2, 3, 4).i64t("i", d(2, 1), 1, 2)
                .op("GatherND", "x,i", "y", attr("batch_dims", 1)), 12, 13);
        c.add("ScatterND", "rows", m -> m.x("x", 4, 4).i64t("i", d(2, 1), 0, 2).x("u", 2, 4)
                .op("ScatterND", "x,i,u", "y"), 11, 13, 16, 18);
        c.add("ScatterElements", "axis 1", m -> m.x("x", 3, 3).i64t("i", d(1, 2), 1, 0).x("u", 1, 2)
                .op("ScatterElements", "x,i,u", "y", attr("axis", 1)), 11, 13, 16, 18);

        c.add("Pad", "constant", m -> {
            m.x("x", 2, 3, 4);
            if (m.opset < 11) {
                m.op("Pad", "x", "y", ints("pads", 0, 1, 2, 0, 3, 1), attr("value", 0.5f));
            } else {
                m.i64("p", 0, 1, 2, 0, 3, 1).fs("v", 0.5f).op("Pad", "x,p,v", "y");
            }
        }, 7, 11, 13, 17, 18, 21);
        c.add("Pad", "reflect", m -> {
            m.x("x", 1, 2, 4, 5);
            if (m.opset < 11) {
                m.op("Pad", "x", "y", ints("pads", 0, 0, 2, 1, 0, 0, 1, 3), attr("mode", "reflect"));
            } else {
                m.i64("p", 0, 0, 2, 1, 0, 0, 1, 3).op("Pad", "x,p", "y", attr("mode", "reflect"));
            }
        }, 7, 13);
        c.add("Pad", "edge", m -> {
            m.x("x", 3, 4);
            if (m.opset < 11) {
                m.op("Pad", "x", "y", ints("pads", 1, 2, 1, 2), attr("mode", "edge"));
            } else {
                m.i64("p", 1, 2, 1, 2).op("Pad", "x,p", "y", attr("mode", "edge"));
            }
        }, 7, 13);
        c.add("Pad", "negative pads crop", m -> m.x("x", 4, 6).i64("p", -1, 1, 0, -2).op("Pad", "x,p", "y"), 11, 13);
        c.add("Pad", "axes input", m -> m.x("x", 2, 3, 4).i64("p", 1, 2, 3, 0).fs("v", 0f).i64("ax", 0, -1)
                .op("Pad", "x,p,v,ax", "y"), 18, 21);
        c.add("Pad", "wrap", m -> m.x("x", 3, 4).i64("p", 1, 2, 2, 1).op("Pad", "x,p", "y", attr("mode", "wrap")), 19, 21);

        c.add("Tile", "repeats", m -> m.x("x", 2, 3, 1).i64("r", 2, 1, 4).op("Tile", "x,r", "y"), 7, 13, 21);
        c.add("Expand", "to higher rank", m -> m.x("x", 3, 1).i64("s", 2, 3, 4).op("Expand", "x,s", "y"), 8, 13, 21);
        c.add("Expand", "shape of lower rank", m -> m.x("x", 2, 3, 1).i64("s", 1, 4).op("Expand", "x,s", "y"), 8, 13);
        c.add("Expand", "shape with ones", m -> m.x("x", 2, 1, 5).i64("s", 1, 1, 3, 1).op("Expand", "x,s", "y"), 8, 13);

        c.add("DepthToSpace", "DCR", m -> m.x("x", 1, 8, 2, 3).op("DepthToSpace", "x", "y", attr("blocksize", 2)), 7, 11, 13, 21);
        c.add("DepthToSpace", "CRD", m -> m.x("x", 2, 18, 2, 2).op("DepthToSpace", "x", "y", attr("blocksize", 3),
                attr("mode", "CRD")), 11, 13);
        c.add("SpaceToDepth", "blocksize 2", m -> m.x("x", 1, 3, 4, 6).op("SpaceToDepth", "x", "y", attr("blocksize", 2)), 7, 13);

        // Resize: scales (input 1 at opset 10; input 2 from 11 with roi before it), sizes, axes (18).
        c.add("Resize", "scales nearest", m -> {
            m.x("x", 1, 2, 3, 5).f("sc", d(4), 1f, 1f, 2f, 1.5f);
            if (m.opset == 10) {
                m.op("Resize", "x,sc", "y");
            } else if (m.opset == 11) {
                m.f("roi", d(0)).op("Resize", "x,roi,sc", "y");
            } else {
                m.op("Resize", "x,,sc", "y");
            }
        }, 10, 11, 13, 17, 18, 19, 21);
        c.add("Resize", "downscale linear", m -> {
            m.x("x", 1, 1, 7, 9).f("sc", d(4), 1f, 1f, 0.5f, 0.4f);
            if (m.opset == 10) {
                m.op("Resize", "x,sc", "y", attr("mode", "linear"));
            } else if (m.opset == 11) {
                m.f("roi", d(0)).op("Resize", "x,roi,sc", "y", attr("mode", "linear"));
            } else {
                m.op("Resize", "x,,sc", "y", attr("mode", "linear"));
            }
        }, 10, 11, 13);
        c.add("Resize", "sizes", m -> {
            m.x("x", 1, 2, 4, 4).i64("sz", 1, 2, 7, 3);
            if (m.opset == 11) {
                m.f("roi", d(0)).f("sc", d(0)).op("Resize", "x,roi,sc,sz", "y");
            } else {
                m.op("Resize", "x,,,sz", "y");
            }
        }, 11, 13, 18, 19);
        c.add("Resize", "axes with sizes", m -> m.x("x", 1, 2, 4, 6).i64("sz", 8, 3)
                .op("Resize", "x,,,sz", "y", ints("axes", 2, 3)), 18, 19);
        c.add("Resize", "axes with scales", m -> m.x("x", 1, 2, 4, 6).f("sc", d(2), 2f, 0.5f)
                .op("Resize", "x,,sc", "y", ints("axes", 2, 3)), 18, 19);
        c.add("Resize", "keep aspect not_larger", m -> m.x("x", 1, 1, 4, 6).i64("sz", 1, 1, 8, 8)
                .op("Resize", "x,,,sz", "y", attr("keep_aspect_ratio_policy", "not_larger")), 18);
        c.add("Resize", "keep aspect not_smaller", m -> m.x("x", 1, 1, 4, 6).i64("sz", 8, 8)
                .op("Resize", "x,,,sz", "y", ints("axes", 2, 3), attr("keep_aspect_ratio_policy", "not_smaller")), 18);
        c.add("Upsample", "nearest", m -> {
            m.x("x", 1, 2, 3, 4);
            if (m.opset < 9) {
                m.op("Upsample", "x", "y", floats("scales", 1f, 1f, 2f, 3f));
            } else {
                m.f("sc", d(4), 1f, 1f, 2f, 3f).op("Upsample", "x,sc", "y");
            }
        }, 7, 9);

        c.add("TopK", "k along last axis", m -> {
            m.x("x", 3, 6);
            if (m.opset < 10) {
                m.op("TopK", "x", "v,i", attr("k", 2));
            } else {
                m.i64("k", 2).op("TopK", "x,k", "v,i");
            }
        }, 7, 10, 11, 13);
        c.add("TopK", "smallest on axis 0", m -> m.x("x", 5, 4).i64("k", 3)
                .op("TopK", "x,k", "v,i", attr("axis", 0), attr("largest", 0), attr("sorted", 1)), 11);
        c.add("TopK", "negative axis", m -> m.x("x", 2, 5, 4).i64("k", 5)
                .op("TopK", "x,k", "v,i", attr("axis", -2)), 11);

        c.add("CumSum", "int64 axis", m -> m.x("x", 2, 3, 4).i64s("a", 1).op("CumSum", "x,a", "y"), 11, 14);
        c.add("CumSum", "exclusive reverse", m -> m.x("x", 5).i64s("a", 0)
                .op("CumSum", "x,a", "y", attr("exclusive", 1), attr("reverse", 1)), 11, 14);
        c.add("OneHot", "last axis", m -> m.i64t("i", d(2, 3), 0, 1, 2, 3, 1, 0).i64s("dep", 5).f("v", d(2), 0f, 1f)
                .op("OneHot", "i,dep,v", "y"), 9, 11);
        c.add("OneHot", "axis 0, int64 values", m -> m.in("i", ElemType.INT64, 4).i64s("dep", 3).i64("v", 0, 1)
                .op("OneHot", "i,dep,v", "y", attr("axis", 0)), 9, 11);
        c.add("OneHot", "negative axis", m -> m.in("i", ElemType.INT64, 2, 3).i64s("dep", 4).f("v", d(2), 0f, 1f)
                .op("OneHot", "i,dep,v", "y", attr("axis", -2)), 11);
        c.add("Range", "int64", m -> m.i64s("s", 2).i64s("l", 11).i64s("dl", 3).op("Range", "s,l,dl", "y"), 11);
        c.add("Range", "float negative delta", m -> m.fs("s", 1f).fs("l", -2f).fs("dl", -0.7f)
                .op("Range", "s,l,dl", "y"), 11);
        c.add("Range", "empty", m -> m.i64s("s", 5).i64s("l", 2).i64s("dl", 1).op("Range", "s,l,dl", "y"), 11);
        c.add("Trilu", "upper", m -> m.x("x", 2, 4, 5).op("Trilu", "x", "y"), 14);
        c.add("Trilu", "lower with k", m -> m.x("x", 4, 3).i64s("k", -1).op("Trilu", "x,k", "y", attr("upper", 0)), 14);

        c.add("NonZero", "runtime input (bound)", m -> m.x("x", 3, 4).op("NonZero", "x", "y").bound("y"), 9, 13);
        c.add("NonZero", "constant input", m -> m.f("x", d(2, 3), 0f, 1f, 0f, 2f, 3f, 0f).x("z", 1)
                .op("NonZero", "x", "y"), 9, 13);
        c.add("Compress", "constant condition", m -> m.x("x", 3, 4).bool("cond", d(3), true, false, true)
                .op("Compress", "x,cond", "y", attr("axis", 0)), 9, 11);
        c.add("Compress", "runtime condition (bound)", m -> m.x("x", 3, 4).in("cond", ElemType.BOOL, 4)
                .op("Compress", "x,cond", "y", attr("axis", 1)).bound("y"), 9, 11);
        c.add("Compress", "no axis, negative axis", m -> {
            m.x("x", 3, 4).bool("cond", d(5), true, false, true, true, false).op("Compress", "x,cond", "y");
            if (m.opset >= 11) {
                m.bool("c2", d(2), false, true).op("Compress", "x,c2", "z", attr("axis", -1));
            }
        }, 9, 11);
        c.add("EyeLike", "float and int64", m -> m.x("x", 3, 4).op("EyeLike", "x", "y", attr("k", 1))
                .op("EyeLike", "x", "z", attr("dtype", ElemType.INT64.code)), 9, 13);
        c.add("ConstantOfShape", "from a shape", m -> m.x("x", 2, 3).op("Shape", "x", "s")
                .op("ConstantOfShape", "s", "y", tensor("value", new OnnxWriter.Tensor("v", ElemType.INT64, 1).longs(7))), 9, 20);
        c.add("ConstantOfShape", "default value", m -> m.i64("s", 4, 1, 2).op("ConstantOfShape", "s", "y"), 9, 20);
        c.add("Shape", "whole", m -> m.x("x", 2, 3, 4).op("Shape", "x", "y"), 7, 13, 21);
        c.add("Shape", "start and end", m -> m.x("x", 2, 3, 4, 5).op("Shape", "x", "a", attr("start", 1))
                .op("Shape", "x", "b", attr("start", -3), attr("end", -1))
                .op("Shape", "x", "c", attr("end", 10)), 15, 21);
        c.add("Shape", "of a scalar", m -> m.x("x").op("Shape", "x", "s").op("Size", "x", "n"), 7, 13);
        c.add("Reshape", "to and from a scalar", m -> m.x("x", 1, 1).i64("empty").op("Reshape", "x,empty", "s")
                .i64("one", 1).op("Reshape", "s,one", "v"), 7, 13);
        c.add("Range", "int32", m -> m.i32t("s", d(), 0).i32t("l", d(), 10).i32t("dl", d(), 4).op("Range", "s,l,dl", "y"), 11);
        c.add("Size", "elements", m -> m.x("x", 2, 3, 4).op("Size", "x", "y"), 7, 13, 21);
    }
}
