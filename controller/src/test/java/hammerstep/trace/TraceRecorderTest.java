package hammerstep.trace;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

class TraceRecorderTest {

    /** Feeds sample k with value k, in blocks of 7 at 1 kHz starting at t = 0. */
    static TraceRecorder fed(int capacity, int total) {
        TraceRecorder r = new TraceRecorder(1000, capacity);
        float[] block = new float[7];
        for (int k = 0; k < total; k += 7) {
            int n = Math.min(7, total - k);
            for (int i = 0; i < n; i++) {
                block[i] = k + i;
            }
            r.onSamples(block, 0, n, (long) k * 1_000_000L);
        }
        return r;
    }

    @Test
    void cutsTheRequestedSpanOutOfTheRingAcrossItsWrap() {
        TraceRecorder r = fed(50, 130);
        float[] dst = new float[50];

        TraceRecorder.Span s = r.copy(100_000_000L, 120_000_000L, dst);

        assertThat(s.samples()).isEqualTo(21);
        assertThat(s.firstSampleNs()).isEqualTo(100_000_000L);
        for (int i = 0; i < 21; i++) {
            assertThat(dst[i]).isEqualTo(100 + i);
        }
    }

    @Test
    void clipsASpanToWhatTheRingStillHolds() {
        TraceRecorder r = fed(50, 130);
        float[] dst = new float[100];

        TraceRecorder.Span s = r.copy(0, 200_000_000L, dst);

        assertThat(s.samples()).isEqualTo(50);
        assertThat(s.firstSampleNs()).isEqualTo(80_000_000L);
        assertThat(dst[0]).isEqualTo(80);
        assertThat(dst[49]).isEqualTo(129);
    }

    @Test
    void keepsTheLatestPartWhenTheDestinationIsShort() {
        TraceRecorder r = fed(50, 40);
        float[] dst = new float[10];

        TraceRecorder.Span s = r.copy(0, 39_000_000L, dst);

        assertThat(s.samples()).isEqualTo(10);
        assertThat(dst[0]).isEqualTo(30);
    }

    @Test
    void aBlockLongerThanTheRingKeepsItsTail() {
        TraceRecorder r = new TraceRecorder(1000, 5);
        float[] block = {0, 1, 2, 3, 4, 5, 6, 7};
        r.onSamples(block, 0, 8, 0);
        float[] dst = new float[5];

        TraceRecorder.Span s = r.copy(0, 7_000_000L, dst);

        assertThat(s.samples()).isEqualTo(5);
        assertThat(dst).containsExactly(3, 4, 5, 6, 7);
    }

    @Test
    void nothingRecordedGivesAnEmptySpan() {
        assertThat(new TraceRecorder(1000, 5).copy(0, 1_000_000, new float[5]).samples()).isZero();
    }
}
