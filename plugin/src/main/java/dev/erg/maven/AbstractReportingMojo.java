package dev.erg.maven;

import dev.erg.error.BadInputException;
import dev.erg.budget.Budget;
import dev.erg.report.Reports;
import java.io.File;
import java.nio.file.Path;
import java.util.Set;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugins.annotations.Parameter;

/** The configuration of the goals that evaluate budgets and write reports: check and report. */
abstract class AbstractReportingMojo extends AbstractErgMojo {
    /**
     * The limits every model must hold on every device: {@code targetFps}, {@code maxPowerMw},
     * {@code maxEnergyPerFrameUj}, {@code maxLatencyMs}, {@code maxWeightKib}, {@code maxActivationKib}.
     * Each is optional.
     */
    @Parameter
    BudgetConfig budget;

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
    Budget budgetSetting() throws MojoExecutionException {
        if (budget == null) {
            return Budget.none();
        }
        try {
            return Budget.builder().targetFps(budget.getTargetFps()).maxPowerMw(budget.getMaxPowerMw())
                    .maxEnergyPerFrameUj(budget.getMaxEnergyPerFrameUj()).maxLatencyMs(budget.getMaxLatencyMs())
                    .maxWeightKib(budget.getMaxWeightKib()).maxActivationKib(budget.getMaxActivationKib()).build();
        } catch (BadInputException e) {
            throw new MojoExecutionException("erg: " + e.getMessage(), e);
        }
    }

    @Override
    Double growthSetting() throws MojoExecutionException {
        if (maxGrowthPercent != null && (maxGrowthPercent.isNaN() || maxGrowthPercent.isInfinite()
                || maxGrowthPercent < 0)) {
            throw new MojoExecutionException("erg: maxGrowthPercent: must be a number of 0 or more (got "
                    + maxGrowthPercent + ")");
        }
        return maxGrowthPercent;
    }

    @Override
    Set<String> formatsSetting() throws MojoExecutionException {
        try {
            return Reports.parseFormats(formats == null ? "" : formats);
        } catch (BadInputException e) {
            throw new MojoExecutionException("erg: " + e.getMessage(), e);
        }
    }

    @Override
    Path outputSetting() throws MojoExecutionException {
        if (outputDirectory == null) {
            throw new MojoExecutionException("erg: outputDirectory: not set");
        }
        return outputDirectory.toPath();
    }
}
