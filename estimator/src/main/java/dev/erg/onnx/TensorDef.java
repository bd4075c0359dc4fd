package dev.erg.onnx;

import java.util.Arrays;

/**
 * A tensor as stored in the file (an initializer, or a Constant node's value): its name, element
 * type and dims, and where its payload lives. The payload itself is only kept for small tensors
 * (at most {@link OnnxReader#KEEP_PAYLOAD_BYTES} bytes), the kind that carries shapes, axes and
 * scales; weight payloads are skipped on the stream and never copied.
 */
public final class TensorDef {
    private final String name;
    private final ElemType type;
    private final long[] dims;
    private final long elements;
    private final TensorValues values;
    private final String externalLocation;

    public TensorDef(String name, ElemType type, long[] dims, long elements, TensorValues values,
                     String externalLocation) {
        this.name = name;
        this.type = type;
        this.dims = dims;
        this.elements = elements;
        this.values = values;
        this.externalLocation = externalLocation;
    }

    public String name() {
        return name;
    }

    public ElemType type() {
        return type;
    }

    public long[] dims() {
        return dims.clone();
    }

    public int rank() {
        return dims.length;
    }

    public long elements() {
        return elements;
    }

    /** Bytes of the stored payload: elements times element width. */
    public long bytes() {
        return type.bytes(elements);
    }

    /** The decoded values of a small tensor, or null when the payload was skipped or is external. */
    public TensorValues values() {
        return values;
    }

    /** The relative location of external data, or null when the data is in the file. */
    public String externalLocation() {
        return externalLocation;
    }

    @Override
    public String toString() {
        return name + ":" + type.label + Arrays.toString(dims);
    }
}
