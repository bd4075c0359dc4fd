def erg = evaluate(new File(itCommon, 'ErgIt.groovy'))
erg.line('[INFO] erg: skipped')
erg.notLogged('erg: analysing')
erg.buildSucceeded()
assert !new File(basedir, 'target/erg').exists()
return true
