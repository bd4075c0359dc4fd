package dev.erg.estimate;

import dev.erg.device.Engine;
import java.util.List;

/**
 * One engine kind: how a MAC node maps onto it and what its operations cost. The estimator keeps
 * everything else (precision, fusion, placement in SRAM and DRAM, latency, memory energy) apart from
 * the kinds, so a new kind is one class here plus its profile keys.
 *
 * <p>{@link #map} sets, on the node's estimate: compute cycles, utilisation, the register and SRAM
 * bytes the mapping moves, and any kind-specific counts (passes, conversions). {@link #price} returns
 * the energy of the node's MACs by destination; memory levels are priced by the estimator from the
 * bytes {@code map} recorded. A kind that holds weights in its own cells says so with
 * {@link #holdsWeights}, and settles per-model effects (capacity, reloads) in {@link #settle}.
 */
public interface EngineModel {
    Engine engine();

    /** Maps one MAC node (its groups, folds, cycles, utilisation and operand traffic) onto the engine. */
    void map(MacJob job, NodeEstimate e);

    /** The energy of the node's MACs on this engine, by destination (memory levels excluded). */
    Energy price(MacJob job, NodeEstimate e, Pricing pricing);

    /** True when weights live in the engine's cells, so placement keeps them out of SRAM. */
    default boolean holdsWeights() {
        return false;
    }

    /** Called once after every MAC node is mapped: model-wide effects such as the capacity of weight cells. */
    default void settle(List<MacJob> jobs, List<NodeEstimate> estimates, Pricing pricing) {
    }

    /** The model of an engine's kind (for a mac-array, of its dataflow). */
    static EngineModel of(Engine engine) {
        switch (engine.kind()) {
            case VECTOR:
                return new VectorUnit(engine);
            case ANALOG_SUM_ARRAY:
                return new AnalogSumArray(engine);
            case IN_MEMORY_MACRO:
                return new InMemoryMacro(engine);
            case CPU:
                return new CpuCores(engine);
            default:
                switch (engine.dataflow()) {
                    case WEIGHT_STATIONARY:
                        return new WeightStationary(engine);
                    case OUTPUT_STATIONARY:
                        return new OutputStationary(engine);
                    default:
                        return new NoReuse(engine);
                }
        }
    }
}
