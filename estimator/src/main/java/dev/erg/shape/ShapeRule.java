package dev.erg.shape;

/**
 * The shape rule of one operator: from the node's input shapes, element types, attributes and any
 * input values known at analysis time, it sets every output's type and shape, and the output's
 * values too when they are small and computable (the integer tensors that feed shapes).
 */
@FunctionalInterface
public interface ShapeRule {
    void infer(InferContext c);
}
