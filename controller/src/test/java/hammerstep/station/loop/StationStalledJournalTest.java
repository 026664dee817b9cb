package hammerstep.station.loop;

import hammerstep.joint.Verdict;
import hammerstep.results.ForwardingOutbox;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageKind;
import hammerstep.results.ResultStoreException;
import hammerstep.sequence.Phase;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Storage off the sample path: the station runs on a journal writer of its own whose every forced
 * write stalls for 500 ms (an SD card at its worst; the figure is the issue's, a slow card stalls
 * for hundreds of ms: field experience, memory). The station must keep taking every sample block,
 * still drop the tool within one block of the crossing, and show a verdict only once its record
 * is on disk.
 */
class StationStalledJournalTest {

    private static final long STALL_NS = 500_000_000L;

    /** The outbox double: notes the virtual time at which each append (a forced write) completed. */
    private static final class TimedOutbox extends ForwardingOutbox {
        final List<Long> appendedAtNs = new ArrayList<>();
        final List<MessageKind> kinds = new ArrayList<>();
        private final StationFixture station;

        TimedOutbox(StationFixture station) {
            super(new MemoryOutbox());
            this.station = station;
        }

        @Override
        public long append(MessageKind kind, long seq, String id, byte[] payload) throws ResultStoreException {
            long position = super.append(kind, seq, id, payload);
            appendedAtNs.add(station.clock.nanoTime());
            kinds.add(kind);
            return position;
        }
    }

    private final StationFixture station = new StationFixture();

    private long jointAppendedAtNs(int n) {
        int seen = 0;
        for (int k = 0; k < outbox.kinds.size(); k++) {
            if (outbox.kinds.get(k) == MessageKind.JOINT && seen++ == n) {
                return outbox.appendedAtNs.get(k);
            }
        }
        throw new AssertionError("joint " + n + " was never appended");
    }
    private final TimedOutbox outbox = new TimedOutbox(station);

    @Test
    void aRunOfPartsWithEveryForcedWriteStalledDropsNoBlockShutsOffWithinABlockAndShowsEachVerdictOnlyOnDisk() {
        station.startOnWriter(outbox, StationFixture.replayConditioning(), STALL_NS);
        int parts = 4;
        long worstShutoffNs = 0;
        int mostWaiting = 0;
        for (int p = 0; p < parts; p++) {
            station.scanPart("SN-" + p);
            for (int joint = 0; joint < 2; joint++) {
                int storedBefore = station.joints.size();
                assertThat(station.tool.enabled).as("part %d joint %d prompted", p, joint).isTrue();
                station.tighten(200, 0);
                worstShutoffNs = Math.max(worstShutoffNs, station.agent.lastShutoffToRelayNs());
                while (station.agent.sequence().phase() == Phase.RUNDOWN) {
                    station.cycle(); // the trigger is let go; the rundown ends
                }
                long judgedAtNs = station.clock.nanoTime();
                // the writer is stuck in the forced write: the station goes on cycling, shows no verdict
                assertThat(station.agent.sequence().phase()).isEqualTo(Phase.STORING);
                for (int k = 0; k < 100; k++) { // 320 ms of blocks
                    station.cycle();
                    mostWaiting = Math.max(mostWaiting, station.ring.waiting());
                    assertThat(station.agent.sequence().phase()).isEqualTo(Phase.STORING);
                    assertThat(station.agent.sequence().done(station.agent.sequence().prompted())).isFalse();
                    assertThat(station.lamps.lit(TowerLamp.GREEN)).isFalse();
                }
                assertThat(station.joints).hasSize(storedBefore);
                int guard = 0;
                while (station.agent.sequence().phase() == Phase.STORING && guard++ < 1000) {
                    station.cycle();
                    mostWaiting = Math.max(mostWaiting, station.ring.waiting());
                }
                assertThat(station.joints).hasSize(storedBefore + 1);
                long shownAtNs = station.clock.nanoTime();
                long onDiskAtNs = jointAppendedAtNs(2 * p + joint);
                assertThat(onDiskAtNs - judgedAtNs).as("the write took the stall").isGreaterThanOrEqualTo(STALL_NS);
                assertThat(shownAtNs).as("the verdict shows only after its record is on disk")
                        .isGreaterThanOrEqualTo(onDiskAtNs);
                assertThat(shownAtNs - onDiskAtNs).as("and within a block of it")
                        .isLessThanOrEqualTo(StationFixture.BLOCK_NS);
            }
            assertThat(station.agent.sequence().phase()).isEqualTo(Phase.COMPLETE);
            assertThat(station.lamps.lit(TowerLamp.GREEN)).as("the part's GO waits for its record").isFalse();
            int guard = 0;
            while (station.parts.size() == p && guard++ < 1000) {
                station.cycle(); // the part record's write
                assertThat(station.lamps.lit(TowerLamp.GREEN)).isEqualTo(station.parts.size() > p);
            }
            while (station.agent.sequence().phase() != Phase.WAITING && guard++ < 2000) {
                station.cycle(); // the complete hold
                assertThat(station.lamps.lit(TowerLamp.GREEN) || station.agent.sequence().phase() == Phase.WAITING)
                        .isTrue();
            }
        }
        assertThat(station.errors).isEmpty();
        assertThat(station.ring.droppedBlocks()).as("sample blocks dropped").isZero();
        assertThat(mostWaiting).as("blocks ever waiting after a cycle").isZero();
        assertThat(worstShutoffNs).isBetween(0L, StationFixture.BLOCK_NS);
        assertThat(station.blowsStartedAfterDisable).isZero();
        assertThat(station.joints).hasSize(2 * parts)
                .allSatisfy(j -> assertThat(j.result().verdict()).isEqualTo(Verdict.GO));
        assertThat(station.parts).hasSize(parts).allSatisfy(p -> assertThat(p.verdict()).isEqualTo("GO"));
        assertThat(outbox.kinds).containsOnly(MessageKind.JOINT, MessageKind.PART).hasSize(3 * parts);
        assertThat(outbox.nextSeq(MessageKind.JOINT)).isEqualTo(2L * parts + 1);
    }

    @Test
    void theStationSeesTheRoomTheWriterReportsAfterAWrite() {
        station.startOnWriter(new MemoryOutbox(1, 1), StationFixture.replayConditioning(), STALL_NS);
        station.scanPart("SN-0");
        assertThat(station.agent.storage()).isEqualTo(hammerstep.results.ResultSink.Storage.OK);
        station.tighten(200, 0);
        int guard = 0;
        while (station.joints.isEmpty() && guard++ < 1000) {
            station.cycle();
        }
        assertThat(station.writer.storage()).isEqualTo(hammerstep.results.ResultSink.Storage.FULL);
        assertThat(station.agent.storage()).isEqualTo(hammerstep.results.ResultSink.Storage.FULL);
        assertThat(station.ring.droppedBlocks()).isZero();
    }
}
