package hammerstep.sim.app;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import hammerstep.app.UserError;
import hammerstep.config.ConfigException;
import hammerstep.joint.JointProgram;
import hammerstep.joint.ProgramFile;
import hammerstep.sim.physics.JointSpec;
import hammerstep.sim.physics.Presets;
import hammerstep.sim.physics.Rig;
import hammerstep.sim.physics.ToolSpec;
import hammerstep.sim.physics.TransducerSpec;
import hammerstep.trace.TraceWriter;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.Callable;

/**
 * {@code hammerstep-sim simulate}: rundowns of a modelled tool on a modelled joint, written as a
 * trace (what the transducer's ADC read) with the physics' ground truth beside it.
 */
@Command(name = "simulate", mixinStandardHelpOptions = true,
        description = {"Simulates rundowns of a tool on a joint and writes the transducer trace and the ground truth.",
                "Each rundown: the trigger held --hold-ms, released, then --gap-ms of quiet; a new fastener each time.",
                "With --reverse each fastener is first tightened so (not written), then loosened so: the tool in reverse.",
                "With --program the station's relay stops the tool when a blow reaches the program's shutoff_at, and the",
                "operator lets go of the trigger --reaction-ms later; --hold-ms is then the longest hold.",
                "Runs longer than a second show a progress line on stderr when it is a terminal."})
public final class SimulateCommand implements Callable<Integer> {

    static final int BLOCK = 4096;

    @Option(names = "--tool", required = true, paramLabel = "NAME|FILE",
            description = "tool preset (${COMPLETION-CANDIDATES}) or a YAML file", completionCandidates = ToolNames.class)
    String tool;

    @Option(names = "--joint", required = true, paramLabel = "NAME|FILE",
            description = "joint preset (${COMPLETION-CANDIDATES}) or a YAML file", completionCandidates = JointNames.class)
    String joint;

    @Option(names = "--transducer", paramLabel = "NAME|FILE", defaultValue = Presets.DEFAULT_TRANSDUCER,
            description = "transducer preset (${COMPLETION-CANDIDATES}) or a YAML file (default: ${DEFAULT-VALUE})",
            completionCandidates = TransducerNames.class)
    String transducer;

    @Option(names = "--rate", paramLabel = "HZ", defaultValue = "50000", description = "ADC rate (default: ${DEFAULT-VALUE})")
    double rateHz;

    @Option(names = "--seed", paramLabel = "S", defaultValue = "1", description = "random seed (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--rundowns", paramLabel = "N", defaultValue = "1", description = "rundowns, one fastener each (default: ${DEFAULT-VALUE})")
    int rundowns;

    @Option(names = "--hold-ms", paramLabel = "MS", defaultValue = "1500", description = "trigger held per rundown (default: ${DEFAULT-VALUE})")
    double holdMs;

    @Option(names = "--gap-ms", paramLabel = "MS", defaultValue = "500", description = "quiet after each rundown (default: ${DEFAULT-VALUE})")
    double gapMs;

    @Option(names = "--lead-ms", paramLabel = "MS", defaultValue = "100", description = "quiet before the first rundown (default: ${DEFAULT-VALUE})")
    double leadMs;

    @Option(names = "--count-above", paramLabel = "NM", defaultValue = "40",
            description = "shaft torque a strike must reach to be a blow in the truth (default: ${DEFAULT-VALUE})")
    double countAboveNm;

    @Option(names = "--supply-bar", paramLabel = "BAR", description = "air supply pressure, gauge (default: the tool's reference)")
    Double supplyBar;

    @Option(names = "--battery-v", paramLabel = "V", description = "battery open-circuit voltage (default: the tool's nominal)")
    Double batteryV;

    @Option(names = "--reverse", description = "the tool in reverse: loosen each fastener after tightening it unrecorded")
    boolean reverse;

    @Option(names = "--program", paramLabel = "FILE",
            description = "joint program: its shutoff_at stops the tool through the station's relay (default: hold --hold-ms)")
    Path program;

    @Option(names = "--reaction-ms", paramLabel = "MS", defaultValue = "200",
            description = "with --program: the operator lets go of the trigger this long after the shut-off (default: ${DEFAULT-VALUE}, a simple reaction time)")
    double reactionMs;

