// Growth over the baseline fails once, listing every metric that grew too much and the layers that grew most.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def r = erg.gate(models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]], devices: ['preset:feeder-npu'],
        budget: [targetFps: 4], baseline: 'src/erg/baseline.json', growth: 5)
assert r.baselineFound()
assert r.failures()*.metric()*.name().containsAll(['MACS', 'WEIGHTS', 'ACTIVATIONS'])
erg.consoleOf(r)
erg.failedOnBudget(r)
erg.notLogged('no baseline at')
// literal: the MAC counts of ItFixtures (small 1,400,832, grown 12,017,664 MACs at batch 1)
erg.logged('[ERROR]   - src/main/onnx/net.onnx on preset:feeder-npu: MACs changed +757.9% over the baseline'
        + ' (1400832 -> 12017664 MACs), more than the allowed 5% (layers that grew most: conv3 +9437184 MACs,'
        + ' conv2 +1179648 MACs)')
erg.reportsOf(r)
return true
