package dev.erg.maven;

import dev.erg.run.RunOutcome;
import dev.erg.run.RunRequest;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugin.MojoFailureException;
import org.apache.maven.plugins.annotations.Mojo;

/**
 * Writes (or refreshes) the baseline file from the current results of every model on every device,
 * for the {@code check} goal to measure growth against. Entries of models or devices not configured
 * any more are kept. Commit the file with the project.
 */
@Mojo(name = "baseline", threadSafe = true)
public class BaselineMojo extends AbstractErgMojo {
    @Override
    void configure(RunRequest.Builder b) throws MojoExecutionException {
        if (baseline == null || baseline.isBlank()) {
            throw new MojoExecutionException("erg: baseline: no baseline file configured; add"
                    + " <baseline>src/erg/baseline.json</baseline> to the plugin configuration or pass"
                    + " -Derg.baseline=FILE");
        }
        b.writeBaseline(true);
    }

    @Override
    void done(RunOutcome o) throws MojoFailureException {
        getLog().info(PREFIX + o.baselineSummary());
        verdict(o, "failOnViolation is false, so the build goes on");
    }
}
