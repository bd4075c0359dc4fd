// The frame rate misses the target: one MojoFailureException naming the metric, value, limit and top layers.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def r = erg.gate(models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]], devices: ['preset:feeder-npu'],
        budget: [targetFps: 30000, maxPowerMw: 500])
assert r.failures().size() == 1
assert r.failures()[0].metric().name() == 'FRAME_RATE'
erg.consoleOf(r)
erg.failedOnBudget(r)
// literal, independent of the estimator's numbers
erg.logged('[ERROR] Failed to execute goal dev.erg:erg-maven-plugin:')
erg.logged(':check (default) on project fail-frame-rate: 1 budget violation:')
erg.logged('[ERROR]   - src/main/onnx/net.onnx on preset:feeder-npu: frame rate ')
erg.logged(' fps is below the target of 30000 fps (top layers by latency: conv2 ')
// the reports are written before the build fails
erg.reportsOf(r)
return true
