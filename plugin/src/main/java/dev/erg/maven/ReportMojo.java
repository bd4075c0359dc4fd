package dev.erg.maven;

import dev.erg.run.RunOutcome;
import dev.erg.run.RunRequest;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugin.MojoFailureException;
import org.apache.maven.plugins.annotations.LifecyclePhase;
import org.apache.maven.plugins.annotations.Mojo;

/**
 * Estimates every model on every device and writes the reports, like {@code check}, but never fails
 * the build on a violation: the verdict is only logged. Broken input or configuration still fails.
 */
@Mojo(name = "report", defaultPhase = LifecyclePhase.VERIFY, threadSafe = true)
public class ReportMojo extends AbstractReportingMojo {
    @Override
    void configure(RunRequest.Builder b) throws MojoExecutionException {
        super.configure(b);
        b.failOnViolation(false);
    }

    @Override
    void done(RunOutcome o) throws MojoFailureException {
        log(o, true);
        verdict(o, "the report goal does not fail the build (the check goal does)");
    }
}
