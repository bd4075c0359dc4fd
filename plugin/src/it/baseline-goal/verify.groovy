// The baseline goal writes what Baseline.of gives for the same results; check then finds no growth.
import dev.erg.budget.Baseline
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
File file = new File(basedir, 'src/erg/baseline.json')
assert file.isFile()
def json = new groovy.json.JsonSlurper().parse(file)
assert json.format == 'erg-baseline' && json.version == 1
assert json.entries*.device == ['preset:feeder-npu', 'src/erg/slow-npu.yaml']
assert json.entries*.model == ['src/main/onnx/net.onnx', 'src/main/onnx/net.onnx']
// literal: ItFixtures.smallCnn counts 221,184 + 1,179,648 MACs at batch 1
assert json.entries*.metrics*.macs == [1400832, 1400832]
assert json.entries[0].layers*.name.containsAll(['conv1', 'conv2'])
def cfg = [models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]],
           devices: ['preset:feeder-npu', 'src/erg/slow-npu.yaml'], budget: [targetFps: 4]]
def fresh = erg.gate(cfg)
assert file.getText('UTF-8') == Baseline.of(fresh.pairs()).toJson(): 'the baseline differs from the library\'s'
erg.line('[INFO] erg: baseline written: ' + file.toPath().toAbsolutePath() + ' (2 entries refreshed, 2 in all)')
// the check: growth of 0% on every metric, within the allowed 2.5%
def r = erg.gate(cfg + [baseline: 'src/erg/baseline.json', growth: 2.5])
assert r.passed() && r.baselineFound()
assert r.pairs()*.checks().flatten().size() == 2 * (1 + 5)
erg.consoleOf(r)
erg.line('[INFO]   ok   src/main/onnx/net.onnx on preset:feeder-npu: MACs changed +0.0% over the baseline'
        + ' (1400832 -> 1400832 MACs), within the allowed 2.5%')
erg.reportsOf(r)
erg.notLogged('no baseline at')
erg.buildSucceeded()
return true
