package dev.erg.maven;

/**
 * One {@code <deviceBudget>} element: the limits of one of the configured devices, which override the
 * plugin's {@code <budget>} limit by limit (a model's own budget overrides them in turn).
 *
 * <pre>
 * &lt;deviceBudget&gt;
 *   &lt;device&gt;preset:feeder-npu&lt;/device&gt;
 *   &lt;budget&gt;&lt;maxPowerMw&gt;15&lt;/maxPowerMw&gt;&lt;/budget&gt;
 * &lt;/deviceBudget&gt;
 * </pre>
 */
public class DeviceBudgetConfig {
    /** One of the configured {@code <devices>}, written the same way. */
    private String device;

    /** The device's limits. */
    private BudgetConfig budget;

    public String getDevice() {
        return device;
    }

    public void setDevice(String device) {
        this.device = device;
    }

    public BudgetConfig getBudget() {
        return budget;
    }

    public void setBudget(BudgetConfig budget) {
        this.budget = budget;
    }
}
