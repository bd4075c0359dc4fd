package dev.erg.maven;

import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.GateResult;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugins.annotations.Mojo;

/**
 * Writes (or refreshes) the baseline file from the current results of every model on every device,
 * for the {@code check} goal to measure growth against. Commit the file with the project.
 */
@Mojo(name = "baseline", threadSafe = true)
public class BaselineMojo extends AbstractErgMojo {
    @Override
    void run(Settings s) throws MojoExecutionException {
        if (s.baselineFile == null) {
            throw new MojoExecutionException("erg: baseline: no baseline file configured; add"
                    + " <baseline>src/erg/baseline.json</baseline> to the plugin configuration or pass"
                    + " -Derg.baseline=FILE");
        }
        GateResult r = evaluate(s, Budget.none(), false);
        Baseline b = Baseline.of(r.pairs());
        b.write(s.baselineFile);
        getLog().info(PREFIX + "baseline written: " + s.baselineFile + " (" + b.size()
                + (b.size() == 1 ? " model x device entry)" : " model x device entries)"));
    }
}
