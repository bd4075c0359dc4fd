dev.erg.maven.it.ItFixtures.smallCnn(new File(basedir, 'src/main/onnx/small.onnx'))
dev.erg.maven.it.ItFixtures.grownCnn(new File(basedir, 'src/main/onnx/grown.onnx'))
return true
