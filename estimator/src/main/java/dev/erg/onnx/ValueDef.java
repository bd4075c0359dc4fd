package dev.erg.onnx;

import java.util.List;

/**
 * A ValueInfoProto: a value's name and declared tensor type. Each dim is a {@link Dim}: a fixed
 * value, a symbolic name, or unknown. {@code dims} is null when the file declares no shape.
 */
public final class ValueDef {
    private final String name;
    private final ElemType type;
    private final List<Dim> dims;

    public ValueDef(String name, ElemType type, List<Dim> dims) {
        this.name = name;
        this.type = type;
        this.dims = dims == null ? null : List.copyOf(dims);
    }

    public String name() {
        return name;
    }

    /** The declared element type, or null when the value is not a tensor or declares none. */
    public ElemType type() {
        return type;
    }

    public List<Dim> dims() {
        return dims;
    }

    /** One dimension of a declared shape. */
    public static final class Dim {
        private final long value;
        private final String param;

        private Dim(long value, String param) {
            this.value = value;
            this.param = param;
        }

        public static Dim fixed(long value) {
            return new Dim(value, null);
        }

        public static Dim symbolic(String param) {
            return new Dim(-1, param);
        }

        public static Dim unknown() {
            return new Dim(-1, null);
        }

        public boolean isFixed() {
            return value >= 0 && param == null;
        }

        public long value() {
            return value;
        }

        /** The symbolic name, or null. */
        public String param() {
            return param;
        }

        @Override
        public String toString() {
            return isFixed() ? Long.toString(value) : param != null ? param : "?";
        }
    }
}
