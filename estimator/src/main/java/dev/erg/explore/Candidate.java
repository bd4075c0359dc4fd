package dev.erg.explore;

import dev.erg.budget.Check;
import dev.erg.device.DeviceProfile;
import dev.erg.workload.PrecisionOverrides;
import java.util.List;

/**
 * One change re-estimated to meet a failed budget: what it changes, the checks of every budgeted
 * metric after it, and how much of the gap of the failing limit it closes. A computed estimate, like
 * every figure of erg.
 *
 * @param change     the change in words ("int4 on the 3 layers of most energy")
 * @param kind       the kind of change: precision, clock, sram, engine, dimension
 * @param checks     every budget check after the change, in rule order
 * @param gapClosed  the share of the failing limit's gap that the change closes (1 or more: closed;
 *                   below 0: the change makes it worse)
 * @param fixed      how many of the failing limits now hold
 * @param broken     how many limits that held now fail
 * @param note       a caveat, or null
 * @param overrides  the precision rules estimated (NONE for other kinds)
 * @param device     the device profile estimated
 * @param dimValue   the value of the swept dim estimated, or null
 */
public record Candidate(String change, String kind, List<Check> checks, double gapClosed, int fixed, int broken,
                        String note, PrecisionOverrides overrides, DeviceProfile device, Long dimValue) {
    public Candidate {
        checks = List.copyOf(checks);
    }

    /** True when every limit holds after the change. */
    public boolean meetsAll() {
        for (Check c : checks) {
            if (!c.passed()) {
                return false;
            }
        }
        return true;
    }
}
