package dev.erg.onnx;

/** Element types of the ONNX standard (TensorProto.DataType), with their storage width. */
public enum ElemType {
    UNDEFINED(0, 0, "undefined"),
    FLOAT(1, 32, "fp32"),
    UINT8(2, 8, "uint8"),
    INT8(3, 8, "int8"),
    UINT16(4, 16, "uint16"),
    INT16(5, 16, "int16"),
    INT32(6, 32, "int32"),
    INT64(7, 64, "int64"),
    STRING(8, 0, "string"),
    BOOL(9, 8, "bool"),
    FLOAT16(10, 16, "fp16"),
    DOUBLE(11, 64, "fp64"),
    UINT32(12, 32, "uint32"),
    UINT64(13, 64, "uint64"),
    COMPLEX64(14, 64, "complex64"),
    COMPLEX128(15, 128, "complex128"),
    BFLOAT16(16, 16, "bf16"),
    FLOAT8E4M3FN(17, 8, "fp8e4m3"),
    FLOAT8E4M3FNUZ(18, 8, "fp8e4m3fnuz"),
    FLOAT8E5M2(19, 8, "fp8e5m2"),
    FLOAT8E5M2FNUZ(20, 8, "fp8e5m2fnuz"),
    UINT4(21, 4, "uint4"),
    INT4(22, 4, "int4"),
    FLOAT4E2M1(23, 4, "fp4");

    private static final ElemType[] BY_CODE = new ElemType[24];
    private static final boolean[] FLOATING = new boolean[values().length];

    static {
        for (ElemType t : values()) {
            BY_CODE[t.code] = t;
            FLOATING[t.ordinal()] = t.floatingByKind();
        }
    }

    public final int code;
    public final int bits;
    public final String label;

    ElemType(int code, int bits, String label) {
        this.code = code;
        this.bits = bits;
        this.label = label;
    }

    /** The type with this TensorProto.DataType code, or null when the code is not in the standard. */
    public static ElemType ofCode(long code) {
        return code >= 0 && code < BY_CODE.length ? BY_CODE[(int) code] : null;
    }

    public boolean isFloat() {
        return FLOATING[ordinal()];
    }

    private boolean floatingByKind() {
        switch (this) {
            case FLOAT: case FLOAT16: case DOUBLE: case BFLOAT16: case FLOAT8E4M3FN: case FLOAT8E4M3FNUZ:
            case FLOAT8E5M2: case FLOAT8E5M2FNUZ: case FLOAT4E2M1:
                return true;
            default:
                return false;
        }
    }

    public boolean isInteger() {
        switch (this) {
            case UINT8: case INT8: case UINT16: case INT16: case INT32: case INT64: case UINT32: case UINT64:
            case UINT4: case INT4: case BOOL:
                return true;
            default:
                return false;
        }
    }

    /** Bytes taken by {@code elements} values of this type (sub-byte types are packed, rounded up). */
    public long bytes(long elements) {
        if (bits == 0) {
            return 0;
        }
        return Math.multiplyExact(elements, bits) / 8 + ((elements * bits) % 8 == 0 ? 0 : 1);
    }
}
