package dev.erg.analysis;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.GraphBuilder;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.OnnxReader;
import dev.erg.shape.ShapeInference;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.WorkloadCounter;
import java.nio.file.Path;
import java.util.Map;

/** The analysis pipeline in one call: read, link and order, infer shapes, count the work. */
public final class Analyzer {
    private Analyzer() {
    }

    /**
     * Analyses the model in {@code file}.
     *
     * @param dims values for symbolic dims (e.g. {@code batch=1})
     * @throws BadInputException when the file, the graph or a binding is unusable
     */
    public static ModelWorkload analyze(Path file, Map<String, Long> dims) {
        return analyze(file, dims, AnalysisOptions.DEFAULTS);
    }

    /**
     * Analyses the model in {@code file} with {@code options}.
     *
     * @param dims values for symbolic dims (e.g. {@code batch=1})
     * @throws BadInputException when the file, the graph or a binding is unusable, or, with
     *                           {@code failOnUnmodelled}, when some node has no rule
     */
    public static ModelWorkload analyze(Path file, Map<String, Long> dims, AnalysisOptions options) {
        return analyze(file, InputBindings.ofDims(dims), options);
    }

    /**
     * Analyses the model in {@code file} with the user's {@code bindings} of its runtime inputs:
     * symbolic dims, whole input shapes and constant input values (folded like initializers). The
     * result's graph lists the bindings in effect ({@code graph().bindings()}).
     *
     * @throws BadInputException when the file, the graph or a binding is unusable (a value that does not
     *                           fit its input's declared type and shape, a name that is no input), or,
     *                           with {@code failOnUnmodelled}, when some node has no rule
     */
    public static ModelWorkload analyze(Path file, InputBindings bindings, AnalysisOptions options) {
        return analyze(OnnxReader.read(file), bindings, options);
    }

    /**
     * Analyses a model already read: links, shapes and counts it with {@code bindings}. The model is
     * not changed, so one read serves many bindings (a sweep over a symbolic dim).
     *
     * @throws BadInputException as {@link #analyze(Path, InputBindings, AnalysisOptions)}
     */
    public static ModelWorkload analyze(OnnxModel model, InputBindings bindings, AnalysisOptions options) {
        Graph graph = GraphBuilder.build(model, bindings);
        ShapeInference.run(graph);
        ModelWorkload w = WorkloadCounter.count(graph);
        return options.failOnUnmodelled() ? w.requireComplete() : w;
    }

    /** The warnings of nodes (a dropped If branch), in topological order, nested subgraphs included. */
    private static void nodeWarnings(Graph g, java.util.List<String> out) {
        for (dev.erg.graph.Node n : g.nodes()) {
            if (n.warning() != null) {
                out.add(g.fileLabel() + ": node " + n.label() + ": " + n.warning());
            }
            for (Graph sub : n.subgraphs()) {
                nodeWarnings(sub, out);
            }
        }
    }

    /**
     * Notes on the analysis for the user: the reader's warnings (an opset newer than erg knows), the
     * nodes' warnings (an If branch dropped because it cannot be shaped), then
     * bindings that match no symbolic dim of the model's inputs (a typo goes unnoticed otherwise), one
     * sentence per unused name, sorted; empty when there is nothing to say.
     */
    public static java.util.List<String> unusedDimNotes(ModelWorkload w, Map<String, Long> dims) {
        java.util.List<String> notes = new java.util.ArrayList<>();
        if (w.graph().model() != null) {
            notes.addAll(w.graph().model().warnings()); // e.g. an opset newer than erg knows
        }
        nodeWarnings(w.graph(), notes);
        for (String name : new java.util.TreeSet<>(dims.keySet())) {
            if (!w.info().boundDims().containsKey(name)) {
                notes.add(w.info().fileLabel() + ": the dimension '" + name
                        + "' is bound, but no graph input has a symbolic dim of that name; the binding is unused");
            }
        }
        return notes;
    }
}
