package dev.erg.validation;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;

/**
 * The five convolution layers of AlexNet in the original layout: 227x227 input, grouped convolutions
 * in layers 2, 4 and 5, ReLU after each and the two max-pools between layers 1-2 and 2-3 that fix the
 * shapes. Written with the project's ONNX writer. Conv MACs per image:
 * <pre>
 * conv1 96x3x11x11 s4      -> 55x55:  55*55*96*363    = 105 415 200
 * conv2 256x48x5x5 g2 p2   -> 27x27:  27*27*256*1200  = 223 948 800
 * conv3 384x256x3x3 p1     -> 13x13:  13*13*384*2304  = 149 520 384
 * conv4 384x192x3x3 g2 p1  -> 13x13:  13*13*384*1728  = 112 140 288
 * conv5 256x192x3x3 g2 p1  -> 13x13:  13*13*256*1728  =  74 760 192
 *                                                total = 665 784 864 (the 666 M of the original layout)
 * </pre>
 */
final class AlexNetConv {
    static final long MACS_PER_IMAGE = 665_784_864L;

    private AlexNetConv() {
    }

    static OnnxWriter.Graph graph(long batch) {
        return graph(batch, false);
    }

    /**
     * The same graph; with {@code graphOnly} its weights are external data whose file is not written
     * (every initializer keeps its dims and type, the payload is absent: a file of a few hundred bytes
     * that erg analyses like the whole model, since the analysis reads no weights).
     */
    static OnnxWriter.Graph graph(long batch, boolean graphOnly) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("alexnet_conv").input("image", ElemType.FLOAT, batch, 3, 227, 227);
        long[][] shapes = {{96, 3, 11, 11}, {96}, {256, 48, 5, 5}, {256}, {384, 256, 3, 3}, {384}, {384, 192, 3, 3},
            {384}, {256, 192, 3, 3}, {256}};
        long offset = 0;
        for (int i = 0; i < shapes.length; i++) {
            String name = (i % 2 == 0 ? "w" : "b") + (i / 2 + 1);
            OnnxWriter.Tensor t = new OnnxWriter.Tensor(name, ElemType.FLOAT, shapes[i]);
            long bytes = ElemType.FLOAT.bytes(count(shapes[i]));
            g.initializer(graphOnly ? t.external("alexnet_conv.weights", offset, bytes) : t.filled());
            offset += bytes;
        }
        g.node("Conv", "conv1", List.of("image", "w1", "b1"), List.of("c1"), OnnxWriter.ints("strides", 4, 4));
        g.node("Relu", "relu1", List.of("c1"), List.of("r1"));
        g.node("MaxPool", "pool1", List.of("r1"), List.of("p1"), OnnxWriter.ints("kernel_shape", 3, 3),
                OnnxWriter.ints("strides", 2, 2));
        g.node("Conv", "conv2", List.of("p1", "w2", "b2"), List.of("c2"), OnnxWriter.ints("pads", 2, 2, 2, 2),
                OnnxWriter.attr("group", 2L));
        g.node("Relu", "relu2", List.of("c2"), List.of("r2"));
        g.node("MaxPool", "pool2", List.of("r2"), List.of("p2"), OnnxWriter.ints("kernel_shape", 3, 3),
                OnnxWriter.ints("strides", 2, 2));
        g.node("Conv", "conv3", List.of("p2", "w3", "b3"), List.of("c3"), OnnxWriter.ints("pads", 1, 1, 1, 1));
        g.node("Relu", "relu3", List.of("c3"), List.of("r3"));
        g.node("Conv", "conv4", List.of("r3", "w4", "b4"), List.of("c4"), OnnxWriter.ints("pads", 1, 1, 1, 1),
                OnnxWriter.attr("group", 2L));
        g.node("Relu", "relu4", List.of("c4"), List.of("r4"));
        g.node("Conv", "conv5", List.of("r4", "w5", "b5"), List.of("c5"), OnnxWriter.ints("pads", 1, 1, 1, 1),
                OnnxWriter.attr("group", 2L));
        g.node("Relu", "relu5", List.of("c5"), List.of("features"));
        return g.output("features", ElemType.FLOAT);
    }

    private static long count(long[] dims) {
        long n = 1;
        for (long d : dims) {
            n *= d;
        }
        return n;
    }
}
