package dev.erg.shape;

import dev.erg.onnx.ElemType;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Matrix products: Gemm, MatMul (numpy semantics), their integer and quantized forms, Einsum. */
final class MatMulRules {
    private MatMulRules() {
    }

    static void register(RuleTable t) {
        t.add("Gemm", MatMulRules::gemm);
        t.add("MatMul", c -> c.out(0, c.type(0), matmul(c, c.dims(0), c.dims(1))));
        t.add("MatMulInteger", c -> c.out(0, ElemType.INT32, matmul(c, c.dims(0), c.dims(1))));
        t.add("QLinearMatMul", c -> c.out(0, c.type(7), matmul(c, c.dims(0), c.dims(3))));
        t.add("Einsum", c -> c.out(0, c.type(0), Einsum.parse(c).outDims));
    }

    static void gemm(InferContext c) {
        long[] a = c.dims(0);
        long[] b = c.dims(1);
        if (a.length != 2 || b.length != 2) {
            throw c.fail("needs 2-D inputs, got " + Arrays.toString(a) + " and " + Arrays.toString(b));
        }
        boolean ta = c.attrInt("transA", 0) == 1;
        boolean tb = c.attrInt("transB", 0) == 1;
        long m = ta ? a[1] : a[0];
        long ka = ta ? a[0] : a[1];
        long kb = tb ? b[1] : b[0];
        long n = tb ? b[0] : b[1];
        if (ka != kb) {
            throw c.fail("multiplies " + Arrays.toString(a) + (ta ? "^T" : "") + " by " + Arrays.toString(b)
                    + (tb ? "^T" : "") + ": inner dims " + ka + " and " + kb + " differ");
        }
        c.out(0, c.type(0), new long[] {m, n});
    }

    /** The output shape of a numpy-style matrix product. */
    static long[] matmul(InferContext c, long[] a, long[] b) {
        if (a.length == 0 || b.length == 0) {
            throw c.fail("multiplies a scalar");
        }
        long[] aa = a.length == 1 ? new long[] {1, a[0]} : a;
        long[] bb = b.length == 1 ? new long[] {b[0], 1} : b;
        long k1 = aa[aa.length - 1];
        long k2 = bb[bb.length - 2];
        if (k1 != k2) {
            throw c.fail("multiplies " + Arrays.toString(a) + " by " + Arrays.toString(b) + ": inner dims "
                    + k1 + " and " + k2 + " differ");
        }
        long[] batch = Shapes.broadcast(c, Arrays.copyOf(aa, aa.length - 2), Arrays.copyOf(bb, bb.length - 2));
        List<Long> out = new ArrayList<>();
        for (long d : batch) {
            out.add(d);
        }
        if (a.length > 1) {
            out.add(aa[aa.length - 2]);
        }
        if (b.length > 1) {
            out.add(bb[bb.length - 1]);
        }
        return out.stream().mapToLong(Long::longValue).toArray();
    }

    /** A parsed Einsum equation with the size of every index. */
    static final class Einsum {
        final long[] outDims;
        /** Product of the sizes of every distinct index: the multiply count of the contraction. */
        final long fullProduct;

        private Einsum(long[] outDims, long fullProduct) {
            this.outDims = outDims;
            this.fullProduct = fullProduct;
        }

        static Einsum parse(InferContext c) {
            String eq = c.attrString("equation", "").replace(" ", "");
            if (eq.isEmpty()) {
                throw c.fail("has no equation");
            }
            String lhs = eq.contains("->") ? eq.substring(0, eq.indexOf("->")) : eq;
            String rhs = eq.contains("->") ? eq.substring(eq.indexOf("->") + 2) : null;
            String[] terms = lhs.split(",", -1);
            if (terms.length != c.inputCount()) {
                throw c.fail("has an equation with " + terms.length + " operands for " + c.inputCount() + " inputs");
            }
            Map<Character, Long> size = new LinkedHashMap<>();
            Map<Character, Integer> count = new LinkedHashMap<>();
            long[] ellipsis = new long[0];
            for (int i = 0; i < terms.length; i++) {
                long[] d = c.dims(i);
                String term = terms[i];
                int dots = term.indexOf("...");
                int letters = term.replace("...", "").length();
                int ellRank = dots >= 0 ? d.length - letters : 0;
                if (ellRank < 0 || (dots < 0 && letters != d.length)) {
                    throw c.fail("has equation term '" + term + "' for an input of rank " + d.length);
                }
                int axis = 0;
                for (int p = 0; p < term.length(); p++) {
                    if (p == dots) {
                        long[] e = Arrays.copyOfRange(d, axis, axis + ellRank);
                        ellipsis = Shapes.broadcast(c, ellipsis, e);
                        axis += ellRank;
                        p += 2;
                        continue;
                    }
                    char ch = term.charAt(p);
                    long dim = d[axis++];
                    Long prev = size.get(ch);
                    if (prev != null && prev != dim && prev != 1 && dim != 1) {
                        throw c.fail("gives index '" + ch + "' the sizes " + prev + " and " + dim);
                    }
                    size.put(ch, prev == null || prev == 1 ? dim : prev);
                    count.merge(ch, 1, Integer::sum);
                }
            }
            List<Long> out = new ArrayList<>();
            if (rhs == null) {
                for (long e : ellipsis) {
                    out.add(e);
                }
                size.keySet().stream().filter(ch -> count.get(ch) == 1).sorted().forEach(ch -> out.add(size.get(ch)));
            } else {
                for (int p = 0; p < rhs.length(); p++) {
                    if (rhs.startsWith("...", p)) {
                        for (long e : ellipsis) {
                            out.add(e);
                        }
                        p += 2;
                        continue;
                    }
                    Long s = size.get(rhs.charAt(p));
                    if (s == null) {
                        throw c.fail("has output index '" + rhs.charAt(p) + "' that no operand has");
                    }
                    out.add(s);
                }
            }
            long full = 1;
            for (long e : ellipsis) {
                full = Math.multiplyExact(full, e);
            }
            for (long s : size.values()) {
                full = Math.multiplyExact(full, s);
            }
            return new Einsum(out.stream().mapToLong(Long::longValue).toArray(), full);
        }
    }
}
