package dev.erg.conformance;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.function.Consumer;

/** The registry the case families fill. */
final class Cases {
    final List<Case> all = new ArrayList<>();
    private final Set<String> ids = new HashSet<>();
    private String family = "";

    Cases family(String f) {
        this.family = f;
        return this;
    }

    /** One case per opset; the body reads {@code m.opset} where the operator's form changed. */
    Cases add(String subject, String variant, Consumer<M> body, long... opsets) {
        for (long o : opsets) {
            Case c = Case.built(family, subject, variant, o, body);
            if (!ids.add(c.id())) {
                throw new IllegalStateException("two cases named " + c.id());
            }
            all.add(c);
        }
        return this;
    }

    static List<Case> standard() {
        Cases c = new Cases();
        ElementwiseCases.register(c.family("elementwise"));
        TensorCases.register(c.family("tensor"));
        ConvPoolCases.register(c.family("conv-pool"));
        MatMulCases.register(c.family("matmul"));
        NormReduceCases.register(c.family("norm-reduce"));
        RecurrentCases.register(c.family("recurrent"));
        QuantCases.register(c.family("quant"));
        ControlCases.register(c.family("control"));
        PatternCases.register(c.family("pattern"));
        return c.all;
    }
}
