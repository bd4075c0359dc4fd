// report logs the verdict and writes the reports, and never fails the build on a budget.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def r = erg.gate(models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]], devices: ['preset:feeder-npu'],
        budget: [targetFps: 30000, maxPowerMw: 1])
assert r.failures().size() == 2
erg.consoleOf(r)
erg.line('[WARNING] erg: 2 limits do not hold; the report goal does not fail the build (the check goal does)')
// formats and outputDirectory as configured: only the JSON reports, in target/erg-reports (the pair's, and
// the ways to meet its failed budget)
File dir = new File(basedir, 'target/erg-reports')
assert (dir.list() as List).sort() == ['net.feeder-npu.json', 'net.feeder-npu.ways.json']
def json = new groovy.json.JsonSlurper().parse(new File(dir, 'net.feeder-npu.json'))
assert json.passed == false
assert json.checks*.message == r.pairs()[0].checks()*.message()
erg.line('[INFO] erg: report: ' + new File(dir, 'net.feeder-npu.json').toPath().toAbsolutePath())
assert !new File(basedir, 'target/erg').exists()
erg.buildSucceeded()
return true
