package hammerstep.sim.physics;

import java.util.SplittableRandom;

/**
 * A modelled tool on a modelled joint through a modelled transducer, advanced in virtual time.
 * Each output sample integrates the mechanics over {@code substeps} internal steps (at least
 * {@link #MIN_INTERNAL_RATE_HZ}), then reads the transducer's ADC.
 *
 * <p>Ground truth: every blow of the mechanism (a contact episode, episodes apart less than the
 * mechanism's re-contact time merged, see {@link Mechanism}) whose highest shaft torque reaches the
 * blow threshold counts, timed at that peak; per fastener.
 *
 * <p>Reverse ({@link #setReverse}): the tool loosens. The mechanism runs as it does forward (its dogs
 * first cross the free travel between the jaws), on the
 * nut's angle mirrored at the moment of the switch; the shaft torque and hence the transducer reading
 * are negated, so strikes come out negative with positive rebound lobes and ringing, and the truth's
 * peaks of reverse blows are negative.
 *
 * <p>Single-threaded. {@link #fill} allocates nothing; the same seed gives the same samples.
 */
public final class Rig {

    /** Internal integration rate floor, Hz. */
    public static final double MIN_INTERNAL_RATE_HZ = 1.0e6;
    /** Default shaft torque a blow must reach to count as a blow, N·m. */
    public static final double DEFAULT_BLOW_THRESHOLD_NM = 40.0;
    /** A blow ended by a release while its torque was still above this fraction of its peak is cut short. */
    public static final double CUT_SHORT_FRACTION = 0.5;
    /** Blows kept per fastener; the count stays right beyond it. */
    public static final int MAX_BLOWS = 8192;
    /** Back-face contacts kept per fastener. */
    public static final int MAX_BACK_CONTACTS = 256;

    private final ToolSpec tool;
    private final TransducerSpec transducerSpec;
    private final double rateHz;
    private final int substeps;
    private final double h;
    private final Drive drive;
    private final Mechanism mechanism;
    private final Fastener fastener;
    private final Transducer transducer;

    private boolean trigger;
    private boolean enabled = true;
    private boolean reverse;
    /** The nut's angle at the last direction switch: the mechanism's zero in the tool's sense. */
    private double switchRad;
    private long samples;
    private long steps;
    private double blowThresholdNm = DEFAULT_BLOW_THRESHOLD_NM;

    private int seenReleases;
    /** Contact episodes apart less than this are one blow, s (the mechanism's re-contact time). */
    private final double mergeS;
    private boolean blowOpen;
    private boolean touching;
    private long blowStartStep;
    private boolean openCutShort;
    private double blowPeakNm;
    private long blowPeakStep;
    private double blowPeakTurns;
    /** The nut's angle (tool's sense) when the open blow's episode began, rad. */
    private double blowOpenRad;
    private double blowLowNm;
    private long blowLowStep;
    /** The open blow reached the threshold backwards first: a back contact, never a blow. */
    private boolean backFirst;
    private final double[] blowPeaksNm = new double[MAX_BLOWS];
    private final double[] blowTimesS = new double[MAX_BLOWS];
    private final double[] blowTurns = new double[MAX_BLOWS];
    private final boolean[] blowCutShort = new boolean[MAX_BLOWS];
    private final double[] blowTurnedRad = new double[MAX_BLOWS];
    private int closedBlows;
    private final double[] backPeaksNm = new double[MAX_BACK_CONTACTS];
    private final double[] backTimesS = new double[MAX_BACK_CONTACTS];
    private int backContacts;
    private double trainWorkJ;
    private double lastShaftNm;

    private Rig(ToolSpec tool, JointSpec joint, TransducerSpec transducer, double rateHz, double internalRateHz,
                long seed) {
        if (!(rateHz > 0) || !(internalRateHz > 0)) {
            throw new IllegalArgumentException("rates must be positive");
        }
        this.tool = tool;
        this.transducerSpec = transducer;
        this.rateHz = rateHz;
        this.substeps = (int) Math.max(1, Math.ceil(internalRateHz / rateHz - 1e-9));
        double internal = rateHz * substeps;
        this.h = 1.0 / internal;
        SplittableRandom root = new SplittableRandom(seed);
        this.drive = Drive.of(tool.drive());
        double k = tool.train().seriesStiffness(transducer.shaftStiffness());
        this.mechanism = Mechanism.of(tool.mechanism(), drive, k, tool.train().dampingRatio());
        this.mergeS = mechanism.recontactS();
        this.fastener = new Fastener(joint, tool.train().inertiaKgM2() + transducer.inertiaKgM2(), root.split());
        this.transducer = new Transducer(transducer, internal, root.split());
        if (transducer.bandwidthHz() >= 0.5 * internal) {
            throw new IllegalArgumentException("transducer bandwidth must be below half the internal rate");
        }
    }

