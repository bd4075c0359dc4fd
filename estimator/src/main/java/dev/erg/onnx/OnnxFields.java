package dev.erg.onnx;

/**
 * Field numbers of the ONNX protobuf messages that erg reads, as onnx.proto3 of the ONNX standard
 * numbers them. One constant per field, prefixed by its message.
 */
final class OnnxFields {
    private OnnxFields() {
    }

    // ModelProto
    static final int MODEL_IR_VERSION = 1;
    static final int MODEL_PRODUCER_NAME = 2;
    static final int MODEL_PRODUCER_VERSION = 3;
    static final int MODEL_DOMAIN = 4;
    static final int MODEL_MODEL_VERSION = 5;
    static final int MODEL_DOC_STRING = 6;
    static final int MODEL_GRAPH = 7;
    static final int MODEL_OPSET_IMPORT = 8;

    // OperatorSetIdProto
    static final int OPSET_DOMAIN = 1;
    static final int OPSET_VERSION = 2;

    // GraphProto
    static final int GRAPH_NODE = 1;
    static final int GRAPH_NAME = 2;
    static final int GRAPH_INITIALIZER = 5;
    static final int GRAPH_INPUT = 11;
    static final int GRAPH_OUTPUT = 12;
    static final int GRAPH_VALUE_INFO = 13;
    static final int GRAPH_SPARSE_INITIALIZER = 15;

    // NodeProto
    static final int NODE_INPUT = 1;
    static final int NODE_OUTPUT = 2;
    static final int NODE_NAME = 3;
    static final int NODE_OP_TYPE = 4;
    static final int NODE_ATTRIBUTE = 5;
    static final int NODE_DOMAIN = 7;

    // AttributeProto
    static final int ATTR_NAME = 1;
    static final int ATTR_F = 2;
    static final int ATTR_I = 3;
    static final int ATTR_S = 4;
    static final int ATTR_T = 5;
    static final int ATTR_G = 6;
    static final int ATTR_FLOATS = 7;
    static final int ATTR_INTS = 8;
    static final int ATTR_STRINGS = 9;
    static final int ATTR_TENSORS = 10;
    static final int ATTR_GRAPHS = 11;
    static final int ATTR_TYPE = 20;
    static final int ATTR_REF_ATTR_NAME = 21;
    static final int ATTR_SPARSE_TENSOR = 22;

    // ValueInfoProto, TypeProto, TypeProto.Tensor, TensorShapeProto, TensorShapeProto.Dimension
    static final int VALUE_NAME = 1;
    static final int VALUE_TYPE = 2;
    static final int TYPE_TENSOR_TYPE = 1;
    static final int TENSOR_TYPE_ELEM_TYPE = 1;
    static final int TENSOR_TYPE_SHAPE = 2;
    static final int SHAPE_DIM = 1;
    static final int DIM_VALUE = 1;
    static final int DIM_PARAM = 2;

    // TensorProto
    static final int TENSOR_DIMS = 1;
    static final int TENSOR_DATA_TYPE = 2;
    static final int TENSOR_FLOAT_DATA = 4;
    static final int TENSOR_INT32_DATA = 5;
    static final int TENSOR_STRING_DATA = 6;
    static final int TENSOR_INT64_DATA = 7;
    static final int TENSOR_NAME = 8;
    static final int TENSOR_RAW_DATA = 9;
    static final int TENSOR_DOUBLE_DATA = 10;
    static final int TENSOR_UINT64_DATA = 11;
    static final int TENSOR_EXTERNAL_DATA = 13;
    static final int TENSOR_DATA_LOCATION = 14;
    /** TensorProto.DataLocation value EXTERNAL (an enum value, not a field number). */
    static final int DATA_LOCATION_EXTERNAL = 1;

    // StringStringEntryProto
    static final int ENTRY_KEY = 1;
    static final int ENTRY_VALUE = 2;

    // SparseTensorProto
    static final int SPARSE_VALUES = 1;
    static final int SPARSE_INDICES = 2;
    static final int SPARSE_DIMS = 3;
}
