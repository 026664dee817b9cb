package hammerstep.health;

import hammerstep.results.StationEvent;
import org.junit.jupiter.api.Test;

import java.time.Instant;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Rejected impulses per hour against the warning level, on a clock advanced by hand. */
class InterferenceWatchTest {

    private static final long MINUTE = 60_000_000_000L;
    private static final Instant AT = Instant.parse("2026-12-02T08:00:00Z");

    @Test
    void moreThanTheLevelWithinAnHourWarnsOnceAndPointsAtShieldingAndGrounding() {
        InterferenceWatch w = new InterferenceWatch(60);
        long t = 5 * MINUTE;
        assertThat(w.poll(t, AT)).isNull();
        // one impulse a minute for an hour: exactly the level, no warning
        for (int m = 0; m < 60; m++) {
            w.add(1);
            assertThat(w.poll(t + m * MINUTE, AT)).isNull();
        }
        w.add(1);
        StationEvent e = w.poll(t + 59 * MINUTE + 1, AT);
        assertThat(e).isNotNull();
        assertThat(e.severity()).isEqualTo(StationEvent.Severity.WARNING);
        assertThat(e.code()).isEqualTo("INTERFERENCE");
        assertThat(e.message()).startsWith("61 electrical impulses").contains("shielding and grounding");
        w.add(5);
        assertThat(w.poll(t + 59 * MINUTE + 2, AT)).as("raised once").isNull();
        assertThat(w.warned()).isTrue();
    }

    @Test
    void aBurstWarnsAtOnceAndTheNoticeComesWhenTheHourHasPassed() {
        InterferenceWatch w = new InterferenceWatch(60);
        w.poll(0, AT);
        w.add(200);
        assertThat(w.poll(MINUTE / 2, AT).code()).isEqualTo("INTERFERENCE");
        assertThat(w.poll(59 * MINUTE, AT)).isNull();
        assertThat(w.lastHour()).isEqualTo(200);
        StationEvent ok = w.poll(61 * MINUTE, AT);
        assertThat(ok.code()).isEqualTo("INTERFERENCE_OK");
        assertThat(ok.severity()).isEqualTo(StationEvent.Severity.NOTICE);
        assertThat(w.lastHour()).isZero();
    }

    @Test
    void aLevelBelowOneIsRefused() {
        assertThatThrownBy(() -> new InterferenceWatch(0)).isInstanceOf(IllegalArgumentException.class);
    }
}
