// One model on two devices in one run: every pair's reports, the comparison of the model on both
// devices, the destinations of the in-memory macro, and the precision rules (one matches, one does not).
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def rules = ['/rnn/LSTM_1@LSTM=w4a8', '/attention/*=w2']
def r = erg.gate(models: [[file: 'src/main/onnx/kws.onnx', precision: rules]],
        devices: ['src/erg/earbud-imc.yaml', 'preset:edge22-reuse'], budget: [targetFps: 4, maxPowerMw: 0.3])
assert r.passed()
assert r.pairs().size() == 2
erg.consoleOf(r)
erg.reportsOf(r)
erg.line('[WARNING] erg: src/main/onnx/kws.onnx: precision rule "/attention/*=w2" matches no node of the model; it changes nothing')
erg.line('[INFO] src/main/onnx/kws.onnx on 2 devices')

File dir = new File(basedir, 'target/erg')
File md = new File(dir, 'kws.compare.md')
File html = new File(dir, 'kws.compare.html')
[md, html].each { f ->
    assert f.isFile(): "missing comparison ${f}"
    erg.line('[INFO] erg: ' + (f.name.endsWith('.html') ? 'HTML report: ' : 'report: ') + f.toPath().toAbsolutePath())
}
def text = md.getText('UTF-8')
def rows = text.readLines().findAll { it.startsWith('| `src/erg/earbud-imc.yaml` | in-memory-macro |') || it.startsWith('| `preset:edge22-reuse` | mac-array |') }
assert rows.size() == 2: text
// The dominant destination on each engine (docs/method.md, the energy ladder): conversion in memory, compute with reuse.
assert rows[0].split(' \\| ')[5] == 'conversion': rows[0]
assert rows[1].split(' \\| ')[5] == 'compute': rows[1]
r.pairs().each { p ->
    def e = p.estimate()
    assert text.contains(dev.erg.format.Numbers.sig(e.energyPerMacJoules() * 1e15) + ' fJ | '
            + dev.erg.format.Numbers.sig(e.opsPerWatt() / 1e12) + ' | '): "${p.device()} row"
}
assert text.contains('| device | compute | registers | SRAM | DRAM | conversion | cell writes | row drive | static | total |'): text
def page = html.getText('UTF-8')
assert page.contains('<svg id="chart-compare"') && page.contains('</html>')

// The in-memory pair names its destinations and the layer the rule set.
def pair = new File(dir, 'kws.earbud-imc.md').getText('UTF-8')
assert pair.contains('| compute | registers | SRAM | DRAM | conversion | cell writes | row drive | static | total |'): pair
assert pair.contains('| `/rnn/LSTM_1` | `LSTM` | w4a8 | override | '): pair
assert pair.contains('| `/rnn/LSTM` | `LSTM` | w8a8 | profile default | '): pair
def json = new groovy.json.JsonSlurper().parse(new File(dir, 'kws.earbud-imc.json'))
assert json.totals.energyJoules.conversion > 0
assert json.totals.dominantDestination == 'conversion'
assert json.nodes.find { it.name == '/rnn/LSTM_1' }.estimate.deployed.origin == 'override'
assert new File(dir, 'kws.earbud-imc.html').getText('UTF-8').contains('<th>conversion</th><th>cell writes</th><th>row drive</th>')
erg.buildSucceeded()
return true
