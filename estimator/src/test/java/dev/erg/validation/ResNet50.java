package dev.erg.validation;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;

/**
 * ResNet-50 as described by He et al., "Deep Residual Learning for Image Recognition", CVPR 2016,
 * Table 1: a 7x7/2 stem, a 3x3/2 max-pool, four stages of 3, 4, 6 and 3 bottleneck blocks
 * (1x1, 3x3, 1x1 with four-fold expansion), projection shortcuts where the shape changes, global
 * average pooling and a 1000-way fully connected layer. {@code strideOnThreeByThree} selects where a
 * stage's stride sits: false for the paper's layout (on the first 1x1), true for the common "v1.5"
 * layout (on the 3x3). Weights are declared as external data that is never written: the analysis needs
 * only their dims.
 */
public final class ResNet50 {
    private ResNet50() {
    }

    private static int counter;

    private static String conv(OnnxWriter.Graph g, String in, long cin, long cout, long k, long stride, boolean relu) {
        int id = counter++;
        String w = "w" + id;
        g.initializer(new OnnxWriter.Tensor(w, ElemType.FLOAT, cout, cin, k, k)
                .external("resnet50.weights.bin", 0, cout * cin * k * k * 4));
        String out = "c" + id;
        long p = k / 2;
        g.node("Conv", "conv" + id, List.of(in, w), List.of(out), OnnxWriter.ints("strides", stride, stride),
                OnnxWriter.ints("pads", p, p, p, p));
        if (!relu) {
            return out;
        }
        g.node("Relu", "relu" + id, List.of(out), List.of(out + "_r"));
        return out + "_r";
    }

    public static OnnxWriter.Graph graph(long batch, boolean strideOnThreeByThree) {
        counter = 0;
        OnnxWriter.Graph g = new OnnxWriter.Graph("resnet50").input("image", ElemType.FLOAT, batch, 3, 224, 224);
        String x = conv(g, "image", 3, 64, 7, 2, true);
        g.node("MaxPool", "pool", List.of(x), List.of("pooled"), OnnxWriter.ints("kernel_shape", 3, 3),
                OnnxWriter.ints("strides", 2, 2), OnnxWriter.ints("pads", 1, 1, 1, 1));
        x = "pooled";
        long cin = 64;
        int[] blocks = {3, 4, 6, 3};
        long[] widths = {64, 128, 256, 512};
        int add = 0;
        for (int s = 0; s < 4; s++) {
            for (int b = 0; b < blocks[s]; b++) {
                long stride = (s > 0 && b == 0) ? 2 : 1;
                long width = widths[s];
                long cout = width * 4;
                String a = conv(g, x, cin, width, 1, strideOnThreeByThree ? 1 : stride, true);
                String m = conv(g, a, width, width, 3, strideOnThreeByThree ? stride : 1, true);
                String z = conv(g, m, width, cout, 1, 1, false);
                String shortcut = b == 0 ? conv(g, x, cin, cout, 1, stride, false) : x;
                String sum = "add" + add++;
                g.node("Add", sum, List.of(z, shortcut), List.of(sum));
                g.node("Relu", sum + "_relu", List.of(sum), List.of(sum + "_r"));
                x = sum + "_r";
                cin = cout;
            }
        }
        g.node("GlobalAveragePool", "gap", List.of(x), List.of("gap"));
        g.node("Flatten", "flatten", List.of("gap"), List.of("flat"));
        g.initializer(new OnnxWriter.Tensor("fc_w", ElemType.FLOAT, 1000, 2048)
                .external("resnet50.weights.bin", 0, 1000L * 2048 * 4));
        g.initializer(new OnnxWriter.Tensor("fc_b", ElemType.FLOAT, 1000).external("resnet50.weights.bin", 0, 4000));
        g.node("Gemm", "fc", List.of("flat", "fc_w", "fc_b"), List.of("logits"), OnnxWriter.attr("transB", 1L));
        return g.output("logits", ElemType.FLOAT);
    }
}
