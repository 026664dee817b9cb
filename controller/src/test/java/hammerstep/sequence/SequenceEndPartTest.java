package hammerstep.sequence;

import org.junit.jupiter.api.Test;

import static hammerstep.sequence.TestPrograms.SNUG;
import static hammerstep.sequence.TestPrograms.go;
import static org.assertj.core.api.Assertions.assertThat;

/** The plant ends the part in work ({@code cmd/end-part}): on record with its reason, stored as abandoned. */
class SequenceEndPartTest {

    private final Harness h = new Harness(false);
    private final Pattern pattern = TestPrograms.fourBolt(3, Acknowledge.OPERATOR, AfterNoGo.REJECT);

    @Test
    void aPartInWorkIsStoredAbandonedAfterANoticeWithTheReason() {
        h.start(pattern, "SN-1");
        h.rundown(go(SNUG));
        assertThat(h.seq.endPart("scrapped at repair", h.now())).isNull();
        h.drain();
        assertThat(h.eventCodes()).containsExactly("PART_ENDED");
        assertThat(h.stored).filteredOn(s -> s instanceof Store.Event)
                .extracting(s -> ((Store.Event) s).event().message()).singleElement()
                .satisfies(m -> assertThat(m).contains("SN-1").endsWith("scrapped at repair"));
        assertThat(h.parts()).singleElement().satisfies(p -> {
            assertThat(p.outcome().ended()).isEqualTo("ABANDONED");
            assertThat(p.outcome().jointIds()).hasSize(1);
        });
        assertThat(h.seq.phase()).isEqualTo(Phase.WAITING);
        assertThat(h.seq.toolEnabled()).isFalse();
    }

    @Test
    void withoutAPartOrDuringAStoreFaultNothingIsEndedAndTheCallerIsToldWhy() {
        assertThat(h.seq.endPart("x", h.now())).isEqualTo("NO_PART");
        h.start(pattern, "SN-2");
        h.storeFails = true;
        h.rundown(go(SNUG));
        assertThat(h.seq.endPart("x", h.now())).isEqualTo("FAULT");
        assertThat(h.seq.part().serial()).isEqualTo("SN-2");
        assertThat(h.parts()).isEmpty();
    }
}