    /** A rig at the output {@code rateHz}, integrating internally at {@link #MIN_INTERNAL_RATE_HZ} or more. */
    public static Rig create(ToolSpec tool, JointSpec joint, TransducerSpec transducer, double rateHz, long seed) {
        return new Rig(tool, joint, transducer, rateHz, MIN_INTERNAL_RATE_HZ, seed);
    }

    /** As {@link #create(ToolSpec, JointSpec, TransducerSpec, double, long)} with a chosen internal rate floor. */
    public static Rig create(ToolSpec tool, JointSpec joint, TransducerSpec transducer, double rateHz, long seed,
                             double internalRateHz) {
        return new Rig(tool, joint, transducer, rateHz, internalRateHz, seed);
    }

    /** The operator's trigger. */
    public void setTrigger(boolean pressed) {
        trigger = pressed;
        drive.setPowered(trigger && enabled);
    }

    /** The station's enable relay: the motor runs only while trigger and enable are both on. */
    public void setEnabled(boolean enabled) {
        this.enabled = enabled;
        drive.setPowered(trigger && enabled);
    }

    /** Supply pressure (gauge) of an air tool; no effect on a cordless tool. */
    public void setSupplyPressureBar(double bar) {
        if (drive instanceof AirDrive a) {
            a.setSupplyPressure(bar);
        }
    }

    /** Battery open-circuit voltage of a cordless tool; no effect on an air tool. */
    public void setBatteryVoltage(double volts) {
        if (drive instanceof CordlessDrive c) {
            c.setBatteryVoltage(volts);
        }
    }

    /** Torque a blow must reach to count as a blow (ground truth), N·m. */
    public void setBlowThresholdNm(double nm) {
        this.blowThresholdNm = nm;
    }

    /**
     * Advances virtual time by {@code length} samples and writes the transducer's reading (N·m,
     * after the ADC) into {@code out[offset, offset+length)}.
     */
    public void fill(float[] out, int offset, int length) {
        int n = substeps;
        for (int i = 0; i < length; i++) {
            for (int s = 0; s < n; s++) {
                step();
            }
            out[offset + i] = transducer.sample();
        }
        samples += length;
    }

    private void step() {
        // the mechanism works in the tool's sense: the nut's angle mirrored while in reverse
        double nutAngle = toolSense(fastener.angleRad());
        double nutSpeed = fastener.speedRadS();
        double t = mechanism.trainTorque(nutAngle, nutSpeed);
        double striker = mechanism.strikerAngle();
        mechanism.advance(h, t, nutAngle, nutSpeed);
        fastener.advance(h, t);
        double nutAfter = toolSense(fastener.angleRad());
        trainWorkJ += t * ((mechanism.strikerAngle() - striker) - (nutAfter - nutAngle));
        double shaft = reverse ? -t : t;
        transducer.filter(shaft);
        lastShaftNm = shaft;
        trackBlow(t);
        steps++;
    }

    /**
     * One definition of a blow (docs/simulator.md): a contact episode of the striker on the anvil, with
     * every episode that begins sooner than the mechanism's re-contact time after its start (the moment
     * its torque reached the blow threshold, as a detector starts a blow; else its first touch); it counts
     * when its highest train torque reaches the blow threshold. One that reached the threshold backwards
     * first is a back contact, with what follows it. {@code t} is in the tool's sense.
     */
    private void trackBlow(double t) {
        if (mechanism.inContact(t)) {
            if (blowOpen && !touching && (steps - blowStartStep) * h >= mergeS) {
                closeBlow();
            }
            if (!blowOpen) {
                blowOpen = true;
                blowStartStep = steps;
                blowOpenRad = toolSense(fastener.angleRad());
                blowPeakNm = 0;
                blowLowNm = 0;
                backFirst = false;
                openCutShort = false;
            }
            touching = true;
            if (t > blowPeakNm) {
                if (blowPeakNm < blowThresholdNm && t >= blowThresholdNm && -blowLowNm < blowThresholdNm) {
                    blowStartStep = steps;
                }
                blowPeakNm = t;
                blowPeakStep = steps;
                blowPeakTurns = relativeTurns();
            } else if (t < blowLowNm) {
                if (-blowLowNm < blowThresholdNm && -t >= blowThresholdNm && blowPeakNm < blowThresholdNm) {
                    // reached the threshold backwards first: a back contact; what follows within the
                    // re-contact time is its rebound, as the detector keeps a reverse strike's lobes
                    blowStartStep = steps;
                    backFirst = true;
                }
                blowLowNm = t;
                blowLowStep = steps;
            }
        } else {
            touching = false;
            if (blowOpen && (steps - blowStartStep) * h >= mergeS) {
                closeBlow();
            }
        }
        if (mechanism.releases() != seenReleases) {
            seenReleases = mechanism.releases();
            // released in mid-strike: the torque falls from near the peak faster than the chain follows
            if (blowOpen && blowPeakNm >= blowThresholdNm && t >= CUT_SHORT_FRACTION * blowPeakNm) {
                openCutShort = true;
            }
        }
    }

