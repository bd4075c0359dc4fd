package dev.erg.conformance;

import static dev.erg.conformance.M.d;
import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.ints;

import dev.erg.onnx.ElemType;

/** Conv, ConvTranspose and every pooling form. */
final class ConvPoolCases {
    private ConvPoolCases() {
    }

    static void register(Cases c) {
        c.add("Conv", "3x3 pad 1 with bias", m -> m.x("x", 1, 3, 8, 8).w("w", 4, 3, 3, 3).w("b", 4)
                .op("Conv", "x,w,b", "y", ints("pads", 1, 1, 1, 1)), 7, 11, 17, 21);
        c.add("Conv", "stride 2, dilations 2", m -> m.x("x", 2, 2, 11, 10).w("w", 3, 2, 3, 3)
                .op("Conv", "x,w", "y", ints("strides", 2, 2), ints("dilations", 2, 2)), 7, 11, 21);
        c.add("Conv", "asymmetric pads, kernel_shape", m -> m.x("x", 1, 2, 7, 7).w("w", 2, 2, 3, 2)
                .op("Conv", "x,w", "y", ints("kernel_shape", 3, 2), ints("pads", 0, 1, 2, 0), ints("strides", 2, 3)), 7, 11);
        for (String ap : new String[] {"SAME_UPPER", "SAME_LOWER", "VALID"}) {
            c.add("Conv", "auto_pad " + ap + " stride 2", m -> m.x("x", 1, 2, 9, 8).w("w", 4, 2, 3, 3)
                    .op("Conv", "x,w", "y", attr("auto_pad", ap), ints("strides", 2, 2)), 7, 11, 21);
        }
        c.add("Conv", "SAME_UPPER with dilations", m -> m.x("x", 1, 2, 9, 8).w("w", 4, 2, 3, 3)
                .op("Conv", "x,w", "y", attr("auto_pad", "SAME_UPPER"), ints("dilations", 2, 2)), 11);
        c.add("Conv", "groups", m -> m.x("x", 1, 6, 6, 6).w("w", 9, 2, 3, 3)
                .op("Conv", "x,w", "y", attr("group", 3)), 7, 11);
        c.add("Conv", "depthwise", m -> m.x("x", 1, 4, 6, 6).w("w", 4, 1, 3, 3)
                .op("Conv", "x,w", "y", attr("group", 4), ints("pads", 1, 1, 1, 1), ints("strides", 2, 2)), 11);
        c.add("Conv", "1-D", m -> m.x("x", 2, 3, 20).w("w", 5, 3, 4)
                .op("Conv", "x,w", "y", ints("strides", 3), ints("pads", 1, 2)), 7, 11);
        c.add("Conv", "3-D", m -> m.x("x", 1, 2, 5, 6, 7).w("w", 3, 2, 3, 3, 3)
                .op("Conv", "x,w", "y", ints("pads", 1, 0, 1, 1, 0, 1), ints("strides", 1, 2, 2)), 7, 11);

        c.add("ConvTranspose", "stride 2 output_padding 1", m -> m.x("x", 1, 3, 5, 5).w("w", 3, 2, 3, 3).w("b", 2)
                .op("ConvTranspose", "x,w,b", "y", ints("strides", 2, 2), ints("pads", 1, 1, 1, 1),
                        ints("output_padding", 1, 1)), 7, 11, 21);
        c.add("ConvTranspose", "output_shape", m -> m.x("x", 1, 2, 4, 4).w("w", 2, 3, 3, 3)
                .op("ConvTranspose", "x,w", "y", ints("strides", 2, 2), ints("output_shape", 10, 9)), 7, 11);
        c.add("ConvTranspose", "auto_pad SAME_UPPER", m -> m.x("x", 1, 2, 4, 5).w("w", 2, 3, 3, 3)
                .op("ConvTranspose", "x,w", "y", ints("strides", 2, 2), attr("auto_pad", "SAME_UPPER")), 11);
        c.add("ConvTranspose", "auto_pad SAME_LOWER", m -> m.x("x", 1, 2, 4, 5).w("w", 2, 3, 3, 3)
                .op("ConvTranspose", "x,w", "y", ints("strides", 2, 2), attr("auto_pad", "SAME_LOWER")), 11);
        c.add("ConvTranspose", "auto_pad VALID", m -> m.x("x", 1, 2, 4, 5).w("w", 2, 3, 3, 2)
                .op("ConvTranspose", "x,w", "y", ints("strides", 2, 3), attr("auto_pad", "VALID")), 11);
        c.add("ConvTranspose", "groups and dilations", m -> m.x("x", 1, 4, 5, 5).w("w", 4, 3, 3, 3)
                .op("ConvTranspose", "x,w", "y", attr("group", 2), ints("dilations", 2, 2)), 7, 11);
        c.add("ConvTranspose", "asymmetric pads, 1-D", m -> m.x("x", 2, 3, 6).w("w", 3, 4, 5)
                .op("ConvTranspose", "x,w", "y", ints("strides", 3), ints("pads", 1, 2)), 7, 11);

        // Pooling. Opset 7: no ceil_mode, no dilations; 8: MaxPool Indices; 10: ceil_mode (and MaxPool
        // dilations); 19: AveragePool dilations; 18: LpPool ceil_mode and dilations.
        for (String op : new String[] {"MaxPool", "AveragePool"}) {
            long[] all = op.equals("MaxPool") ? d(7, 10, 12, 21) : d(7, 10, 11, 19, 21);
            c.add(op, "3x3 stride 2 pads", m -> m.x("x", 1, 2, 9, 8)
                    .op(op, "x", "y", ints("kernel_shape", 3, 3), ints("strides", 2, 2), ints("pads", 1, 1, 1, 1)), all);
            c.add(op, "asymmetric pads", m -> m.x("x", 1, 2, 7, 6)
                    .op(op, "x", "y", ints("kernel_shape", 2, 3), ints("strides", 2, 1), ints("pads", 0, 1, 1, 2)), all);
            for (String ap : new String[] {"SAME_UPPER", "SAME_LOWER", "VALID"}) {
                c.add(op, "auto_pad " + ap, m -> m.x("x", 1, 2, 9, 8)
                        .op(op, "x", "y", ints("kernel_shape", 3, 2), ints("strides", 2, 3), attr("auto_pad", ap)), all);
            }
            c.add(op, "ceil_mode", m -> m.x("x", 1, 2, 8, 9)
                    .op(op, "x", "y", ints("kernel_shape", 3, 3), ints("strides", 2, 2), attr("ceil_mode", 1)), 10, 21);
            c.add(op, "ceil_mode window in end padding", m -> m.x("x", 1, 1, 5, 5)
                    .op(op, "x", "y", ints("kernel_shape", 3, 3), ints("strides", 3, 3), ints("pads", 1, 1, 1, 1),
                            attr("ceil_mode", 1)), 10, 21);
            c.add(op, "ceil_mode stride past input", m -> m.x("x", 1, 1, 6, 7)
                    .op(op, "x", "y", ints("kernel_shape", 2, 2), ints("strides", 2, 2), ints("pads", 0, 0, 1, 1),
                            attr("ceil_mode", 1)), 10, 21);
            c.add(op, "1-D", m -> m.x("x", 2, 3, 11).op(op, "x", "y", ints("kernel_shape", 3), ints("strides", 2)), all);
            c.add(op, "3-D", m -> m.x("x", 1, 2, 5, 6, 7)
                    .op(op, "x", "y", ints("kernel_shape", 2, 3, 2), ints("strides", 2, 2, 2), ints("pads", 0, 1, 1, 0, 1, 0)), all);
        }
        c.add("MaxPool", "dilations", m -> m.x("x", 1, 2, 10, 9)
                .op("MaxPool", "x", "y", ints("kernel_shape", 3, 2), ints("dilations", 2, 3)), 10, 12, 21);
        c.add("MaxPool", "dilations with ceil_mode", m -> m.x("x", 1, 1, 10, 9)
                .op("MaxPool", "x", "y", ints("kernel_shape", 2, 2), ints("dilations", 2, 2), ints("strides", 2, 2),
                        attr("ceil_mode", 1)), 10, 21);
        c.add("MaxPool", "with Indices", m -> m.x("x", 2, 3, 6, 7)
                .op("MaxPool", "x", "y,idx", ints("kernel_shape", 2, 2), ints("strides", 2, 2)), 8, 10, 12, 21);
        c.add("MaxPool", "uint8 input", m -> m.in("x", ElemType.UINT8, 1, 2, 6, 6)
                .op("MaxPool", "x", "y", ints("kernel_shape", 2, 2), ints("strides", 2, 2)), 12, 21);
        c.add("AveragePool", "count_include_pad", m -> m.x("x", 1, 2, 7, 7)
                .op("AveragePool", "x", "y", ints("kernel_shape", 3, 3), ints("pads", 1, 1, 1, 1),
                        attr("count_include_pad", 1)), 7, 11, 21);
        c.add("AveragePool", "dilations", m -> m.x("x", 1, 2, 10, 9)
                .op("AveragePool", "x", "y", ints("kernel_shape", 3, 2), ints("dilations", 2, 3)), 19, 21);
        c.add("LpPool", "p 2", m -> m.x("x", 1, 2, 8, 8)
                .op("LpPool", "x", "y", ints("kernel_shape", 3, 3), ints("strides", 2, 2), attr("p", 2)), 7, 11, 18);
        c.add("LpPool", "ceil_mode and dilations", m -> m.x("x", 1, 2, 9, 8)
                .op("LpPool", "x", "y", ints("kernel_shape", 2, 2), ints("strides", 2, 2), ints("dilations", 2, 1),
                        attr("ceil_mode", 1)), 18);
        for (String op : new String[] {"GlobalAveragePool", "GlobalMaxPool", "GlobalLpPool"}) {
            c.add(op, "2-D", m -> m.x("x", 2, 3, 5, 6).op(op, "x", "y"), 7, 13);
            c.add(op, "1-D and 3-D", m -> m.x("x", 2, 3, 5).x("z", 1, 2, 3, 4, 5).op(op, "x", "y").op(op, "z", "y3"), 7, 13);
        }
        c.add("MaxRoiPool", "pooled 2x3", m -> m.x("x", 1, 3, 8, 8).f("rois", d(2, 5), 0, 0, 0, 4, 4, 0, 2, 2, 7, 6)
                .op("MaxRoiPool", "x,rois", "y", ints("pooled_shape", 2, 3)), 7, 13);
        c.add("RoiAlign", "output 3x2", m -> m.x("x", 2, 3, 8, 8).f("rois", d(3, 4), 0, 0, 4, 4, 1, 1, 6, 7, 2, 0, 7, 3)
                .i64("bi", 0, 1, 1).op("RoiAlign", "x,rois,bi", "y", attr("output_height", 3), attr("output_width", 2)), 10, 16);
        c.add("RoiAlign", "default size", m -> m.x("x", 1, 2, 6, 6).f("rois", d(1, 4), 0, 0, 4, 4)
                .i64("bi", 0).op("RoiAlign", "x,rois,bi", "y"), 10, 16);
    }
}
