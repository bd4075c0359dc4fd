package dev.erg.maven;

import dev.erg.budget.GateResult;
import org.apache.maven.plugin.MojoExecutionException;
import org.apache.maven.plugins.annotations.LifecyclePhase;
import org.apache.maven.plugins.annotations.Mojo;

/**
 * Estimates every model on every device and writes the reports, like {@code check}, but never fails
 * the build on a budget: the verdict is only logged. Broken input or configuration still fails.
 */
@Mojo(name = "report", defaultPhase = LifecyclePhase.VERIFY, threadSafe = true)
public class ReportMojo extends AbstractReportingMojo {
    @Override
    void run(Settings s) throws MojoExecutionException {
        GateResult r = evaluate(s, s.budget, true);
        logAndWrite(r, s);
        if (!r.passed()) {
            getLog().warn(PREFIX + r.failures().size() + (r.failures().size() == 1 ? " limit does" : " limits do")
                    + " not hold; the report goal does not fail the build (the check goal does)");
        }
    }
}