    private void closeBlow() {
        blowOpen = false;
        if (blowPeakNm >= blowThresholdNm && !backFirst) {
            if (closedBlows < MAX_BLOWS) {
                blowPeaksNm[closedBlows] = reverse ? -blowPeakNm : blowPeakNm;
                blowTimesS[closedBlows] = blowPeakStep * h;
                blowTurns[closedBlows] = blowPeakTurns;
                blowCutShort[closedBlows] = openCutShort;
                blowTurnedRad[closedBlows] = toolSense(fastener.angleRad()) - blowOpenRad;
            }
            closedBlows++;
        }
        if (-blowLowNm >= blowThresholdNm) {
            if (backContacts < MAX_BACK_CONTACTS) {
                backPeaksNm[backContacts] = reverse ? -blowLowNm : blowLowNm;
                backTimesS[backContacts] = blowLowStep * h;
            }
            backContacts++;
        }
        blowPeakNm = 0;
        blowLowNm = 0;
    }

    /** Forgets the blow under way (a new fastener, a direction switch). */
    private void dropOpenBlow() {
        blowOpen = false;
        touching = false;
        blowPeakNm = 0;
        blowLowNm = 0;
        seenReleases = mechanism.releases();
    }

    /**
     * The tool's direction switch: true to loosen. Switch with the tool at rest (trigger released and
     * run down): the mechanism starts again at rest against the anvil in the new sense. The fastener
     * keeps its state and its blows.
     */
    public void setReverse(boolean reverse) {
        if (reverse == this.reverse) {
            return;
        }
        this.reverse = reverse;
        switchRad = fastener.angleRad();
        fastener.setReverse(reverse);
        mechanism.resetSwitched();
        dropOpenBlow();
    }

    /** The nut's angle as the mechanism sees it: from the last switch, mirrored in reverse. */
    private double toolSense(double nutRad) {
        return reverse ? switchRad - nutRad : nutRad - switchRad;
    }

    /** True while the tool runs in reverse (loosening). */
    public boolean reverse() {
        return reverse;
    }

    /** The next bolt: the joint reset to loose, the striker at rest against the anvil, blow count zero. */
    public void newFastener(JointSpec joint) {
        reverse = false;
        switchRad = 0;
        fastener.renew(joint);
        mechanism.reset();
        dropOpenBlow();
        closedBlows = 0;
        backContacts = 0;
    }

    /** Torque to turn the present fastener further now (first movement), N·m. */
    public double residualTorqueNm() {
        return fastener.residualTorqueNm();
    }

    /** Angle the present fastener has turned since it was started, degrees. */
    public double angleDeg() {
        return Math.toDegrees(fastener.angleRad());
    }

    /** Angle turned past the joint's snug point, degrees (0 before seating or once loosened). */
    public double angleAfterSnugDeg() {
        return Math.max(0.0, Math.toDegrees(fastener.angleRad() - fastener.joint().freeAngleRad()));
    }

    /** Clamp load of the present fastener, N. */
    public double clampLoadN() {
        return fastener.clampLoadN();
    }

    /** Load at which the present fastener's bolt yields (ISO 898-1: stress area × Rp0.2), N; NaN without a bolt. */
    public double yieldLoadN() {
        Bolt bolt = fastener.joint().bolt();
        return bolt == null ? Double.NaN : bolt.yieldLoadN();
    }

    /** Whether the present fastener's bolt has yielded. */
    public boolean yielded() {
        return fastener.yielded();
    }

    /**
     * Strikes per relative turn of striker against anvil over the present fastener's blows: blows less
     * one over the relative turns from the first blow's peak to the last's; NaN with fewer than two.
     */
    public double strikesPerRev() {
        return strikesPerRev(0);
    }

    /** As {@link #strikesPerRev()} over the blows from {@code firstBlow} on. */
    public double strikesPerRev(int firstBlow) {
        int last = Math.min(blows(), MAX_BLOWS) - 1;
        if (last - firstBlow < 1) {
            return Double.NaN;
        }
        double turns = blowTurns(last) - blowTurns(firstBlow);
        return turns > 0 ? (last - firstBlow) / turns : Double.NaN;
    }

    /** Blows on the present fastener so far (a blow still open counts once its peak qualifies). */
    public int blows() {
        return closedBlows + (openBlowCounts() ? 1 : 0);
    }

    private boolean openBlowCounts() {
        return blowOpen && blowPeakNm >= blowThresholdNm && !backFirst;
    }

