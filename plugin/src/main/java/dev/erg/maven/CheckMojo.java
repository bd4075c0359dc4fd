package dev.erg.maven;

import dev.erg.budget.GateResult;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugin.MojoFailureException;
import org.apache.maven.plugins.annotations.LifecyclePhase;
import org.apache.maven.plugins.annotations.Mojo;

/**
 * Estimates every model on every device, writes the reports and fails the build when a budget or the
 * allowed growth over the baseline does not hold. Every violation is collected first; the build then
 * fails once, listing all of them. Broken input or configuration is an error of its own.
 */
@Mojo(name = "check", defaultPhase = LifecyclePhase.VERIFY, threadSafe = true)
public class CheckMojo extends AbstractReportingMojo {
    @Override
    void run(Settings s) throws MojoExecutionException, MojoFailureException {
        GateResult r = evaluate(s, s.budget, true);
        logAndWrite(r, s);
        if (!r.passed()) {
            throw new MojoFailureException(r.failureMessage());
        }
    }
}
