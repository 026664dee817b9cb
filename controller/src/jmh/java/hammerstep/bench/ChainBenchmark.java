package hammerstep.bench;

import hammerstep.joint.FinalTorque;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointMonitor;
import hammerstep.joint.JointProgram;
import hammerstep.signal.Conditioning;
import hammerstep.signal.PulseTrain;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;

import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.concurrent.TimeUnit;

/**
 * The whole measurement chain (conditioning, blow detection, rundown segmentation, verdict) on a
 * realistic block stream at 50 kHz: rundowns of 6 to 20 blows at 1100 to 3300 per minute with
 * noise and offset, separated by idle time, as a station sees it. One operation is one block;
 * samples per second = ops/s × block. {@code copy} moves the same blocks with System.arraycopy,
 * the floor any chain is compared with; {@code extremes} only reads them and takes their extremes,
 * the floor of any stage that looks at every sample. {@code rejectImpulses} switches impulse rejection (and its
 * look-ahead copy) and the flat-top check on or off; {@code mainsHz} 50 names the mains frequency
 * (hum cancelling), 0 leaves it unnamed (with rejection on, the hum watchers run instead). The
 * stream carries 5 N·m of 50 Hz hum and 1.5 N·m at 150 Hz either way.
 *
 * <pre>
 * mvn -q -Pbench -DskipTests package -pl controller
 * java -jar controller/target/benchmarks.jar ChainBenchmark -prof gc
 * </pre>
 */
@State(Scope.Thread)
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class ChainBenchmark {

    private static final double RATE = 50_000;

    @Param({"512"})
    int block;

    /** Impulse rejection and the flat-top check on (as replay and the station run) or off, to show their cost. */
    @Param({"true", "false"})
    boolean rejectImpulses;

    /** The mains frequency named (hum cancelled), or 0 for none. */
    @Param({"0", "50"})
    double mainsHz;

    private float[] stream;
    private float[] copy;
    private int pos;
    private long ns;
    private JointMonitor monitor;
    private long rundowns;

    @Setup
    public void setUp() {
        Random r = new Random(42);
        List<PulseTrain.Strike> strikes = new ArrayList<>();
        double t = 0.3;
        double duration = 60.0;
        while (t < duration - 2) {
            int blows = 6 + r.nextInt(15);
            List<PulseTrain.Strike> rundown = PulseTrain.randomRundown(r, t, blows, 60, 210, 1100, 3300);
            strikes.addAll(rundown);
            t = rundown.get(blows - 1).startS() + 0.5 + r.nextDouble();
        }
        stream = PulseTrain.render(RATE, duration, strikes, 0.4, 0.3, 7);
        for (int i = 0; i < stream.length; i++) {
            double ph = 2 * Math.PI * 50 * i / RATE;
            stream[i] += (float) (5 * Math.sin(ph + 0.3) + 1.5 * Math.sin(3 * ph + 1.1));
        }
        copy = new float[block];
        JointProgram program = new JointProgram("bench", "", new JointProgram.Torque(180, 200, 230),
                FinalTorque.MAX_PEAK, new JointProgram.Blows(40, 20, 4, 30, 7.5),
                new JointProgram.Rundown(10, 200, 5000), 205, 2);
        JointEvents events = result -> rundowns++;
        Conditioning conditioning = JointMonitor.replayConditioning(program);
        conditioning = (rejectImpulses ? conditioning : conditioning.withImpulse(0)).withMains(mainsHz);
        monitor = new JointMonitor(program, conditioning, RATE, block, events);
    }

    private int next() {
        int p = pos;
        if (p + block > stream.length) {
            p = 0;
        }
        pos = p + block;
        ns += (long) (block * 1e9 / RATE);
        return p;
    }

    @Benchmark
    public void chain() {
        monitor.onSamples(stream, next(), block, ns);
    }

    @Benchmark
    public void copy(Blackhole bh) {
        System.arraycopy(stream, next(), copy, 0, block);
        bh.consume(copy);
    }

    /**
     * The least a scalar pass over the block costs: it reads each sample once and takes the block's
     * extremes the way the conditioner's pass does (as integer keys, four accumulators each, no
     * branch per sample), and does nothing else. No stage that looks at every sample can beat it.
     */
    @Benchmark
    public void extremes(Blackhole bh) {
        float[] s = stream;
        int b = next();
        int max0 = Integer.MIN_VALUE, max1 = max0, max2 = max0, max3 = max0;
        int min0 = Integer.MAX_VALUE, min1 = min0, min2 = min0, min3 = min0;
        for (int i = 0; i + 3 < block; i += 4) { // a block of 512: the tail of a block not of fours is left out
            int k0 = key(s[b + i]);
            int k1 = key(s[b + i + 1]);
            int k2 = key(s[b + i + 2]);
            int k3 = key(s[b + i + 3]);
            max0 = Math.max(max0, k0);
            max1 = Math.max(max1, k1);
            max2 = Math.max(max2, k2);
            max3 = Math.max(max3, k3);
            min0 = Math.min(min0, k0);
            min1 = Math.min(min1, k1);
            min2 = Math.min(min2, k2);
            min3 = Math.min(min3, k3);
        }
        bh.consume(Math.max(Math.max(max0, max1), Math.max(max2, max3)));
        bh.consume(Math.min(Math.min(min0, min1), Math.min(min2, min3)));
    }

    private static int key(float v) {
        int bits = Float.floatToRawIntBits(v);
        return bits ^ ((bits >> 31) >>> 1);
    }


}
