package hammerstep.station;

import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class SampleRingTest {

    private final List<String> seen = new ArrayList<>();
    private final SampleBlockHandler recorder = (s, off, len, ns) -> seen.add(len + "@" + ns + ":" + s[off]);

    @Test
    void handsBlocksOverInOrderWithTheirTimes() {
        SampleRing ring = new SampleRing(10_000, 4, 4);
        assertThat(ring.offer(new float[] {1, 2, 3}, 0, 3, 100)).isTrue();
        assertThat(ring.offer(new float[] {9, 5}, 0, 2, 400)).isTrue();
        assertThat(ring.poll(recorder, 10)).isEqualTo(2);
        assertThat(seen).containsExactly("3@100:1.0", "2@400:9.0");
        assertThat(ring.poll(recorder, 10)).isZero();
    }

    @Test
    void dropsAndCountsABlockWhenFullInsteadOfWaiting() {
        SampleRing ring = new SampleRing(10_000, 2, 2);
        float[] b = {1, 2};
        assertThat(ring.offer(b, 0, 2, 0)).isTrue();
        assertThat(ring.offer(b, 0, 2, 1)).isTrue();
        assertThat(ring.offer(b, 0, 2, 2)).isFalse();
        assertThat(ring.droppedBlocks()).isEqualTo(1);
        assertThat(ring.poll(recorder, 1)).isEqualTo(1);
        assertThat(ring.offer(b, 0, 2, 3)).isTrue();
        assertThat(ring.poll(recorder, 5)).isEqualTo(2);
        assertThat(seen).extracting(s -> s.split("@")[1].split(":")[0]).containsExactly("0", "1", "3");
    }

    /** Records blocks and the gaps announced before them. */
    private final SampleBlockHandler gapRecorder = new SampleBlockHandler() {
        @Override
        public void onBlock(float[] samples, int offset, int length, long firstSampleNs) {
            seen.add(Long.toString(firstSampleNs));
        }

        @Override
        public void onGap() {
            seen.add("gap");
        }
    };

    @Test
    void aDroppedBlockIsAnnouncedOnceBeforeTheBlockThatFollowsIt() {
        SampleRing ring = new SampleRing(10_000, 2, 2);
        float[] b = {1, 2};
        ring.offer(b, 0, 2, 0);
        ring.offer(b, 0, 2, 1);
        assertThat(ring.offer(b, 0, 2, 2)).isFalse();
        assertThat(ring.offer(b, 0, 2, 3)).isFalse();
        ring.poll(gapRecorder, 1);
        ring.offer(b, 0, 2, 4);
        ring.poll(gapRecorder, 1);
        ring.offer(b, 0, 2, 5);
        ring.poll(gapRecorder, 5);
        assertThat(seen).containsExactly("0", "1", "gap", "4", "5");
    }

    @Test
    void aLossTheWriterReportsIsAnnouncedBeforeItsNextBlock() {
        SampleRing ring = new SampleRing(10_000, 2, 4);
        float[] b = {1, 2};
        ring.offer(b, 0, 2, 0);
        ring.lost(); // e.g. conversions missed while this block filled
        ring.offer(b, 0, 2, 1);
        ring.offer(b, 0, 2, 2);
        ring.poll(gapRecorder, 5);
        assertThat(seen).containsExactly("0", "gap", "1", "2");
    }

    @Test
    void claimAndCommitFillTheSlotInPlace() {
        SampleRing ring = new SampleRing(10_000, 3, 2);
        float[] slot = ring.claim();
        slot[0] = 7;
        ring.commit(1, 55);
        ring.poll(recorder, 1);
        assertThat(seen).containsExactly("1@55:7.0");
    }

    @Test
    void rejectsACapacityThatIsNotAPowerOfTwo() {
        assertThatThrownBy(() -> new SampleRing(1000, 8, 3)).isInstanceOf(IllegalArgumentException.class);
    }

    @Test
    void carriesEveryBlockAcrossThreadsWithoutLoss() throws InterruptedException {
        SampleRing ring = new SampleRing(10_000, 1, 8);
        int total = 200_000;
        Thread writer = new Thread(() -> {
            float[] one = new float[1];
            for (int i = 0; i < total; ) {
                one[0] = i;
                if (ring.offer(one, 0, 1, i)) {
                    i++;
                } else {
                    Thread.onSpinWait();
                }
            }
        });
        long[] expected = {0};
        boolean[] inOrder = {true};
        writer.start();
        while (expected[0] < total) {
            ring.poll((s, off, len, ns) -> {
                if (ns != expected[0] || s[off] != (float) ns) {
                    inOrder[0] = false;
                }
                expected[0]++;
            }, 8);
        }
        writer.join();
        assertThat(inOrder[0]).isTrue();
    }
}
