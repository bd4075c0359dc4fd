package dev.erg.maven;

import dev.erg.run.RunOutcome;
import org.apache.maven.plugin.MojoFailureException;
import org.apache.maven.plugins.annotations.LifecyclePhase;
import org.apache.maven.plugins.annotations.Mojo;

/**
 * Estimates every model on every device, writes the reports and fails the build when a budget, the
 * allowed growth over the baseline or a policy does not hold. Every violation is collected first; the
 * build then fails once, listing all of them. Broken input or configuration is an error of its own.
 * With {@code failOnViolation} false it only reports.
 */
@Mojo(name = "check", defaultPhase = LifecyclePhase.VERIFY, threadSafe = true)
public class CheckMojo extends AbstractReportingMojo {
    @Override
    void done(RunOutcome o) throws MojoFailureException {
        log(o, true);
        verdict(o, "failOnViolation is false, so the build goes on");
    }
}
