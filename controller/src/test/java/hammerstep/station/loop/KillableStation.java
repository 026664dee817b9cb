package hammerstep.station.loop;

import hammerstep.joint.JointMonitor;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.station.PartIdentity;
import hammerstep.station.SampleRing;
import hammerstep.station.VirtualClock;

import java.nio.file.Path;
import java.time.Instant;
import java.util.Map;
import java.util.UUID;

import static hammerstep.station.loop.StationFixture.BLOCK;
import static hammerstep.station.loop.StationFixture.BLOCK_NS;
import static hammerstep.station.loop.StationFixture.FINAL;
import static hammerstep.station.loop.StationFixture.ID;
import static hammerstep.station.loop.StationFixture.PATTERN;
import static hammerstep.station.loop.StationFixture.RATE;

/**
 * A station that works part after part in virtual time on a file outbox in the folder given as
 * the first argument, forcing every result to disk, until it is killed. {@link StationKillIT} runs
 * it in a child JVM and kills it with SIGKILL at random moments. A part found interrupted at start
 * is closed with the supervisor key first. Prints {@code started} once that is stored.
 */
public final class KillableStation {

    private KillableStation() {
    }

    public static void main(String[] args) throws Exception {
        Path dir = Path.of(args[0]);
        FileOutbox outbox = FileOutbox.open(new StorageSettings(dir, 1 << 20, 64L << 20, 1L << 30, 0, 0),
                () -> Long.MAX_VALUE);
        Fakes.Relay tool = new Fakes.Relay();
        Fakes.Scanner scanner = new Fakes.Scanner();
        Fakes.Inputs inputs = new Fakes.Inputs();
        SampleRing ring = new SampleRing(RATE, BLOCK, 16);
        VirtualClock clock = new VirtualClock(Instant.parse("2026-03-02T06:00:00Z"));
        StationAgent agent = new StationAgent(clock, new StationPorts(ring, new Fakes.RecordingLamps(4), tool,
                inputs, scanner), new OutboxResultSink(outbox, ID),
                new Sequence(new Sequence.Settings("TQ-1", null, 1), false), Map.of("M", PATTERN),
                JointMonitor.replayConditioning(FINAL), 1_000_000_000L, StationListener.NONE, t -> {
                    t.printStackTrace();
                    System.exit(3);
                });
        if (agent.sequence().phase() == Phase.REJECTED) {
            // a part was in work at the last kill: the supervisor checks it and turns the key
            agent.doWork();
            inputs.key = true;
            clock.advanceNs(BLOCK_NS);
            agent.doWork();
            inputs.key = false;
            clock.advanceNs(BLOCK_NS);
            agent.doWork();
        }
        System.out.println("started");
        System.out.flush();
        float[] block = new float[BLOCK];
        long sample = 0;
        long blowAt = Long.MIN_VALUE;
        long nextBlow = 0;
        int blowNo = 0;
        while (true) {
            scanner.queue.add(new PartIdentity("SN-" + UUID.randomUUID().toString().substring(0, 8), "M"));
            for (int joint = 0; joint < 2; joint++) {
                blowNo = 0;
                nextBlow = sample + BLOCK;
                for (int k = 0; k < 120; k++) {
                    boolean trigger = k < 80;
                    for (int i = 0; i < BLOCK; i++) {
                        long n = sample + i;
                        if (trigger && tool.enabled && n >= nextBlow) {
                            blowAt = n;
                            blowNo++;
                            nextBlow = n + 400;
                        }
                        long d = n - blowAt;
                        block[i] = d >= 0 && d < 40 ? (float) (45.0 * blowNo * Math.sin(Math.PI * d / 40)) : 0f;
                    }
                    ring.offer(block, 0, BLOCK, clock.nanoTime());
                    sample += BLOCK;
                    clock.advanceNs(BLOCK_NS);
                    agent.doWork();
                }
            }
            for (int k = 0; k < 4; k++) {
                clock.advanceNs(BLOCK_NS);
                agent.doWork();
            }
        }
    }
}
