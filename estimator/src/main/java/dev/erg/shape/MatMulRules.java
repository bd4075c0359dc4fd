package dev.erg.shape;

import dev.erg.onnx.ElemType;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/** Matrix products: Gemm, MatMul (numpy semantics), their integer and quantized forms, Einsum. */
final class MatMulRules {
    private MatMulRules() {
    }

    static void register(RuleTable t) {
        t.add("Gemm", MatMulRules::gemm);
        t.add("MatMul", c -> c.out(0, c.type(0), matmul(c, c.dims(0), c.dims(1))));
        t.add("MatMulInteger", c -> c.out(0, ElemType.INT32, matmul(c, c.dims(0), c.dims(1))));
        t.add("QLinearMatMul", c -> c.out(0, c.type(7), matmul(c, c.dims(0), c.dims(3))));
        t.add("Einsum", c -> c.out(0, c.type(0), einsum(c).outDims()));
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
        if (c.has(2)) {
            // C broadcasts unidirectionally to [M, N].
            long[] cd = c.dims(2);
            boolean ok = cd.length <= 2;
            for (int i = 0; i < cd.length && ok; i++) {
                long want = i == cd.length - 1 ? n : m;
                ok = cd[i] == 1 || cd[i] == want;
            }
            if (!ok) {
                throw c.fail("has C " + Arrays.toString(cd) + " that does not broadcast to [" + m + ", " + n + "]");
            }
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

    /** The parsed equation of an Einsum node, against its inputs' shapes. */
    static EinsumEquation einsum(InferContext c) {
        List<long[]> dims = new ArrayList<>();
        for (int i = 0; i < c.inputCount(); i++) {
            dims.add(c.dims(i));
        }
        return EinsumEquation.parse(c.attrString("equation", ""), dims, c::fail);
    }
}
