package hammerstep.trace;

import hammerstep.joint.JointResult;
import hammerstep.results.JointOutcome;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * Keeps the torque trace of every judged joint for the station: a {@link TraceRecorder} fed with
 * every sample block, and a {@link TraceStore} that each joint's span (from {@code leadMs} before
 * its start to the last sample the recorder has) is written to. {@link #keep} returns the joint
 * with its {@code tracePath} set.
 *
 * <p>A trace that cannot be written never stops the station: the joint is stored without a trace,
 * the failure is logged and counted ({@link #failures()}). Station thread only.
 */
public final class TraceKeeper implements SampleSink {

    private static final Logger LOG = LoggerFactory.getLogger(TraceKeeper.class);

    private final TraceRecorder recorder;
    private final TraceStore store;
    private final long leadNs;
    private long lastSampleNs = Long.MIN_VALUE;
    private long failures;

    public TraceKeeper(TraceRecorder recorder, TraceStore store, double leadMs) {
        this.recorder = recorder;
        this.store = store;
        this.leadNs = Math.round(leadMs * 1e6);
    }

    /** A keeper for {@code settings} at the station's sample rate. */
    public static TraceKeeper open(TracesSection.Traces settings, double rateHz) throws IOException {
        return new TraceKeeper(TraceRecorder.forSeconds(rateHz, settings.ringSeconds()),
                new TraceStore(settings.dir(), settings.maxCount(), settings.maxBytes(), settings.encoding()),
                settings.leadMs());
    }

    @Override
    public void onSamples(float[] samples, int offset, int length, long firstSampleNs) {
        recorder.onSamples(samples, offset, length, firstSampleNs);
        if (length > 0) {
            lastSampleNs = firstSampleNs + Math.round((length - 1) * 1e9 / recorder.rateHz());
        }
    }

    /** Writes the joint's trace and returns the joint naming it; the joint unchanged when it could not be written. */
    public JointOutcome keep(JointOutcome joint) {
        JointResult r = joint.result();
        Map<String, String> meta = new LinkedHashMap<>();
        meta.put("part_serial", String.valueOf(joint.partSerial()));
        meta.put("position", String.valueOf(joint.position()));
        meta.put("pass", String.valueOf(joint.pass()));
        meta.put("attempt", Integer.toString(joint.attempt()));
        meta.put("program", r.program().id());
        meta.put("program_revision", r.program().revision());
        meta.put("verdict", r.verdict().name());
        String name = joint.partSerial() + "_" + joint.position() + "_" + joint.pass() + "_" + joint.attempt();
        try {
            Path p = store.save(name, meta, recorder, r.startNs() - leadNs, Math.max(r.endNs(), lastSampleNs));
            return new JointOutcome(joint.partSerial(), joint.partModel(), joint.pattern(), joint.position(),
                    joint.positionIndex(), joint.pass(), joint.attempt(), joint.result(), joint.transducerSerial(),
                    joint.calibrationDue(), joint.at(), p.toString());
        } catch (IOException | RuntimeException e) {
            failures++;
            LOG.warn("trace of {} not kept: {}", name, e.toString());
            return joint;
        }
    }

    /** Traces that could not be written. */
    public long failures() {
        return failures;
    }

    public TraceStore store() {
        return store;
    }
}
