package hammerstep.sim.demo;

import hammerstep.sim.physics.SampleRates;
import hammerstep.station.setup.StationConfig;
import hammerstep.station.setup.StationFile;
import org.junit.jupiter.api.Test;

import java.nio.file.Files;

import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The demo station's modelled tool: sampled fast enough for its peaks, and any bundled tool preset may be named. */
class DemoRateTest {

    private static final Path STATION = Path.of("../config/demo/station.yaml");

    private static SimulationSection.Simulation simulation(Path station) throws Exception {
        StationConfig config = StationFile.load(station, SimulationSection.withStationSections());
        return config.get(SimulationSection.INSTANCE);
    }

    @Test
    void theDemoSamplesAtLeastAtTheRecommendedMinimumForItsTool() throws Exception {
        SimulationSection.Simulation sim = simulation(STATION);
        assertThat(sim.rateHz()).isGreaterThanOrEqualTo(SampleRates.recommendedMinHz(sim.tool().mechanism()));
    }

    @Test
    void theDemoStationFileTakesTheDogClutchPresets() throws Exception {
        String text = Files.readString(STATION);
        assertThat(text).contains("  tool: cordless-three-dog\n");
        for (String tool : List.of("air-rocking-dog", "air-three-jaw", "air-twin-pin-oil-bath")) {
            // the copy sits beside the original so that its relative paths (patterns, programs) resolve
            Path copy = STATION.resolveSibling(".demo-rate-test-" + tool + ".yaml");
            try {
                Files.writeString(copy, text.replace("  tool: cordless-three-dog\n", "  tool: " + tool + "\n")
                        .replace("  battery_v: 18.0\n", "  supply_bar: 6.3\n"));
                assertThat(simulation(copy).tool().name()).isEqualTo(tool);
            } finally {
                Files.deleteIfExists(copy);
            }
        }
    }
}
