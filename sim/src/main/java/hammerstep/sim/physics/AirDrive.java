package hammerstep.sim.physics;

/**
 * Vane air motor: a straight speed-torque line from stall torque to free speed. With supply
 * pressure p (gauge) against the reference p₀, stall torque scales with p/p₀ (torque is pressure
 * on the vanes) and free speed with √(p/p₀) (flow through the ports); a motor pushed backwards
 * gives no more than its stall torque. Valve closed, only drag acts.
 */
final class AirDrive extends Drive {

    private final DriveSpec.Air spec;
    private double stallNm;
    private double freeRadS;

    AirDrive(DriveSpec.Air spec) {
        this.spec = spec;
        setSupplyPressure(spec.referencePressureBar());
    }

    void setSupplyPressure(double bar) {
        double p = Math.max(0.0, bar) / spec.referencePressureBar();
        this.stallNm = spec.stallTorqueNm() * p;
        this.freeRadS = spec.freeSpeedRpm() * 2.0 * Math.PI / 60.0 * Math.sqrt(p);
    }

    @Override
    double shaftTorque(double shaftRadS) {
        double n = spec.gearRatio();
        double wm = shaftRadS * n;
        double motorNm = 0.0;
        if (powered && freeRadS > 0) {
            motorNm = stallNm * (1.0 - wm / freeRadS);
            if (motorNm > stallNm) {
                motorNm = stallNm;
            }
        }
        return (motorNm - spec.dragNmPerRadS() * wm) * n;
    }

    @Override
    double reflectedInertiaKgM2() {
        return spec.reflectedInertiaKgM2();
    }

    @Override
    double freeShaftSpeedRadS() {
        if (freeRadS <= 0) {
            return 0;
        }
        // stall (1 - w/wf) = drag w
        return stallNm / (stallNm / freeRadS + spec.dragNmPerRadS()) / spec.gearRatio();
    }
}
