// Without the baseline file, growth is not checked: the library's note is logged as a warning.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def r = erg.gate(models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]], devices: ['preset:feeder-npu'],
        budget: [targetFps: 4, maxPowerMw: 25], baseline: 'src/erg/baseline.json')
assert !r.baselineFound() && r.passed()
erg.consoleOf(r)
erg.line('[WARNING] erg: ' + r.baselineNote() + "; create it with 'mvn erg:baseline' and commit it")
erg.line("[WARNING] erg: no baseline at src/erg/baseline.json: growth is not checked; create it with 'mvn erg:baseline'"
        + " and commit it")
erg.reportsOf(r)
erg.line('[INFO] BUILD SUCCESS')
assert !new File(basedir, 'src/erg/baseline.json').exists(): 'check must not write the baseline'
return true
