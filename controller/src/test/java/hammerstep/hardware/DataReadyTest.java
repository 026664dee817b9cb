package hammerstep.hardware;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

class DataReadyTest {

    @Test
    void pacedIsReadyOncePerPeriod() {
        PacedDataReady r = new PacedDataReady(10_000); // 100 us
        assertThat(r.ready(1_000)).isTrue();
        r.taken(1_000);
        assertThat(r.ready(100_999)).isFalse();
        assertThat(r.ready(101_000)).isTrue();
    }

    @Test
    void pacedRestartsFromNowWhenFarBehind() {
        PacedDataReady r = new PacedDataReady(10_000);
        r.ready(0);
        r.taken(0);
        r.taken(1_000_000); // read 10 periods late
        assertThat(r.ready(1_099_999)).isFalse();
        assertThat(r.ready(1_100_000)).isTrue();
    }

    @Test
    void lineTakesAConversionOnlyOnce() {
        boolean[] low = {true};
        LineDataReady r = new LineDataReady(() -> low[0], 10_000);

        assertThat(r.ready(0)).isTrue();
        r.taken(0);
        assertThat(r.ready(10_000)).as("line still low right after the read").isFalse();
        assertThat(r.ready(50_000)).isTrue();
        low[0] = false;
        assertThat(r.ready(60_000)).isFalse();
    }
}
