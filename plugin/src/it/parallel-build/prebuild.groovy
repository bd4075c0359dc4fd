dev.erg.maven.it.ItFixtures.smallCnn(new File(basedir, 'camera/src/main/onnx/camera.onnx'))
dev.erg.maven.it.ItFixtures.grownCnn(new File(basedir, 'spotter/src/main/onnx/spotter.onnx'))
return true
