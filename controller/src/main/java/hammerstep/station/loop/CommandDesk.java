package hammerstep.station.loop;

import hammerstep.joint.InputStage;
import hammerstep.mqtt.StationCommands;
import hammerstep.results.ResultSink;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Phase;
import hammerstep.sequence.Sequence;
import hammerstep.station.PartIdentity;

import java.util.List;
import java.util.Map;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.ArrayBlockingQueue;
import java.util.concurrent.atomic.AtomicBoolean;

/**
 * The plant's commands to one station loop ({@link StationCommands}). The delivery thread calls in;
 * each command goes into a bounded queue that the {@link StationAgent} drains at the start of its
 * duty cycle, so the sequence keeps its single writer; the answer completes on the station thread
 * after the station acted. A full queue, or a station that has stopped, answers at once and changes
 * nothing.
 *
 * <p>{@code reload} reads the program and pattern files on a thread of its own (never on the
 * station or delivery thread); the loaded patterns then wait until no part is in work and no
 * rundown under way, and replace the old ones between two cycles. A file with a problem changes
 * nothing and answers {@code RELOAD_FAILED} with the first problem.
 */
public final class CommandDesk implements StationCommands {

    /** Reads the part models and their patterns again; throws with a one-line reason when a file is wrong. */
    @FunctionalInterface
    public interface ProgramLoader {
        Map<String, Pattern> load() throws Exception;
    }

    /** How many commands may wait for the station thread at once. */
    public static final int QUEUE_CAPACITY = 16;

    private sealed interface Request {
        CompletableFuture<Reply> answer();
    }

    private record Start(PartIdentity identity, CompletableFuture<Reply> answer) implements Request { }

    private record End(String reason, CompletableFuture<Reply> answer) implements Request { }

    private record Reload(Map<String, Pattern> patterns, CompletableFuture<Reply> answer) implements Request { }

    // Agrona's array queues need jdk.internal.misc exported on Java 17; the JDK's bounded queue needs nothing
    private final ArrayBlockingQueue<Request> queue = new ArrayBlockingQueue<>(QUEUE_CAPACITY);
    private final ProgramLoader loader;
    private final AtomicBoolean reloading = new AtomicBoolean();
    private volatile Activity activity = new Activity(Phase.WAITING.name(), null, null, null);
    private volatile boolean closed;
    private volatile long gapsOutside;
    private volatile long gapsDuring;

    // station thread only
    private Reload pendingReload;
    private Phase seenPhase;
    private PartIdentity seenPart;
    private PartIdentity seenQueued;

    /** @param loader reads the programs again for {@code reload}; null when this station cannot reload */
    public CommandDesk(ProgramLoader loader) {
        this.loader = loader;
    }

    // ---- delivery thread ----------------------------------------------------------------------

    @Override
    public CompletionStage<Reply> startPart(String serial, String model) {
        CompletableFuture<Reply> answer = new CompletableFuture<>();
        PartIdentity identity;
        try {
            identity = new PartIdentity(serial, model);
        } catch (IllegalArgumentException e) {
            return CompletableFuture.completedFuture(Reply.refused("INVALID", e.getMessage()));
        }
        return offer(new Start(identity, answer));
    }

    @Override
    public CompletionStage<Reply> endPart(String reason) {
        return offer(new End(reason, new CompletableFuture<>()));
    }

    @Override
    public CompletionStage<Reply> reloadPrograms() {
        if (loader == null) {
            return CompletableFuture.completedFuture(Reply.refused("UNAVAILABLE", "this station cannot reload programs"));
        }
        if (closed) {
            return stopped();
        }
        if (!reloading.compareAndSet(false, true)) {
            return CompletableFuture.completedFuture(Reply.refused("BUSY", "a reload is already under way"));
        }
        CompletableFuture<Reply> answer = new CompletableFuture<>();
        answer.whenComplete((r, t) -> reloading.set(false));
        Thread t = new Thread(() -> {
            Map<String, Pattern> loaded;
            try {
                loaded = Map.copyOf(loader.load());
            } catch (hammerstep.config.ConfigException e) {
                // the station file names the broken pattern first; the pattern's own problem follows
                List<String> first = e.problems().stream().limit(3).map(Object::toString).toList();
                answer.complete(Reply.refused("RELOAD_FAILED", firstLine(String.join("; ", first))));
                return;
            } catch (Exception | LinkageError e) {
                answer.complete(Reply.refused("RELOAD_FAILED", firstLine(e.getMessage())));
                return;
            }
            if (loaded.isEmpty()) {
                answer.complete(Reply.refused("RELOAD_FAILED", "the station file names no part model"));
                return;
            }
            offer(new Reload(loaded, answer));
        }, "program-reload");
        t.setDaemon(true);
        t.start();
        return answer;
    }

    @Override
    public Activity activity() {
        return activity;
    }

    private CompletionStage<Reply> offer(Request r) {
        if (closed) {
            return stopped();
        }
        if (!queue.offer(r)) {
            r.answer().complete(Reply.refused("BUSY", "the station has " + QUEUE_CAPACITY + " commands waiting"));
        } else if (closed) {
            drainQueue(); // the station stopped while we offered: nobody else will answer it
        }
        return r.answer();
    }

    private static CompletionStage<Reply> stopped() {
        return CompletableFuture.completedFuture(Reply.refused("UNAVAILABLE", "the station has stopped"));
    }

    private static String firstLine(String s) {
        if (s == null || s.isBlank()) {
            return "cannot read the programs";
        }
        int nl = s.indexOf('\n');
        String one = nl < 0 ? s : s.substring(0, nl);
        return one.length() > 600 ? one.substring(0, 600) + "..." : one;
    }

