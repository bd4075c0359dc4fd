package dev.erg.onnx;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;

import dev.erg.error.BadInputException;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * External data resolved through symbolic links before a runtime opens it (ONNX standard: external
 * data, "location" is relative to the model's folder; common practice, no single source: a loader
 * must not follow links out of the folder it was given).
 */
class ExternalDataTest {
    @TempDir
    Path dir;

    private Path model(Path folder) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("g").input("x", ElemType.FLOAT, 1, 4)
                .initializer(new OnnxWriter.Tensor("w", ElemType.FLOAT, 4, 4).external("weights.bin", 0, 64))
                .node("MatMul", "mm", List.of("x", "w"), List.of("y")).output("y", ElemType.FLOAT);
        Path f = folder.resolve("m.onnx");
        new OnnxWriter.Model(13, g).write(f);
        return f;
    }

    @Test
    void aLocationInsideTheFolderResolvesToItsRealPath() throws IOException {
        Path m = model(dir);
        Files.write(dir.resolve("weights.bin"), new byte[64]);
        Map<String, Path> r = ExternalData.resolveInsideFolder(OnnxReader.read(m));
        assertEquals(Map.of("weights.bin", dir.toRealPath().resolve("weights.bin")), r);
    }

    @Test
    void aSymbolicLinkOutOfTheFolderIsRefused() throws IOException {
        Path inner = Files.createDirectory(dir.resolve("model"));
        Path secret = Files.write(dir.resolve("secret.bin"), new byte[64]);
        Files.createSymbolicLink(inner.resolve("weights.bin"), secret);
        Path m = model(inner);
        BadInputException e = assertThrows(BadInputException.class,
                () -> ExternalData.resolveInsideFolder(OnnxReader.read(m)));
        assertEquals(m + ": tensor 'w' has external data at 'weights.bin', which resolves through a symbolic link to "
                + secret.toRealPath() + ", outside the model's folder " + inner.toRealPath(), e.getMessage());
    }

    @Test
    void aMissingLocationIsRefused() {
        Path m = model(dir);
        BadInputException e = assertThrows(BadInputException.class,
                () -> ExternalData.resolveInsideFolder(OnnxReader.read(m)));
        assertEquals(m + ": tensor 'w' has external data at 'weights.bin', which does not exist", e.getMessage());
    }
}
