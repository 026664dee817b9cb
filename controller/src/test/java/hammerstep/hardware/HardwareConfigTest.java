package hammerstep.hardware;

import hammerstep.config.ConfigException;
import hammerstep.config.Problem;
import hammerstep.config.YamlDocument;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.time.LocalDate;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.catchThrowableOfType;
import static org.assertj.core.api.Assertions.within;

class HardwareConfigTest {

    static final String ADS = """
            hardware:
              adc: { type: ads1256, cs_pin: 22, data_ready_pin: 17, gain: 64, rate_hz: 15000, reference_v: 2.5 }
              outputs:
                tool_enable: 5
                tower: { red: 20, green: { pin: 16, active: low } }
                positions: [21, 23]
              inputs:
                acknowledge: 27
                supervisor_key: { pin: 4, active: high, debounce_ms: 30 }
            transducer:
              serial: RT-1
              rated_output_mv_per_v: 2.0
              full_scale_nm: 500
              shunt_ohm: 100000
              calibration_due: 2027-03-31
            """;

    static HardwareConfig read(String yaml) throws ConfigException {
        return HardwareConfig.read(YamlDocument.parse("station.yaml", yaml));
    }

    static List<String> problems(String yaml) {
        ConfigException e = catchThrowableOfType(ConfigException.class, () -> read(yaml));
        assertThat(e).as("expected problems").isNotNull();
        return e.problems().stream().map(Problem::toString).toList();
    }

    @Test
    void readsTheExampleStationFile() throws Exception {
        HardwareConfig c = HardwareConfig.load(Path.of("../config/station.example.yaml"));

        assertThat(c.hardware().adc().type()).isEqualTo(AdcSettings.Type.ADS1256);
        assertThat(c.hardware().positions()).hasSize(5);
        assertThat(c.hardware().tower()).containsOnlyKeys("white", "blue", "green", "yellow", "red");
        assertThat(c.transducer().shuntOutputMvPerV()).isCloseTo(0.8735, within(0.00005));
    }

    @Test
    void readsLinesWithTheirDefaults() throws Exception {
        HardwareConfig c = read(ADS);
        HardwareSettings hw = c.hardware();

        assertThat(hw.toolEnable()).isEqualTo(new OutputLine("hardware.outputs.tool_enable", 5, true));
        assertThat(hw.tower().get("green").activeHigh()).isFalse();
        assertThat(hw.acknowledge()).isEqualTo(new InputLine("hardware.inputs.acknowledge", 27, false,
                InputLine.Pull.UP, 20.0));
        assertThat(hw.supervisorKey().pull()).isEqualTo(InputLine.Pull.DOWN);
        assertThat(hw.supervisorKey().debounceNs()).isEqualTo(30_000_000L);
        assertThat(hw.partPresent()).isNull();
        assertThat(hw.adc().inputNegative()).isEqualTo(1);
        assertThat(c.transducer().excitationV()).isEqualTo(5.0);
        assertThat(c.transducer().bridgeOhm()).isEqualTo(350.0);
        assertThat(c.transducer().calibrationDue()).isEqualTo(LocalDate.of(2027, 3, 31));
        assertThat(c.transducer().calibrationDue(LocalDate.of(2027, 3, 31))).isTrue();
    }

    @Test
    void reportsAPinUsedTwiceWhereItIsWritten() {
        assertThat(problems(ADS.replace("positions: [21, 23]", "positions: [21, 5]")))
                .containsExactly("station.yaml:6:21: 'hardware.outputs.positions[1]' is pin 5, already used by"
                        + " 'hardware.outputs.tool_enable'");
    }

    @Test
    void reportsSpiPinsAndPartLimits() {
        String yaml = ADS.replace("cs_pin: 22", "cs_pin: 9").replace("gain: 64", "gain: 128")
                .replace("rate_hz: 15000", "rate_hz: 20000");
        assertThat(problems(yaml)).containsExactly(
                "station.yaml:2:33: 'hardware.adc.cs_pin' is pin 9, which is SPI0 MISO: choose another pin",
                "station.yaml:2:62: 'hardware.adc.gain' is 128: the ADS1256 PGA takes 1, 2, 4, 8, 16, 32 or 64",
                "station.yaml:2:76: 'hardware.adc.rate_hz' is 20000: the ADS1256 runs at 30000, 15000, 7500, 3750,"
                        + " 2000, 1000, 500, 100, 60, 50, 30, 25, 15, 10, 5 or 2.5 Hz");
    }

    @Test
    void reportsMisspeltKeysAndMissingLines() {
        String yaml = ADS.replace("tool_enable: 5", "tool_enabel: 5");
        assertThat(problems(yaml)).anySatisfy(p -> assertThat(p).startsWith("station.yaml:4:5:")
                .contains("missing key 'hardware.outputs.tool_enable'"));
        assertThat(problems(yaml)).anySatisfy(p -> assertThat(p).startsWith("station.yaml:4:5: unknown key"
                + " 'hardware.outputs.tool_enabel'"));
    }

    @Test
    void aBridgeTransducerNeedsTheBridgeAdc() {
        String yaml = ADS.replace("type: ads1256, cs_pin: 22, data_ready_pin: 17, gain: 64, rate_hz: 15000, reference_v: 2.5",
                "type: mcp3208, gain: 0.2, rate_hz: 20000, reference_v: 4.096");
        assertThat(problems(yaml)).singleElement().asString()
                .startsWith("station.yaml:11:3: a bridge transducer (mV/V) needs the ADS1256");
    }

    @Test
    void theFullScaleSignalMustFitTheInputRange() {
        // 3 mV/V x 10 V x 64 = 1.92 V fits 2 x 0.5 V? no: reported
        String yaml = ADS.replace("reference_v: 2.5", "reference_v: 0.5")
                .replace("rated_output_mv_per_v: 2.0", "rated_output_mv_per_v: 3.0\n  excitation_v: 10");
        assertThat(problems(yaml)).singleElement().asString()
                .contains("at full-scale torque the ADC sees 1.920 V (after gain 64), beyond its input range of ±1.000 V");
    }

    @Test
    void reportsABadCalibrationDate() {
        assertThat(problems(ADS.replace("2027-03-31", "31.03.2027"))).singleElement().asString()
                .isEqualTo("station.yaml:15:20: 'transducer.calibration_due' is \"31.03.2027\": expected a date as YYYY-MM-DD");
    }

    @Test
    void confirmSensorsComeOnePerPosition() {
        String yaml = ADS.replace("supervisor_key: { pin: 4, active: high, debounce_ms: 30 }",
                "supervisor_key: 4\n    confirm: [2, 3, 14]");
        assertThat(problems(yaml)).singleElement().asString()
                .contains("'hardware.inputs.confirm' has 3 sensors for 2 position lamps");
    }
}
