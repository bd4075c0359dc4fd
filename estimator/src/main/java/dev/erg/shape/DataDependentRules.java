package dev.erg.shape;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorValues;
import java.util.Arrays;
import java.util.HashSet;
import java.util.Set;

/**
 * Operators whose output sizes depend on the values they read: NonMaxSuppression and Unique. When
 * those values are known at analysis time the size is exact; otherwise the rule takes the largest
 * size the operator definition allows and says so in the node's note.
 */
final class DataDependentRules {
    private DataDependentRules() {
    }

    static void register(RuleTable t) {
        t.add("NonMaxSuppression", DataDependentRules::nonMaxSuppression);
        t.add("Unique", DataDependentRules::unique);
    }

    /**
     * NonMaxSuppression (opsets 10, 11): boxes [B, N, 4], scores [B, C, N], max_output_boxes_per_class
     * (optional, default 0: no output) -> selected_indices [num_selected, 3] int64. At most
     * min(max_output_boxes_per_class, N) boxes per class and batch are selected.
     */
    static void nonMaxSuppression(InferContext c) {
        long[] boxes = c.dims(0);
        long[] scores = c.dims(1);
        if (boxes.length != 3 || boxes[2] != 4 || scores.length != 3 || scores[0] != boxes[0] || scores[2] != boxes[1]) {
            throw c.fail("needs boxes [B, N, 4] and scores [B, C, N] (got " + Arrays.toString(boxes) + " and "
                    + Arrays.toString(scores) + ")");
        }
        long batches = boxes[0];
        long classes = scores[1];
        long n = boxes[1];
        long perClass;
        String bound;
        if (!c.has(2)) {
            perClass = 0;
            bound = null;
        } else if (c.data(2) != null) {
            perClass = Math.min(Math.max(c.data(2).longAt(0), 0), n);
            bound = "at most min(max_output_boxes_per_class, boxes) = " + perClass;
        } else {
            perClass = n;
            bound = "max_output_boxes_per_class is computed at run time, so at most every box (" + n + ")";
        }
        long rows = Math.multiplyExact(Math.multiplyExact(batches, classes), perClass);
        c.out(0, ElemType.INT64, new long[] {rows, 3});
        if (bound != null) {
            c.note("NonMaxSuppression selects a data-dependent count; erg assumes " + bound + " per class and batch: "
                    + batches + " x " + classes + " x " + perClass + " = " + rows + " rows (upper bound)");
        }
    }

    /**
     * Unique (opset 11): Y (the unique values or slices), indices, inverse_indices, counts. Without
     * axis, Y is 1-D; with axis, the axis holds the unique slices.
     */
    static void unique(InferContext c) {
        long[] d = c.dims(0);
        TensorValues v = c.data(0);
        boolean flat = !c.hasAttr("axis");
        long total = flat ? Shapes.product(d) : d[c.axis(c.attrInt("axis", 0), d.length)];
        long u;
        if (v != null && flat) {
            Set<Double> seen = new HashSet<>();
            for (int i = 0; i < v.size(); i++) {
                seen.add(v.doubleAt(i));
            }
            u = seen.size();
        } else {
            u = total;
            c.note("Unique returns a data-dependent count; erg assumes every " + (flat ? "element" : "slice")
                    + " is distinct (" + u + ", upper bound)");
        }
        long[] y;
        if (flat) {
            y = new long[] {u};
        } else {
            y = d.clone();
            y[c.axis(c.attrInt("axis", 0), d.length)] = u;
        }
        c.out(0, c.type(0), y);
        c.out(1, ElemType.INT64, new long[] {u});
        c.out(2, ElemType.INT64, new long[] {total});
        c.out(3, ElemType.INT64, new long[] {u});
    }
}
