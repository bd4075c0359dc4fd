package dev.erg.report;

import dev.erg.format.Numbers;
import dev.erg.workload.ModelInfo;
import dev.erg.workload.Kind;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.NodeWork;
import java.util.Map;
import java.util.TreeMap;

/** Shape and model facts shared by the report writers; numbers go through {@link Numbers}. */
final class Format {

    /** The name the JSON and the table give the default ONNX domain (stored as the empty string). */
    static final String DEFAULT_DOMAIN = "ai.onnx";

    private Format() {
    }

    /** A count with a decimal unit ({@link Numbers#count}). */
    static String count(long v) {
        return Numbers.count(v);
    }

    /** A byte size with a binary unit ({@link Numbers#bytes}). */
    static String bytes(long v) {
        return Numbers.bytes(v);
    }

    /** A whole number with thousands separators ({@link Numbers#exact}). */
    static String exact(long v) {
        return Numbers.exact(v);
    }

    /** A shape as 1x64x56x56; "scalar" for rank 0, "?" when unknown. */
    static String shape(long[] dims) {
        if (dims == null) {
            return "?";
        }
        if (dims.length == 0) {
            return "scalar";
        }
        StringBuilder b = new StringBuilder();
        for (int i = 0; i < dims.length; i++) {
            b.append(i == 0 ? "" : "x").append(dims[i]);
        }
        return b.toString();
    }

    /** The number of nodes of kind {@code k}. */
    static int countKind(ModelWorkload w, Kind k) {
        int n = 0;
        for (NodeWork nw : w.nodes()) {
            if (nw.kind() == k) {
                n++;
            }
        }
        return n;
    }

    /** What the reports say about the model, copied out of the analysis. */
    static ModelInfo model(ModelWorkload w) {
        return w.info();
    }

    /** Opset per domain, sorted by domain name, the default domain shown as {@value #DEFAULT_DOMAIN}. */
    static Map<String, Long> opsets(ModelInfo m) {
        Map<String, Long> out = new TreeMap<>();
        for (Map.Entry<String, Long> e : m.opsets().entrySet()) {
            out.put(e.getKey().isEmpty() ? DEFAULT_DOMAIN : e.getKey(), e.getValue());
        }
        return out;
    }

    /**
     * The input bindings in effect, one line ({@code dims batch=1; shapes input=1x576; values sr=16000}),
     * or empty when nothing is bound.
     */
    static String bindings(ModelWorkload w) {
        return w == null || w.graph() == null ? "" : w.graph().bindings().describe();
    }

    /** The symbolic dims bound for this analysis, sorted by name. */
    static Map<String, Long> dims(ModelWorkload w) {
        return w.info().boundDims();
    }

    /** An energy in joules with a readable unit ({@link Numbers#joules}). */
    static String joules(double j) {
        return Numbers.joules(j);
    }

    /** A quantity ({@link Numbers#sig}): the one rule for every number in every report. */
    static String sig(double v) {
        return Numbers.sig(v);
    }

    static String fixed(double v, int decimals) {
        return Numbers.fixed(v, decimals);
    }

    static String percent(double share) {
        return Numbers.percent(share);
    }

    static String signed(double v) {
        return Numbers.signed(v);
    }

    static String signedExact(long v) {
        return Numbers.signedExact(v);
    }

    /** {@code s} with a capital first letter and a closing full stop. */
    static String sentence(String s) {
        if (s.isEmpty()) {
            return s;
        }
        String t = Character.toUpperCase(s.charAt(0)) + s.substring(1);
        return t.endsWith(".") ? t : t + ".";
    }
}
