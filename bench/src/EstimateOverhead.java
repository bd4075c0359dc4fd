import dev.erg.analysis.Analyzer;
import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.Estimator;
import dev.erg.onnx.OnnxWriter;
import dev.erg.validation.ResNet50;
import dev.erg.workload.ModelWorkload;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Locale;
import java.util.Map;

/**
 * How much estimation adds to analysis, on a ResNet-50-sized graph, in one warm JVM: the median time
 * of analyze alone against analyze followed by estimate on every built-in preset, interleaved.
 * Usage: java -cp erg.jar:classes EstimateOverhead WORKDIR [ROUNDS]
 */
public final class EstimateOverhead {
    public static void main(String[] args) throws Exception {
        Path work = Path.of(args[0]);
        int rounds = args.length > 1 ? Integer.parseInt(args[1]) : 301;
        Files.createDirectories(work);
        Path model = work.resolve("resnet50.onnx");
        new OnnxWriter.Model(13, ResNet50.graph(1, true)).write(model);
        String[] presets = DeviceLoader.presetIds().toArray(new String[0]);
        DeviceProfile[] devices = new DeviceProfile[presets.length];
        for (int i = 0; i < presets.length; i++) {
            devices[i] = DeviceLoader.load("preset:" + presets[i], Path.of("."));
        }
        ModelWorkload probe = Analyzer.analyze(model, Map.of());
        // Warm-up: run both paths for a few seconds so that the JIT has compiled them (steady state).
        long warmUntil = System.nanoTime() + 4_000_000_000L;
        while (System.nanoTime() < warmUntil) {
            ModelWorkload w = Analyzer.analyze(model, Map.of());
            for (DeviceProfile d : devices) {
                Estimator.estimate(w, d);
            }
        }
        long[] analyze = new long[rounds];
        long[] both = new long[rounds];
        long[] estimateOnly = new long[rounds];
        for (int r = 0; r < rounds; r++) {
            long t0 = System.nanoTime();
            Analyzer.analyze(model, Map.of());
            long t1 = System.nanoTime();
            ModelWorkload w = Analyzer.analyze(model, Map.of());
            long t2 = System.nanoTime();
            Estimator.estimate(w, devices[r % devices.length]);
            long t3 = System.nanoTime();
            analyze[r] = t1 - t0;
            both[r] = t3 - t1;
            estimateOnly[r] = t3 - t2;
        }
        double a = median(analyze) / 1e6;
        double b = median(both) / 1e6;
        double e = median(estimateOnly) / 1e6;
        System.out.printf(Locale.ROOT, "model: ResNet-50 (v1.5 layout), %d nodes, %.3f G MACs%n",
                probe.nodes().size(), probe.macs() / 1e9);
        System.out.printf(Locale.ROOT, "rounds: %d (presets: %s)%n", rounds, String.join(", ", presets));
        System.out.printf(Locale.ROOT, "analyze:            %8.3f ms (median)%n", a);
        System.out.printf(Locale.ROOT, "analyze + estimate: %8.3f ms (median)%n", b);
        System.out.printf(Locale.ROOT, "estimate alone:     %8.3f ms (median)%n", e);
        System.out.printf(Locale.ROOT, "estimation adds:    %8.1f %% to analyze (budget: under 25 %%)%n", 100 * e / a);
    }

    private static double median(long[] v) {
        long[] s = v.clone();
        Arrays.sort(s);
        return s[s.length / 2];
    }
}
