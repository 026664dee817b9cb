package hammerstep.hardware;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

class DebouncerTest {

    static final long MS = 1_000_000;

    @Test
    void ignoresBouncesShorterThanTheDebounceTime() {
        Debouncer d = new Debouncer(20 * MS, false);

        assertThat(d.update(true, 0)).isFalse();
        assertThat(d.update(false, 3 * MS)).isFalse();
        assertThat(d.update(true, 5 * MS)).isFalse();
        assertThat(d.update(true, 24 * MS)).as("held 19 ms").isFalse();
        assertThat(d.update(true, 25 * MS)).as("held 20 ms").isTrue();
    }

    @Test
    void releaseIsDebouncedToo() {
        Debouncer d = new Debouncer(10 * MS, false);
        d.update(true, 0);
        d.update(true, 10 * MS);

        assertThat(d.update(false, 11 * MS)).isTrue();
        assertThat(d.update(true, 12 * MS)).isTrue();
        assertThat(d.update(false, 13 * MS)).isTrue();
        assertThat(d.update(false, 23 * MS)).isFalse();
    }

    @Test
    void zeroDebounceFollowsAtOnce() {
        Debouncer d = new Debouncer(0, false);

        assertThat(d.update(true, 5)).isTrue();
        assertThat(d.update(false, 6)).isFalse();
    }

    @Test
    void worksAcrossTheClockWrap() {
        Debouncer d = new Debouncer(10 * MS, false);
        long start = Long.MAX_VALUE - 5 * MS;

        d.update(true, start);
        assertThat(d.update(true, start + 9 * MS)).isFalse();
        assertThat(d.update(true, start + 10 * MS)).isTrue();
    }
}
