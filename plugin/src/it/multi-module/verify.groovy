// Each module of a multi-module consumer is checked with the parent's devices and budget and its own
// model, and writes its reports into its own target/erg.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
['camera', 'spotter'].each { m ->
    def r = erg.gate(base: m, models: [[file: "src/main/onnx/${m}.onnx", dims: [batch: 1]]],
            devices: ['preset:feeder-npu'], budget: [targetFps: 4, maxPowerMw: 25])
    assert r.passed(): "${m}: ${r.failureMessage()}"
    erg.consoleOf(r)
    erg.reportsOf(r, "${m}/target/erg")
}
erg.line('[INFO] Reactor Summary for multi-module 1:')
erg.logged('[INFO] camera ............')
erg.logged('[INFO] spotter ...........')
erg.buildSucceeded()
return true
