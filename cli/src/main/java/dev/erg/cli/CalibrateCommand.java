package dev.erg.cli;

import dev.erg.calibrate.Calibration;
import dev.erg.calibrate.CalibrationRun;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/**
 * {@code erg calibrate MODEL... --device PROFILE|preset:ID --measured FILE... --out CALIBRATED.yaml}: fits the
 * profile's correction factors to measurements and writes the calibrated profile (docs/calibration.md).
 */
@Command(name = "calibrate", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Fits a device profile's correction factors to measured latency, energy or power and writes"
                + " the profile with a calibration section.")
final class CalibrateCommand implements Callable<Integer> {
    @Parameters(index = "0..*", arity = "1..*", paramLabel = "MODEL.onnx",
            description = "The measured models (a measurement file names them by file name).")
    List<Path> models = new ArrayList<>();

    @Option(names = "--device", required = true, paramLabel = "FILE|preset:ID",
            description = "The device profile to calibrate: a .yaml or .yml file, or a built-in preset (preset:ID),"
                    + " whose text the calibrated profile starts with.")
    String device;

    @Option(names = "--measured", required = true, arity = "1..*", paramLabel = "FILE.csv",
            description = "Measurement files (format: docs/calibration.md); repeatable.")
    List<Path> measured = new ArrayList<>();

    @Option(names = "--out", required = true, paramLabel = "CALIBRATED.yaml",
            description = "Where the calibrated profile is written.")
    Path out;

    @CommandLine.Mixin
    ModelOptions modelOptions = new ModelOptions();

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Calibration c = CalibrationRun.run(models, Collections.nCopies(models.size(), modelOptions.bindings(spec)),
                device, measured, out);
        PrintWriter o = spec.commandLine().getOut();
        o.println("calibrated " + device + " on " + models.size() + (models.size() == 1 ? " model" : " models") + ":");
        for (String l : CalibrationRun.summary(c)) {
            o.println(l);
        }
        o.println("calibrated profile written to " + out);
        o.flush();
        return Main.OK;
    }
}
