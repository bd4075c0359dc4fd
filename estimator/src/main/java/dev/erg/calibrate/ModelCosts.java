package dev.erg.calibrate;

import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.NodeEstimate;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The predicted parts of every node of one model on one device, the input of a fit.
 *
 * @param model the model's file name (the {@code model} column of a measurement file)
 * @param nodes the priced nodes, in topological order
 */
public record ModelCosts(String model, List<NodeCost> nodes) {
    public ModelCosts {
        nodes = List.copyOf(nodes);
    }

    /** The parts of an estimate's priced nodes (nodes that do not run on the device are left out). */
    public static ModelCosts of(String model, DeviceEstimate estimate) {
        List<NodeCost> out = new ArrayList<>();
        for (NodeEstimate e : estimate.nodes()) {
            NodeCost c = NodeCost.of(e);
            if (c != null) {
                out.add(c);
            }
        }
        return new ModelCosts(model, out);
    }

    /** The nodes by name. */
    public Map<String, NodeCost> byName() {
        Map<String, NodeCost> m = new LinkedHashMap<>();
        for (NodeCost c : nodes) {
            m.put(c.name(), c);
        }
        return m;
    }
}
