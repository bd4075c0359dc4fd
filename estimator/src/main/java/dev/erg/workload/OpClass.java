package dev.erg.workload;


/** The operator classes that get a compute efficiency of their own in a calibration. */
public enum OpClass {
    /** Convolutions with one group (Conv, ConvTranspose and their integer forms). */
    DENSE_CONV("dense-conv"),
    /** Convolutions with more than one group, depthwise ones included. */
    GROUPED_CONV("grouped-conv"),
    /** Every other multiply-accumulate node: MatMul, Gemm, Einsum, recurrent cells and their integer forms. */
    MATMUL("matmul"),
    /**
     * Multiply-accumulate nodes whose matrix view has one row per group (M = 1): matrix-vector products,
     * such as a classifier at batch 1 or a convolution over a 1x1 map. Each weight is used once per
     * frame, so reading the weights limits them rather than arithmetic (matrix-vector against
     * matrix-matrix work: common practice, no single source); they get an efficiency of their own.
     */
    MATRIX_VECTOR("matrix-vector"),
    /** Nodes without MACs that run: elementwise, normalisation, pooling, reductions, data movement. */
    VECTOR("vector");

    public final String label;

    OpClass(String label) {
        this.label = label;
    }

    /** The class of a node's work. */
    public static OpClass of(NodeWork w) {
        if (w.kind() != Kind.MAC) {
            return VECTOR;
        }
        if (w.gemmGroups() > 0 && w.gemmM() == 1) {
            return MATRIX_VECTOR;
        }
        String op = w.opType();
        if (op.startsWith("Conv") || op.equals("QLinearConv")) {
            return w.node().attrInt("group", 1) > 1 ? GROUPED_CONV : DENSE_CONV;
        }
        return MATMUL;
    }
}
