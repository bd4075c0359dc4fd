package dev.erg.shape;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.TreeSet;
import java.util.function.Function;

/**
 * An Einsum equation (ONNX operator definition: Einsum, opset 12) parsed against its operands' shapes:
 * the size of every label, the output shape, and the cost of evaluating it.
 *
 * <p>Labels are letters; {@code ...} stands for the broadcast leading dims, which get labels of their
 * own. A label repeated within one term takes a diagonal. Without {@code ->} (implicit form) the
 * output holds the ellipsis dims, then the labels that occur exactly once in the equation, in
 * alphabetical order.
 *
 * <p>Cost: with one operand, one vector op per point of its index space (a transpose, a diagonal, a
 * reduction). With two or more, the operands are contracted left to right, as runtimes evaluate
 * Einsum: a label that occurs in one operand only and not in the output is summed out of it first
 * (one vector op per point of that operand's index space), then each pairwise product costs one MAC
 * per point of the pair's joint index space, and the result keeps the labels still needed by the
 * output or a later operand. For two operands that is a batched matrix product whose batch labels
 * are in both operands and the output, M labels in the first operand and the output, N labels in the
 * second operand and the output, K labels in both operands only.
 */
public final class EinsumEquation {
    private static final char ELLIPSIS_BASE = '\uE000';

    private final List<Set<Character>> operands;
    private final String output;
    private final Map<Character, Long> size;
    private final long[] outDims;

    private EinsumEquation(List<Set<Character>> operands, String output, Map<Character, Long> size) {
        this.operands = operands;
        this.output = output;
        this.size = size;
        long[] d = new long[output.length()];
        for (int i = 0; i < d.length; i++) {
            d[i] = size.get(output.charAt(i));
        }
        this.outDims = d;
    }

    public long[] outDims() {
        return outDims.clone();
    }

    public int operandCount() {
        return operands.size();
    }

    /** Parses {@code equation} for operands of {@code dims}; {@code fail} makes the error for a bad equation. */
    public static EinsumEquation parse(String equation, List<long[]> dims, Function<String, RuntimeException> fail) {
        String eq = equation.replace(" ", "");
        if (eq.isEmpty()) {
            throw fail.apply("has no equation");
        }
        int arrow = eq.indexOf("->");
        String lhs = arrow >= 0 ? eq.substring(0, arrow) : eq;
        String rhs = arrow >= 0 ? eq.substring(arrow + 2) : null;
        String[] terms = lhs.split(",", -1);
        if (terms.length != dims.size()) {
            throw fail.apply("has an equation with " + terms.length + " operands for " + dims.size() + " inputs");
        }
        // The rank of the ellipsis: the most dims any operand gives it.
        int ellRank = 0;
        int[] ellOf = new int[terms.length];
        for (int i = 0; i < terms.length; i++) {
            String t = terms[i];
            int dots = t.indexOf("...");
            if (dots >= 0 && t.indexOf("...", dots + 1) >= 0) {
                throw fail.apply("has more than one ellipsis in term '" + t + "'");
            }
            int letters = t.replace("...", "").length();
            for (char ch : t.replace("...", "").toCharArray()) {
                if (!Character.isLetter(ch)) {
                    throw fail.apply("has '" + ch + "' in term '" + t + "', not a letter");
                }
            }
            int e = dots >= 0 ? dims.get(i).length - letters : 0;
            if (e < 0 || (dots < 0 && letters != dims.get(i).length)) {
                throw fail.apply("has equation term '" + t + "' for an input of rank " + dims.get(i).length);
            }
            ellOf[i] = e;
            ellRank = Math.max(ellRank, e);
        }
        StringBuilder ellLabels = new StringBuilder();
        for (int k = 0; k < ellRank; k++) {
            ellLabels.append((char) (ELLIPSIS_BASE + k));
        }
        Map<Character, Long> size = new LinkedHashMap<>();
        Map<Character, Integer> occurrences = new LinkedHashMap<>();
        List<Set<Character>> operands = new ArrayList<>();
        for (int i = 0; i < terms.length; i++) {
            String t = terms[i].replace("...", ellLabels.substring(ellRank - ellOf[i]));
            long[] d = dims.get(i);
            Set<Character> labels = new LinkedHashSet<>();
            for (int a = 0; a < t.length(); a++) {
                char ch = t.charAt(a);
                long dim = d[a];
                Long prev = size.get(ch);
                boolean ell = ch >= ELLIPSIS_BASE;
                if (prev != null && prev != dim) {
                    if (labels.contains(ch) || !(prev == 1 || dim == 1)) {
                        throw fail.apply(ell ? "has ellipsis dims " + prev + " and " + dim + " that do not broadcast"
                                : "gives label '" + ch + "' the sizes " + prev + " and " + dim);
                    }
                }
                size.put(ch, prev == null || prev == 1 ? dim : prev);
                if (!ell) {
                    occurrences.merge(ch, 1, Integer::sum);
                }
                labels.add(ch);
            }
            operands.add(labels);
        }
        String out;
        if (rhs == null) {
            StringBuilder b = new StringBuilder(ellLabels);
            new TreeSet<>(occurrences.keySet()).stream().filter(ch -> occurrences.get(ch) == 1).forEach(b::append);
            out = b.toString();
        } else {
            int dots = rhs.indexOf("...");
            if (dots < 0 && ellRank > 0) {
                throw fail.apply("has an ellipsis in its operands but not in its output '" + rhs + "'");
            }
            out = dots >= 0 ? rhs.replace("...", ellLabels) : rhs;
            Set<Character> seen = new LinkedHashSet<>();
            for (char ch : out.toCharArray()) {
                if (!size.containsKey(ch)) {
                    throw fail.apply("has output label '" + ch + "' that no operand has");
                }
                if (!seen.add(ch)) {
                    throw fail.apply("repeats output label '" + ch + "'");
                }
            }
        }
        return new EinsumEquation(operands, out, size);
    }

