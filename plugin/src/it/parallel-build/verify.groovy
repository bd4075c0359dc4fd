// Built with -T 2: Maven runs the two modules on two threads without a thread-safety warning, and
// each module's lines (whole, if interleaved) and reports are exactly those of its own run.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
erg.logged('MultiThreadedBuilder implementation with a thread count of 2')
erg.notLogged('@threadSafe')
['camera', 'spotter'].each { m ->
    def r = erg.gate(base: m, models: [[file: "src/main/onnx/${m}.onnx", dims: [batch: 1]]],
            devices: ['preset:feeder-npu'], budget: [targetFps: 4, maxPowerMw: 25])
    assert r.passed(): "${m}: ${r.failureMessage()}"
    erg.reportsOf(r, "${m}/target/erg")
    r.pairs().each { p ->
        p.checks().each { c -> erg.line('[INFO]   ok   ' + c.message()) }
    }
}
erg.buildSucceeded()
return true
