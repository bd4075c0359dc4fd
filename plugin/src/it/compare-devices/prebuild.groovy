// The hearing-aid sample of the repository (samples/hearing-aid-kws): its model graph and its invented
// in-memory part, copied into this project.
import java.nio.file.Files
import java.nio.file.StandardCopyOption

def sample = new File(itCommon).toPath().resolve('../../../../samples/hearing-aid-kws').normalize()
def onnx = basedir.toPath().resolve('src/main/onnx')
def erg = basedir.toPath().resolve('src/erg')
Files.createDirectories(onnx)
Files.createDirectories(erg)
Files.copy(sample.resolve('kws.onnx'), onnx.resolve('kws.onnx'), StandardCopyOption.REPLACE_EXISTING)
Files.copy(sample.resolve('earbud-imc.yaml'), erg.resolve('earbud-imc.yaml'), StandardCopyOption.REPLACE_EXISTING)
return true
