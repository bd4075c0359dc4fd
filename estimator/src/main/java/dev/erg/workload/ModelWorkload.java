package dev.erg.workload;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import java.util.List;
import java.util.Map;

/** The workload of a whole model: every node's work, the totals, and what erg could not model. */
public final class ModelWorkload {
    private final Graph graph;
    private final ModelInfo info;
    private final List<NodeWork> nodes;
    private final long macs;
    private final long vectorOps;
    private final long weightBytes;
    private final long peakActivationBytes;
    private final Map<String, Integer> unmodelled;
    private final Map<String, Integer> unresolved;

    ModelWorkload(Graph graph, List<NodeWork> nodes, long macs, long vectorOps, long weightBytes,
                  long peakActivationBytes, Map<String, Integer> unmodelled, Map<String, Integer> unresolved) {
        this.graph = graph;
        this.info = ModelInfo.of(graph);
        this.nodes = List.copyOf(nodes);
        this.macs = macs;
        this.vectorOps = vectorOps;
        this.weightBytes = weightBytes;
        this.peakActivationBytes = peakActivationBytes;
        this.unmodelled = Map.copyOf(unmodelled);
        this.unresolved = Map.copyOf(unresolved);
    }

    /**
     * The analysis's working graph, for the stages after the workload (estimation). Reports read
     * {@link #info()} and {@link #nodes()} instead: they never hold the graph.
     */
    public Graph graph() {
        return graph;
    }

    /** What reports say about the model: file, producer, opsets, bound dims. Immutable. */
    public ModelInfo info() {
        return info;
    }

    /** Every node of the main graph, in topological order. */
    public List<NodeWork> nodes() {
        return nodes;
    }

    public long macs() {
        return macs;
    }

    public long vectorOps() {
        return vectorOps;
    }

    /**
     * Bytes of the model's stored weights: every initializer, plus Constant-node tensors that feed a
     * MAC operator (exporters that inline weights as Constant nodes), each counted once.
     */
    public long weightBytes() {
        return weightBytes;
    }

    /** The most activation bytes live at once over the topological schedule. */
    public long peakActivationBytes() {
        return peakActivationBytes;
    }

    /** Operator types with no rule, with the number of nodes of each (sorted by name). */
    public Map<String, Integer> unmodelled() {
        return new java.util.TreeMap<>(unmodelled);
    }

    /** Operator types of nodes left unshaped because of an unmodelled node upstream, with counts. */
    public Map<String, Integer> unresolved() {
        return new java.util.TreeMap<>(unresolved);
    }

    /** True when every node was shaped and priced by a rule. */
    public boolean complete() {
        return unmodelled.isEmpty() && unresolved.isEmpty();
    }

    /**
     * Returns this workload when it is complete; otherwise fails with one line that names the file
     * and lists the operators without a rule and those left unresolved, with their node counts.
     *
     * @throws BadInputException when some node was not modelled
     */
    public ModelWorkload requireComplete() {
        if (complete()) {
            return this;
        }
        throw new BadInputException(incompleteness());
    }

    /** One line naming what was not modelled ("...: the analysis is incomplete: no rule for X (2 nodes)"), or null. */
    public String incompleteness() {
        if (complete()) {
            return null;
        }
        StringBuilder b = new StringBuilder(graph.fileLabel()).append(": the analysis is incomplete:");
        if (!unmodelled.isEmpty()) {
            b.append(" no rule for ").append(list(unmodelled()));
        }
        if (!unresolved.isEmpty()) {
            b.append(unmodelled.isEmpty() ? " " : "; ").append("unresolved downstream: ").append(list(unresolved()));
        }
        return b.toString();
    }

    private static String list(Map<String, Integer> counts) {
        StringBuilder b = new StringBuilder();
        for (Map.Entry<String, Integer> e : counts.entrySet()) {
            b.append(b.length() == 0 ? "" : ", ").append(e.getKey()).append(" (").append(e.getValue())
                    .append(e.getValue() == 1 ? " node)" : " nodes)");
        }
        return b.toString();
    }
}
