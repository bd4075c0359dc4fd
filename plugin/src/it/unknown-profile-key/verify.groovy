// A profile key the format does not know is a MojoExecutionException naming the file and the key.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
String msg = erg.badInput(models: [[file: 'src/main/onnx/net.onnx', dims: [batch: 1]]],
        devices: ['src/erg/typo-npu.yaml'])
erg.failedOnInput(msg)
erg.logged('src/erg/typo-npu.yaml')
erg.logged('boost-mode')
erg.logged('unknown key')
return true
