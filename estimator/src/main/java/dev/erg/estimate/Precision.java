package dev.erg.estimate;

import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.device.Precisions;
import dev.erg.estimate.DeployedPrecision.Origin;
import dev.erg.graph.Node;
import dev.erg.graph.Value;
import dev.erg.workload.Kind;
import dev.erg.workload.NodeWork;
import dev.erg.workload.PrecisionOverrides;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/**
 * Settles each node's deployed precision (docs/method.md, "Deployed precision"): the model's types,
 * then the profile's defaults for float tensors (deploy-precision; an in-memory macro's weight-bits for
 * the weights it holds), then the first matching override rule. The widths set here decide weight
 * bytes, activation bytes and the label the node's operations are priced at.
 */
final class Precision {
    private static final Set<String> RECURRENT = Set.of("LSTM", "GRU", "RNN");
    private final Schedule s;
    private final PrecisionOverrides overrides;
    private final String deploy;
    private final int macroWeightBits;
    private final Set<PrecisionOverrides.Rule> used = new LinkedHashSet<>();

    Precision(Schedule s, PrecisionOverrides overrides, DeviceProfile device, Engine arrayEngine) {
        this.s = s;
        this.overrides = overrides;
        this.deploy = device.deployPrecision();
        this.macroWeightBits = arrayEngine != null && arrayEngine.macro() != null ? arrayEngine.macro().weightBits() : 0;
    }

    void settle(int i, NodeEstimate e) {
        NodeWork nw = s.works.get(i);
        boolean mac = nw.kind() == Kind.MAC;
        String wt = nw.weightPrecision();
        String at = nw.activationPrecision() != null ? nw.activationPrecision() : nw.precision();
        int wBits = wt == null ? 0 : bits(wt);
        int aBits = bits(at);
        Origin wo = wt == null ? null : Origin.MODEL;
        Origin ao = Origin.MODEL;
        String wType = wt;
        String aType = at;
        boolean weightSet = false;
        if (wt != null && Precisions.isFloat(wt)) {
            if (mac && macroWeightBits > 0) {
                wBits = macroWeightBits;
                wType = "int" + wBits;
                wo = Origin.PROFILE;
                weightSet = true;
            } else if (deploy != null) {
                wBits = s.deployBits;
                wType = deploy;
                wo = Origin.PROFILE;
            }
        }
        if (Precisions.isFloat(at) && deploy != null) {
            aBits = s.deployBits;
            aType = deploy;
            ao = Origin.PROFILE;
        }
        PrecisionOverrides.Rule r = overrides.isEmpty() ? null : overrides.match(nw.name(), nw.opType());
        if (r != null) {
            used.add(r);
            if (r.weightBits() > 0 && wt != null && mac) {
                wBits = r.weightBits();
                wType = "int" + wBits;
                wo = Origin.OVERRIDE;
                weightSet = true;
            }
            if (r.activationBits() > 0) {
                aBits = r.activationBits();
                aType = "int" + aBits;
                ao = Origin.OVERRIDE;
                s.outputBits[i] = aBits;
            }
        }
        e.deployed = deployed(wBits, aBits, wType, aType, wo, ao);
        e.weightBitsSet = weightSet;
        boolean ints = isInt(aType) && (wType == null || isInt(wType));
        String label = defaultLabel(nw.precision());
        if (weightSet || ao == Origin.OVERRIDE) {
            if (ints) {
                label = mac && wBits > 0 ? Precisions.intLabel(wBits, aBits) : "int" + aBits;
            }
        } else if (mac && wt != null && ints && wBits != aBits) {
            label = Precisions.intLabel(wBits, aBits);
        }
        e.precision = label;
        if (weightSet) {
            Node node = nw.node();
            Value v = node.opType().startsWith("QLinear") ? node.input(3) : node.inputCount() > 1 ? node.input(1) : null;
            if (v != null && v.isConstant()) {
                s.deployWeight(v, wBits);
            }
            Value recurrent = RECURRENT.contains(node.opType()) && node.inputCount() > 2 ? node.input(2) : null;
            if (recurrent != null && recurrent.isConstant()) {
                s.deployWeight(recurrent, wBits); // the recurrent weights of LSTM, GRU and RNN
            }
        }
    }

    /** {@link Precisions#bits}, remembered for the last label: nodes mostly repeat their neighbour's. */
    private int bits(String label) {
        if (label != lastLabel) {
            lastBits = Precisions.bits(label);
            lastLabel = label;
        }
        return lastBits;
    }

    private String lastLabel;
    private int lastBits;
    private DeployedPrecision lastDeployed;

    /** The deployed precision, shared with the previous node when it is the same (the record is immutable). */
    private DeployedPrecision deployed(int wBits, int aBits, String wType, String aType, Origin wo, Origin ao) {
        DeployedPrecision d = lastDeployed;
        if (d == null || d.weightBits() != wBits || d.activationBits() != aBits || d.weightOrigin() != wo
                || d.activationOrigin() != ao || !java.util.Objects.equals(d.weightType(), wType)
                || !java.util.Objects.equals(d.activationType(), aType)) {
            d = new DeployedPrecision(wBits, aBits, wType, aType, wo, ao);
            lastDeployed = d;
        }
        return d;
    }

    private static boolean isInt(String label) {
        return label != null && (label.startsWith("int") || label.startsWith("uint"));
    }

    private String defaultLabel(String precision) {
        if (deploy != null && Precisions.isFloat(precision)) {
            return deploy;
        }
        return precision;
    }

    /** Notes every rule that matched no node that runs on the device. */
    void noteUnusedRules(List<String> assumptions) {
        for (PrecisionOverrides.Rule r : overrides.rules()) {
            if (!used.contains(r)) {
                assumptions.add("precision rule \"" + r + "\" matches no node that runs on the device");
            }
        }
    }
}
