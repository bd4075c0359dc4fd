package dev.erg.shape;

import dev.erg.onnx.ElemType;

/** Normalisations: batch, instance, layer, group, mean-variance, local response. */
final class NormRules {
    private NormRules() {
    }

    static void register(RuleTable t) {
        // BatchNormalization: Y has X's shape. Opsets 7 and 9: optional mean, var, saved_mean, saved_var,
        // each [C] of X's type. Opsets 14 and 15: optional running_mean and running_var (training_mode),
        // [C] of input_mean's type (U in opset 14, T2 in opset 15).
        t.add("BatchNormalization", c -> {
            long[] x = c.dims(0);
            c.out(0, c.type(0), x);
            long[] ch = {x.length > 1 ? x[1] : 1};
            int extra = c.opset() >= 14 ? 2 : 4;
            if (c.outputCount() > 1 + extra) {
                throw c.fail("has " + c.outputCount() + " outputs; at opset " + c.opset() + " it has at most "
                        + (1 + extra));
            }
            ElemType stat = c.opset() >= 14 ? c.type(3) : c.type(0);
            for (int i = 1; i < c.outputCount(); i++) {
                c.out(i, stat, ch);
            }
        });
        t.add("InstanceNormalization", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("GroupNormalization", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("MeanVarianceNormalization", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("LRN", c -> c.out(0, c.type(0), c.dims(0)));
        t.add("LayerNormalization", c -> {
            long[] d = c.dims(0);
            c.out(0, c.type(0), d);
            int axis = c.axis(c.attrInt("axis", -1), d.length);
            long[] stat = d.clone();
            for (int i = axis; i < d.length; i++) {
                stat[i] = 1;
            }
            long stash = c.attrInt("stash_type", 1);
            ElemType st = ElemType.ofCode(stash);
            c.out(1, st == null ? ElemType.FLOAT : st, stat);
            c.out(2, st == null ? ElemType.FLOAT : st, stat);
        });
    }
}