    @Option(names = "--out", required = true, paramLabel = "FILE", description = "trace to write: CSV (time_s,torque_nm), or raw float32 N·m if FILE ends in .f32")
    Path out;

    @Option(names = "--truth", required = true, paramLabel = "FILE", description = "ground truth to write (JSON)")
    Path truth;

    @Override
    public Integer call() throws ConfigException, IOException {
        if (!(rateHz >= 1000 && rateHz <= 1_000_000)) {
            throw new UserError("--rate " + rateHz + ": expected 1000 to 1000000 Hz");
        }
        if (rundowns < 1 || rundowns > 10_000) {
            throw new UserError("--rundowns " + rundowns + ": expected 1 to 10000");
        }
        if (!(holdMs > 0) || !(gapMs >= 0) || !(leadMs >= 0) || holdMs > 600_000) {
            throw new UserError("--hold-ms must be positive (at most 600000); --gap-ms and --lead-ms not negative");
        }
        if (!(reactionMs >= 0 && reactionMs <= 5000)) {
            throw new UserError("--reaction-ms " + reactionMs + ": expected 0 to 5000");
        }
        if (program != null && reverse) {
            throw new UserError("--program stops a tightening at its shutoff_at; it does not apply to --reverse");
        }
        JointProgram jointProgram = program == null ? null : ProgramFile.load(program);
        ToolSpec toolSpec = Presets.tool(tool);
        JointSpec jointSpec = Presets.joint(joint);
        TransducerSpec transducerSpec = Presets.transducer(transducer);
        Rig rig = Rig.create(toolSpec, jointSpec, transducerSpec, rateHz, seed);
        rig.setBlowThresholdNm(countAboveNm);
        if (supplyBar != null) {
            rig.setSupplyPressureBar(supplyBar);
        }
        if (batteryV != null) {
            rig.setBatteryVoltage(batteryV);
        }
        Map<String, String> meta = new LinkedHashMap<>();
        meta.put("source", "hammerstep-sim simulate");
        meta.put("tool", toolSpec.name());
        meta.put("joint", jointSpec.name());
        meta.put("transducer", transducerSpec.name());
        meta.put("seed", Long.toString(seed));
        if (reverse) {
            meta.put("direction", "loosen");
        }
        RelayOperator relay = null;
        if (jointProgram != null) {
            meta.put("program", jointProgram.id());
            relay = new RelayOperator(jointProgram, rateHz);
        }
        Progress progress = Progress.onStderr(rundowns);
        List<Map<String, Object>> results = new ArrayList<>();
        long skippedSamples = 0;
        float[] block = new float[BLOCK];
        try (TraceWriter writer = new TraceWriter(out, rateHz, meta)) {
            run(rig, writer, block, samplesFor(leadMs), relay);
            for (int r = 0; r < rundowns; r++) {
                if (r > 0) {
                    rig.newFastener(jointSpec);
                }
                int firstBlow = 0;
                if (reverse) {
                    // the bolt is tightened by the same tool first, off the record, then loosened
                    rig.setTrigger(true);
                    skip(rig, block, samplesFor(holdMs));
                    rig.setTrigger(false);
                    skip(rig, block, samplesFor(gapMs));
                    skippedSamples += samplesFor(holdMs) + samplesFor(gapMs);
                    rig.setReverse(true);
                    firstBlow = rig.blows();
                }
                double startS = (rig.samplesElapsed() - skippedSamples) / rateHz;
                rig.setTrigger(true);
                long crossing = -1;
                if (relay == null) {
                    run(rig, writer, block, samplesFor(holdMs), null);
                } else {
                    crossing = holdUntilShutoff(rig, writer, block, samplesFor(holdMs), relay);
                }
                long releasedAt = rig.samplesElapsed();
                rig.setTrigger(false);
                rig.setEnabled(true);
                run(rig, writer, block, samplesFor(gapMs), relay);
                Map<String, Object> truthRundown = Truth.rundown(rig, startS, firstBlow, skippedSamples / rateHz);
                if (relay != null) {
                    truthRundown.put("shutoff_s", crossing < 0 ? null : Truth.round(crossing / rateHz, 1e6));
                    truthRundown.put("trigger_released_s", Truth.round(releasedAt / rateHz, 1e6));
                }
                results.add(truthRundown);
                progress.update(r + 1);
            }
        }
        if (relay != null) {
            relay.finish();
        }
        progress.finish(rundowns);
        Map<String, Object> doc = new LinkedHashMap<>();
        doc.put("tool", toolSpec.name());
        doc.put("joint", jointSpec.name());
        doc.put("transducer", transducerSpec.name());
        doc.put("rate_hz", rateHz);
        doc.put("seed", seed);
        doc.put("count_above_nm", countAboveNm);
        doc.put("recontact_ms", Truth.round(rig.recontactS() * 1e3, 100));
        doc.put("direction", reverse ? "loosen" : "tighten");
        if (jointProgram != null) {
            doc.put("program", jointProgram.id());
            doc.put("shutoff_at_nm", jointProgram.hasShutoff() ? jointProgram.shutoffAtNm() : null);
            doc.put("reaction_ms", reactionMs);
        }
        doc.put("rundowns", results);
        new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValue(truth.toFile(), doc);
        return 0;
    }

