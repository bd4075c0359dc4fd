package dev.erg.estimate;

/**
 * The precision a node is deployed at on a device: bits of its weights and of its activations, and
 * where each came from. Weight bytes, activation bytes and the energy of the node's operations follow it.
 *
 * @param weightBits bits per weight element, 0 when the node reads no weight
 * @param activationBits bits per activation element (the operands it multiplies and the outputs it writes)
 * @param weightType the weights' element type as deployed ("int4", "fp16"...), or null without weights
 * @param activationType the activations' element type as deployed
 * @param weightOrigin where the weight width came from (null without weights)
 * @param activationOrigin where the activation width came from
 */
public record DeployedPrecision(int weightBits, int activationBits, String weightType, String activationType,
                                Origin weightOrigin, Origin activationOrigin) {
    /** Where a deployed width came from. */
    public enum Origin {
        /** The model's own types: QDQ, integer operators, float16, INT4/UINT4 tensors. */
        MODEL("model"),
        /** A precision override rule given with the model ({@code dev.erg.workload.PrecisionOverrides}). */
        OVERRIDE("override"),
        /** The device profile's default: deploy-precision for float tensors, or an in-memory macro's weight-bits. */
        PROFILE("profile default");

        public final String label;

        Origin(String label) {
            this.label = label;
        }
    }

    /** {@code w4a8} style: weight and activation bits; {@code a8} for a node without weights. */
    public String label() {
        return (weightBits > 0 ? "w" + weightBits : "") + "a" + activationBits;
    }

    /** The origin to show for the node: an override wins, then a profile default, then the model. */
    public Origin origin() {
        if (weightOrigin == Origin.OVERRIDE || activationOrigin == Origin.OVERRIDE) {
            return Origin.OVERRIDE;
        }
        if (weightOrigin == Origin.PROFILE || activationOrigin == Origin.PROFILE) {
            return Origin.PROFILE;
        }
        return Origin.MODEL;
    }
}
