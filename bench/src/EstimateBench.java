import dev.erg.analysis.Analyzer;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Path;
import java.util.Map;

/**
 * The scale benchmark's stand-in for an 'erg estimate' command (bench/scale.sh): analyses a model
 * and prices it on a device preset, as one process, and prints the phase times.
 *
 * Usage: java -cp erg.jar:classes EstimateBench MODEL.onnx [PRESET]   (default preset generic-45nm)
 */
public final class EstimateBench {
    private EstimateBench() {
    }

    public static void main(String[] args) {
        Path model = Path.of(args[0]);
        String preset = args.length > 1 ? args[1] : "generic-45nm";
        long t0 = System.nanoTime();
        ModelWorkload w = Analyzer.analyze(model, Map.of("batch", 1L));
        long t1 = System.nanoTime();
        DeviceProfile device = DeviceLoader.load(DeviceLoader.PRESET_PREFIX + preset, Path.of("."));
        DeviceEstimate e = Estimator.estimate(w, device);
        long t2 = System.nanoTime();
        System.out.printf("%s: %d nodes, analyze %.3f s, estimate %.3f s, latency %.6f s, energy %.6f J%n",
                model.getFileName(), w.nodes().size(), (t1 - t0) / 1e9, (t2 - t1) / 1e9, e.latencySeconds(),
                e.energyPerFrameJoules());
    }
}
