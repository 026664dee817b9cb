package hammerstep.web;

import hammerstep.joint.JointProgram;
import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.signal.SignalFaults;
import hammerstep.station.LampMode;
import hammerstep.station.PartIdentity;
import hammerstep.station.TowerLamp;
import hammerstep.station.loop.StationAgent;
import hammerstep.station.loop.StationListener;

import java.lang.invoke.VarHandle;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * The station's side of the web view: listens on the station thread and hands the web side what it
 * shows without a lock the station could wait on.
 *
 * <ul>
 *   <li>The station's state ({@link LiveSnapshot}) is compared field by field at the end of every
 *       cycle against what was last published; only a change builds a new immutable snapshot, swapped
 *       in through a volatile reference.</li>
 *   <li>The rundown's torque goes into preallocated arrays, one point per {@link #POINT_MS} ms (the
 *       sample of largest magnitude in it), published by a volatile count; a new rundown bumps a
 *       generation number first, and a reader that sees it change while copying throws its copy
 *       away (a sequence lock without the writer ever waiting). The sample path allocates nothing.</li>
 *   <li>Joints, parts and events go to the {@link ResultLog}, as they are stored.</li>
 * </ul>
 *
 * Single writer: every {@code on...} method runs on the station thread; {@link #snapshot()} and
 * {@link #trail()} may be called from any thread.
 */
public final class LiveBoard implements StationListener {

    /** Width of one live-trace point. */
    public static final double POINT_MS = 2.0;
    /** Points kept per rundown: 16 s at {@link #POINT_MS}; a longer rundown's trace stops there. */
    static final int MAX_POINTS = 8192;
    static final int MAX_BLOWS = 1024;
    private static final TowerLamp[] TOWER = {TowerLamp.WHITE, TowerLamp.BLUE, TowerLamp.GREEN, TowerLamp.YELLOW,
        TowerLamp.RED};
    private static final int MAX_LAMPS = 64;

    private final ResultLog log;
    private final double periodNs;
    private final int samplesPerPoint;

    // ---- the trail, written by the station thread only
    private final float[] points = new float[MAX_POINTS];
    private final float[] blowMs = new float[MAX_BLOWS];
    private final float[] blowNm = new float[MAX_BLOWS];
    private volatile long generation;
    private volatile int pointCount;
    private volatile int blowCount;
    private volatile boolean recording;
    private long startNs;
    private float pointPeak;
    private int pointSamples;

    // ---- the state last published, station thread only
    private volatile LiveSnapshot snapshot = LiveSnapshot.idle();
    private long version;
    private boolean seen;
    private int phase = -1;
    private PartIdentity part;
    private Pattern pattern;
    private int passIndex;
    private int prompted;
    private int rework;
    private boolean toolOn;
    private int storage;
    private int faults;
    private long zeroTenths;
    private boolean weak;
    private long errors;
    private final byte[] lamps = new byte[MAX_LAMPS + TOWER.length];

    /**
     * @param rateHz the transducer's sample rate
     * @param log    where stored results go for the results pages
     */
    public LiveBoard(double rateHz, ResultLog log) {
        this.log = log;
        this.periodNs = 1e9 / rateHz;
        this.samplesPerPoint = Math.max(1, (int) Math.round(POINT_MS * 1e-3 * rateHz));
    }

    public ResultLog log() {
        return log;
    }

    /** The station as last published; never null. */
    public LiveSnapshot snapshot() {
        return snapshot;
    }

    /** A consistent copy of the current (or last) rundown's trail. */
    public Trail trail() {
        while (true) {
            long g = generation;
            int n = pointCount;
            int b = blowCount;
            boolean running = recording;
            float[] t = Arrays.copyOf(points, n);
            float[] bm = Arrays.copyOf(blowMs, b);
            float[] bn = Arrays.copyOf(blowNm, b);
            VarHandle.acquireFence(); // the copies above are read before the generation below
            if (generation == g) {
                return new Trail(g, samplesPerPoint * periodNs * 1e-6, t, bm, bn, running);
            }
        }
    }

    // ---- station thread ----------------------------------------------------------------------

    @Override
    public void onRundownStart(long nowNs) {
        generation = generation + 1;
        VarHandle.storeStoreFence(); // the new generation is seen before any point of the new rundown
        pointCount = 0;
        blowCount = 0;
        startNs = nowNs;
        pointPeak = 0;
        pointSamples = 0;
        recording = true;
    }

    @Override
    public void onBlow(int index, double peakNm, long peakNs) {
        int b = blowCount;
        if (!recording || b >= MAX_BLOWS) {
            return;
        }
        blowMs[b] = (float) ((peakNs - startNs) * 1e-6);
        blowNm[b] = (float) peakNm;
        blowCount = b + 1;
    }

    @Override
    public void onTorque(float[] samples, int offset, int length, long firstSampleNs) {
        if (!recording) {
            return;
        }
        int i = offset;
        int end = offset + length;
        if (firstSampleNs < startNs) {
            i += (int) Math.min(length, Math.ceil((startNs - firstSampleNs) / periodNs));
        }
        int n = pointCount;
        float peak = pointPeak;
        int count = pointSamples;
        for (; i < end && n < MAX_POINTS; i++) {
            float v = samples[i];
            if (Math.abs(v) > Math.abs(peak)) {
                peak = v;
            }
            if (++count == samplesPerPoint) {
                points[n++] = peak;
                peak = 0;
                count = 0;
            }
        }
        pointPeak = peak;
        pointSamples = count;
        pointCount = n;
    }

    @Override
    public void onCycle(StationAgent station, long nowNs) {
        if (recording && !station.inRundown()) {
            int n = pointCount;
            if (pointSamples > 0 && n < MAX_POINTS) {
                points[n] = pointPeak;
                pointCount = n + 1;
            }
            recording = false;
        }
        if (changed(station)) {
            snapshot = build(station);
        }
    }

    @Override
    public void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
        log.joint(joint, receipt);
    }

    @Override
    public void onPart(PartOutcome part, ResultSink.Receipt receipt) {
        log.part(part, receipt);
    }

    @Override
    public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
        log.event(event, receipt);
    }

    @Override
    public void onStoreFailed(String message) {
        log.storeFailed(message);
    }

    /** Compares what the page shows with what was published; records the new values. No allocation. */
    private boolean changed(StationAgent station) {
        Sequence s = station.sequence();
        boolean c = !seen;
        seen = true;
        int ph = s.phase().ordinal();
        if (ph != phase) {
            phase = ph;
            c = true;
        }
        if (s.part() != part || s.pattern() != pattern) {
            part = s.part();
            pattern = s.pattern();
            c = true;
        }
        if (s.passIndex() != passIndex || s.prompted() != prompted || s.reworkPosition() != rework) {
            passIndex = s.passIndex();
            prompted = s.prompted();
            rework = s.reworkPosition();
            c = true;
        }
        if (station.toolOn() != toolOn) {
            toolOn = station.toolOn();
            c = true;
        }
        int st = station.storage().ordinal();
        int f = station.inputStage().faults();
        long zero = Math.round(station.inputStage().conditioner().zeroNm() * 10);
        boolean w = station.toolHealth() != null && station.toolHealth().anyWeak();
        if (st != storage || f != faults || zero != zeroTenths || w != weak || station.errors() != errors) {
            storage = st;
            faults = f;
            zeroTenths = zero;
            weak = w;
            errors = station.errors();
            c = true;
        }
        int positions = pattern == null ? 0 : Math.min(MAX_LAMPS, pattern.size());
        for (int i = 0; i < MAX_LAMPS; i++) {
            byte m = i < positions ? (byte) s.positionLamp(i).ordinal() : 0;
            if (m != lamps[i]) {
                lamps[i] = m;
                c = true;
            }
        }
        for (int k = 0; k < TOWER.length; k++) {
            byte m = (byte) s.tower(TOWER[k]).ordinal();
            if (m != lamps[MAX_LAMPS + k]) {
                lamps[MAX_LAMPS + k] = m;
                c = true;
            }
        }
        return c;
    }

    private LiveSnapshot build(StationAgent station) {
        Sequence s = station.sequence();
        LampMode[] modes = LampMode.values();
        List<String> labels = pattern == null ? List.of() : pattern.positions();
        List<String> posLamps = new ArrayList<>(labels.size());
        for (int i = 0; i < Math.min(MAX_LAMPS, labels.size()); i++) {
            posLamps.add(modes[lamps[i]].name());
        }
        List<String> tower = new ArrayList<>(TOWER.length);
        for (int k = 0; k < TOWER.length; k++) {
            tower.add(modes[lamps[MAX_LAMPS + k]].name());
        }
        Pattern.Pass pass = s.pass();
        JointProgram p = pass == null ? null : pass.program();
        String promptedLabel = prompted >= 0 && prompted < labels.size() ? labels.get(prompted) : "";
        String reworkLabel = rework >= 0 && rework < labels.size() ? labels.get(rework) : "";
        version++;
        return new LiveSnapshot(version, s.phase().name(), part == null ? "" : part.serial(),
                part == null ? "" : part.model(), pattern == null ? "" : pattern.id(), labels, posLamps, tower,
                pass == null ? "" : pass.name(), pass == null ? 0 : passIndex + 1,
                pattern == null ? 0 : pattern.passes().size(), promptedLabel, reworkLabel, toolOn,
                station.storage().name(), SignalFaults.names(faults), zeroTenths / 10.0, weak, errors,
                p == null ? "" : p.id(), p == null ? Double.NaN : p.torque().minNm(),
                p == null ? Double.NaN : p.torque().maxNm(), p == null ? Double.NaN : p.torque().targetNm(),
                p == null || !p.hasShutoff() ? Double.NaN : p.shutoffAtNm());
    }
}
