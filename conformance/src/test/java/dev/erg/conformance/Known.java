package dev.erg.conformance;

import java.util.Map;
import java.util.TreeMap;

/**
 * Cases where erg and onnxruntime are known to disagree, by case id, with the reason. A listed
 * case must still disagree: once a rule is fixed its entry has to go (the suite says so).
 */
final class Known {
    private Known() {
    }

    static final Map<String, String> MISMATCHES = new TreeMap<>();

    /**
     * Cases that the standard allows but the runtime fails on (not erg's doing), by case id: shown as
     * not supported by the runtime, with the reason.
     */
    static final Map<String, String> RUNTIME_FAILS = new TreeMap<>();

    static {
        // No known mismatch: the Dropout mask type of opsets 7-9 and the Loop and Scan rules agree now.

        String omitted = "the runtime fails at run time when noop_with_empty_axes = 1 and the axes input is omitted"
                + " (it reduces all axes, then expects one element); the same node with an empty axes tensor"
                + " runs and agrees (case 'noop_with_empty_axes, empty axes')";
        RUNTIME_FAILS.put("ReduceSum noop_with_empty_axes, axes omitted @13", omitted);
        for (String op : new String[] {"ReduceSum", "ReduceMean", "ReduceMax", "ReduceMin", "ReduceProd", "ReduceL1",
            "ReduceL2", "ReduceLogSum", "ReduceLogSumExp", "ReduceSumSquare"}) {
            RUNTIME_FAILS.put(op + " noop_with_empty_axes, axes omitted @18", omitted);
        }
    }
}
