package dev.erg.conformance;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.GraphBuilder;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.NodeDef;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.OnnxReader;
import dev.erg.onnx.OnnxWriter;
import dev.erg.onnx.TensorDef;
import dev.erg.onnx.ValueDef;
import dev.erg.shape.ShapeInference;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashSet;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Runs one case both ways: erg's reader, graph builder and shape inference on the file, and
 * onnxruntime on the same bytes with every node output of the main graph exposed as a graph
 * output. Compares each value's shape and element type.
 */
final class Harness {
    private Harness() {
    }

    enum Status { OK, MISMATCH, RUNTIME_UNSUPPORTED, RUNTIME_ERROR }

    /** What one node of the main graph gave on both sides. */
    record NodeCheck(String opType, long opset, String node, List<String> problems, int values, boolean unresolved) {
        boolean ok() {
            return problems.isEmpty();
        }
    }

    record Result(Case c, long opset, Status status, String message, List<NodeCheck> nodes) {
        List<String> problems() {
            List<String> p = new ArrayList<>();
            if (message != null && status != Status.OK) {
                p.add(message);
            }
            for (NodeCheck n : nodes) {
                for (String s : n.problems()) {
                    p.add("node '" + n.node() + "' (" + n.opType() + "): " + s);
                }
            }
            return p;
        }
    }

    /** The IR version that goes with an opset (IR 8 carries up to opset 18, 9 up to 20, 10 up to 22). */
    static long irFor(long opset) {
        return opset <= 18 ? 8 : opset <= 20 ? 9 : 10;
    }

    static Result run(Case c, Path dir) {
        try {
            Files.createDirectories(dir);
            byte[] original;
            Set<String> bounds = Set.of();
            if (c.file != null) {
                original = Files.readAllBytes(c.file);
            } else {
                M m = new M(c.opset, c.id(), c.id().hashCode());
                c.body.accept(m);
                bounds = m.bounds;
                original = new OnnxWriter.Model(c.opset, m.g).irVersion(irFor(c.opset)).toBytes();
            }
            Path file = dir.resolve(c.id().replaceAll("[^A-Za-z0-9@_.-]+", "_") + (c.file != null ? "" : ".onnx"));
            Files.write(file, original);
            OnnxModel before = OnnxReader.read(file);
            Set<String> declared = new HashSet<>();
            for (ValueDef v : before.graph().outputs()) {
                declared.add(v.name());
            }
            List<String> added = new ArrayList<>();
            for (NodeDef n : before.graph().nodes()) {
                for (String o : n.outputs()) {
                    if (!o.isEmpty() && !declared.contains(o)) {
                        added.add(o);
                    }
                }
            }
            byte[] bytes = ModelEdit.addOutputs(original, added);
            Files.write(file, bytes);
            OnnxModel model = OnnxReader.read(file);
            long opset = model.defaultOpset();

            // erg
            Graph g = null;
            String ergError = null;
            try {
                g = GraphBuilder.build(model, c.dims);
                ShapeInference.run(g);
            } catch (BadInputException e) {
                ergError = e.getMessage();
            }

            // onnxruntime
            Set<String> inits = new HashSet<>();
            for (TensorDef t : model.graph().initializers()) {
                inits.add(t.name());
            }
            List<ValueDef> runtimeInputs = new ArrayList<>();
            for (ValueDef v : model.graph().inputs()) {
                if (!inits.contains(v.name())) {
                    runtimeInputs.add(v);
                }
            }
            Map<String, OrtRun.Out> ort;
            try {
                ort = OrtRun.run(bytes, runtimeInputs, c.dims, c.id().hashCode());
            } catch (OrtRun.Failure f) {
                String why = Known.RUNTIME_FAILS.get(c.id());
                if (why != null) {
                    return new Result(c, opset, Status.RUNTIME_UNSUPPORTED, why, List.of());
                }
                return new Result(c, opset, f.unsupported ? Status.RUNTIME_UNSUPPORTED : Status.RUNTIME_ERROR,
                        "onnxruntime: " + f.getMessage(), List.of());
            }
            if (ergError != null) {
                return new Result(c, opset, Status.MISMATCH, "erg rejects a model the runtime runs: " + ergError,
                        List.of());
            }
            List<NodeCheck> checks = new ArrayList<>();
            boolean bad = false;
            for (Node n : g.nodes()) {
                List<String> problems = new ArrayList<>();
                int values = 0;
                for (Value v : n.outputs()) {
                    if (v == null) {
                        continue;
                    }
                    values++;
                    String p = compare(n.status(), n.note(), v, ort.get(v.name()), bounds.contains(v.name()));
                    if (p != null) {
                        problems.add(p);
                    }
                }
                bad |= !problems.isEmpty();
                checks.add(new NodeCheck(n.opType(), n.opset(), n.name(), problems, values,
                        n.status() == Node.Status.UNRESOLVED));
            }
            return new Result(c, opset, bad ? Status.MISMATCH : Status.OK, null, checks);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static String show(ElemType t, long[] dims) {
        return (t == null ? "?" : t.name().toLowerCase()) + (dims == null ? "[?]" : Arrays.toString(dims));
    }

    /** Null when erg's value agrees with the runtime's output, else one line saying how they differ. */
    static String compare(Node.Status status, String note, Value v, OrtRun.Out o, boolean bound) {
        if (o == null) {
            return "'" + v.name() + "': the runtime gave no such output";
        }
        if (o.shape() == null) {
            return "'" + v.name() + "': the runtime gave a " + o.kind() + ", not a tensor";
        }
        ElemType ot = o.type();
        String ortShown = show(ot, o.shape());
        if (status != Node.Status.SHAPED || !v.hasShape()) {
            return "'" + v.name() + "': erg gives no shape (node " + status.name().toLowerCase()
                    + (note == null ? "" : ", " + note) + "), onnxruntime " + ortShown;
        }
        String ergShown = show(v.type(), v.dims());
        boolean typeOk = v.type() == ot;
        boolean shapeOk;
        if (bound) {
            shapeOk = v.dims().length == o.shape().length;
            for (int i = 0; shapeOk && i < o.shape().length; i++) {
                shapeOk = o.shape()[i] <= v.dims()[i];
            }
        } else {
            shapeOk = Arrays.equals(v.dims(), o.shape());
        }
        if (typeOk && shapeOk) {
            return null;
        }
        return "'" + v.name() + "': erg " + ergShown + (bound ? " (upper bound)" : "") + ", onnxruntime " + ortShown;
    }

    /** Every distinct (operator, opset) of the main graph, in file order. */
    static Set<String> operators(Result r) {
        Set<String> s = new LinkedHashSet<>();
        for (NodeCheck n : r.nodes()) {
            s.add(n.opType());
        }
        return s;
    }
}
