dev.erg.maven.it.ItFixtures.corruptModel(new File(basedir, 'src/main/onnx/broken.onnx'))
return true
