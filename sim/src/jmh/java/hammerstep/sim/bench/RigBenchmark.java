package hammerstep.sim.bench;

import hammerstep.config.ConfigException;
import hammerstep.sim.physics.Presets;
import hammerstep.sim.physics.Rig;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

import java.util.concurrent.TimeUnit;

/**
 * Simulator speed: one operation is 100 ms of virtual time at a 50 kHz ADC rate (5000 samples,
 * 100 000 internal steps at 1 MHz) with the trigger held on iso-hard, so hammering dominates.
 * Real-time factor = 100 ms / (time per operation).
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class RigBenchmark {

    static final double RATE_HZ = 50_000;
    static final int SAMPLES = 5000;

    @Param({"cordless-two-dog", "air-twin-hammer", "oil-pulse"})
    public String tool;

    private Rig rig;
    private final float[] out = new float[SAMPLES];
    private int ops;

    @Setup(Level.Iteration)
    public void setUp() throws ConfigException {
        rig = Rig.create(Presets.tool(tool), Presets.joint("iso-hard"), Presets.defaultTransducer(), RATE_HZ, 1);
        rig.setTrigger(true);
        ops = 0;
    }

    @Benchmark
    public float hundredMillisecondsAtFiftyKilohertz() throws ConfigException {
        if (++ops % 20 == 0) {
            // a fresh bolt every 2 s of virtual time keeps the tool hammering rather than stalled
            rig.newFastener(rig.joint());
        }
        rig.fill(out, 0, SAMPLES);
        return out[SAMPLES - 1];
    }
}
