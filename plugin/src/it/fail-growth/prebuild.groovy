// The baseline records the small CNN under the model's path; the model at that path is then the grown one.
import dev.erg.maven.it.ItFixtures
File small = new File(basedir, 'target/small.onnx')
ItFixtures.smallCnn(small)
ItFixtures.baseline(basedir, 'src/main/onnx/net.onnx', small, [batch: 1L], ['preset:feeder-npu'],
        new File(basedir, 'src/erg/baseline.json'))
ItFixtures.grownCnn(new File(basedir, 'src/main/onnx/net.onnx'))
return true
