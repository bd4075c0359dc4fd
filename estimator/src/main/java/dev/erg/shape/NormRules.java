package dev.erg.shape;

import dev.erg.onnx.ElemType;

/** Normalisations: batch, instance, layer, group, mean-variance, local response. */
final class NormRules {
    private NormRules() {
    }

    static void register(RuleTable t) {
        t.add("BatchNormalization", c -> {
            c.out(0, c.type(0), c.dims(0));
            long[] ch = {c.dims(0).length > 1 ? c.dims(0)[1] : 1};
            for (int i = 1; i < c.outputCount(); i++) {
                c.out(i, c.type(0), ch);
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