    private long space(Set<Character> labels) {
        long n = 1;
        for (char ch : labels) {
            n = Math.multiplyExact(n, size.get(ch));
        }
        return n;
    }

    /** The cost of an Einsum: MACs, vector ops, and for two operands its view as a batched matrix product. */
    public static final class Cost {
        public final long macs;
        public final long vectorOps;
        /** Per group m x k x n, {@code groups} groups; all 0 when there is no single-product view. */
        public final long m;
        public final long k;
        public final long n;
        public final long groups;

        Cost(long macs, long vectorOps, long m, long k, long n, long groups) {
            this.macs = macs;
            this.vectorOps = vectorOps;
            this.m = m;
            this.k = k;
            this.n = n;
            this.groups = groups;
        }
    }

    /** The cost, by the left-to-right contraction of the class comment. */
    public Cost cost() {
        Set<Character> outSet = new LinkedHashSet<>();
        for (char ch : output.toCharArray()) {
            outSet.add(ch);
        }
        if (operands.size() == 1) {
            return new Cost(0, space(operands.get(0)), 0, 0, 0, 0);
        }
        long vector = 0;
        List<Set<Character>> ops = new ArrayList<>();
        for (int i = 0; i < operands.size(); i++) {
            Set<Character> own = new LinkedHashSet<>(operands.get(i));
            Set<Character> keep = new LinkedHashSet<>();
            for (char ch : own) {
                boolean elsewhere = outSet.contains(ch);
                for (int j = 0; j < operands.size() && !elsewhere; j++) {
                    elsewhere = j != i && operands.get(j).contains(ch);
                }
                if (elsewhere) {
                    keep.add(ch);
                }
            }
            if (keep.size() < own.size()) {
                vector = Math.addExact(vector, space(own)); // summed out of this operand first
            }
            ops.add(keep);
        }
        long macs = 0;
        Set<Character> cur = ops.get(0);
        for (int i = 1; i < ops.size(); i++) {
            Set<Character> joint = new LinkedHashSet<>(cur);
            joint.addAll(ops.get(i));
            macs = Math.addExact(macs, space(joint));
            Set<Character> needed = new LinkedHashSet<>(outSet);
            for (int j = i + 1; j < ops.size(); j++) {
                needed.addAll(ops.get(j));
            }
            joint.retainAll(needed);
            cur = joint;
        }
        if (ops.size() == 2) {
            Set<Character> a = ops.get(0);
            Set<Character> b = ops.get(1);
            Set<Character> batch = new LinkedHashSet<>();
            Set<Character> m = new LinkedHashSet<>();
            Set<Character> n = new LinkedHashSet<>();
            Set<Character> k = new LinkedHashSet<>();
            Set<Character> all = new LinkedHashSet<>(a);
            all.addAll(b);
            for (char ch : all) {
                boolean inA = a.contains(ch);
                boolean inB = b.contains(ch);
                boolean inOut = outSet.contains(ch);
                if (inA && inB && inOut) {
                    batch.add(ch);
                } else if (inA && inB) {
                    k.add(ch);
                } else if (inA) {
                    m.add(ch);
                } else {
                    n.add(ch);
                }
            }
            return new Cost(macs, vector, space(m), space(k), space(n), space(batch));
        }
        return new Cost(macs, vector, 0, 0, 0, 0);
    }

    @Override
    public String toString() {
        return operands + "->" + output + " " + Arrays.toString(outDims);
    }
}
