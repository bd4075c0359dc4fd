package dev.erg.graph;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.erg.error.BadInputException;
import dev.erg.TestModels;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * Node order (the ONNX IR requires a graph's nodes to be topologically sorted; readers commonly accept
 * any order and sort): the file order when it is valid, otherwise a topological order with the
 * smallest file index first; a cycle is one clear error naming a node on it.
 */
class GraphOrderTest {

    static Graph build(OnnxWriter.Graph g) {
        return GraphBuilder.build(TestModels.roundTrip(new OnnxWriter.Model(13, g)), Map.of());
    }

    static List<String> names(Graph g) {
        return g.nodes().stream().map(Node::name).toList();
    }

    @Test
    void fileOrderKeptWhenValid() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("ok")
                .input("x", ElemType.FLOAT, 2)
                .node("Relu", "a", List.of("x"), List.of("y1"))
                .node("Neg", "b", List.of("x"), List.of("y2"))
                .node("Add", "c", List.of("y1", "y2"), List.of("z"))
                .output("z", ElemType.FLOAT);
        Graph built = build(g);
        assertEquals(List.of("a", "b", "c"), names(built));
        assertEquals(2, built.value("x").consumers().size());
        assertEquals("c", built.value("y1").consumers().get(0).name());
    }

    /** Written consumers first: sorted so that every node follows its producers, ties by file index. */
    @Test
    void reversedFileIsSorted() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("rev")
                .input("x", ElemType.FLOAT, 2)
                .node("Add", "c", List.of("y1", "y2"), List.of("z"))
                .node("Neg", "b", List.of("x"), List.of("y2"))
                .node("Relu", "a", List.of("x"), List.of("y1"))
                .output("z", ElemType.FLOAT);
        Graph built = build(g);
        assertEquals(List.of("b", "a", "c"), names(built));
        for (int i = 0; i < built.nodes().size(); i++) {
            assertEquals(i, built.nodes().get(i).index());
        }
    }

    @Test
    void cycleNamesANodeOnIt() {
        OnnxWriter.Graph g = new OnnxWriter.Graph("cyc")
                .input("x", ElemType.FLOAT, 2)
                .node("Relu", "head", List.of("x"), List.of("h"))
                .node("Add", "p", List.of("h", "q_out"), List.of("p_out"))
                .node("Neg", "q", List.of("p_out"), List.of("q_out"))
                .output("q_out", ElemType.FLOAT);
        BadInputException e = assertThrows(BadInputException.class, () -> build(g));
        assertTrue(e.getMessage().contains("cycle") && (e.getMessage().contains("'p'") || e.getMessage().contains("'q'")),
                e.getMessage());
    }
}
