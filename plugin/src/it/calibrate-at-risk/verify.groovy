// erg:calibrate wrote the calibrated profile next to the one it read; the check then carries the
// calibration's band, and a target inside it is at risk: a warning by default, a failure with
// failWhenAtRisk. The measurements in src/erg/board.csv are invented for the test.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
def written = new File(basedir, 'src/erg/npu.calibrated.yaml')
assert written.isFile()
assert written.text.contains('\ncalibration:\n')
erg.logged('[INFO] erg: calibrated src/erg/npu.yaml on 1 model:')
erg.logged('[INFO] erg: calibrated profile written to ')
erg.logged('[INFO]   RISK src/main/onnx/net.onnx on src/erg/npu.calibrated.yaml: frame rate ')
erg.logged('% after calibration on 3 layers of 1 model) meets the target of 7000 fps, but the target lies inside the error band: at risk')
erg.logged('[INFO] erg: warning: 1 check is at risk: the limit lies inside the calibrated error band')
erg.logged('[WARNING] erg: at risk: src/main/onnx/net.onnx on src/erg/npu.calibrated.yaml: frame rate ')
erg.logged('at risk (checks at risk fail this run)')
erg.line('[INFO] BUILD SUCCESS')
erg.line('[INFO] BUILD FAILURE')
return true
