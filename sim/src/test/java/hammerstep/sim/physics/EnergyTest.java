package hammerstep.sim.physics;

import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import static org.assertj.core.api.Assertions.assertThat;

class EnergyTest {

    /** Work–energy balance: drive work = stored energy + strike losses + work into the joint (textbook mechanics). */
    @ParameterizedTest(name = "{0}: drive work = stored + losses + joint work within 1 %, shrinking with the step (work-energy theorem)")
    @ValueSource(strings = {"cordless-two-dog", "cordless-three-dog", "cordless-skip-dog", "air-twin-hammer", "oil-pulse",
            "air-rocking-dog", "air-three-jaw", "air-twin-pin-oil-bath"})
    void driveWorkBalancesStoredEnergyLossesAndJointWork(String tool) throws Exception {
        Rig.Energy e = run(tool, Rig.MIN_INTERNAL_RATE_HZ);
        assertThat(Math.abs(e.balanceErrorJ())).isLessThan(0.01 * e.driveWorkJ());
        assertThat(e.lossesJ()).isGreaterThan(0.0);
        assertThat(e.jointWorkJ()).isGreaterThan(0.0);
        // the residual is integration error: it shrinks with the step (first-order method)
        Rig.Energy fine = run(tool, 4 * Rig.MIN_INTERNAL_RATE_HZ);
        assertThat(Math.abs(fine.balanceErrorJ() / fine.driveWorkJ()))
                .isLessThan(Math.max(0.6 * Math.abs(e.balanceErrorJ() / e.driveWorkJ()), 1e-4));
    }

    private static Rig.Energy run(String tool, double internalRateHz) throws Exception {
        Rig rig = Rig.create(Presets.tool(tool), Presets.joint("iso-hard"), Presets.defaultTransducer(), 50_000, 3,
                internalRateHz);
        float[] block = new float[1000];
        rig.setTrigger(true);
        for (int i = 0; i < 40; i++) {
            rig.fill(block, 0, block.length);
        }
        rig.setTrigger(false);
        for (int i = 0; i < 15; i++) {
            rig.fill(block, 0, block.length);
        }
        assertThat(rig.blows()).isGreaterThan(3);
        assertThat(rig.energy().driveWorkJ()).isGreaterThan(10.0);
        return rig.energy();
    }
}
