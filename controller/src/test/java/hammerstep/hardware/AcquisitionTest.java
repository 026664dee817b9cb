package hammerstep.hardware;

import hammerstep.signal.Calibration;
import hammerstep.station.SampleRing;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class AcquisitionTest {

    static final double RATE = 10_000; // 100 us per conversion
    static final long PERIOD = 100_000;

    final FakeClock clock = new FakeClock();
    int next;
    final SimulatedAds1256 part = new SimulatedAds1256(() -> next++);
    final Ads1256 adc = new Ads1256(new PartLink(part), new PacedDataReady(RATE), clock, "spi0.1", 0, 1, 64, 1000, 2.5, true);

    /** An ADS1256 at 1000 Hz in the driver; the acquisition is checked with the paced data-ready at {@link #RATE}. */
    AdcDriver at(double rateHz) {
        return new AdcDriver() {
            public String part() { return adc.part(); }
            public int bits() { return 24; }
            public double rateHz() { return rateHz; }
            public double fullScaleInputV() { return adc.fullScaleInputV(); }
            public double gain() { return adc.gain(); }
            public void start() { adc.start(); }
            public int read() { return adc.read(); }
            public void stop() { adc.stop(); }
        };
    }

    // 1 count = 1 mN.m: a made-up calibration that keeps the arithmetic readable
    final Calibration cal = new Calibration(1.0, 1.0, 1, 1.0, 1e-3 * Math.scalb(1.0, 23) * 1e-3, 24);

    @Test
    void fillsBlocksWithConvertedSamplesStampedAtTheirFirstSample() {
        SampleRing ring = new SampleRing(RATE, 4, 8);
        Acquisition acq = new Acquisition(at(RATE), new PacedDataReady(RATE), clock, cal, 2, ring);
        acq.onStart();
        next = 10;
        clock.nowNs = 5_000_000;

        for (int i = 0; i < 9; i++) {
            assertThat(acq.doWork()).isEqualTo(1);
            assertThat(acq.doWork()).as("nothing until the next period").isZero();
            clock.advanceNs(PERIOD);
        }

        List<float[]> blocks = new ArrayList<>();
        List<Long> stamps = new ArrayList<>();
        ring.poll((s, off, len, first) -> {
            blocks.add(java.util.Arrays.copyOfRange(s, off, off + len));
            stamps.add(first);
        }, 10);
        assertThat(blocks).hasSize(2);
        assertThat(blocks.get(0)[0]).isCloseTo(0.008f, within(1e-6f)); // (10 - 2) counts
        assertThat(blocks.get(1)[3]).isCloseTo(0.015f, within(1e-6f)); // (17 - 2) counts
        assertThat(stamps).containsExactly(5_000_000L, 5_400_000L);
        assertThat(acq.samples()).isEqualTo(9);
        assertThat(acq.missedSamples()).isZero();
    }

    @Test
    void countsConversionsMissedWhileTheThreadWasAway() {
        SampleRing ring = new SampleRing(RATE, 4, 8);
        Acquisition acq = new Acquisition(at(RATE), new PacedDataReady(RATE), clock, cal, 0, ring);
        acq.onStart();

        acq.doWork();
        clock.advanceNs(PERIOD);
        acq.doWork();
        clock.advanceNs(5 * PERIOD); // four conversions came and went
        acq.doWork();

        assertThat(acq.missedSamples()).isEqualTo(4);
    }

    @Test
    void missedConversionsShowInTheStampsAndAreAnnouncedToTheStation() {
        SampleRing ring = new SampleRing(RATE, 2, 8);
        Acquisition acq = new Acquisition(at(RATE), new PacedDataReady(RATE), clock, cal, 0, ring);
        acq.onStart();
        clock.nowNs = 1_000_000;
        for (int i = 0; i < 4; i++) {
            acq.doWork();
            clock.advanceNs(i == 2 ? 4 * PERIOD : PERIOD); // three conversions missed after the third read
        }
        acq.doWork();
        clock.advanceNs(PERIOD);
        acq.doWork();

        List<String> seen = new ArrayList<>();
        ring.poll(new hammerstep.station.SampleBlockHandler() {
            @Override
            public void onBlock(float[] samples, int offset, int length, long firstSampleNs) {
                seen.add(Long.toString(firstSampleNs));
            }

            @Override
            public void onGap() {
                seen.add("gap");
            }
        }, 10);
        // reads at 0, 1, 2, 6, 7, 8 periods in blocks of two: the second block (2 and 6) holds the gap
        assertThat(seen).containsExactly("1000000", "gap", "1200000", "1700000");
        assertThat(acq.missedSamples()).isEqualTo(3);
    }

    @Test
    void aReadLateByLessThanAConversionDoesNotMoveTheStampsByHalfAPeriod() {
        SampleRing ring = new SampleRing(RATE, 4, 8);
        Acquisition acq = new Acquisition(at(RATE), new PacedDataReady(RATE), clock, cal, 0, ring);
        acq.onStart();
        clock.nowNs = 2_000_000;
        long[] late = {0, 0, 0, 0, 40_000, 0, 0, 0, 0, 0, 0, 0}; // the fifth read comes 40 µs late
        for (int i = 0; i < late.length; i++) {
            clock.nowNs = 2_000_000 + i * PERIOD + late[i];
            acq.doWork();
        }
        List<Long> stamps = new ArrayList<>();
        ring.poll((s, off, len, first) -> stamps.add(first), 10);
        assertThat(stamps).hasSize(3);
        assertThat(stamps.get(1) - stamps.get(0) - 4 * PERIOD).isBetween(-PERIOD / 2, PERIOD / 2);
        assertThat(stamps.get(2) - stamps.get(1) - 4 * PERIOD).isBetween(-PERIOD / 2, PERIOD / 2);
        assertThat(acq.missedSamples()).isZero();
    }

    @Test
    void discardsAWholeBlockWhenTheRingIsFull() {
        SampleRing ring = new SampleRing(RATE, 2, 2);
        Acquisition acq = new Acquisition(at(RATE), new PacedDataReady(RATE), clock, cal, 0, ring);
        acq.onStart();

        for (int i = 0; i < 8; i++) {
            acq.doWork();
            clock.advanceNs(PERIOD);
        }

        assertThat(ring.waiting()).isEqualTo(2);
        assertThat(acq.droppedBlocks()).isEqualTo(2);
        float[] firstValues = new float[2];
        ring.poll((s, off, len, first) -> {
            if (firstValues[1] == 0) {
                firstValues[0] = s[off];
                firstValues[1] = 1;
            }
        }, 1);
        assertThat(firstValues[0]).as("the oldest blocks are kept").isCloseTo(0.0f, within(1e-6f));
    }
}
