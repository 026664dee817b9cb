package hammerstep.sim.physics;

import org.hipparchus.ode.ODEState;
import org.hipparchus.ode.ODEStateAndDerivative;
import org.hipparchus.ode.OrdinaryDifferentialEquation;
import org.hipparchus.ode.nonstiff.DormandPrince853Integrator;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.util.SplittableRandom;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

/** The strike integration checked against the textbook lumped strike and against an independent ODE solver. */
class StrikeTest {

    private static final double J = 1.2e-3;
    private static final double K = 1.0e4;
    private static final double OMEGA = 150.0;
    private static final double H = 1e-6;

    private static TwinHammerMechanism cage(double dampingRatio) {
        DriveSpec.Air air = new DriveSpec.Air(6.3, 8000, 10, 1e-9, 0, 1);
        Drive drive = Drive.of(air);
        MechanismSpec.TwinHammer spec = new MechanismSpec.TwinHammer(J - air.reflectedInertiaKgM2(), 0.5, 1e9, 1e9);
        return new TwinHammerMechanism(spec, drive, K, dampingRatio);
    }

    /** Runs one strike on a held nut; returns {peak N·m, contact time s}. */
    private static double[] strikeOnHeldNut(TwinHammerMechanism m) {
        m.setStriker(-1e-3, OMEGA);
        double peak = 0;
        double start = Double.NaN;
        double end = Double.NaN;
        for (int i = 0; i < 100_000; i++) {
            double t = m.trainTorque(0, 0);
            if (t > 0 && Double.isNaN(start)) {
                start = i * H;
            }
            if (t == 0 && !Double.isNaN(start)) {
                end = i * H;
                break;
            }
            peak = Math.max(peak, t);
            m.advance(H, t, 0, 0);
        }
        return new double[] {peak, end - start};
    }

    @Test
    @DisplayName("strike of J at ω on a spring k: peak ω·√(J·k), contact π·√(J/k) within 2 % (rigid body on a spring, any dynamics textbook)")
    void strikeOnASpringMatchesTheTextbook() {
        double[] r = strikeOnHeldNut(cage(0.0));
        assertThat(r[0]).isCloseTo(OMEGA * Math.sqrt(J * K), within(0.02 * OMEGA * Math.sqrt(J * K)));
        assertThat(r[1]).isCloseTo(Math.PI * Math.sqrt(J / K), within(0.02 * Math.PI * Math.sqrt(J / K)));
    }

    @Test
    void dampedStrikeReboundsSlowerThanItArrived() {
        TwinHammerMechanism m = cage(0.3);
        strikeOnHeldNut(m);
        assertThat(m.inputSpeedRadS()).isNegative().isGreaterThan(-0.9 * OMEGA);
    }

    /**
     * Hammer on a nut that slips against a running torque, with unloading damping: the rig's own
     * step (semi-implicit Euler at 1 MHz) against Hipparchus' Dormand–Prince 8(5,3) on the same
     * equations (a reference integrator as test oracle).
     */
    @Test
    @DisplayName("strike on a slipping nut agrees with Dormand-Prince 8(5,3) on the same equations within 0.5 %")
    void strikeOnASlippingNutAgreesWithDormandPrince() {
        double runningNm = 150.0;
        double nutJ = 1.0e-4;
        double zeta = 0.3;
        JointSpec joint = new JointSpec("test", runningNm, 1e6, runningNm + 1, 1.0, 1.1, 0, 0, 0.2, 0.016, 0, 100, null);
        TwinHammerMechanism m = cage(zeta);
        Fastener nut = new Fastener(joint, nutJ, new SplittableRandom(1));
        m.setStriker(-1e-3, OMEGA);
        double peak = 0;
        double endS = 3e-3;
        int steps = (int) Math.round(endS / H);
        for (int i = 0; i < steps; i++) {
            double a = nut.angleRad();
            double w = nut.speedRadS();
            double t = m.trainTorque(a, w);
            peak = Math.max(peak, t);
            m.advance(H, t, a, w);
            nut.advance(H, t);
        }

        double c = 2 * zeta * Math.sqrt(K * J);
        double hold = 1.1 * runningNm;
        double[] peakOracle = {0};
        boolean[] slipping = {false};
        OrdinaryDifferentialEquation ode = new OrdinaryDifferentialEquation() {
            @Override
            public int getDimension() {
                return 4;
            }

            @Override
            public double[] computeDerivatives(double time, double[] y) {
                double d = y[0] - y[2];
                double dv = y[1] - y[3];
                double t = 0;
                if (d > 0) {
                    t = K * d + (dv < 0 ? c * dv : 0);
                    t = Math.max(0, t);
                }
                double nutAcc;
                if (y[3] > 0 || t > hold || slipping[0]) {
                    nutAcc = (t - runningNm) / nutJ;
                    if (y[3] <= 0 && nutAcc < 0) {
                        nutAcc = 0;
                    }
                } else {
                    nutAcc = 0;
                }
                return new double[] {y[1], -t / J, Math.max(y[3], 0), nutAcc};
            }
        };
        DormandPrince853Integrator dp = new DormandPrince853Integrator(1e-18, 2e-6, 1e-10, 1e-10);
        dp.addStepHandler((interpolator) -> {
            ODEStateAndDerivative s = interpolator.getCurrentState();
            double[] y = s.getPrimaryState();
            double d = y[0] - y[2];
            if (d > 0) {
                double dv = y[1] - y[3];
                double t = Math.max(0, K * d + (dv < 0 ? c * dv : 0));
                peakOracle[0] = Math.max(peakOracle[0], t);
                if (t > hold) {
                    slipping[0] = true;
                }
            }
        });
        ODEStateAndDerivative fin = dp.integrate(ode, new ODEState(0, new double[] {-1e-3, OMEGA, 0, 0}), endS);
        double[] y = fin.getPrimaryState();
        assertThat(peak).isCloseTo(peakOracle[0], within(0.005 * peakOracle[0]));
        assertThat(nut.angleRad()).isCloseTo(y[2], within(0.005 * y[2]));
        assertThat(m.strikerAngle()).isCloseTo(y[0], within(0.005 * Math.abs(y[0])));
    }
}
