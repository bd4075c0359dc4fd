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

    static {
    }
}
