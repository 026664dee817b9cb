package hammerstep.sim.physics;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

class PlanetaryTest {

    @Test
    @DisplayName("5-tooth sun, 55-tooth ring: 12:1 ring fixed, -11:1 carrier fixed (Willis relation, gearing textbook)")
    void ratiosFollowFromToothCounts() {
        assertThat(Planetary.ringFixedRatio(5, 55)).isEqualTo(12.0);
        assertThat(Planetary.carrierFixedRatio(5, 55)).isEqualTo(-11.0);
        assertThat(Planetary.meshes(5, 25, 55)).isTrue();
        assertThat(Planetary.meshes(5, 24, 55)).isFalse();
    }

    @Test
    @DisplayName("cordless presets: about 20 000 rpm motor, spindle 1700 to 2000 rpm free (fact of the trade)")
    void cordlessPresetsTurnLikeTheTrade() throws Exception {
        DriveSpec.Cordless d = (DriveSpec.Cordless) Presets.tool("cordless-two-dog").drive();
        CordlessDrive drive = new CordlessDrive(d);
        double spindleRpm = drive.freeShaftSpeedRadS() * 60 / (2 * Math.PI);
        assertThat(spindleRpm * d.ratio()).isBetween(18_000.0, 23_000.0);
        assertThat(spindleRpm).isBetween(1700.0, 2100.0);
    }
}
