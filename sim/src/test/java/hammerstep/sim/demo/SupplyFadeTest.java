package hammerstep.sim.demo;

import hammerstep.sim.physics.Presets;
import hammerstep.sim.physics.ToolSpec;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class SupplyFadeTest {

    @Test
    void holdsTheFirstTwoPartsThenFallsEvenlyToTheFullDropAtTheLastPart() throws Exception {
        SupplyFade f = new SupplyFade(null, air(), 6.3, 30, 8);

        assertThat(f.level(0)).isEqualTo(6.3);
        assertThat(f.level(1)).isEqualTo(6.3);
        assertThat(f.level(2)).isCloseTo(6.3 * (1 - 0.3 / 6), within(1e-12));
        assertThat(f.level(7)).isCloseTo(6.3 * 0.7, within(1e-12));
    }

    @Test
    void startsFromTheToolsOwnReferenceWhenTheStationSetsNone() throws Exception {
        ToolSpec air = air();
        assertThat(SupplyFade.nominalOf(air, Double.NaN, Double.NaN))
                .isEqualTo(((hammerstep.sim.physics.DriveSpec.Air) air.drive()).referencePressureBar());
        assertThat(SupplyFade.nominalOf(air, 5.5, Double.NaN)).isEqualTo(5.5);
    }

    private static ToolSpec air() throws hammerstep.config.ConfigException {
        return Presets.tool("air-twin-hammer");
    }
}
