"""The benchmarks' peer: ONNX's own shape inference (C++, through Debian's python3-onnx).

Loads the model with onnx.load (external data left unloaded: the scale models' weight file is never
written) and runs onnx.shape_inference.infer_shapes on it, with data propagation when asked (shape
arithmetic such as Shape -> Gather -> Concat -> Reshape then gets values, as in erg). Prints the node
count, the number of values it gave a shape to, and the shape of the first graph output, so that a
peer that gave up early shows it.

Usage: python3 onnx_peer.py MODEL.onnx [--data-prop]
"""
import sys

import onnx
from onnx import shape_inference


def dims(value):
    t = value.type.tensor_type
    if not t.HasField("shape"):
        return "no shape"
    return "x".join(d.dim_param if d.HasField("dim_param") else str(d.dim_value) if d.HasField("dim_value") else "?"
                    for d in t.shape.dim)


def main():
    path = sys.argv[1]
    data_prop = "--data-prop" in sys.argv[2:]
    model = onnx.load(path, load_external_data=False)
    inferred = shape_inference.infer_shapes(model, data_prop=data_prop)
    shaped = sum(1 for v in inferred.graph.value_info if v.type.tensor_type.HasField("shape"))
    out = inferred.graph.output[0]
    print("%d nodes, %d values shaped, output %s: %s" % (len(inferred.graph.node), shaped, out.name, dims(out)))


if __name__ == "__main__":
    main()
