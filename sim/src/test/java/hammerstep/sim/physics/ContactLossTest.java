package hammerstep.sim.physics;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/**
 * No contact of the mechanisms is lossless: the striker on the anvil and the balls on the groove ends
 * rebound with a coefficient of restitution below one (steel on steel roughly 0.5 to 0.9 depending on
 * speed and geometry: contact mechanics, memory; the values used are named in the code and in
 * docs/simulator.md).
 */
class ContactLossTest {

    private static final double H = 1e-6;

    @Test
    @DisplayName("striker on the anvil at the presets' damping ratio 0.3: restitution about 0.67, within steel on steel's 0.5 to 0.9 (contact mechanics, memory)")
    void strikerReboundsFromTheAnvilWithTheNamedRestitution() {
        DriveSpec.Air air = new DriveSpec.Air(6.3, 8000, 10, 1e-9, 0, 1);
        double j = 1.2e-3;
        MechanismSpec.TwinHammer spec = new MechanismSpec.TwinHammer(j - air.reflectedInertiaKgM2(), 0.5, 1e9, 1e9);
        TwinHammerMechanism m = new TwinHammerMechanism(spec, Drive.of(air), 1e4, 0.3);
        double omega = 150;
        m.setStriker(-1e-3, omega);
        boolean touched = false;
        for (int i = 0; i < 100_000; i++) {
            double t = m.trainTorque(0, 0);
            touched |= t > 0;
            if (touched && t == 0) {
                break;
            }
            m.advance(H, t, 0, 0);
        }
        double e = -m.inputSpeedRadS() / omega;
        assertThat(e).isCloseTo(Mechanism.TRAIN_RESTITUTION_AT_PRESET_DAMPING, within(0.02));
        assertThat(e).isBetween(0.5, 0.9);
    }

    @Test
    @DisplayName("balls on the groove ends: nominal restitution 0.5, 0.57 pushing only, within steel on steel's 0.5 to 0.9 (assumption; contact mechanics, memory)")
    void ballsReboundFromTheGrooveEndsWithTheStatedRestitution() throws Exception {
        ToolSpec tool = Presets.tool("cordless-two-dog");
        Drive drive = Drive.of(tool.drive());
        CamMechanism cam = new CamMechanism((MechanismSpec.Cam) tool.mechanism(), drive, 1e4, 0.3);
        double travel = cam.ballTravelRad();
        double approach = 200;
        // the hammer flies back against the still spindle, lifted clear of the jaws: only the cam acts
        cam.setLifted(0, 0, -(travel - 0.01), -approach);
        double entry = Double.NaN;
        double exit = Double.NaN;
        double before = cam.inputSpeedRadS() - hammerSpeed(cam);
        for (int i = 0; i < 200_000; i++) {
            cam.advance(H, 0, -100, 0);
            double phi = cam.inputAngleRad() - cam.strikerAngle();
            double rel = cam.inputSpeedRadS() - hammerSpeed(cam);
            if (Double.isNaN(entry) && phi >= travel) {
                entry = before;
            }
            if (!Double.isNaN(entry) && phi < travel) {
                exit = rel;
                break;
            }
            before = rel;
        }
        // at the same angle the cam spring has given back what it took: the speed lost is the stop's
        assertThat(-exit / entry).isCloseTo(CamMechanism.STOP_RESTITUTION_MEASURED, within(0.02));
        assertThat(-exit / entry).isBetween(CamMechanism.STOP_RESTITUTION, 0.9);
    }

    private static double hammerSpeed(CamMechanism cam) {
        return cam.hammerSpeedRadS();
    }
}
