dev.erg.maven.it.ItFixtures.smallCnn(new File(basedir, 'src/main/onnx/net.onnx'))
return true
