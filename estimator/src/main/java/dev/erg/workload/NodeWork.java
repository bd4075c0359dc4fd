package dev.erg.workload;

import dev.erg.graph.Node;
import java.util.List;

/**
 * The work of one node: multiply-accumulates, vector operations, the bytes it reads and writes, and
 * its operand precision. MAC nodes also carry their view as a matrix product (per group: {@code m}
 * output positions x {@code k} reduction x {@code n} output channels), which the estimator maps onto
 * an engine.
 */
public final class NodeWork {
    private final Node node;
    private final Kind kind;
    private final long macs;
    private final long vectorOps;
    private final long weightBytes;
    private final long inputBytes;
    private final long outputBytes;
    private final String precision;
    private final String weightPrecision;
    private final String activationPrecision;
    private final int precisionBits;
    private final long gemmM;
    private final long gemmK;
    private final long gemmN;
    private final long gemmGroups;
    private final List<long[]> outputShapes;
    private final String note;

    NodeWork(Builder b) {
        this.node = b.node;
        this.kind = b.kind;
        this.macs = b.macs;
        this.vectorOps = b.vectorOps;
        this.weightBytes = b.weightBytes;
        this.inputBytes = b.inputBytes;
        this.outputBytes = b.outputBytes;
        this.precision = b.precision;
        this.weightPrecision = b.weightPrecision;
        this.activationPrecision = b.activationPrecision;
        this.precisionBits = b.precisionBits;
        this.gemmM = b.gemmM;
        this.gemmK = b.gemmK;
        this.gemmN = b.gemmN;
        this.gemmGroups = b.gemmGroups;
        // An unknown shape is null, which List.copyOf would reject.
        this.outputShapes = java.util.Collections.unmodifiableList(new java.util.ArrayList<>(b.outputShapes));
        this.note = b.note;
    }

    /** The graph node, for the estimation stage; reports read {@link #name()}, {@link #opType()}, {@link #domain()}. */
    public Node node() {
        return node;
    }

    /** The operator's domain ("" for the default ONNX domain). */
    public String domain() {
        return node.domain();
    }

    public String name() {
        return node.name();
    }

    public String opType() {
        return node.opType();
    }

    public Kind kind() {
        return kind;
    }

    public long macs() {
        return macs;
    }

    public long vectorOps() {
        return vectorOps;
    }

    /** Bytes of constant operands (weights, biases, scales) at their stored element type. */
    public long weightBytes() {
        return weightBytes;
    }

    /** Bytes of runtime (activation) inputs. */
    public long inputBytes() {
        return inputBytes;
    }

    public long outputBytes() {
        return outputBytes;
    }

    /** Operand precision label (e.g. "fp32", "int8"): the wider of the activation and weight operands. */
    public String precision() {
        return precision;
    }

    /** The weight operand's precision label, or null when the node reads no weight. */
    public String weightPrecision() {
        return weightPrecision;
    }

    /**
     * The activation operand's precision label as the model stores it (through DequantizeLinear to its
     * integers), or null when unknown.
     */
    public String activationPrecision() {
        return activationPrecision;
    }

    /** Bit width of {@link #precision()}. */
    public int precisionBits() {
        return precisionBits;
    }

    public long gemmM() {
        return gemmM;
    }

    public long gemmK() {
        return gemmK;
    }

    public long gemmN() {
        return gemmN;
    }

    public long gemmGroups() {
        return gemmGroups;
    }

    /** Output shapes; an unknown shape is null. */
    public List<long[]> outputShapes() {
        return outputShapes;
    }

    /** An assumption made for this node, or null. */
    public String note() {
        return note;
    }

    /** Mutable assembly of a {@link NodeWork}, filled by the workload rules. */
    public static final class Builder {
        final Node node;
        Kind kind;
        long macs;
        long vectorOps;
        long weightBytes;
        long inputBytes;
        long outputBytes;
        String precision;
        String weightPrecision;
        String activationPrecision;
        int precisionBits;
        long gemmM;
        long gemmK;
        long gemmN;
        long gemmGroups;
        List<long[]> outputShapes = List.of();
        String note;

        Builder(Node node, Kind kind) {
            this.node = node;
            this.kind = kind;
        }

        public Node node() {
            return node;
        }

        public Builder kind(Kind k) {
            this.kind = k;
            return this;
        }

        public Builder macs(long m) {
            this.macs = m;
            return this;
        }

        public Builder vectorOps(long v) {
            this.vectorOps = v;
            return this;
        }

        /** Records the node as the matrix product m x k x n, repeated for {@code groups} groups. */
        public Builder gemm(long m, long k, long n, long groups) {
            this.gemmM = m;
            this.gemmK = k;
            this.gemmN = n;
            this.gemmGroups = groups;
            this.macs = Math.multiplyExact(Math.multiplyExact(Math.multiplyExact(m, k), n), groups);
            return this;
        }
    }
}
