package hammerstep.sim.demo;

import hammerstep.app.StationSections;
import hammerstep.sim.physics.SampleRates;
import hammerstep.station.setup.StationConfig;
import hammerstep.station.setup.StationFile;
import hammerstep.station.setup.StationSection;
import org.junit.jupiter.api.Test;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The demo station samples its modelled tool at no less than the rate its blow peaks need. */
class DemoRateTest {

    @Test
    void theDemoSamplesAtLeastAtTheRecommendedMinimumForItsTool() throws Exception {
        List<StationSection<?>> sections = new ArrayList<>(StationSections.all());
        sections.removeIf(s -> s.key().equals(SimulationSection.INSTANCE.key()));
        sections.add(SimulationSection.INSTANCE);
        StationConfig config = StationFile.load(Path.of("../config/demo/station.yaml"), sections);
        SimulationSection.Simulation sim = config.get(SimulationSection.INSTANCE);
        assertThat(sim.rateHz()).isGreaterThanOrEqualTo(SampleRates.recommendedMinHz(sim.tool().mechanism()));
    }
}
