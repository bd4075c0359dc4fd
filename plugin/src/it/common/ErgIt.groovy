// Shared checks for the integration-test projects. A project's verify.groovy loads it with
//     def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
// (itCommon is a script variable set in the plugin's pom) and then calls the methods below. The
// expected messages are computed here by the library itself, from the same configuration the
// project's pom gives the plugin, so every assertion on build.log is verbatim.

import dev.erg.error.BadInputException
import dev.erg.budget.Baseline
import dev.erg.budget.Budget
import dev.erg.budget.GateResult
import dev.erg.budget.PairResult
import dev.erg.device.DeviceLoader
import dev.erg.report.Reports
import dev.erg.run.ModelSpec
import dev.erg.run.RunRequest
import dev.erg.run.Runner
import groovy.json.JsonSlurper
import groovy.transform.Field

// ---- Report formats every project must find on disk -----------------------------------------
// Only the JSON writer exists behind dev.erg.report.Reports today. When the HTML, Markdown and
// JUnit writers arrive, switch their checks on by editing this one line:
//     @Field List<String> REPORT_FORMATS = ['json', 'html', 'markdown', 'junit']
@Field List<String> REPORT_FORMATS = ['json', 'html', 'markdown', 'junit']

/** The file a format writes for a pair's file-name stem. */
String reportFile(String format, String stem) {
    switch (format) {
        case 'json': return stem + '.json'
        case 'html': return stem + '.html'
        case 'markdown': return stem + '.md'
        case 'junit': return 'TEST-erg.' + stem + '.xml'
        default: throw new IllegalArgumentException('unknown format ' + format)
    }
}

/** Checks that a report file is well formed, as far as its format allows. */
void parses(String format, File f, PairResult p) {
    String text = f.getText('UTF-8')
    switch (format) {
        case 'json':
            def json = new JsonSlurper().parseText(text)
            assert json.passed == p.passed(): "${f}: passed"
            assert json.checks*.message == p.checks()*.message(): "${f}: the check messages differ from the library's"
            break
        case 'junit':
            def xml = new groovy.xml.XmlSlurper().parseText(text)
            assert xml.name() in ['testsuite', 'testsuites']: "${f}: not a JUnit XML report"
            break
        case 'html':
            assert text.contains('<html') && text.contains('</html>'): "${f}: not an HTML page"
            break
        case 'markdown':
            assert text.contains(p.model()): "${f}: does not name the model"
            break
    }
}

// ---- build.log ------------------------------------------------------------------------------

String buildLog() {
    return new File(basedir, 'build.log').getText('UTF-8')
}

List<String> logLines() {
    return buildLog().readLines()
}

/** The exact line is in build.log. */
void line(String expected) {
    assert logLines().contains(expected): "build.log has no line\n  ${expected}"
}

void logged(String fragment) {
    assert buildLog().contains(fragment): "build.log does not contain\n  ${fragment}"
}

void notLogged(String fragment) {
    assert !buildLog().contains(fragment): "build.log should not contain\n  ${fragment}"
}

// ---- the library's view of the same configuration -------------------------------------------

/**
 * Evaluates what the pom configures: models ([file: 'x.onnx', dims: [batch: 1], precision: ['conv*=w4a8']]), devices, budget
 * (a map of the budget's element names), baseline (path or null) and growth (percent); base, the
 * module folder (relative to the project) that paths are relative to.
 */
GateResult gate(Map cfg) {
    def base = cfg.base ? new File(basedir, cfg.base).toPath() : basedir.toPath() // base: a module's folder
    def req = RunRequest.builder().deviceBase(base)
    cfg.models.each { m ->
        req.model(new ModelSpec(m.file, base.resolve(m.file), (m.dims ?: [:]).collectEntries { k, v -> [k, v as Long] })
                .withPrecision((m.precision ?: []) as List<String>))
    }
    cfg.devices.each { req.device(it) }
    def b = Budget.builder()
    (cfg.budget ?: [:]).each { k, v -> b.limit(k, v as Double) }
    req.budget(b.build())
    if (cfg.baseline) {
        req.baseline(cfg.baseline, base.resolve(cfg.baseline)).maxGrowthPercent((cfg.growth ?: 5) as Double)
    }
    return Runner.run(req.build(), Runner.Progress.NONE).result()
}

/** The library's one-line message for the first broken input among the configured models and devices. */
String badInput(Map cfg) {
    try {
        gate(cfg)
    } catch (BadInputException e) {
        return e.message
    }
    throw new AssertionError('the library accepts this configuration')
}

// ---- what a run of the check (or report) goal must have logged and written -------------------

/** Progress (one line per model and per model x device), the console table and verdict, verbatim. */
void consoleOf(GateResult r) {
    r.pairs()*.model().unique().each { line("[INFO] erg: analysing ${it}") }
    r.pairs().each { line("[INFO] erg: estimating ${it.model()} on ${it.device()}") }
    Reports.console(r).readLines().each { line("[INFO] " + it) }
}

/** Every report file of every pair exists, parses, and its path was logged. */
void reportsOf(GateResult r, String outputDirectory = 'target/erg') {
    File dir = new File(basedir, outputDirectory)
    r.pairs().each { p ->
        REPORT_FORMATS.each { format ->
            File f = new File(dir, reportFile(format, Reports.stem(p)))
            assert f.isFile(): "missing report ${f}"
            parses(format, f, p)
            line("[INFO] erg: " + (format == 'html' ? 'HTML report: ' : 'report: ') + f.toPath().toAbsolutePath())
        }
    }
}

void buildSucceeded() {
    line('[INFO] BUILD SUCCESS')
    notLogged('[ERROR]')
}

/**
 * The build failed once on the budget: a MojoFailureException whose message is the library's
 * failure message, every violation on its own line.
 */
void failedOnBudget(GateResult r, String goal = 'check') {
    assert !r.passed(): 'the library finds no violation in this configuration'
    line('[INFO] BUILD FAILURE')
    List<String> msg = r.failureMessage().readLines()
    def head = logLines().find { it.startsWith('[ERROR] Failed to execute goal dev.erg:erg-maven-plugin:') }
    assert head != null: 'build.log has no failed goal'
    assert head.contains(":${goal} (") && head.endsWith(': ' + msg[0]): "unexpected failure line\n  ${head}"
    msg.drop(1).each { line('[ERROR] ' + it) }
    logged('[Help 1] http://cwiki.apache.org/confluence/display/MAVEN/MojoFailureException')
    notLogged('MojoExecutionException')
}

/** The build failed on broken input or configuration with the library's (or plugin's) one-line message. */
void failedOnInput(String message) {
    line('[INFO] BUILD FAILURE')
    def head = logLines().find { it.startsWith('[ERROR] Failed to execute goal dev.erg:erg-maven-plugin:') }
    assert head != null: 'build.log has no failed goal'
    assert head.endsWith(': ' + message + ' -> [Help 1]'): "unexpected failure line\n  ${head}\nexpected it to end in\n  ${message}"
    logged('[Help 1] http://cwiki.apache.org/confluence/display/MAVEN/MojoExecutionException')
    notLogged('MojoFailureException')
    notLogged('\tat ')
}

return this
