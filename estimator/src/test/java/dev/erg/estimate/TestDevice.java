package dev.erg.estimate;

import dev.erg.device.Dataflow;
import dev.erg.device.DeviceProfile;
import dev.erg.device.Engine;
import dev.erg.device.Memory;
import java.util.List;
import java.util.Map;

/**
 * Hand-set device profiles for the estimator's tests. The numbers are the round ones of the worked
 * examples in docs/method.md (invented for the examples, not a real device) unless a test says otherwise.
 */
final class TestDevice {
    String deploy = "int8";
    double clockMhz = 100;
    int rows = 8;
    int columns = 8;
    Dataflow dataflow = Dataflow.WEIGHT_STATIONARY;
    double macFj = 100;
    double vectorFj = 10;
    int lanes = 16;
    long arrayOverhead = 0;
    double regRead = 5;
    double regWrite = 5;
    long sramBytes = 64 * 1024;
    double sramRead = 50;
    double sramWrite = 60;
    double sramBytesPerCycle = 16;
    double dramFj = 20_000;
    double dramBytesPerSecond = 1e9;
    double staticMw = 1;
    boolean registers = true;

    DeviceProfile build() {
        Engine array = new Engine("mac-array", Engine.Kind.MAC_ARRAY, rows, columns, 0, dataflow,
                Map.of("int8", macFj), 0.2 / 0.23, 32, arrayOverhead);
        Engine vector = new Engine("vector", Engine.Kind.VECTOR, 0, 0, lanes, null, Map.of("int8", vectorFj),
                0.2 / 0.23, 32, 0);
        Memory reg = registers ? new Memory("registers", Memory.Level.REGISTERS, -1, regRead, regWrite, 0, 0) : null;
        Memory sram = new Memory("sram", Memory.Level.SRAM, sramBytes, sramRead, sramWrite, sramBytesPerCycle, 0);
        Memory dram = new Memory("dram", Memory.Level.DRAM, -1, dramFj, dramFj, 0, dramBytesPerSecond);
        return new DeviceProfile("test-device", "test device", clockMhz, List.of(array, vector), reg, sram, dram,
                staticMw, deploy, Map.of());
    }
}
