package dev.erg.conformance;

import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.ints;

/** Shape-arithmetic chains as exporters write them: every intermediate is checked too. */
final class PatternCases {
    private PatternCases() {
    }

    static void register(Cases c) {
        c.add("Reshape", "pattern: Shape-Gather-Unsqueeze-Concat-Reshape", m -> m.x("x", 2, 3, 4)
                .op("Shape", "x", "s").i64s("zero", 0).op("Gather", "s,zero", "n", attr("axis", 0))
                .axesOp("Unsqueeze", 13, "n", M.d(0), "nu").i64("minus1", -1)
                .op("Concat", "nu,minus1", "shape", attr("axis", 0)).op("Reshape", "x,shape", "y"), 11, 13, 17);
        c.add("Reshape", "pattern: Shape-Slice-Concat-Reshape", m -> {
            m.x("x", 2, 3, 4, 5).op("Shape", "x", "s");
            if (m.opset < 10) {
                m.op("Slice", "s", "head", ints("starts", 0), ints("ends", 2));
            } else {
                m.i64("st", 0).i64("en", 2).op("Slice", "s,st,en", "head");
            }
            m.i64("minus1", -1).op("Concat", "head,minus1", "shape", attr("axis", 0)).op("Reshape", "x,shape", "y");
        }, 9, 11, 13);
        c.add("Reshape", "pattern: attention head split", m -> m.x("x", 2, 5, 8)
                .op("Shape", "x", "s").i64s("i0", 0).i64s("i1", 1).i64s("i2", 2).i64s("heads", 2)
                .op("Gather", "s,i0", "b", attr("axis", 0)).op("Gather", "s,i1", "t", attr("axis", 0))
                .op("Gather", "s,i2", "h", attr("axis", 0)).op("Div", "h,heads", "hd")
                .axesOp("Unsqueeze", 13, "b", M.d(0), "bu").axesOp("Unsqueeze", 13, "t", M.d(0), "tu")
                .axesOp("Unsqueeze", 13, "heads", M.d(0), "nu").axesOp("Unsqueeze", 13, "hd", M.d(0), "du")
                .op("Concat", "bu,tu,nu,du", "shape", attr("axis", 0)).op("Reshape", "x,shape", "r")
                .op("Transpose", "r", "y", ints("perm", 0, 2, 1, 3)), 11, 13, 17);
        c.add("Expand", "pattern: ConstantOfShape mask expanded", m -> m.x("x", 2, 1, 6)
                .op("Shape", "x", "s").op("ConstantOfShape", "s", "ones")
                .i64("big", 1, 4, 1).op("Expand", "ones,big", "mask").op("Mul", "mask,x", "y"), 11, 13);
        c.add("Range", "pattern: positions from Shape", m -> m.x("x", 2, 7, 4)
                .op("Shape", "x", "s").i64s("i1", 1).op("Gather", "s,i1", "len", attr("axis", 0))
                .i64s("zero", 0).i64s("one", 1).op("Range", "zero,len,one", "pos")
                .axesOp("Unsqueeze", 13, "pos", M.d(0, 2), "posu").op("Cast", "posu", "posf", attr("to", 1L))
                .op("Add", "x,posf", "y"), 11, 13);
        c.add("Resize", "pattern: sizes from Shape", m -> m.x("x", 1, 3, 4, 5)
                .op("Shape", "x", "s").i64("st", 2).i64("en", 4).op("Slice", "s,st,en", "hw")
                .i64("two", 2).op("Mul", "hw,two", "hw2").i64("st0", 0).op("Slice", "s,st0,st", "nc")
                .op("Concat", "nc,hw2", "sizes", attr("axis", 0)).op("Resize", "x,,,sizes", "y"), 13, 18);
        c.add("Slice", "pattern: ends from Shape", m -> m.x("x", 3, 9)
                .op("Shape", "x", "s").i64s("last", -1).op("Gather", "s,last", "n", attr("axis", 0))
                .i64s("k", 2).op("Sub", "n,k", "e").axesOp("Unsqueeze", 13, "e", M.d(0), "eu")
                .i64("st", 1).i64("ax", 1).op("Slice", "x,st,eu,ax", "y"), 11, 13);
        c.add("Flatten", "pattern: Size and Shape", m -> m.x("x", 2, 3, 4).op("Size", "x", "n")
                .op("Shape", "x", "s").op("ReduceProd", "s", "p", attr("keepdims", 1))
                .op("Reshape", "x,p", "y"), 13);
    }
}
