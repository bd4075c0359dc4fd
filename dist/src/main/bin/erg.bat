@echo off
rem erg launcher for Windows: runs the erg command line from this distribution (bin\erg.bat, lib\*.jar).
rem
rem Environment:
rem   JAVA_HOME      the JDK or JRE to run (17 or newer); without it, java on the PATH
rem   ERG_JAVA_OPTS  more JVM options, after erg's own (e.g. -Xmx1g)
rem   ERG_CDS        0 to start without the class-data-sharing archive
rem
rem On its first run the launcher turns lib\erg.classlist into a class-data-sharing archive for this
rem JDK, lib\erg.jsa, when lib\ is writable. Delete lib\erg.jsa after changing Java: it is then made
rem again. If it cannot be made or used, erg starts without it (the JVM falls back silently).
setlocal
set "ERG_HOME=%~dp0.."
set "LIB=%ERG_HOME%\lib"
set "JAVACMD=java.exe"
if defined JAVA_HOME set "JAVACMD=%JAVA_HOME%\bin\java.exe"
set "CP={{erg.classpath.bat}}"
set "FLAGS=-XX:TieredStopAtLevel=1 -XX:+UseParallelGC -XX:-UsePerfData"

if "%ERG_CDS%"=="0" goto run
if not exist "%LIB%\erg.classlist" goto run
if exist "%LIB%\erg.jsa" goto usecds
"%JAVACMD%" -Xshare:dump "-XX:SharedClassListFile=%LIB%\erg.classlist" "-XX:SharedArchiveFile=%LIB%\erg.jsa.tmp" -cp "%CP%" >nul 2>&1
if errorlevel 1 goto cleanup
move /y "%LIB%\erg.jsa.tmp" "%LIB%\erg.jsa" >nul 2>&1
:cleanup
if exist "%LIB%\erg.jsa.tmp" del /q "%LIB%\erg.jsa.tmp" >nul 2>&1
if not exist "%LIB%\erg.jsa" goto run
:usecds
"%JAVACMD%" %FLAGS% -Xshare:auto -Xlog:cds=off -Xlog:cds+dynamic=off "-XX:SharedArchiveFile=%LIB%\erg.jsa" %ERG_JAVA_OPTS% -cp "%CP%" dev.erg.cli.Main %*
exit /b %ERRORLEVEL%

:run
"%JAVACMD%" %FLAGS% %ERG_JAVA_OPTS% -cp "%CP%" dev.erg.cli.Main %*
exit /b %ERRORLEVEL%
