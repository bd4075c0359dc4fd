package dev.erg.onnx;

import dev.erg.error.BadInputException;
import dev.erg.error.InputFiles;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * Checks a model's external data before anything opens it.
 *
 * <p>The analysis never opens external data: the reader only checks that each location is a relative
 * path that stays inside the model's folder as written. A runtime that loads the model (onnxruntime,
 * when erg measures a model on the machine) does open it, and follows symbolic links on the way. Call
 * {@link #resolveInsideFolder(OnnxModel)} before handing a model to such a runtime: it resolves every
 * location through symbolic links and refuses one whose real path lands outside the model's folder,
 * so that a model cannot make the runtime read files it was not shipped with.
 */
public final class ExternalData {
    private ExternalData() {
    }

    /**
     * Resolves every external-data location of {@code model} (main graph, subgraphs and tensor
     * attributes) through symbolic links.
     *
     * @return the real path of each location, by location as written in the file, sorted; empty when
     *         the model keeps all its data inside the file
     * @throws BadInputException naming the file, the tensor and the location, when a location does not
     *                           exist, is not a regular file, or resolves outside the model's folder
     */
    public static Map<String, Path> resolveInsideFolder(OnnxModel model) {
        String label = model.file().toString();
        Path folder;
        try {
            folder = model.file().toAbsolutePath().getParent().toRealPath();
        } catch (IOException e) {
            throw new BadInputException(label + ": cannot resolve the model's folder (" + e.getMessage() + ")");
        }
        List<TensorDef> tensors = new ArrayList<>();
        collect(model.graph(), tensors);
        Map<String, Path> out = new TreeMap<>();
        for (TensorDef t : tensors) {
            String loc = t.externalLocation();
            if (loc == null || out.containsKey(loc)) {
                continue;
            }
            String what = label + ": tensor '" + t.name() + "' has external data at '" + loc + "'";
            Path written = folder.resolve(loc.replace('\\', '/')).normalize();
            if (!written.startsWith(folder)) {
                throw new BadInputException(what + ", outside the model's folder");
            }
            if (!Files.exists(written)) {
                throw new BadInputException(what + ", which does not exist");
            }
            Path real;
            try {
                real = written.toRealPath();
            } catch (IOException e) {
                throw new BadInputException(what + ", which cannot be resolved (" + e.getMessage() + ")");
            }
            if (!real.startsWith(folder)) {
                throw new BadInputException(what + ", which resolves through a symbolic link to " + real
                        + ", outside the model's folder " + folder);
            }
            InputFiles.requireRegular(real, what, "external data file");
            out.put(loc, real);
        }
        return out;
    }

    private static void collect(GraphDef g, List<TensorDef> out) {
        if (g == null) {
            return;
        }
        out.addAll(g.initializers());
        for (NodeDef n : g.nodes()) {
            for (AttributeDef a : n.attributes().values()) {
                if (a.t() != null) {
                    out.add(a.t());
                }
                out.addAll(a.tensors());
                collect(a.g(), out);
                for (GraphDef sub : a.graphs()) {
                    collect(sub, out);
                }
            }
        }
    }
}
