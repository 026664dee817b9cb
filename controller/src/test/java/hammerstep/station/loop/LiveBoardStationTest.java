package hammerstep.station.loop;

import hammerstep.results.MemoryOutbox;
import hammerstep.web.LiveBoard;
import hammerstep.web.LiveSnapshot;
import hammerstep.web.ResultLog;
import hammerstep.web.Trail;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

/** The web view's board on the real station loop, driven by hand in virtual time. */
class LiveBoardStationTest {

    private final StationFixture f = new StationFixture();
    private final LiveBoard board = new LiveBoard(StationFixture.RATE, new ResultLog(100));

    private void start() {
        f.extra = board;
        f.start(new MemoryOutbox(), StationFixture.replayConditioning());
    }

    @Test
    void publishesANewSnapshotOnlyWhenWhatItShowsChanges() {
        start();
        f.cycles(5);
        LiveSnapshot waiting = board.snapshot();
        assertThat(waiting.phase()).isEqualTo("WAITING");
        assertThat(waiting.towerLamps().get(0)).as("white: ready").isEqualTo("STEADY");
        f.cycles(50);
        assertThat(board.snapshot()).as("nothing changed: the same object").isSameAs(waiting);

        f.scanPart("S-1");
        LiveSnapshot prompt = board.snapshot();
        assertThat(prompt.version()).isGreaterThan(waiting.version());
        assertThat(prompt.partSerial()).isEqualTo("S-1");
        assertThat(prompt.positions()).containsExactly("L", "R");
        assertThat(prompt.prompted()).isEqualTo("L");
        assertThat(prompt.positionLamps().get(0)).isEqualTo("BLINKING");
        assertThat(prompt.towerLamps().get(1)).as("blue: act").isEqualTo("STEADY");
        assertThat(prompt.toolEnabled()).isTrue();
        assertThat(prompt.targetNm()).isEqualTo(200.0);
        assertThat(prompt.shutoffNm()).isEqualTo(200.0);
    }

    @Test
    void drawsTheRundownAsItHappensWithItsBlows() {
        start();
        f.scanPart("S-1");
        f.pullTrigger();
        f.cycles(20); // 64 ms into the rundown: blows of 45, 90, 135, ... N·m every 20 ms
        Trail during = board.trail();
        assertThat(during.generation()).isEqualTo(1);
        assertThat(during.running()).isTrue();
        assertThat(during.blowNm()).isNotEmpty();
        f.trigger = false;
        f.cycles(200);
        Trail after = board.trail();
        assertThat(after.running()).isFalse();
        assertThat(after.blowNm().length).isGreaterThanOrEqualTo(during.blowNm().length);
        // each point keeps the largest sample of its 2 ms: the blow peaks survive the decimation
        float most = 0;
        for (float v : after.torqueNm()) {
            most = Math.max(most, v);
        }
        float lastBlow = after.blowNm()[after.blowNm().length - 1];
        assertThat((double) most).isCloseTo(lastBlow, org.assertj.core.data.Offset.offset(lastBlow * 0.05));
        assertThat(after.pointMs()).isEqualTo(LiveBoard.POINT_MS);
        assertThat(board.log().joints()).hasSize(1);
        assertThat(board.log().joints().get(0).id()).isEqualTo("id-1");
    }

    @Test
    void aNewRundownStartsANewTrail() {
        start();
        f.scanPart("S-1");
        f.tighten();
        long first = board.trail().generation();
        f.tighten();
        Trail second = board.trail();
        assertThat(second.generation()).isEqualTo(first + 1);
        assertThat(board.log().joints()).hasSize(2);
        assertThat(board.log().parts()).hasSize(1);
    }

    @Test
    void watchingAStationThatStandsStillAllocatesNothing() {
        com.sun.management.ThreadMXBean threads =
                (com.sun.management.ThreadMXBean) java.lang.management.ManagementFactory.getThreadMXBean();
        start();
        f.scanPart("S-1");
        f.cycles(400); // warm up: a prompt that stays, lamps blinking, idle torque blocks
        long tid = Thread.currentThread().getId();
        LiveSnapshot before = board.snapshot();
        long bytes = threads.getThreadAllocatedBytes(tid);
        for (int k = 0; k < 1000; k++) {
            board.onCycle(f.agent, f.clock.nanoTime());
        }
        long allocated = threads.getThreadAllocatedBytes(tid) - bytes;
        assertThat(board.snapshot()).isSameAs(before);
        assertThat(allocated).as("bytes allocated by 1000 unchanged cycles").isLessThan(1024);
    }

    @Test
    void aRundownsSamplesAndBlowsAllocateNothing() {
        com.sun.management.ThreadMXBean threads =
                (com.sun.management.ThreadMXBean) java.lang.management.ManagementFactory.getThreadMXBean();
        LiveBoard b = new LiveBoard(50_000, new ResultLog(10));
        float[] block = new float[512];
        for (int i = 0; i < block.length; i++) {
            block[i] = (float) (100 * Math.sin(i * 0.05));
        }
        long tid = Thread.currentThread().getId();
        b.onRundownStart(0);
        for (int k = 0; k < 100; k++) { // warm up
            b.onTorque(block, 0, 512, k * 10_240_000L);
            b.onBlow(k, 100, k * 10_240_000L + 5_000_000L);
        }
        long bytes = threads.getThreadAllocatedBytes(tid);
        b.onRundownStart(2_000_000_000L);
        for (int k = 0; k < 1000; k++) {
            long t = 2_000_000_000L + k * 10_240_000L;
            b.onTorque(block, 0, 512, t);
            b.onBlow(k, 100, t + 5_000_000L);
        }
        long allocated = threads.getThreadAllocatedBytes(tid) - bytes;
        assertThat(allocated).as("bytes allocated over 1000 blocks of a rundown").isLessThan(1024);
        Trail t = b.trail();
        assertThat(t.torqueNm()).hasSize(LiveBoardStationTest.maxPoints());
        assertThat(t.blowNm()).hasSize(1000);
    }

    private static int maxPoints() {
        return Math.min(8192, 1000 * 512 / 100); // 100 samples a point at 50 kHz
    }
}