    private long samplesFor(double ms) {
        return Math.round(ms * 1e-3 * rateHz);
    }

    /** Advances the rig without writing: virtual time that the trace does not show. */
    private static void skip(Rig rig, float[] block, long samples) {
        long left = samples;
        while (left > 0) {
            int n = (int) Math.min(block.length, left);
            rig.fill(block, 0, n);
            left -= n;
        }
    }

    /** Advances the rig by {@code samples}, writing them, and feeding them to the relay's chain if there is one. */
    private static void run(Rig rig, TraceWriter writer, float[] block, long samples, RelayOperator relay)
            throws IOException {
        long left = samples;
        while (left > 0) {
            int n = (int) Math.min(block.length, left);
            long first = rig.samplesElapsed();
            rig.fill(block, 0, n);
            writer.write(block, 0, n);
            if (relay != null) {
                feed(relay, block, n, first);
            }
            left -= n;
        }
    }

    /**
     * The trigger held for at most {@code samples}, in blocks of {@link RelayOperator#BLOCK}: when a
     * sample reaches {@code shutoff_at}, tool enable drops at the end of that block (the relay), and the
     * hold ends {@code --reaction-ms} after the crossing (the operator lets go). Returns the crossing
     * sample, or -1 when the rundown never reached it.
     */
    private long holdUntilShutoff(Rig rig, TraceWriter writer, float[] block, long samples, RelayOperator relay)
            throws IOException {
        relay.nextRundown();
        long end = rig.samplesElapsed() + samples;
        long reaction = samplesFor(reactionMs);
        while (rig.samplesElapsed() < end) {
            long crossing = relay.crossingSample();
            if (crossing >= 0) {
                end = Math.min(end, crossing + reaction);
                if (rig.samplesElapsed() >= end) {
                    break;
                }
            }
            int n = (int) Math.min(RelayOperator.BLOCK, end - rig.samplesElapsed());
            long first = rig.samplesElapsed();
            rig.fill(block, 0, n);
            writer.write(block, 0, n);
            relay.onSamples(block, n, first);
            if (relay.crossingSample() >= 0) {
                rig.setEnabled(false);
            }
        }
        return relay.crossingSample();
    }

    private static void feed(RelayOperator relay, float[] block, int n, long firstSample) {
        float[] slice = relay.slice();
        for (int i = 0; i < n; i += RelayOperator.BLOCK) {
            int m = Math.min(RelayOperator.BLOCK, n - i);
            System.arraycopy(block, i, slice, 0, m);
            relay.onSamples(slice, m, firstSample + i);
        }
    }

    static final class ToolNames extends ArrayList<String> {
        ToolNames() {
            super(Presets.TOOLS);
        }
    }

    static final class JointNames extends ArrayList<String> {
        JointNames() {
            super(Presets.JOINTS);
        }
    }

    static final class TransducerNames extends ArrayList<String> {
        TransducerNames() {
            super(Presets.TRANSDUCERS);
        }
    }
}
