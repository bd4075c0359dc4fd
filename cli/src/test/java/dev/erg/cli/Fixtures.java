package dev.erg.cli;

import dev.erg.onnx.ElemType;
import dev.erg.onnx.OnnxWriter;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

/** Models and a device profile of known numbers for the estimate and check tests. */
final class Fixtures {
    private Fixtures() {
    }

    /**
     * The device of worked example 1 in docs/method.md (invented round numbers): 100 MHz, an 8x8
     * weight-stationary int8 array at 100 fJ per MAC, registers 5 fJ/B, SRAM 64 KiB at 50/60 fJ/B and
     * 16 B/cycle, DRAM 20 pJ/B at 1 GB/s, static 1 mW, no per-layer overhead.
     */
    static Path exampleDevice(Path dir) {
        String yaml = String.join("\n",
                "name: Worked example device",
                "clock-mhz: 100",
                "static-power-mw: 1",
                "deploy-precision: int8",
                "engines:",
                "  - id: mac-array",
                "    kind: mac-array",
                "    rows: 8",
                "    columns: 8",
                "    dataflow: weight-stationary",
                "    mac-energy-fj: { int8: 100 }",
                "    accumulator-bits: 32",
                "    layer-overhead-cycles: 0",
                "  - id: vector",
                "    kind: vector",
                "    lanes: 16",
                "    op-energy-fj: { int8: 10 }",
                "    layer-overhead-cycles: 0",
                "memories:",
                "  - id: registers",
                "    read-energy-fj-per-byte: 5",
                "    write-energy-fj-per-byte: 5",
                "  - id: sram",
                "    capacity-kib: 64",
                "    read-energy-fj-per-byte: 50",
                "    write-energy-fj-per-byte: 60",
                "    bytes-per-cycle: 16",
                "  - id: dram",
                "    read-energy-pj-per-byte: 20",
                "    write-energy-pj-per-byte: 20",
                "    gbytes-per-second: 1",
                "");
        try {
            return Files.writeString(dir.resolve("example-device.yaml"), yaml);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Worked example 1's layer: Conv, input 1x8x10x10, weight {@code filters}x8x3x3, pads 1. */
    static Path conv(Path dir, String name, long filters) {
        OnnxWriter.Graph g = new OnnxWriter.Graph("example")
                .input("x", ElemType.FLOAT, 1, 8, 10, 10)
                .weight("w", ElemType.FLOAT, filters, 8, 3, 3)
                .node("Conv", "conv", List.of("x", "w"), List.of("y"), OnnxWriter.ints("pads", 1, 1, 1, 1))
                .output("y", ElemType.FLOAT);
        Path p = dir.resolve(name);
        new OnnxWriter.Model(13, g).write(p);
        return p;
    }
}
