package dev.erg.workload;


/** The operator classes that get a compute efficiency of their own in a calibration. */
public enum OpClass {
    /** Convolutions with one group (Conv, ConvTranspose and their integer forms). */
    DENSE_CONV("dense-conv"),
    /** Convolutions with more than one group, depthwise ones included. */
    GROUPED_CONV("grouped-conv"),
    /** Every other multiply-accumulate node: MatMul, Gemm, Einsum, recurrent cells and their integer forms. */
    MATMUL("matmul"),
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
        String op = w.opType();
        if (op.startsWith("Conv") || op.equals("QLinearConv")) {
            return w.node().attrInt("group", 1) > 1 ? GROUPED_CONV : DENSE_CONV;
        }
        return MATMUL;
    }
}
