#!/usr/bin/python3
"""Makes a runnable copy of an ONNX graph whose weight payloads were removed.

    /usr/bin/python3 bench/fill_weights.py SOURCE.graph.onnx OUT_DIR [SEED]

Every initializer whose data is external (the weight-stripped *.graph.onnx files keep only their
dims, element type and external-data entries) gets seeded random values of its own element type
and shape, written into the copy: floats drawn from N(0, 1/fan_in), integers in [-8, 8). Small
initializers stored in the file (shapes, axes, scales) are kept as they are. The copy keeps the
source's file name and node names, so erg's analysis of the source and the copy agree node by node.
Needs Debian's python3-onnx and python3-numpy. Only timing runs use the copies: the values are random.
"""
import os
import sys

import numpy as np
import onnx
from onnx import mapping, numpy_helper, TensorProto


def filled(t, rng):
    dtype = mapping.TENSOR_TYPE_TO_NP_TYPE[t.data_type]
    shape = tuple(int(d) for d in t.dims)
    if np.issubdtype(dtype, np.floating):
        fan_in = int(np.prod(shape[1:])) if len(shape) > 1 else max(1, shape[0] if shape else 1)
        arr = rng.standard_normal(shape) / np.sqrt(max(1, fan_in))
    elif dtype == np.bool_:
        arr = rng.integers(0, 2, shape)
    else:
        lo = 0 if np.issubdtype(dtype, np.unsignedinteger) else -8
        arr = rng.integers(lo, 8, shape)
    return numpy_helper.from_array(arr.astype(dtype), t.name)


def main():
    if len(sys.argv) < 3:
        sys.exit("usage: fill_weights.py SOURCE.onnx OUT_DIR [SEED]")
    src, out_dir = sys.argv[1], sys.argv[2]
    seed = int(sys.argv[3]) if len(sys.argv) > 3 else 1
    model = onnx.load(src, load_external_data=False)
    rng = np.random.default_rng(seed)
    count = 0
    for t in model.graph.initializer:
        if t.data_location == TensorProto.EXTERNAL:
            t.CopyFrom(filled(t, rng))
            count += 1
    os.makedirs(out_dir, exist_ok=True)
    dst = os.path.join(out_dir, os.path.basename(src))
    onnx.save(model, dst)
    print(f"{dst}: {count} initializers filled (seed {seed})")


if __name__ == "__main__":
    main()
