package dev.erg.report;

import dev.erg.budget.Baseline;
import dev.erg.budget.Budget;
import dev.erg.budget.Gate;
import dev.erg.budget.GateResult;
import dev.erg.budget.PairResult;
import dev.erg.analysis.Analyzer;
import dev.erg.estimate.Estimator;
import dev.erg.run.DeviceSpec;
import dev.erg.run.ModelSpec;
import dev.erg.run.RunRequest;
import dev.erg.run.Runner;
import dev.erg.workload.ModelWorkload;
import java.util.ArrayList;
import dev.erg.device.DeviceProfile;
import dev.erg.estimate.TestDevice;
import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.nio.file.Path;
import java.util.List;

/** Gate results of small models on the hand-set test device, for the report tests. */
final class Gates {
    /** A node name that tries every escape: markup, an entity, both quotes and a table pipe. */
    static final String HOSTILE = "<script>alert(1)</script> & \"q\" 'x' | `tick`";

    private Gates() {
    }

    static DeviceProfile device() {
        return new TestDevice().build();
    }

    static GateResult gate(Path model, Budget budget) {
        return gate(model, budget, null, null, null);
    }

    static GateResult gate(Path model, Budget budget, Baseline baseline, String baselineFile, Double growth) {
        return gate(List.of(new ModelSpec(model.getFileName().toString(), model)), List.of(device()), budget,
                baseline, baselineFile, growth);
    }

    /** The run of the library's runner, with a baseline given in memory rather than read from a file. */
    static GateResult gate(List<ModelSpec> models, List<DeviceProfile> devices, Budget budget, Baseline baseline,
                           String baselineFile, Double growth) {
        List<PairResult> pairs = new ArrayList<>();
        for (ModelSpec m : models) {
            ModelWorkload w = Analyzer.analyze(m.file(), m.dims());
            for (DeviceProfile d : devices) {
                pairs.add(Gate.evaluatePair(m.label(), d.id(), Estimator.estimate(w, d), budget, baseline, growth));
            }
        }
        return Gate.result(pairs, budget, growth, baselineFile, baseline != null, List.of());
    }

    /** A run of {@code models} on {@code devices} through the library's runner. */
    static GateResult run(List<ModelSpec> models, List<DeviceProfile> devices, Budget budget) {
        RunRequest.Builder b = RunRequest.builder().models(models).budget(budget);
        for (DeviceProfile d : devices) {
            b.device(new DeviceSpec(d));
        }
        return Runner.run(b.build(), Runner.Progress.NONE).result();
    }

    /** A budget the conv+relu model fails on frame rate and holds on latency. */
    static Budget mixed() {
        return Budget.builder().targetFps(1e9).maxLatencyMs(1.0).build();
    }

    /**
     * x[1,3,8,8] -> Conv named {@code convName} (w[filters,3,3,3], pads 1) -> Relu named {@code reluName} -> z.
     * MACs 1*filters*8*8*3*3*3 = 1,728 x filters (hand-worked: N.K.P.Q.C.R.S).
     */
    static Path convRelu(Path file, String convName, String reluName, long filters) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("tiny")
                .input("x", ElemType.FLOAT, 1, 3, 8, 8)
                .weight("w", ElemType.FLOAT, filters, 3, 3, 3)
                .node("Conv", convName, List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .node("Relu", reluName, List.of("y"), List.of("z"))
                .output("z", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }

    /** One MatMul x[1,8] . w[8,8]: a single layer of 64 MACs. */
    static Path single(Path file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("one")
                .input("x", ElemType.FLOAT, 1, 8)
                .weight("w", ElemType.FLOAT, 8, 8)
                .node("MatMul", "only", List.of("x", "w"), List.of("y"))
                .output("y", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }

    /** {@code count} chained MatMuls x[1,8] . w_i[8,8], named mm0, mm1...: {@code count} layers of 64 MACs. */
    static Path chain(Path file, int count) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("chain").input("x", ElemType.FLOAT, 1, 8);
        String prev = "x";
        for (int i = 0; i < count; i++) {
            g.weight("w" + i, ElemType.FLOAT, 8, 8);
            String out = "h" + i;
            g.node("MatMul", "mm" + i, List.of(prev, "w" + i), List.of(out));
            prev = out;
        }
        g.output(prev, ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }

    /** A graph of one Reshape (a view): nothing runs on the device, the frame costs nothing. */
    static Path viewOnly(Path file) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("view")
                .input("x", ElemType.FLOAT, 2, 8)
                .longs("shape", 16)
                .node("Reshape", "reshape", List.of("x", "shape"), List.of("y"))
                .output("y", ElemType.FLOAT);
        new OnnxWriter.Model(13, g).write(file);
        return file;
    }
}
