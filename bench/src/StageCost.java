import dev.erg.device.DeviceLoader;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.DeviceEstimate;
import dev.erg.estimate.Estimator;
import dev.erg.graph.Graph;
import dev.erg.graph.GraphBuilder;
import dev.erg.graph.InputBindings;
import dev.erg.onnx.OnnxModel;
import dev.erg.onnx.OnnxReader;
import dev.erg.report.AnalysisJson;
import dev.erg.report.EstimateJson;
import dev.erg.shape.ShapeInference;
import dev.erg.workload.ModelWorkload;
import dev.erg.workload.WorkloadCounter;
import java.lang.management.ManagementFactory;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.Locale;
import java.util.Map;

/**
 * What each stage of erg costs per node, in one JVM: CPU time of the main thread and bytes allocated
 * by it (the JVM's per-thread counters), for reading, linking, shaping, counting and estimating, over
 * ROUNDS rounds after the first (medians); then the bytes the finished analysis keeps reachable
 * (heap used after a full collection, with and without the result held).
 * Usage: java -cp erg.jar:classes StageCost MODEL.onnx [ROUNDS] [PRESET] [OUT-PREFIX]
 * With OUT-PREFIX it also writes the analysis and estimate JSON (OUT-PREFIX.analysis.json,
 * OUT-PREFIX.estimate.json), to compare outputs before and after a change.
 */
public final class StageCost {
    private static final com.sun.management.ThreadMXBean MX =
            (com.sun.management.ThreadMXBean) ManagementFactory.getThreadMXBean();
    private static Object keepW;
    private static Object keepE;
    private static final String[] STAGES = {"read", "link", "shape", "count", "estimate"};

    public static void main(String[] args) throws Exception {
        Path file = Path.of(args[0]);
        int rounds = args.length > 1 ? Integer.parseInt(args[1]) : 5;
        String preset = args.length > 2 ? args[2] : "generic-45nm";
        DeviceProfile device = DeviceLoader.load("preset:" + preset, Path.of("."));
        InputBindings bindings = InputBindings.ofDims(Map.of("batch", 1L));
        long[][] cpu = new long[STAGES.length][rounds];
        long[][] alloc = new long[STAGES.length][rounds];
        int nodes = 0;
        ModelWorkload w = null;
        DeviceEstimate e = null;
        for (int r = 0; r < rounds; r++) {
            w = null;
            e = null;
            long[] c = new long[STAGES.length + 1];
            long[] a = new long[STAGES.length + 1];
            mark(c, a, 0);
            OnnxModel model = OnnxReader.read(file);
            mark(c, a, 1);
            Graph graph = GraphBuilder.build(model, bindings);
            mark(c, a, 2);
            ShapeInference.run(graph);
            mark(c, a, 3);
            w = WorkloadCounter.count(graph);
            mark(c, a, 4);
            e = Estimator.estimate(w, device);
            mark(c, a, 5);
            for (int s = 0; s < STAGES.length; s++) {
                cpu[s][r] = c[s + 1] - c[s];
                alloc[s][r] = a[s + 1] - a[s];
            }
            nodes = w.nodes().size();
        }
        System.out.printf(Locale.ROOT, "%s: %d nodes, median of %d rounds%n", file.getFileName(), nodes, rounds);
        System.out.printf(Locale.ROOT, "%-9s %10s %10s %12s %14s%n", "stage", "CPU ms", "bytes/node", "MB", "1st round ms");
        long tc = 0;
        long ta = 0;
        long t1 = 0;
        for (int s = 0; s < STAGES.length; s++) {
            long mc = median(cpu[s]);
            long ma = median(alloc[s]);
            tc += mc;
            ta += ma;
            t1 += cpu[s][0];
            System.out.printf(Locale.ROOT, "%-9s %10.1f %10d %12.1f %14.1f%n", STAGES[s], mc / 1e6, ma / nodes, ma / 1e6,
                    cpu[s][0] / 1e6);
        }
        long ac = tc - median(cpu[4]);
        System.out.printf(Locale.ROOT, "%-9s %10.1f %10d %12.1f %14.1f%n", "total", tc / 1e6, ta / nodes, ta / 1e6, t1 / 1e6);
        System.out.printf(Locale.ROOT, "estimate / analysis CPU: %.2f (first round %.2f)%n", median(cpu[4]) / (double) ac,
                cpu[4][0] / (double) (t1 - cpu[4][0]));
        if (args.length > 3) {
            Files.write(Path.of(args[3] + ".analysis.json"), AnalysisJson.toBytes(w));
            Files.write(Path.of(args[3] + ".estimate.json"), EstimateJson.toBytes(e, null));
        }
        keepW = w;
        keepE = e;
        w = null;
        e = null;
        long withEstimate = usedAfterGc();
        keepE = null;
        long withoutEstimate = usedAfterGc();
        keepW = null;
        long none = usedAfterGc();
        System.out.printf(Locale.ROOT, "retained: analysis %d bytes/node, estimate %d bytes/node%n",
                (withoutEstimate - none) / nodes, (withEstimate - withoutEstimate) / nodes);
    }

    private static void mark(long[] c, long[] a, int i) {
        c[i] = MX.getCurrentThreadCpuTime();
        a[i] = MX.getThreadAllocatedBytes(Thread.currentThread().getId());
    }

    private static long usedAfterGc() {
        Runtime rt = Runtime.getRuntime();
        for (int i = 0; i < 3; i++) {
            System.gc();
        }
        return rt.totalMemory() - rt.freeMemory();
    }

    private static long median(long[] v) {
        long[] s = v.clone();
        Arrays.sort(s);
        return s[s.length / 2];
    }
}
