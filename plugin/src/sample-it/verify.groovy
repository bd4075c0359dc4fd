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
// ...and the failure message ends with the first three ways to meet the budget, computed estimates
erg.line('[ERROR] ways to meet the budget, src/main/onnx/feeder.onnx on src/erg/feeder-npu.calibrated.yaml (each candidate is a computed estimate of the changed model or device, not a measurement):')
erg.logged('[ERROR]   1. int4 on the whole model: fixes 1 of 2 failing limits, closes ')
erg.logged('[ERROR]   2. ')
erg.logged('[ERROR]   3. ')
assert new File(basedir, 'target/erg/feeder.feeder-npu.calibrated.ways.md').getText('UTF-8').startsWith('# Ways to meet the budget: ')

// -Pwider-view: the sweep of the picture side, its formulas (hand count in docs/method.md), the edge
// of the activation limit, and its report files in their own folder.
erg.line('[INFO] erg: sweeping side=64..512:32 of src/main/onnx/feeder-any-size.onnx on src/erg/feeder-npu.calibrated.yaml')
erg.line('[INFO] erg:   MACs (MACs), degree 2: 396·side² + 768')
erg.line('[INFO] erg:   peak activation bytes (B), degree 2: 4·side²')
erg.line('[INFO] erg:   peak activations exceed the limit of 160 KiB for side ≥ 203')
erg.logged('largest value that meets every limit: side = 202, found with the fitted curves and confirmed by an estimate there; side = 203 fails')
['json', 'html', 'md'].each { ext ->
    def f = new File(basedir, "target/erg-wider/feeder-any-size.feeder-npu.calibrated.sweep.${ext}")
    assert f.isFile(): "no sweep report ${f}"
    assert f.getText('UTF-8').contains('396·side² + 768'): "${f} has no MACs formula"
}
// the swept model fails at side = 224; the sweep's value is one of the ways to meet its budget
assert new File(basedir, 'target/erg-wider/feeder-any-size.feeder-npu.calibrated.ways.md').getText('UTF-8')
        .contains('| side = 202, the value the sweep found | meets every limit |')

// 'mvn erg:calibrate' (the first invocation) wrote the same calibrated profile as the committed one
erg.logged('[INFO] erg: calibrated src/erg/feeder-npu.yaml on 1 model:')
erg.logged('erg: calibrated profile written to ')
def committed = new File(sampleDir, '../../../../sample-project/src/erg/feeder-npu.calibrated.yaml').text
assert new File(basedir, 'src/erg/feeder-npu.calibrated.yaml').text == committed
return true
