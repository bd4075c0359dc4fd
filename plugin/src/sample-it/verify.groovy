// The sample project: the table, the verdict and the report paths, verbatim from the library, for
// the committed configuration (pass, growth checked against the committed baseline) and for
// -Ptight-budget (one failure listing both violations).
// This script lives outside the project, so the invoker's basedir is its own folder: point it at the clone.
basedir = new File(sampleDir)
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def cfg = [models: [[file: 'src/main/onnx/feeder.onnx']], devices: ['src/erg/feeder-npu.calibrated.yaml'],
           baseline: 'src/erg/baseline.json', growth: 5]
def pass = erg.gate(cfg + [budget: [targetFps: 4, maxPowerMw: 25, maxWeightKib: 384, maxActivationKib: 160]])
assert pass.passed() && pass.baselineFound(): 'the sample as committed must pass against its baseline'
erg.consoleOf(pass)
erg.line('[INFO] erg: all budgets hold')
erg.line('[INFO] BUILD SUCCESS')
// literal: the scenario's budget, as the README quotes it
erg.logged('[INFO]   ok   src/main/onnx/feeder.onnx on src/erg/feeder-npu.calibrated.yaml: frame rate ')
// the committed calibration's band (feeder-board.csv, invented for the demo) is in the verdict
erg.logged('% after calibration on 20 layers of 1 model) meets the target of 4 fps')
erg.logged(' mW at 4 fps is within the limit of 25 mW')

def tight = erg.gate(cfg + [budget: [targetFps: 4, maxPowerMw: 2, maxWeightKib: 256, maxActivationKib: 160]])
assert tight.failures()*.metric()*.name() == ['POWER', 'WEIGHTS']
erg.consoleOf(tight)
erg.failedOnBudget(tight)
erg.logged(':check (default) on project feeder-camera: 2 budget violations:')
erg.logged(' mW at 4 fps exceeds the limit of 2 mW; static power is 3.91 mW of it (top layers by energy: ')
erg.logged(' KiB exceed the limit of 256 KiB (top layers by weight bytes: ')
// the reports of the last run are on disk and their paths were logged
erg.reportsOf(tight)
// 'mvn erg:calibrate' (the first invocation) wrote the same calibrated profile as the committed one
erg.logged('[INFO] erg: calibrated src/erg/feeder-npu.yaml on 1 model:')
erg.logged('erg: calibrated profile written to ')
def committed = new File(sampleDir, '../../../../sample-project/src/erg/feeder-npu.calibrated.yaml').text
assert new File(basedir, 'src/erg/feeder-npu.calibrated.yaml').text == committed
return true
