// Every goal, parameter and user property that erg:help -Ddetail prints is documented in docs/plugin.md,
// and every goal and parameter that docs/plugin.md documents is one the plugin has.
def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
List<String> out = erg.logLines().collect { it.startsWith('[INFO] ') ? it.substring(7) : it }
def goals = out.findAll { it ==~ /^erg:[a-z]+$/ }.collect { it.substring(4) }
assert goals.sort() == ['baseline', 'calibrate', 'check', 'help', 'report']
// parameters: four spaces, a name, and maybe "(Default: ...)"; properties: "User property: erg.x"
def params = out.findAll { it ==~ /^    [a-zA-Z]+( \(Default: .*\))?$/ }.collect { it.trim().split(' ')[0] }.unique()
def props = out.findAll { it ==~ /^\s+User property: .*/ }.collect { it.split(':', 2)[1].trim() }.unique()
assert params.containsAll(['models', 'devices', 'budget', 'baseline', 'maxGrowthPercent', 'formats',
                           'outputDirectory', 'skip'])
assert props.containsAll(['erg.skip', 'erg.formats', 'erg.baseline'])
String doc = new File(docsDir, 'plugin.md').getText('UTF-8')
def missing = []
goals.each { if (!doc.contains("erg:${it}")) missing << "goal erg:${it}" }
params.each { if (!doc.contains("`${it}`")) missing << "parameter `${it}`" }
props.each { if (!doc.contains("`${it}`")) missing << "user property `${it}`" }
// defaults as help prints them
out.findAll { it ==~ /^    [a-zA-Z]+ \(Default: .*\)$/ }.each {
    def m = it =~ /^    ([a-zA-Z]+) \(Default: (.*)\)$/
    String dflt = m[0][2]
    if (!doc.contains("`${dflt}`")) missing << "default `${dflt}` of ${m[0][1]}"
}
assert missing.isEmpty(): "docs/plugin.md lacks: ${missing}"
// the other way round: the parameter table of docs/plugin.md names no parameter the plugin lacks
def documented = (doc =~ /(?m)^\| `([a-zA-Z]+)` \|/).collect { it[1] }.unique()
assert !documented.isEmpty()
assert (documented - params).isEmpty(): "docs/plugin.md documents parameters the plugin has not: ${documented - params}"
return true
