package hammerstep.sim.station;

import hammerstep.sim.physics.JointSpec;
import hammerstep.sim.physics.Rig;
import hammerstep.sim.physics.ToolSpec;
import hammerstep.sim.physics.TransducerSpec;

/**
 * The physics rig behind the virtual transducer, one rig per position so that each fastener keeps
 * its state (and its relaxation) from pass to pass. The tool's settings (supply pressure or battery
 * voltage) apply to all. Also keeps the ground truth the station never sees: blows struck after the
 * relay dropped.
 */
public final class RigToolModel implements ToolModel {

    /** Longest strike pulse (strike pulses last about 1 to 5 ms: transducer practice, memory): a blow peaking later began after. */
    private static final double PULSE_S = 0.005;

    private final Rig[] rigs;
    private final JointSpec joint;
    private int at;
    private boolean trigger;
    private boolean enabled;
    private boolean reverse;
    private double relayOffS = Double.NaN;
    private int countedUpTo;
    private long blowsAfterRelayOff;

    /**
     * @param internalRateHz the rig's integration rate floor ({@link Rig#MIN_INTERNAL_RATE_HZ} for the finest)
     */
    public RigToolModel(ToolSpec tool, JointSpec joint, TransducerSpec transducer, double rateHz, long seed,
                        int positions, double internalRateHz) {
        this.joint = joint;
        this.rigs = new Rig[positions];
        for (int i = 0; i < positions; i++) {
            rigs[i] = Rig.create(tool, joint, transducer, rateHz, seed * 1_000_003L + i, internalRateHz);
        }
    }

    /** Air supply, gauge bar; no effect on a cordless tool. */
    public void setSupplyPressureBar(double bar) {
        for (Rig r : rigs) {
            r.setSupplyPressureBar(bar);
        }
    }

    /** The torque a strike must reach to count as a blow in the ground truth (the programs' count_above). */
    public void setBlowThresholdNm(double nm) {
        for (Rig r : rigs) {
            r.setBlowThresholdNm(nm);
        }
    }

    /** Battery voltage, V; no effect on an air tool. */
    public void setBatteryVoltage(double volts) {
        for (Rig r : rigs) {
            r.setBatteryVoltage(volts);
        }
    }

    @Override
    public void setTrigger(boolean pulled) {
        trigger = pulled;
        rigs[at].setTrigger(pulled);
    }

    @Override
    public void setEnabled(boolean on) {
        if (enabled && !on) {
            relayOffS = rigs[at].timeS();
            countedUpTo = rigs[at].blows();
        }
        enabled = on;
        rigs[at].setEnabled(on);
    }

    @Override
    public void setReverse(boolean reverse) {
        this.reverse = reverse;
        rigs[at].setReverse(reverse);
    }

    @Override
    public void fill(float[] out, int offset, int length) {
        Rig rig = rigs[at];
        rig.fill(out, offset, length);
        if (!enabled && !Double.isNaN(relayOffS)) {
            int n = rig.blows();
            for (int i = countedUpTo; i < n; i++) {
                if (rig.blowTimeS(i) > relayOffS + PULSE_S) {
                    blowsAfterRelayOff++;
                }
            }
            countedUpTo = n;
        }
    }

    @Override
    public void moveTo(int index) {
        if (index == at) {
            return;
        }
        rigs[at].setTrigger(false);
        rigs[at].setEnabled(false);
        at = index;
        relayOffS = Double.NaN;
        rigs[at].setReverse(reverse);
        rigs[at].setEnabled(enabled);
        rigs[at].setTrigger(trigger);
    }

    @Override
    public void newPart() {
        for (Rig r : rigs) {
            r.newFastener(joint);
        }
        relayOffS = Double.NaN;
    }

    @Override
    public int blows() {
        return rigs[at].blows();
    }

    @Override
    public double residualTorqueNm() {
        return rigs[at].residualTorqueNm();
    }

    /** Ground truth: blows that began after the relay dropped, over the whole run. */
    public long blowsAfterRelayOff() {
        return blowsAfterRelayOff;
    }

    /** Residual torque of position {@code index}'s fastener now, N·m. */
    public double residualTorqueNm(int index) {
        return rigs[index].residualTorqueNm();
    }
}
