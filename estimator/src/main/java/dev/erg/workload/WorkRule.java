package dev.erg.workload;

import dev.erg.graph.Node;

/** Counts the arithmetic of one operator: sets MACs (or the matrix-product view) and vector ops. */
@FunctionalInterface
public interface WorkRule {
    void count(Node n, NodeWork.Builder w);
}
