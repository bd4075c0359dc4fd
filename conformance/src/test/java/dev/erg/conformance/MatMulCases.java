package dev.erg.conformance;

import static dev.erg.onnx.OnnxWriter.attr;

/** Gemm, MatMul in every rank combination, Einsum. */
final class MatMulCases {
    private MatMulCases() {
    }

    static void register(Cases c) {
        c.add("Gemm", "plain with C", m -> m.x("a", 3, 4).w("b", 4, 5).w("cc", 3, 5).op("Gemm", "a,b,cc", "y"), 7, 9, 11, 13, 17, 21);
        c.add("Gemm", "transA transB, C row", m -> m.x("a", 4, 3).w("b", 5, 4).w("cc", 5)
                .op("Gemm", "a,b,cc", "y", attr("transA", 1), attr("transB", 1), attr("alpha", 0.5f)), 7, 11, 13);
        c.add("Gemm", "C scalar-like", m -> m.x("a", 2, 3).w("b", 3, 6).w("cc", 1)
                .op("Gemm", "a,b,cc", "y", attr("beta", 2f)), 7, 13);
        c.add("Gemm", "C column", m -> m.x("a", 2, 3).w("b", 6, 3).w("cc", 2, 1)
                .op("Gemm", "a,b,cc", "y", attr("transB", 1)), 7, 13);
        c.add("Gemm", "no C", m -> m.x("a", 2, 3).w("b", 3, 6).op("Gemm", "a,b", "y"), 11, 13, 21);

        c.add("MatMul", "2-D", m -> m.x("a", 3, 4).w("b", 4, 5).op("MatMul", "a,b", "y"), 7, 9, 13, 17, 21);
        c.add("MatMul", "vector by matrix", m -> m.x("a", 4).w("b", 4, 5).op("MatMul", "a,b", "y"), 7, 13);
        c.add("MatMul", "matrix by vector", m -> m.x("a", 2, 3, 4).w("b", 4).op("MatMul", "a,b", "y"), 7, 13);
        c.add("MatMul", "vector by vector", m -> m.x("a", 4).w("b", 4).op("MatMul", "a,b", "y"), 7, 13);
        c.add("MatMul", "vector by batch", m -> m.x("a", 4).x("b", 2, 4, 5).op("MatMul", "a,b", "y"), 7, 13);
        c.add("MatMul", "batched broadcast", m -> m.x("a", 2, 1, 3, 4).x("b", 5, 4, 2).op("MatMul", "a,b", "y"), 7, 13, 21);
        c.add("MatMul", "batch by 2-D", m -> m.x("a", 2, 6, 3, 4).w("b", 4, 7).op("MatMul", "a,b", "y"), 7, 13);

        String[][] eqs = {
            {"matrix product", "ij,jk->ik", "3,4", "4,5"},
            {"batched", "bij,bjk->bik", "2,3,4", "2,4,5"},
            {"implicit output", "ij,jk", "3,4", "4,5"},
            {"implicit transpose", "ba", "3,4"},
            {"diagonal", "ii->i", "4,4"},
            {"trace", "ii", "4,4"},
            {"dot", "i,i->", "5", "5"},
            {"outer", "i,j->ij", "3", "4"},
            {"ellipsis broadcast", "...ij,...jk->...ik", "2,1,3,4", "1,5,4,2"},
            {"sum over axis", "bhqk->bhq", "2,3,4,5"},
            {"attention", "bhqd,bhkd->bhqk", "1,2,5,4", "1,2,6,4"},
        };
        for (String[] e : eqs) {
            c.add("Einsum", e[0], m -> {
                StringBuilder ins = new StringBuilder();
                for (int i = 2; i < e.length; i++) {
                    String[] p = e[i].split(",");
                    long[] dims = new long[p.length];
                    for (int k = 0; k < p.length; k++) {
                        dims[k] = Long.parseLong(p[k]);
                    }
                    m.x("in" + i, dims);
                    ins.append(i > 2 ? "," : "").append("in").append(i);
                }
                m.op("Einsum", ins.toString(), "y", attr("equation", e[1]));
            }, 12, 13);
        }
    }
}
