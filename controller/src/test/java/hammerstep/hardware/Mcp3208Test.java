package hammerstep.hardware;

import hammerstep.signal.Calibration;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.time.LocalDate;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

class Mcp3208Test {

    @Test
    @DisplayName("request bytes: start bit, single-ended, D2 in byte 0; D1 D0 at the top of byte 1 (MCP3208 datasheet, 8-bit segments)")
    void encodesRequests() {
        byte[] out = new byte[3];
        Mcp3208.encodeRequest(0, out);
        assertThat(Ads1256Test.hex(out, 3)).isEqualTo("06 00 00");
        Mcp3208.encodeRequest(5, out);
        assertThat(Ads1256Test.hex(out, 3)).isEqualTo("07 40 00");
        Mcp3208.encodeRequest(7, out);
        assertThat(Ads1256Test.hex(out, 3)).isEqualTo("07 C0 00");
    }

    @Test
    void decodesResultAfterTheNullBit() {
        assertThat(Mcp3208.decode(new byte[] {0x00, 0x0A, (byte) 0xBC})).isEqualTo(0xABC);
        assertThat(Mcp3208.decode(new byte[] {0x00, 0x0F, (byte) 0xFF})).isEqualTo(4095);
        assertThat(Mcp3208.decode(new byte[] {(byte) 0xFF, (byte) 0xFF, (byte) 0xFF})).as("null bit high").isEqualTo(-1);
    }

    /*
     * By hand: a +-10 V amplified transducer of 200 N.m behind a 0.2 front end onto VREF 4.096 V, zero at
     * 2.048 V. 100 N.m gives 5 V, 1.000 V at the pin above mid-scale, 1 mV per count: 1000 counts, raw 3048
     * (0xBE8). N.m per count = (2.048 / 2048) / 0.2 / 10 x 200 = 0.1.
     */
    @Test
    @DisplayName("amplified +-10 V output through a 0.2 front end: raw 3048 reads 100 N·m (hand-computed)")
    void readsAmplifiedOutputThroughTheFrontEnd() {
        SimulatedMcp3208 part = new SimulatedMcp3208(() -> 3048 - 2048);
        PartLink link = new PartLink(part);
        Mcp3208 adc = new Mcp3208(link, "spi0.0", 3, 20000, 4.096, 0.2);
        TransducerSettings t = new TransducerSettings("A-1", TransducerSettings.Output.VOLTAGE, 10.0, 200.0,
                Double.NaN, Double.NaN, Double.NaN, LocalDate.of(2027, 1, 1), 0);
        Calibration cal = t.calibration(adc);

        adc.start();
        int counts = adc.read();

        assertThat(part.lastInput()).isEqualTo(3);
        assertThat(counts).isEqualTo(1000);
        assertThat(cal.nmPerCount()).isCloseTo(0.1, within(1e-12));
        assertThat(counts * cal.nmPerCount()).isCloseTo(100.0, within(1e-9));
    }

    @Test
    void aFloatingDataLineFailsStart() {
        SimulatedPart floating = (tx, txOffset, rx, rxOffset, length) -> {
            for (int i = 0; i < length; i++) {
                rx[rxOffset + i] = (byte) 0xFF;
            }
        };
        Mcp3208 adc = new Mcp3208(new PartLink(floating), "spi0.0", 0, 20000, 4.096, 0.2);

        assertThatThrownBy(adc::start).isInstanceOf(HardwareException.class)
                .hasMessage("MCP3208 on spi0.0 does not answer (null bit high in ff ff ff): check wiring, power and chip select");
    }

    @Test
    @DisplayName("a frame lost in running reads as the positive rail, so over-range flags it as a sensor fault")
    void aLostFrameInRunningReadsAsTheRail() {
        boolean[] lost = {false};
        SimulatedMcp3208 real = new SimulatedMcp3208(() -> 0);
        SimulatedPart part = new SimulatedPart() {
            @Override
            public void exchange(byte[] tx, int txOffset, byte[] rx, int rxOffset, int length) {
                real.exchange(tx, txOffset, rx, rxOffset, length);
                if (lost[0]) {
                    rx[1] = (byte) 0xFF;
                }
            }

            @Override
            public void deselected() {
                real.deselected();
            }
        };
        Mcp3208 adc = new Mcp3208(new PartLink(part), "spi0.0", 0, 20000, 4.096, 0.2);
        adc.start();

        assertThat(adc.read()).isZero();
        lost[0] = true;
        assertThat(adc.read()).isEqualTo(2047);
        assertThat(adc.badFrames()).isEqualTo(1);
    }
}
