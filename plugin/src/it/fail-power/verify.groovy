// Average power at 4 fps exceeds 1 mW (the preset's static power is 3 mW): one MojoFailureException.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def r = erg.gate(models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]], devices: ['preset:feeder-npu'],
        budget: [targetFps: 4, maxPowerMw: 1])
assert r.failures().size() == 1
assert r.failures()[0].metric().name() == 'POWER'
erg.consoleOf(r)
erg.failedOnBudget(r)
erg.logged(':check (default) on project fail-power: 1 budget violation:')
erg.logged('[ERROR]   - src/main/onnx/net.onnx on preset:feeder-npu: average power ')
erg.logged(' mW at 4 fps exceeds the limit of 1 mW; static power is 3 mW of it (top layers by energy: conv2 ')
erg.reportsOf(r)
return true
