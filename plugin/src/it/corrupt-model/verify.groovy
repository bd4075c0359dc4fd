// Broken input is a MojoExecutionException carrying the library's one-line message that names the file.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
String msg = erg.badInput(models: [[file: 'src/main/onnx/broken.onnx']], devices: ['preset:feeder-npu'])
File model = new File(basedir, 'src/main/onnx/broken.onnx')
assert msg.startsWith(model.toPath().toAbsolutePath().toString() + ': ')
erg.failedOnInput(msg)
erg.logged('src/main/onnx/broken.onnx: ')
assert !new File(basedir, 'target/erg').exists(): 'no reports for broken input'
return true
