package dev.erg.run;

import dev.erg.budget.Budget;
import dev.erg.device.DeviceProfile;

/**
 * One target device of a run: {@code preset:ID} or a profile file (as the user wrote it), and its own
 * budget limits. Immutable, like {@link ModelSpec}.
 */
public final class DeviceSpec {
    private final String label;
    private final DeviceProfile profile;
    private final Budget budget;

    /** A device the run loads: {@code preset:ID} or a profile file. */
    public DeviceSpec(String label) {
        this(label, null, Budget.none());
    }

    /** A profile already loaded or built in code; its id is its label. */
    public DeviceSpec(DeviceProfile profile) {
        this(profile.id(), profile, Budget.none());
    }

    private DeviceSpec(String label, DeviceProfile profile, Budget budget) {
        this.label = label;
        this.profile = profile;
        this.budget = budget == null ? Budget.none() : budget;
    }

    /** This device with its own limits: they override the run's, and a model's override them. */
    public DeviceSpec withBudget(Budget budget) {
        return new DeviceSpec(label, profile, budget);
    }

    /** The profile given in code, or null when the run loads it from the label. */
    public DeviceProfile profile() {
        return profile;
    }

    public String label() {
        return label;
    }

    public Budget budget() {
        return budget;
    }
}
