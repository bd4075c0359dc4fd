package dev.erg.shape;

import static dev.erg.onnx.OnnxWriter.attr;
import static dev.erg.onnx.OnnxWriter.ints;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.graph.Graph;
import dev.erg.graph.GraphBuilder;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxReader;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Every registered shape rule fed inputs of the wrong rank and attributes of the wrong length: each
 * either shapes the node or fails with one sentence about the node, never with an escaped index
 * error (the ONNX standard fixes each operator's ranks; inputs outside them are bad input).
 */
class WrongRankRuleTest {
    @TempDir
    Path dir;

    private static final long[][] RANKS = {{}, {2}, {2, 3, 4}, {1, 2, 3, 4, 5}, {3, 1, 2, 2, 2, 2, 1}};

    private static List<OnnxWriter.Attr[]> attributeSets() {
        List<OnnxWriter.Attr[]> out = new ArrayList<>();
        out.add(new OnnxWriter.Attr[0]);
        // Lengths that fit no rank at once: the form of the mutated ConvTranspose that escaped before.
        out.add(new OnnxWriter.Attr[] {ints("kernel_shape", 3), ints("pads", 1, 1, 1), ints("strides", 2, 2, 2, 2, 2, 2),
                ints("dilations", 1), ints("output_padding", 1, 1, 1), ints("output_shape", 1), ints("axes", 7, -9),
                attr("axis", 5), ints("perm", 0, 0), attr("group", 3), ints("shape", 2), ints("starts", 0),
                ints("ends", 1), ints("blocksize", 2), attr("hidden_size", 2), ints("split", 1, 1, 1)});
        return out;
    }

    @Test
    void everyRuleFailsAsASentenceAboutTheNode() {
        RuleTable table = RuleTable.standard();
        Path file = dir.resolve("m.onnx");
        int cases = 0;
        int refused = 0;
        for (String op : table.operators()) {
            for (int inputs = 1; inputs <= 5; inputs++) {
                for (int r = 0; r < RANKS.length; r++) {
                    for (OnnxWriter.Attr[] attrs : attributeSets()) {
                        for (ElemType type : new ElemType[] {ElemType.FLOAT, ElemType.INT64}) {
                            if (type == ElemType.INT64 && r != 1) {
                                continue;
                            }
                            cases++;
                            refused += run(file, op, inputs, r, attrs, type) ? 0 : 1;
                        }
                    }
                }
            }
        }
        assertTrue(refused > 0 && refused < cases, refused + " of " + cases);
    }

    /** True when the node shaped; false when it was refused with a proper sentence. */
    private static boolean run(Path file, String op, int inputs, int r, OnnxWriter.Attr[] attrs, ElemType type) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("g");
        List<String> ins = new ArrayList<>();
        for (int i = 0; i < inputs; i++) {
            // Mixed ranks: each input one rank further along the list than the one before.
            g.input("x" + i, type, RANKS[(r + i) % RANKS.length]);
            ins.add("x" + i);
        }
        g.node(op, "n", ins, List.of("y0", "y1", "y2"), attrs).output("y0", ElemType.FLOAT);
        new OnnxWriter.Model(17, g).write(file);
        Graph graph = GraphBuilder.build(OnnxReader.read(file), Map.of());
        try {
            ShapeInference.run(graph);
            return true;
        } catch (BadInputException e) {
            String m = e.getMessage();
            String where = op + " with " + inputs + " inputs, ranks from " + r + ", " + attrs.length + " attributes: " + m;
            assertTrue(m.startsWith(file + ": node 'n' (" + op + ") "), where);
            assertFalse(m.matches(".*(Exception|Index \\d|out of bounds for length).*"), where);
            assertEquals(-1, m.indexOf('\n'), where);
            return false;
        }
    }
}
