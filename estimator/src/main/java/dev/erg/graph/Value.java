package dev.erg.graph;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.TensorValues;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.Set;

/**
 * A value of the analysed graph: a tensor with its element type and shape once inference has run.
 *
 * <p>A value is <em>constant</em> when it does not depend on the model's runtime inputs: stored
 * tensors (initializers, Constant nodes) and everything computed from them or from static shapes
 * alone. Constant values are worked out at analysis time and never run on the device. A constant
 * value keeps the stored tensors it derives from ({@link #sources()}), so that a node reading a
 * weight through Identity, DequantizeLinear or Transpose is charged the weight's stored bytes.
 */
public final class Value {
    private final String name;
    private ElemType type;
    private long[] dims;
    private long elements = 1;
    private TensorValues data;
    private boolean constant;
    private TensorDef stored;
    private Set<TensorDef> sources = Collections.emptySet();
    private Node producer;
    private final List<Node> consumers = new ArrayList<>(2);
    private boolean graphInput;
    private boolean graphOutput;
    /** While a graph is built: the file index of the node that produces this value, or -1. */
    int fileProducer = -1;

    public Value(String name) {
        this.name = name;
    }

    public String name() {
        return name;
    }

    /** The element type, or null before inference (or when it could not be inferred). */
    public ElemType type() {
        return type;
    }

    /** The shape, or null when unknown. Never modify the returned array. */
    public long[] dims() {
        return dims;
    }

    public boolean hasShape() {
        return dims != null;
    }

    public int rank() {
        return dims.length;
    }

    /** The element count: the product of the dims (kept from when the shape was set). */
    public long elements() {
        return elements;
    }

    /** Bytes of the value at its element type; 0 when the shape or type is unknown. */
    public long bytes() {
        if (dims == null || type == null) {
            return 0;
        }
        return type.bytes(elements());
    }

    public void setType(ElemType type, long[] dims) {
        this.type = type;
        this.dims = dims;
        long n = 1;
        if (dims != null) {
            for (long d : dims) {
                n *= d;
            }
        }
        this.elements = n;
    }

    /** Values known at analysis time (small tensors only), or null. */
    public TensorValues data() {
        return data;
    }

    public void setData(TensorValues data) {
        this.data = data;
    }

    public boolean isConstant() {
        return constant;
    }

    public void setConstant(boolean constant) {
        this.constant = constant;
    }

    /** The stored tensor when this value is an initializer or a Constant node's output, else null. */
    public TensorDef stored() {
        return stored;
    }

    public void setStored(TensorDef stored) {
        this.stored = stored;
        this.constant = true;
        this.sources = Collections.singleton(stored);
    }

    /** The stored tensors this constant value is derived from (empty for runtime values). */
    public Set<TensorDef> sources() {
        return sources;
    }

    /**
     * Sets the stored tensors behind this constant value. The set is kept as given, not copied: it must
     * not change afterwards (values of a folded chain share one set).
     */
    public void setSources(Set<TensorDef> sources) {
        this.sources = sources.isEmpty() ? Collections.emptySet() : sources;
    }

    /** Bytes of the stored tensors behind this constant value (or its own bytes when none). */
    public long storedBytes() {
        if (sources.isEmpty()) {
            return bytes();
        }
        long b = 0;
        for (TensorDef t : sources) {
            b += t.bytes();
        }
        return b;
    }

    public Node producer() {
        return producer;
    }

    void setProducer(Node producer) {
        this.producer = producer;
    }

    public List<Node> consumers() {
        return consumers;
    }

    public boolean isGraphInput() {
        return graphInput;
    }

    void markGraphInput() {
        graphInput = true;
    }

    public boolean isGraphOutput() {
        return graphOutput;
    }

    void markGraphOutput() {
        graphOutput = true;
    }

    @Override
    public String toString() {
        return name + ":" + (type == null ? "?" : type.label) + (dims == null ? "[?]" : java.util.Arrays.toString(dims));
    }
}
