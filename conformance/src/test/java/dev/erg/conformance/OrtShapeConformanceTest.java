package dev.erg.conformance;

import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.fail;

import ai.onnxruntime.OrtEnvironment;
import dev.erg.conformance.Harness.Result;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.Comparator;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.TestFactory;

/**
 * erg's inferred shapes and element types against onnxruntime's actual outputs, value by value.
 * Source of truth: the runtime executing the ONNX standard's operators (onnxruntime, CPU build).
 * A case fails when the two disagree and the case is not in {@link Known}; a case the runtime has
 * no kernel for is skipped and listed in the report.
 */
class OrtShapeConformanceTest {
    static final Path TARGET = Path.of("target");
    static final List<Result> RESULTS = Collections.synchronizedList(new ArrayList<>());

    @TestFactory
    Stream<DynamicTest> builtModels() {
        return Cases.standard().stream().map(c -> DynamicTest.dynamicTest(c.id(), () -> check(c)));
    }

    @TestFactory
    Stream<DynamicTest> sharedRunnableModels() {
        Path demo = Path.of("..", "estimator", "src", "test", "resources", "models", "demo");
        return Stream.of("feeder_cnn.onnx", "lstm_kws.onnx")
                .map(f -> Case.file("models", "model", demo.resolve(f), Map.of()))
                .map(c -> DynamicTest.dynamicTest(c.id(), () -> {
                    if (!Files.exists(c.file)) {
                        fail("shared model missing: " + c.file);
                    }
                    check(c);
                }));
    }

    static void check(Case c) {
        Result r = Harness.run(c, TARGET.resolve("ort-models"));
        RESULTS.add(r);
        String known = Known.MISMATCHES.get(c.id());
        if (r.status() != Harness.Status.RUNTIME_UNSUPPORTED && Known.RUNTIME_FAILS.containsKey(c.id())) {
            fail(c.id() + " is listed as failing in the runtime but now runs; remove it from Known.RUNTIME_FAILS");
        }
        switch (r.status()) {
            case OK:
                assertNull(known, c.id() + " is listed as a known mismatch but now agrees with onnxruntime;"
                        + " remove it from Known");
                break;
            case RUNTIME_UNSUPPORTED:
                Assumptions.abort("onnxruntime has no kernel for this form: " + r.message());
                break;
            default:
                if (known == null) {
                    fail(c.id() + " disagrees with onnxruntime:\n  " + String.join("\n  ", r.problems()));
                }
        }
    }

    @AfterAll
    static void report() {
        List<Result> all = new ArrayList<>(RESULTS);
        all.sort(Comparator.comparing((Result r) -> r.c().family).thenComparing(r -> r.c().subject)
                .thenComparing(r -> r.c().variant).thenComparingLong(r -> r.c().opset));
        String version = OrtEnvironment.getEnvironment().getVersion();
        Report.write(TARGET.resolve("ort-verified.md"), Report.matrix(all, version));
        Report.write(TARGET.resolve("ort-cases.md"), Report.caseList(all));
    }
}
