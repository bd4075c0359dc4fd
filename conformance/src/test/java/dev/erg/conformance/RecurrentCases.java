package dev.erg.conformance;

import static dev.erg.onnx.OnnxWriter.attr;

import dev.erg.onnx.ElemType;

/** RNN, GRU and LSTM: layouts, directions, optional inputs and outputs. */
final class RecurrentCases {
    private RecurrentCases() {
    }

    private static final long SEQ = 5;
    private static final long BATCH = 2;
    private static final long IN = 3;
    private static final long HID = 4;

    static void register(Cases c) {
        Object[][] ops = {{"RNN", 1L}, {"GRU", 3L}, {"LSTM", 4L}};
        for (Object[] o : ops) {
            String op = (String) o[0];
            long gates = (Long) o[1];
            boolean lstm = op.equals("LSTM");
            String outs = lstm ? "y,yh,yc" : "y,yh";
            for (String dir : new String[] {"forward", "reverse", "bidirectional"}) {
                long dirs = dir.equals("bidirectional") ? 2 : 1;
                c.add(op, dir + " with bias", m -> m.x("x", SEQ, BATCH, IN).w("w", dirs, gates * HID, IN)
                        .w("r", dirs, gates * HID, HID).w("b", dirs, 2 * gates * HID)
                        .op(op, "x,w,r,b", outs, attr("hidden_size", HID), attr("direction", dir)), 7, 14, 21, 22);
            }
            c.add(op, "sequence_lens and initial_h", m -> {
                m.x("x", SEQ, BATCH, IN).w("w", 1, gates * HID, IN).w("r", 1, gates * HID, HID)
                        .i32t("sl", M.d(BATCH), 5, 3).w("h0", 1, BATCH, HID);
                String ins = "x,w,r,,sl,h0";
                if (lstm) {
                    m.w("c0", 1, BATCH, HID);
                    ins += ",c0";
                }
                m.op(op, ins, outs, attr("hidden_size", HID));
            }, 7, 14);
            c.add(op, "only Y_h", m -> m.x("x", SEQ, BATCH, IN).w("w", 2, gates * HID, IN).w("r", 2, gates * HID, HID)
                    .op(op, "x,w,r", lstm ? ",yh," : ",yh", attr("hidden_size", HID), attr("direction", "bidirectional")),
                    7, 14);
            c.add(op, "layout 1 (batch first)", m -> m.x("x", BATCH, SEQ, IN).w("w", 2, gates * HID, IN)
                    .w("r", 2, gates * HID, HID)
                    .op(op, "x,w,r", outs, attr("hidden_size", HID), attr("direction", "bidirectional"), attr("layout", 1)),
                    14, 22);
        }
        c.add("GRU", "linear_before_reset", m -> m.x("x", SEQ, BATCH, IN).w("w", 1, 3 * HID, IN).w("r", 1, 3 * HID, HID)
                .op("GRU", "x,w,r", "y,yh", attr("hidden_size", HID), attr("linear_before_reset", 1)), 7, 14);
        c.add("LSTM", "peepholes", m -> m.x("x", SEQ, BATCH, IN).w("w", 1, 4 * HID, IN).w("r", 1, 4 * HID, HID)
                .w("p", 1, 3 * HID).op("LSTM", "x,w,r,,,,,p", "y,yh,yc", attr("hidden_size", HID)), 7, 14);
        c.add("LSTM", "input_forget", m -> m.x("x", SEQ, BATCH, IN).w("w", 1, 4 * HID, IN).w("r", 1, 4 * HID, HID)
                .op("LSTM", "x,w,r", "y,yh,yc", attr("hidden_size", HID), attr("input_forget", 1)), 7, 14);
        c.add("RNN", "batch 1, then squeeze", m -> m.in("x", ElemType.FLOAT, 3, 1, IN).w("w", 1, HID, IN)
                .w("r", 1, HID, HID).op("RNN", "x,w,r", "y,yh", attr("hidden_size", HID))
                .axesOp("Squeeze", 13, "y", M.d(1), "ys"), 7, 13);
    }
}
