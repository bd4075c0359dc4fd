package dev.erg.shape;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.onnx.AttributeDef;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.TensorValues;
import java.util.Arrays;

/** What a {@link ShapeRule} sees of one node: inputs, attributes, opset; and where it puts outputs. */
public final class InferContext {
    private final Graph graph;
    private final Node node;
    private final ShapeInference engine;
    private String unmodelledReason;

    InferContext(Graph graph, Node node, ShapeInference engine) {
        this.graph = graph;
        this.node = node;
        this.engine = engine;
    }

    public Node node() {
        return node;
    }

    public Graph graph() {
        return graph;
    }

    ShapeInference engine() {
        return engine;
    }

    public long opset() {
        return node.opset();
    }

    public int inputCount() {
        return node.inputCount();
    }

    public int outputCount() {
        return node.outputs().size();
    }

    /** True when input {@code i} is present (not omitted). */
    public boolean has(int i) {
        return node.input(i) != null;
    }

    public Value in(int i) {
        Value v = node.input(i);
        if (v == null) {
            throw fail("needs input " + i + ", which is missing");
        }
        return v;
    }

    public long[] dims(int i) {
        return in(i).dims();
    }

    public int rank(int i) {
        return in(i).dims().length;
    }

    public ElemType type(int i) {
        return in(i).type();
    }

    /** The values of input {@code i} when known at analysis time, else null. */
    public TensorValues data(int i) {
        Value v = node.input(i);
        return v == null ? null : v.data();
    }

    /**
     * The values of input {@code i} as longs; the input must be known at analysis time (a shape, axes,
     * pads...). Fails with a message naming the input when it is not.
     */
    public long[] ints(int i, String what) {
        TensorValues t = data(i);
        if (t == null) {
            throw fail("its " + what + " (input " + i + ", '" + in(i).name()
                    + "') is not known at analysis time; erg needs it to be a constant or computable from shapes");
        }
        return t.longs();
    }

    public double[] reals(int i, String what) {
        TensorValues t = data(i);
        if (t == null) {
            throw fail("its " + what + " (input " + i + ", '" + in(i).name()
                    + "') is not known at analysis time; erg needs it to be a constant or computable from shapes");
        }
        return t.doubles();
    }

    // ---- attributes -------------------------------------------------------------------------

    public boolean hasAttr(String name) {
        return node.hasAttr(name);
    }

    public long attrInt(String name, long dflt) {
        return node.attrInt(name, dflt);
    }

    public float attrFloat(String name, float dflt) {
        return node.attrFloat(name, dflt);
    }

    public String attrString(String name, String dflt) {
        return node.attrString(name, dflt);
    }

    public long[] attrInts(String name) {
        return node.attrInts(name);
    }

    public float[] attrFloats(String name) {
        return node.attrFloats(name);
    }

    public AttributeDef attr(String name) {
        return node.attr(name);
    }

    // ---- outputs ----------------------------------------------------------------------------

    /** Sets output {@code i} (ignored when the node does not name that output). */
    public void out(int i, ElemType type, long[] dims) {
        Value v = node.output(i);
        if (v == null) {
            return;
        }
        for (long d : dims) {
            if (d < 0) {
                throw fail("output " + i + " would get the negative dim " + d + " " + Arrays.toString(dims));
            }
        }
        long n = 1;
        for (long d : dims) {
            try {
                n = Math.multiplyExact(n, d);
            } catch (ArithmeticException e) {
                throw fail("output " + i + " dims " + Arrays.toString(dims) + " overflow 64 bits");
            }
        }
        if (type == null) {
            throw fail("output " + i + " ('" + v.name() + "') gets no element type: its type attribute names a code"
                    + " the standard does not define, or an input's type is unknown");
        }
        if (type == ElemType.UNDEFINED) {
            throw fail("output " + i + " ('" + v.name() + "') gets the undefined element type (code 0), which no"
                    + " tensor may have");
        }
        v.setType(type, dims.clone());
    }

    /** Sets output {@code i} from its computed values (type and dims follow). */
    public void outData(int i, TensorValues data) {
        out(i, data.type(), data.dims());
        Value v = node.output(i);
        if (v != null) {
            v.setData(data);
        }
    }

    /**
     * Marks the node as not modelled, with the reason, instead of failing: a well-formed node whose
     * cost erg cannot work out (a Loop with a trip count known only at run time, a branch with an
     * unmodelled operator). The outputs the rule did set keep their shapes, so that nodes downstream
     * can still be shaped; the node itself is reported as unmodelled and priced at nothing.
     */
    public void unmodelled(String reason) {
        unmodelledReason = reason;
    }

    String unmodelledReason() {
        return unmodelledReason;
    }

    /** Records an assumption that the report should show beside this node. */
    public void note(String text) {
        node.setNote(node.note() == null ? text : node.note() + "; " + text);
    }

    /** A note that front ends show with the totals too (see {@link Node#warning()}). */
    public void warn(String text) {
        note(text);
        node.setWarning(node.warning() == null ? text : node.warning() + "; " + text);
    }

    /** A bad-input error naming the file and this node. */
    public BadInputException fail(String what) {
        return new BadInputException(graph.fileLabel() + ": node " + node.label() + " " + what);
    }

    /** Normalises a possibly negative axis against {@code rank}, failing when it is out of range. */
    public int axis(long axis, int rank) {
        long a = axis < 0 ? axis + rank : axis;
        if (a < 0 || a >= rank) {
            throw fail("has axis " + axis + " outside a tensor of rank " + rank);
        }
        return (int) a;
    }
}