    // ---- station thread -----------------------------------------------------------------------

    /** Applies a waiting reload when the station is free, acts on every queued command, updates the activity. */
    int serve(StationAgent agent, long nowNs) {
        if (closed) {
            return 0;
        }
        int work = 0;
        if (pendingReload != null && free(agent)) {
            apply(agent, pendingReload);
            pendingReload = null;
            work++;
        }
        Request r;
        while ((r = poll()) != null) {
            work++;
            if (r instanceof Start s) {
                r.answer().complete(start(agent, s.identity, nowNs));
            } else if (r instanceof End e) {
                r.answer().complete(end(agent, e.reason, nowNs));
            } else if (r instanceof Reload load) {
                if (free(agent)) {
                    apply(agent, load);
                } else {
                    if (pendingReload != null) {
                        pendingReload.answer().complete(Reply.refused("RELOAD_FAILED", "replaced by a later reload"));
                    }
                    pendingReload = load;
                }
            }
        }
        observe(agent.sequence(), agent.queuedPart());
        observeGaps(agent.inputStage());
        return work;
    }

    /** Keeps the data-gap counts for status messages (writes only when one changed). */
    private void observeGaps(InputStage stage) {
        long outside = stage.gapsOutsideRundowns();
        long during = stage.gapsDuringRundowns();
        if (outside != gapsOutside) {
            gapsOutside = outside;
        }
        if (during != gapsDuring) {
            gapsDuring = during;
        }
    }

    @Override
    public DataGaps dataGaps() {
        return new DataGaps(gapsOutside, gapsDuring);
    }

    private static Reply start(StationAgent agent, PartIdentity id, long nowNs) {
        Sequence seq = agent.sequence();
        Pattern pattern = agent.patterns().get(id.model());
        if (pattern == null) {
            return Reply.refused("UNKNOWN_MODEL", "no pattern for model " + id.model() + "; this station knows "
                    + String.join(", ", agent.patterns().keySet()));
        }
        if (seq.phase() == Phase.FAULT) {
            return Reply.refused("FAULT", "the station stands in a store fault until the supervisor key");
        }
        if (seq.phase() != Phase.WAITING && seq.phase() != Phase.COMPLETE) {
            return Reply.refused("BUSY", "part " + seq.part().serial() + " is in work");
        }
        if (agent.storage() == ResultSink.Storage.FULL) {
            return Reply.refused("STORAGE_FULL", "result storage is full: no new part until results are delivered");
        }
        if (!agent.partPresent()) {
            PartIdentity before = agent.queuedPart();
            agent.identify(id);
            return Reply.accepted("part " + id.serial() + " (" + pattern.id() + ") starts when it is in the fixture"
                    + (before == null || before.equals(id) ? ""
                    : "; it replaces part " + before.serial() + ", which was waiting for it and never started"));
        }
        if (!seq.partArrived(id, pattern, nowNs)) {
            return Reply.refused("BUSY", "the station did not start part " + id.serial());
        }
        return Reply.accepted("part " + id.serial() + " started: pattern " + pattern.id());
    }

    /** Ends the part in work; with none, cancels the part waiting for the fixture (nothing to store: it never started). */
    private static Reply end(StationAgent agent, String reason, long nowNs) {
        Sequence seq = agent.sequence();
        String serial = seq.part() == null ? null : seq.part().serial();
        String refused = seq.endPart(reason, nowNs);
        if (refused == null) {
            return Reply.accepted("part " + serial + " ended");
        }
        if ("FAULT".equals(refused)) {
            return Reply.refused("FAULT", "the station stands in a store fault until the supervisor key");
        }
        PartIdentity queued = agent.cancelQueuedPart();
        if (queued != null) {
            return Reply.accepted("part " + queued.serial() + " was waiting for the fixture and is cancelled;"
                    + " it never started");
        }
        return Reply.refused("NO_PART", "no part in work and none waiting for the fixture");
    }

    private static boolean free(StationAgent agent) {
        Sequence seq = agent.sequence();
        return (seq.part() == null || seq.phase() == Phase.COMPLETE) && seq.phase() != Phase.FAULT
                && !agent.inRundown();
    }

    private static void apply(StationAgent agent, Reload load) {
        String problem = agent.replacePatterns(load.patterns);
        load.answer().complete(problem != null ? Reply.refused("RELOAD_FAILED", problem)
                : Reply.accepted("programs reloaded: " + load.patterns.size()
                        + (load.patterns.size() == 1 ? " part model" : " part models")));
    }

    /** Keeps the snapshot for status messages; allocates only when the phase, the part or the queued part changes. */
    private void observe(Sequence seq, PartIdentity queued) {
        Phase phase = seq.phase();
        PartIdentity part = seq.part();
        if (phase != seenPhase || part != seenPart || queued != seenQueued) {
            seenPhase = phase;
            seenPart = part;
            seenQueued = queued;
            Pattern p = seq.pattern();
            activity = new Activity(phase.name(), part == null ? null : part.serial(),
                    part == null ? null : part.model(), p == null ? null : p.id(),
                    queued == null ? null : queued.serial(), queued == null ? null : queued.model());
        }
    }

    /** The station stopped: every waiting command is answered, later ones at once. */
    void close() {
        closed = true;
        drainQueue();
        Reload p = pendingReload;
        if (p != null) {
            pendingReload = null;
            p.answer().complete(Reply.refused("UNAVAILABLE", "the station has stopped"));
        }
    }

    private Request poll() {
        return queue.poll();
    }

    private void drainQueue() {
        Request r;
        while ((r = poll()) != null) {
            r.answer().complete(Reply.refused("UNAVAILABLE", "the station has stopped"));
        }
    }
}
