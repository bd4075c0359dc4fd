package dev.erg.shape;

import java.util.Arrays;

/** Recurrent layers: RNN, GRU and LSTM, in both layouts and every direction. */
final class RecurrentRules {
    private RecurrentRules() {
    }

    static void register(RuleTable t) {
        t.add("RNN", c -> recurrent(c, 1, false));
        t.add("GRU", c -> recurrent(c, 3, false));
        t.add("LSTM", c -> recurrent(c, 4, true));
    }

    /** Number of directions of a recurrent node. */
    static int directions(InferContext c) {
        String dir = c.attrString("direction", "forward");
        switch (dir) {
            case "forward":
            case "reverse":
                return 1;
            case "bidirectional":
                return 2;
            default:
                throw c.fail("has the unknown direction '" + dir + "'");
        }
    }

    static void recurrent(InferContext c, int gates, boolean cell) {
        long[] x = c.dims(0);
        long[] w = c.dims(1);
        if (x.length != 3 || w.length != 3) {
            throw c.fail("needs a 3-D input and weight, got " + Arrays.toString(x) + " and " + Arrays.toString(w));
        }
        boolean batchFirst = c.attrInt("layout", 0) == 1;
        long seq = batchFirst ? x[1] : x[0];
        long batch = batchFirst ? x[0] : x[1];
        int dirs = directions(c);
        long hidden = c.attrInt("hidden_size", w[1] / gates);
        if (w[0] != dirs || w[1] != gates * hidden || w[2] != x[2]) {
            throw c.fail("has weight " + Arrays.toString(w) + " that does not match " + dirs + " direction(s), "
                    + gates + " gate(s) of hidden size " + hidden + " and input size " + x[2]);
        }
        long[] y = batchFirst ? new long[] {batch, seq, dirs, hidden} : new long[] {seq, dirs, batch, hidden};
        long[] state = batchFirst ? new long[] {batch, dirs, hidden} : new long[] {dirs, batch, hidden};
        c.out(0, c.type(0), y);
        c.out(1, c.type(0), state);
        if (cell) {
            c.out(2, c.type(0), state);
        }
    }
}
