package hammerstep.hardware;

import hammerstep.signal.Calibration;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.util.ArrayDeque;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class Ads1256Test {

    @Test
    @DisplayName("24-bit two's complement: 7FFFFF, 800000, FFFFFF, 000001 (ADS1256 datasheet, output code table)")
    void decodesTwosComplementCodes() {
        assertThat(Ads1256.decode24((byte) 0x7F, (byte) 0xFF, (byte) 0xFF)).isEqualTo(8_388_607);
        assertThat(Ads1256.decode24((byte) 0x80, (byte) 0x00, (byte) 0x00)).isEqualTo(-8_388_608);
        assertThat(Ads1256.decode24((byte) 0xFF, (byte) 0xFF, (byte) 0xFF)).isEqualTo(-1);
        assertThat(Ads1256.decode24((byte) 0x00, (byte) 0x00, (byte) 0x01)).isEqualTo(1);
    }

    /*
     * Strain-gauge bridge basics (derived): a 24-bit ADC at gain 128 on a 2 mV/V transducer at full scale reads about
     * 2 147 484 counts, ratiometric: 2^23 x 128 x 0.002 = 2 147 483.6. By hand 2 147 484 = 0x20C49C.
     */
    @Test
    @DisplayName("frame 20 C4 9C reads full scale: 24 bit, gain 128, 2 mV/V ratiometric (strain-gauge bridge basics, derived)")
    void frameAtFullScaleReadsRatedTorque() {
        int counts = Ads1256.decode24((byte) 0x20, (byte) 0xC4, (byte) 0x9C);
        Calibration cal = new Calibration(2.0, 500.0, 128, 5.0, 5.0, 24);

        assertThat(counts).isEqualTo(2_147_484);
        assertThat(counts * cal.nmPerCount()).isCloseTo(500.0, within(0.001));
    }

    @Test
    @DisplayName("DRATE, PGA and MUX codes as in the datasheet's register descriptions")
    void encodesRegisterCodes() {
        assertThat(Ads1256.rateCode(30000)).isEqualTo(0xF0);
        assertThat(Ads1256.rateCode(15000)).isEqualTo(0xE0);
        assertThat(Ads1256.rateCode(1000)).isEqualTo(0xA1);
        assertThat(Ads1256.rateCode(2.5)).isEqualTo(0x03);
        assertThat(Ads1256.pgaCode(1)).isZero();
        assertThat(Ads1256.pgaCode(64)).isEqualTo(6);
        assertThat(Ads1256.muxCode(0, 1)).isEqualTo(0x01);
        assertThat(Ads1256.muxCode(2, Ads1256.AINCOM)).isEqualTo(0x28);
        assertThatThrownBy(() -> Ads1256.pgaCode(128)).hasMessageContaining("1, 2, 4, 8, 16, 32, 64");
        assertThatThrownBy(() -> Ads1256.rateCode(20000)).hasMessageContaining("30000, 15000");
    }

    @Test
    @DisplayName("WREG of four registers from STATUS is 50 03 then the values")
    void encodesRegisterWrite() {
        byte[] out = new byte[8];
        int n = Ads1256.encodeWrite(Ads1256.REG_STATUS, new int[] {0x06, 0x01, 0x06, 0xE0}, out);

        assertThat(n).isEqualTo(6);
        assertThat(hex(out, n)).isEqualTo("50 03 06 01 06 E0");
    }

    @Test
    void startsConfiguresVerifiesAndReadsContinuously() {
        ArrayDeque<Integer> recorded = new ArrayDeque<>(List.of(2_147_484, -1, -8_388_608, 8_388_607));
        SimulatedAds1256 part = new SimulatedAds1256(recorded::poll);
        PartLink link = new PartLink(part);
        Ads1256 adc = new Ads1256(link, now -> true, new FakeClock(), "spi0.1", 0, 1, 64, 15000, 2.5, true);

        adc.start();

        assertThat(link.sentHex()).isEqualTo(
                "FE 0F 50 03 06 01 06 E0 10 03 00 00 00 00 F0 FC 00 03");
        assertThat(part.register(Ads1256.REG_MUX)).isEqualTo(0x01);
        assertThat(part.register(Ads1256.REG_ADCON)).isEqualTo(0x06);
        assertThat(part.register(Ads1256.REG_DRATE)).isEqualTo(0xE0);
        assertThat(part.continuous()).isTrue();
        assertThat(adc.chipId()).isEqualTo(3);
        assertThat(link.selected).as("chip select held through continuous reading").isTrue();
        assertThat(link.pausedNs).as("t6 waits before each answer").isGreaterThanOrEqualTo(2 * Ads1256.T6_NS);

        assertThat(adc.read()).isEqualTo(2_147_484);
        assertThat(adc.read()).isEqualTo(-1);
        assertThat(adc.read()).isEqualTo(-8_388_608);
        assertThat(adc.read()).isEqualTo(8_388_607);

        adc.stop();
        assertThat(part.continuous()).isFalse();
        assertThat(link.selected).isFalse();
    }

    @Test
    @DisplayName("full-scale input is 2 VREF: with VREF half the excitation the calibration is ratiometric")
    void fullScaleInputIsTwiceTheReference() {
        Ads1256 adc = new Ads1256(new PartLink(new SimulatedAds1256(() -> 0)), now -> true, new FakeClock(), "spi0.1",
                0, 1, 64, 15000, 2.5, true);

        assertThat(adc.fullScaleInputV()).isEqualTo(5.0);
        assertThat(adc.bits()).isEqualTo(24);
        assertThat(adc.gain()).isEqualTo(64.0);
    }

    @Test
    void reportsAPartThatDoesNotAnswer() {
        SimulatedPart silent = (tx, txOffset, rx, rxOffset, length) -> {
            for (int i = 0; i < length; i++) {
                rx[rxOffset + i] = (byte) 0xFF;
            }
        };
        Ads1256 adc = new Ads1256(new PartLink(silent), now -> true, new FakeClock(), "spi0.1", 0, 1, 64, 15000, 2.5, true);

        assertThatThrownBy(adc::start).isInstanceOf(HardwareException.class)
                .hasMessage("ADS1256 on spi0.1 does not answer (registers read ff ff ff ff): check wiring, power and chip select");
    }

    @Test
    void reportsSettingsThatDidNotStick() {
        SimulatedAds1256 real = new SimulatedAds1256(() -> 0);
        SimulatedPart stuckGain = (tx, txOffset, rx, rxOffset, length) -> {
            real.exchange(tx, txOffset, rx, rxOffset, length);
            if (length == 4) {
                rx[rxOffset + 2] = 0x20; // ADCON still at its reset value
            }
        };
        Ads1256 adc = new Ads1256(new PartLink(stuckGain), now -> true, new FakeClock(), "spi0.1", 0, 1, 64, 15000, 2.5, true);

        assertThatThrownBy(adc::start).isInstanceOf(HardwareException.class)
                .hasMessageContaining("did not take its settings: wrote 06 01 06 e0, read back 37 01 20 e0");
    }

    @Test
    void timesOutWithoutDataReady() {
        FakeClock clock = new FakeClock();
        clock.stepPerReadNs = 1_000_000;
        Ads1256 adc = new Ads1256(new PartLink(new SimulatedAds1256(() -> 0)), now -> false, clock, "spi0.1",
                0, 1, 64, 15000, 2.5, true);

        assertThatThrownBy(adc::start).isInstanceOf(HardwareException.class)
                .hasMessageContaining("no data-ready after reset");
    }

    static String hex(byte[] b, int n) {
        StringBuilder s = new StringBuilder();
        for (int i = 0; i < n; i++) {
            s.append(i == 0 ? "" : " ").append(String.format("%02X", b[i] & 0xFF));
        }
        return s.toString();
    }
}
