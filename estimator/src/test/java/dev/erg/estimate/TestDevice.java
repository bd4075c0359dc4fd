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
public final class TestDevice {
    public String deploy = "int8";
    public double clockMhz = 100;
    public int rows = 8;
    public int columns = 8;
    public Dataflow dataflow = Dataflow.WEIGHT_STATIONARY;
    public double macFj = 100;
    public double vectorFj = 10;
    public int lanes = 16;
    public long arrayOverhead = 0;
    public double regRead = 5;
    public double regWrite = 5;
    public long sramBytes = 64 * 1024;
    public double sramRead = 50;
    public double sramWrite = 60;
    public double sramBytesPerCycle = 16;
    public double dramFj = 20_000;
    public double dramBytesPerSecond = 1e9;
    public double staticMw = 1;
    public boolean registers = true;

    public DeviceProfile build() {
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
