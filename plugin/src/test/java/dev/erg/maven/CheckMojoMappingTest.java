package dev.erg.maven;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.nio.file.Path;
import org.apache.maven.api.plugin.testing.InjectMojo;
import org.apache.maven.api.plugin.testing.MojoTest;
import org.junit.jupiter.api.Test;

@MojoTest
class CheckMojoMappingTest {
    @Test
    @InjectMojo(goal = "check", pom = "src/test/resources/unit/check-mapping/pom.xml")
    void probe(CheckMojo mojo) throws Exception {
        System.out.println("basedir=" + mojo.basedir + " out=" + mojo.outputDirectory + " models=" + mojo.models
                + " skip=" + mojo.skip + " growth=" + mojo.maxGrowthPercent + " formats=" + mojo.formats
                + " devices=" + mojo.devices);
        AbstractErgMojo.Settings s = mojo.settings();
        System.out.println(s.models.get(0).dims() + " " + s.models.get(0).file() + " " + s.budget.maxActivationKib());
    }
}
