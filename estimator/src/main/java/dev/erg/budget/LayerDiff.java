package dev.erg.budget;

/** How one layer differs from the baseline: added, removed or changed, with deltas (current - baseline). */
public final class LayerDiff {
    /** The kind of difference. */
    public enum Change {
        ADDED("added"), REMOVED("removed"), CHANGED("changed");

        public final String label;

        Change(String label) {
            this.label = label;
        }
    }

    private final String name;
    private final String opType;
    private final Change change;
    private final long macsDelta;
    private final double energyDeltaJoules;
    private final double latencyDeltaSeconds;

    public LayerDiff(String name, String opType, Change change, long macsDelta, double energyDeltaJoules,
                     double latencyDeltaSeconds) {
        this.name = name;
        this.opType = opType;
        this.change = change;
        this.macsDelta = macsDelta;
        this.energyDeltaJoules = energyDeltaJoules;
        this.latencyDeltaSeconds = latencyDeltaSeconds;
    }

    public String name() {
        return name;
    }

    public String opType() {
        return opType;
    }

    public Change change() {
        return change;
    }

    public long macsDelta() {
        return macsDelta;
    }

    public double energyDeltaJoules() {
        return energyDeltaJoules;
    }

    public double latencyDeltaSeconds() {
        return latencyDeltaSeconds;
    }
}
