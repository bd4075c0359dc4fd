package dev.erg.measure;

/**
 * The measured time of one node over the timed runs.
 *
 * @param name     erg's name of the node (the ONNX node name)
 * @param opType   its operator
 * @param medianMs the median of its kernel time over the timed runs, in milliseconds
 * @param p90Ms    the 90th percentile (nearest rank), in milliseconds
 * @param samples  how many timed runs recorded it
 */
public record NodeTiming(String name, String opType, double medianMs, double p90Ms, int samples) {
}
