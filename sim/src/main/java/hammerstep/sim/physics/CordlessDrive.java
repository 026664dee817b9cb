package hammerstep.sim.physics;

/**
 * Brushless DC motor on a battery through a planetary stage. Motor current is
 * {@code I = (V - ω_m/Kv) / (R_w + R_b)}, held within ±{@code currentLimitA}; torque {@code Kt·I}
 * less viscous drag; at the carrier {@code N·η} times that. The battery terminal voltage sags by
 * {@code I·R_b}. Trigger released, the controller brakes by shorting the windings.
 */
final class CordlessDrive extends Drive {

    private final DriveSpec.Cordless spec;
    private final double ratio;
    private final double kt;
    private final double resistance;
    private final double efficiency;
    private final double conductance;
    private final double brakeConductance;
    private double voltage;
    private double lastCurrent;

    CordlessDrive(DriveSpec.Cordless spec) {
        this.spec = spec;
        this.ratio = spec.ratio();
        this.kt = 60.0 / (2.0 * Math.PI * spec.kvRpmPerV());
        this.resistance = spec.windingResistanceOhm() + spec.internalResistanceOhm();
        this.efficiency = spec.gearEfficiency();
        this.conductance = 1.0 / resistance;
        this.brakeConductance = 1.0 / spec.windingResistanceOhm();
        this.voltage = spec.voltageV();
    }

    void setBatteryVoltage(double volts) {
        this.voltage = Math.max(0.0, volts);
    }

    @Override
    double shaftTorque(double shaftRadS) {
        double wm = shaftRadS * ratio;
        double back = kt * wm;
        double current;
        if (powered) {
            current = (voltage - back) * conductance;
        } else {
            current = -back * brakeConductance;
        }
        double limit = powered ? spec.currentLimitA() : spec.brakeCurrentA();
        if (current > limit) {
            current = limit;
        } else if (current < -limit) {
            current = -limit;
        }
        lastCurrent = current;
        double motorNm = kt * current - spec.dragNmPerRadS() * wm;
        return motorNm * ratio * efficiency;
    }

    @Override
    double reflectedInertiaKgM2() {
        return spec.reflectedInertiaKgM2();
    }

    @Override
    double freeShaftSpeedRadS() {
        // (V - Kt ω) Kt / R = drag ω  →  ω = V Kt / (Kt² + drag R)
        return voltage * kt / (kt * kt + spec.dragNmPerRadS() * resistance) / ratio;
    }

    /** Battery terminal voltage at the last evaluated current. */
    double terminalVoltage() {
        return voltage - Math.max(0.0, lastCurrent) * spec.internalResistanceOhm();
    }

    double ratio() {
        return ratio;
    }
}