    /** Peak shaft torque of blow {@code i} (0-based) of the present fastener, N·m; negative for a reverse blow. */
    public double blowPeakNm(int i) {
        return i == closedBlows ? (reverse ? -blowPeakNm : blowPeakNm) : blowPeaksNm[i];
    }

    /** Time of blow {@code i}'s peak, seconds of virtual time since the rig was created. */
    public double blowTimeS(int i) {
        return i == closedBlows ? blowPeakStep * h : blowTimesS[i];
    }

    /** Turns of the mechanism's input relative to the fastener at blow {@code i}'s peak (see {@link #relativeTurns()}). */
    public double blowTurns(int i) {
        return i == closedBlows ? blowPeakTurns : blowTurns[i];
    }

    /**
     * Angle the nut turned during blow {@code i} (from its episode's first touch to its close, in the tool's
     * sense), degrees: zero for a blow that did not turn the nut. The open blow's so far.
     */
    public double blowTurnedDeg(int i) {
        double rad = i == closedBlows ? toolSense(fastener.angleRad()) - blowOpenRad : blowTurnedRad[i];
        return Math.toDegrees(rad);
    }

    /**
     * Whether blow {@code i} was cut short: the striker was released in mid-strike (dogs sliding
     * off a jaw they barely engaged), so its torque fell from near its peak within microseconds,
     * faster than a transducer and ADC can follow. Its measured peak reads low.
     */
    public boolean blowCutShort(int i) {
        return i < closedBlows ? blowCutShort[i] : (i == closedBlows && openCutShort);
    }

    /**
     * Back-face contacts on the present fastener whose torque reached the blow threshold against the
     * tool's sense: the hammer's back dog face meeting the jaw behind it (docs/simulator.md, "The back
     * contact after the last blow"). Never a blow.
     */
    public int backContacts() {
        return backContacts;
    }

    /** Lowest shaft torque of back contact {@code i}, N·m (negative when tightening). */
    public double backContactNm(int i) {
        return backPeaksNm[i];
    }

    /** Time of back contact {@code i}'s lowest torque, seconds of virtual time. */
    public double backContactTimeS(int i) {
        return backTimesS[i];
    }

    /** The re-contact time that merges contact episodes into one blow, s. */
    public double recontactS() {
        return mergeS;
    }

    /** Samples produced so far. */
    public long samplesElapsed() {
        return samples;
    }

    /** Virtual time, seconds. */
    public double timeS() {
        return steps * h;
    }

    /** Speed of the mechanism's input (spindle, cage or liner), rpm. */
    public double toolSpeedRpm() {
        return mechanism.inputSpeedRadS() * 60.0 / (2.0 * Math.PI);
    }

    /** Turns of the mechanism's input relative to the fastener since the present fastener was started. */
    public double relativeTurns() {
        return (mechanism.inputAngleRad() - toolSense(fastener.angleRad())) / (2.0 * Math.PI);
    }

    /** Free speed of the mechanism's input under the present supply, rpm. */
    public double freeSpeedRpm() {
        return drive.freeShaftSpeedRadS() * 60.0 / (2.0 * Math.PI);
    }

    /** Shaft torque at the last internal step (before the transducer), N·m. */
    public double shaftTorqueNm() {
        return lastShaftNm;
    }

    public double rateHz() {
        return rateHz;
    }

    /** Internal steps per output sample. */
    public int substeps() {
        return substeps;
    }

    public ToolSpec tool() {
        return tool;
    }

    public JointSpec joint() {
        return fastener.joint();
    }

    public TransducerSpec transducer() {
        return transducerSpec;
    }

    /** The energy ledger since the rig was created (see docs/simulator.md). */
    public Energy energy() {
        return new Energy(mechanism.driveWorkJ(), mechanism.storedJ(), fastener.kineticJ(),
                mechanism.trainElasticJ(toolSense(fastener.angleRad())), trainWorkJ,
                fastener.jointWorkJ(), mechanism.internalLossJ());
    }

    /**
     * Energy ledger, J. {@code driveWorkJ} balances {@code mechanismJ + nutKineticJ + trainWorkJ +
     * jointWorkJ + mechanismLossJ} to integration tolerance; of the train work, {@code trainElasticJ} is
     * still held and the rest was lost (contact damping, oil leak, relief and venting, elastic energy left
     * behind when the striker lets go); {@code mechanismLossJ} was lost inside the mechanism (end stops).
     */
    public record Energy(double driveWorkJ, double mechanismJ, double nutKineticJ, double trainElasticJ,
                         double trainWorkJ, double jointWorkJ, double mechanismLossJ) {

        public double balanceErrorJ() {
            return driveWorkJ - (mechanismJ + nutKineticJ + trainWorkJ + jointWorkJ + mechanismLossJ);
        }

        public double lossesJ() {
            return trainWorkJ - trainElasticJ + mechanismLossJ;
        }
    }
}
