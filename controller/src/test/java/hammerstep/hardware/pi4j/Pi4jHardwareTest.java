package hammerstep.hardware.pi4j;

import com.pi4j.context.Context;
import com.pi4j.io.gpio.digital.DigitalState;
import com.pi4j.plugin.mock.provider.gpio.digital.MockDigitalInput;
import com.pi4j.plugin.mock.provider.gpio.digital.MockDigitalOutput;
import hammerstep.config.YamlDocument;
import hammerstep.hardware.Acquisition;
import hammerstep.hardware.HardwareConfig;
import hammerstep.hardware.HardwareException;
import hammerstep.hardware.SimulatedAds1256;
import hammerstep.hardware.SimulatedMcp3208;
import hammerstep.station.FixedWallClock;
import hammerstep.station.SampleRing;
import hammerstep.station.StationClock;
import hammerstep.station.TowerLamp;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.lang.reflect.Method;
import java.lang.reflect.Modifier;
import java.time.Instant;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.assertj.core.api.Assertions.within;

/** The real adapters on Pi4J's mock GPIO providers and the simulated SPI provider. */
class Pi4jHardwareTest {

    static final String STATION = """
            hardware:
              adc: { type: ads1256, cs_pin: 22, data_ready_pin: 17, gain: 64, rate_hz: 1000, reference_v: 2.5 }
              outputs:
                tool_enable: 5
                shunt_cal: 6
                tower: { red: { pin: 20, active: low }, green: 16 }
                positions: [21, 23]
              inputs:
                acknowledge: 27
                supervisor_key: { pin: 4, active: high }
                part_present: { pin: 3, debounce_ms: 50 }
                confirm: [12, 13]
            transducer:
              serial: RT-1
              rated_output_mv_per_v: 2.0
              full_scale_nm: 500
              excitation_v: 5.0
              shunt_ohm: 100000
              calibration_due: 2027-03-31
            """;

    final long[] now = {0};
    final StationClock clock = new FixedWallClock(() -> now[0], Instant.EPOCH);
    final List<AutoCloseable> open = new ArrayList<>();

    @AfterEach
    void close() throws Exception {
        for (AutoCloseable c : open) {
            c.close();
        }
    }

    Pi4jHardware mock(String yaml) throws Exception {
        Pi4jHardware hw = Pi4jHardware.open(Pi4jHardware.Mode.MOCK, config(yaml).hardware(), config(yaml).transducer(), clock);
        open.add(hw);
        return hw;
    }

    static HardwareConfig config(String yaml) throws Exception {
        return HardwareConfig.read(YamlDocument.parse("station.yaml", yaml));
    }

    static Context context(Pi4jHardware hw) {
        return hw.board().context();
    }

    static MockDigitalOutput output(Pi4jHardware hw, int pin) {
        return context(hw).registry().get("out-gpio" + pin, MockDigitalOutput.class);
    }

    static MockDigitalInput input(Pi4jHardware hw, int pin) {
        return context(hw).registry().get("in-gpio" + pin, MockDigitalInput.class);
    }

    @Test
    @DisplayName("the relay starts de-energised and is energised to enable the tool")
    void relayIsEnergisedToEnable() throws Exception {
        Pi4jHardware hw = mock(STATION);
        MockDigitalOutput relay = output(hw, 5);

        assertThat(relay.state()).isEqualTo(DigitalState.LOW);
        hw.toolEnable().set(true);
        assertThat(relay.state()).isEqualTo(DigitalState.HIGH);
        assertThat(hw.toolEnable().enabled()).isTrue();

        hw.close();
        open.remove(hw);
        assertThat(relay.state()).as("closing drops the relay").isEqualTo(DigitalState.LOW);
    }

    @Test
    void lampsFollowTheirActiveLevel() throws Exception {
        Pi4jHardware hw = mock(STATION);

        assertThat(output(hw, 20).state()).as("active-low red starts off, pin high").isEqualTo(DigitalState.HIGH);
        hw.lamps().tower(TowerLamp.RED, true);
        hw.lamps().tower(TowerLamp.GREEN, true);
        hw.lamps().position(1, true);
        hw.lamps().tower(TowerLamp.BLUE, true); // not fitted: ignored

        assertThat(output(hw, 20).state()).isEqualTo(DigitalState.LOW);
        assertThat(output(hw, 16).state()).isEqualTo(DigitalState.HIGH);
        assertThat(output(hw, 23).state()).isEqualTo(DigitalState.HIGH);
        assertThat(output(hw, 21).state()).isEqualTo(DigitalState.LOW);
        assertThat(hw.lamps().positionLamps()).isEqualTo(2);
    }

    @Test
    void inputsAreDebouncedOnTheClock() throws Exception {
        Pi4jHardware hw = mock(STATION);
        var inputs = hw.inputs();

        assertThat(inputs.acknowledge()).as("mock input starts at its inactive level").isFalse();
        input(hw, 27).mockState(DigitalState.LOW); // button to ground pressed
        assertThat(inputs.acknowledge()).isFalse();
        now[0] += 19_000_000;
        assertThat(inputs.acknowledge()).as("19 ms of 20").isFalse();
        now[0] += 1_000_000;
        assertThat(inputs.acknowledge()).isTrue();

        input(hw, 4).mockState(DigitalState.HIGH); // active-high key
        now[0] += 20_000_000;
        assertThat(inputs.supervisorKey()).isFalse();
        assertThat(inputs.supervisorKey()).isFalse(); // first reading starts the 20 ms
        now[0] += 20_000_000;
        assertThat(inputs.supervisorKey()).isTrue();

        assertThat(inputs.hasPartPresent()).isTrue();
        assertThat(inputs.hasTrigger()).isFalse();
        assertThat(inputs.hasConfirmSensors()).isTrue();
        input(hw, 13).mockState(DigitalState.LOW);
        inputs.confirmedPosition();
        now[0] += 20_000_000;
        assertThat(inputs.confirmedPosition()).isEqualTo(1);
        input(hw, 12).mockState(DigitalState.LOW);
        inputs.confirmedPosition();
        now[0] += 20_000_000;
        assertThat(inputs.confirmedPosition()).as("two at once").isEqualTo(-1);
    }

