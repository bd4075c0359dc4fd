// Every limit holds: the table and "all budgets hold" are logged, the reports written, the build passes.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def r = erg.gate(models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]], devices: ['preset:feeder-npu'],
        budget: [targetFps: 4, maxPowerMw: 25, maxEnergyPerFrameUj: 100, maxLatencyMs: 50, maxWeightKib: 64,
                 maxActivationKib: 128])
assert r.passed()
assert r.pairs()[0].checks().size() == 6
erg.consoleOf(r)
erg.line('[INFO] erg: all budgets hold')
// literal, independent of the estimator's numbers
erg.logged('[INFO]   ok   src/main/onnx/net.onnx on preset:feeder-npu: average power ')
erg.logged(' mW at 4 fps is within the limit of 25 mW')
erg.reportsOf(r)
erg.notLogged('no baseline')
erg.buildSucceeded()
return true
