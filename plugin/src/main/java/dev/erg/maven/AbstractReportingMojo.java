package dev.erg.maven;

import dev.erg.error.BadInputException;
import dev.erg.budget.Budget;
import dev.erg.report.Reports;
import dev.erg.run.DeviceSpec;
import dev.erg.run.RunRequest;
import java.io.File;
import java.util.List;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugins.annotations.Parameter;

/** The configuration of the goals that evaluate budgets and write reports: check and report. */
abstract class AbstractReportingMojo extends AbstractErgMojo {
    /**
     * The limits every model must hold on every device: {@code targetFps}, {@code maxPowerMw},
     * {@code maxEnergyPerFrameUj}, {@code maxLatencyMs}, {@code maxWeightKib}, {@code maxActivationKib}.
     * Each is optional. A {@code <budget>} inside a {@code <model>} or a {@code <deviceBudget>}
     * overrides it limit by limit.
     */
    @Parameter
    BudgetConfig budget;

    /**
     * Limits of single devices: each {@code <deviceBudget>} names one of the {@code <devices>} and
     * gives a {@code <budget>} that overrides the plugin's limit by limit (a model's own overrides it).
     */
    @Parameter
    List<DeviceBudgetConfig> deviceBudgets;

    /** The growth allowed per metric over the baseline, in percent. Used only when a baseline is configured. */
    @Parameter(property = "erg.maxGrowthPercent", defaultValue = "5")
    Double maxGrowthPercent;

    /** The report formats to write, comma-separated: json, html, markdown, junit. */
    @Parameter(property = "erg.formats", defaultValue = "json,html,markdown,junit")
    String formats;

    /** Where the reports are written. */
    @Parameter(property = "erg.outputDirectory", defaultValue = "${project.build.directory}/erg")
    File outputDirectory;

    @Override
    void configure(RunRequest.Builder b) throws MojoExecutionException {
        if (outputDirectory == null) {
            throw new MojoExecutionException("erg: outputDirectory: not set");
        }
        b.budget(budget == null ? Budget.none() : budget.toBudget("budget"))
                .maxGrowthPercent(maxGrowthPercent)
                .reports(outputDirectory.toPath(), Reports.parseFormats(formats == null ? "" : formats));
        if (deviceBudgets != null) {
            for (int i = 0; i < deviceBudgets.size(); i++) {
                DeviceBudgetConfig d = deviceBudgets.get(i);
                String label = d == null || d.getDevice() == null ? "" : d.getDevice().strip();
                if (devices == null || !devices.stream().map(String::strip).toList().contains(label)) {
                    throw new BadInputException("deviceBudgets[" + i + "]: '" + label + "' is not one of the"
                            + " configured devices");
                }
            }
        }
    }

    @Override
    boolean checksBudgets() {
        return true;
    }

    @Override
    DeviceSpec device(String label) {
        DeviceSpec d = new DeviceSpec(label);
        if (deviceBudgets != null) {
            for (int i = 0; i < deviceBudgets.size(); i++) {
                DeviceBudgetConfig c = deviceBudgets.get(i);
                if (c != null && c.getDevice() != null && c.getDevice().strip().equals(label) && c.getBudget() != null) {
                    d = d.withBudget(c.getBudget().toBudget("deviceBudgets[" + i + "].budget"));
                }
            }
        }
        return d;
    }
}