    /*
     * Recorded ADS1256 frames, decoded by hand (24-bit two's complement; gain 64, VREF 2.5 V = half of the
     * 5 V excitation, so 2^23 x 64 x 2 mV/V = 1 073 741.8 counts at 500 N.m):
     *   10 00 00 = 1 048 576 counts -> 1 048 576 / 1 073 741.8 x 500 = 488.281 N.m
     *   FF FF 38 = -200 counts       -> -0.0931 N.m
     *   00 00 00 = 0                 -> 0
     *   08 00 00 = 524 288           -> 244.141 N.m
     */
    @Test
    @DisplayName("recorded ADS1256 frames through the simulated SPI provider read the hand-computed N·m")
    void recordedFramesReadHandComputedTorque() throws Exception {
        ArrayDeque<Integer> frames = new ArrayDeque<>(List.of(0x100000, 0xFFFF38, 0x000000, 0x080000));
        SimulatedAds1256 part = new SimulatedAds1256(() -> (frames.poll() << 8) >> 8);
        HardwareConfig c = config(STATION);
        Pi4jHardware hw = Pi4jHardware.open(Pi4jBoard.mock(part), c.hardware(), c.transducer(), clock);
        open.add(hw);
        SampleRing ring = new SampleRing(1000, 4, 4);
        Acquisition acq = new Acquisition(hw.adc(), hw.dataReady(), clock, hw.calibration(), 0, ring);

        acq.onStart();
        for (int i = 0; i < 4; i++) {
            now[0] += 1_000_000;
            assertThat(acq.doWork()).isEqualTo(1);
        }

        float[] got = new float[4];
        assertThat(ring.poll((s, off, len, first) -> System.arraycopy(s, off, got, 0, len), 1)).isEqualTo(1);
        assertThat(got[0]).isCloseTo(488.281f, within(0.001f));
        assertThat(got[1]).isCloseTo(-0.0931f, within(0.0001f));
        assertThat(got[2]).isZero();
        assertThat(got[3]).isCloseTo(244.141f, within(0.001f));
        assertThat(part.register(1)).as("MUX AIN0/AIN1").isEqualTo(0x01);
        assertThat(output(hw, 22).state()).as("chip select held low while reading").isEqualTo(DigitalState.LOW);
    }

    @Test
    @DisplayName("simulated shunt: 350 Ω arm with 100 kΩ reads 0.8735 mV/V = 218.4 N·m of 500 (bridge basics, derived: Vo/E = R / (2R + 4Rs))")
    void simulatedShuntReadsTheBridgeFormula() throws Exception {
        Pi4jHardware hw = mock(STATION);
        hw.adc().start();
        int before = hw.adc().read();

        hw.shuntCal().set(true);
        int engaged = hw.adc().read();

        double nm = (engaged - before) * hw.calibration().nmPerCount();
        assertThat(nm).isCloseTo(350.0 / 400_700 * 1e3 / 2.0 * 500, within(0.05)); // 218.37 N.m; one reading, noise +-20 counts
    }

    @Test
    void mcp3208ReadsThroughTheSimulatedProvider() throws Exception {
        String yaml = STATION.replace("type: ads1256, cs_pin: 22, data_ready_pin: 17, gain: 64, rate_hz: 1000, reference_v: 2.5",
                        "type: mcp3208, input_positive: 2, gain: 0.2, rate_hz: 1000, reference_v: 4.096")
                .replace("rated_output_mv_per_v: 2.0", "output: voltage\n  rated_output_v: 10.0")
                .replace("  excitation_v: 5.0\n", "").replace("  shunt_ohm: 100000\n", "");
        SimulatedMcp3208 part = new SimulatedMcp3208(() -> 1000);
        HardwareConfig c = config(yaml);
        Pi4jHardware hw = Pi4jHardware.open(Pi4jBoard.mock(part), c.hardware(), c.transducer(), clock);
        open.add(hw);

        hw.adc().start();
        assertThat(hw.adc().read() * hw.calibration().nmPerCount()).isCloseTo(250.0, within(1e-9)); // 1000 x 0.25 N.m
        assertThat(part.lastInput()).isEqualTo(2);
    }

    @Test
    @DisplayName("on a machine without GPIO the real board fails with one line")
    void realBoardWithoutGpioFailsWithOneLine() {
        org.junit.jupiter.api.Assumptions.assumeFalse(new java.io.File("/dev/gpiochip0").exists());

        assertThatThrownBy(() -> Pi4jBoard.requireGpio(0, 0)).isInstanceOf(HardwareException.class)
                .hasMessageStartingWith("no GPIO on this machine").hasMessageNotContaining("\n");
    }

    @Test
    @DisplayName("no Pi4J type appears in the public interface of the adapters")
    void pi4jTypesStayInside() {
        for (Class<?> c : List.of(Pi4jHardware.class)) {
            for (Method m : c.getMethods()) {
                if (!Modifier.isPublic(m.getModifiers())) {
                    continue;
                }
                assertThat(m.getReturnType().getName()).as(m.toString()).doesNotStartWith("com.pi4j");
                assertThat(Arrays.stream(m.getParameterTypes()).map(Class::getName)).as(m.toString())
                        .noneMatch(n -> n.startsWith("com.pi4j"));
            }
        }
    }
}
