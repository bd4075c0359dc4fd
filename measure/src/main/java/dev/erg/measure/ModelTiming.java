package dev.erg.measure;

import java.util.List;

/**
 * What {@code erg measure} found for one model.
 *
 * @param model       the model's file name
 * @param runtime     "onnxruntime VERSION, CPU"
 * @param threads     intra-op threads
 * @param warmups     untimed runs before the timed ones
 * @param clock       what timed the whole runs: "wall" (wall-clock time) or "cpu" (the calling thread's CPU time)
 * @param runMs       the wall time of every timed run, in milliseconds, in run order
 * @param medianMs    the median of {@code runMs}
 * @param p90Ms       the 90th percentile of {@code runMs} (nearest rank)
 * @param nodes       per node, in erg's topological order, the nodes onnxruntime ran
 * @param inputs      the generated inputs, "name: type[dims]"
 * @param notRun      erg's nodes that onnxruntime did not run as kernels of their own (Constant nodes, which the
 *                    runtime turns into initializers when it loads the model)
 * @param seed        the seed of the generated inputs
 * @param measuredAt  when the timed runs ended (UTC, ISO-8601, to the second)
 * @param host        the host's processor and logical core count
 */
public record ModelTiming(String model, String runtime, int threads, int warmups, String clock, double[] runMs, double medianMs,
                          double p90Ms, List<NodeTiming> nodes, List<String> inputs, List<String> notRun, long seed,
                          String measuredAt, String host) {
    /** The sum of the node medians: the time spent inside kernels, without the runtime's own work between them. */
    public double nodeSumMs() {
        double s = 0;
        for (NodeTiming n : nodes) {
            s += n.medianMs();
        }
        return s;
    }
}
