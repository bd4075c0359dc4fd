// Every pair is evaluated before the build fails; passing pairs are listed as such.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def r = erg.gate(models: [[file: 'src/main/onnx/small.onnx', dims: [batch: 1]],
                          [file: 'src/main/onnx/grown.onnx', dims: [batch: 1]]],
        devices: ['preset:feeder-npu', 'src/erg/slow-npu.yaml'],
        budget: [targetFps: 200, maxPowerMw: 25, maxWeightKib: 8])
assert r.pairs().size() == 4
assert r.pairs()*.passed() == [true, true, false, false]
erg.consoleOf(r)
erg.failedOnBudget(r)
// literal: the verdict per pair, and the weights of the grown model (11,736 bytes at int8 = 11.46 KiB, three
// significant digits: 11.5) over 8 KiB
erg.logged('[INFO] src/main/onnx/small.onnx on preset:feeder-npu (')
def lines = erg.logLines()
[['small', 'preset:feeder-npu', 'pass'], ['small', 'src/erg/slow-npu.yaml', 'pass'],
 ['grown', 'preset:feeder-npu', 'FAIL'], ['grown', 'src/erg/slow-npu.yaml', 'FAIL']].each { m, d, v ->
    int head = lines.findIndexOf { it.startsWith("[INFO] src/main/onnx/${m}.onnx on ${d} (") }
    assert head >= 0 : "no console section for ${m} on ${d}"
    def verdict = lines.drop(head).find { it.startsWith('[INFO] verdict: ') }
    assert verdict != null && verdict.startsWith("[INFO] verdict: ${v}") : "verdict of ${m} on ${d}: ${verdict}"
}
erg.logged('[ERROR]   - src/main/onnx/grown.onnx on src/erg/slow-npu.yaml: frame rate ')
erg.logged('[ERROR]   - src/main/onnx/grown.onnx on preset:feeder-npu: weights 11.5 KiB exceed the limit of 8 KiB'
        + ' (top layers by weight bytes: conv3 ')
erg.reportsOf(r)
return true
