package hammerstep.web;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.joint.JointResult;
import hammerstep.results.StationEvent;
import hammerstep.web.ResultLog.EventRow;
import hammerstep.web.ResultLog.JointRow;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * Pushes the live page's updates as server-sent events to every open page, from one thread of its
 * own: every {@link #PERIOD_MS} ms it reads the board's snapshot and trail (never waiting on the
 * station), and writes what changed, built once for all pages. Events: {@code state} (the
 * {@link LiveSnapshot}), {@code trail} (the rundown's torque: whole, or the points added since the
 * last push), {@code joints} (the last joints), {@code events} (the last alarms, warnings and
 * notices). A page that cannot take its bytes is dropped.
 */
final class LiveFeed implements Runnable {

    static final long PERIOD_MS = 100;
    static final int MAX_PAGES = 100;
    private static final long HEARTBEAT_MS = 15_000;
    private static final int LAST_JOINTS = 8;
    private static final int LAST_EVENTS = 12;

    private final LiveBoard board;
    private final ObjectMapper json = new ObjectMapper();
    private final List<Page> pages = new CopyOnWriteArrayList<>();
    private volatile boolean running = true;

    private long sentVersion = -1;
    private long sentGeneration = -1;
    private int sentPoints;
    private int sentBlows;
    private boolean sentRunning;
    private long sentJoints = -1;
    private long sentEvents = -1;
    private long lastWriteMs;

    private static final class Page {
        final OutputStream out;
        volatile boolean fresh = true;

        Page(OutputStream out) {
            this.out = out;
        }
    }

    LiveFeed(LiveBoard board) {
        this.board = board;
    }

    /** Takes a page's open event stream; false when too many pages are open. */
    boolean add(OutputStream out) {
        if (pages.size() >= MAX_PAGES) {
            return false;
        }
        pages.add(new Page(out));
        return true;
    }

    int pages() {
        return pages.size();
    }

    void stop() {
        running = false;
        for (Page p : pages) {
            close(p);
        }
        pages.clear();
    }

    @Override
    public void run() {
        while (running) {
            try {
                push(System.currentTimeMillis());
                Thread.sleep(PERIOD_MS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            } catch (RuntimeException | JsonProcessingException e) {
                // a bad snapshot must not end the feed; the next push tries again
            }
        }
    }

    /** One push: what changed to the pages that have seen the last one, everything to new pages. */
    void push(long nowMs) throws JsonProcessingException {
        if (pages.isEmpty()) {
            sentVersion = -1;
            sentGeneration = -1;
            sentJoints = -1;
            sentEvents = -1;
            return;
        }
        LiveSnapshot s = board.snapshot();
        Trail t = board.trail();
        List<JointRow> joints = board.log().joints();
        List<EventRow> events = board.log().events();
        long jointsStored = board.log().jointsStored();

        String full = event("state", stateJson(s)) + trailEvent(t, 0, 0) + event("joints", jointsJson(joints))
                + event("events", eventsJson(events));
        StringBuilder delta = new StringBuilder();
        if (s.version() != sentVersion) {
            delta.append(event("state", stateJson(s)));
        }
        if (t.generation() != sentGeneration) {
            delta.append(trailEvent(t, 0, 0));
        } else if (t.torqueNm().length > sentPoints || t.blowNm().length > sentBlows || t.running() != sentRunning) {
            delta.append(trailEvent(t, Math.min(sentPoints, t.torqueNm().length), Math.min(sentBlows, t.blowNm().length)));
        }
        if (jointsStored != sentJoints) {
            delta.append(event("joints", jointsJson(joints)));
        }
        long eventsStored = board.log().eventsStored();
        if (eventsStored != sentEvents) {
            delta.append(event("events", eventsJson(events)));
        }
        if (delta.length() == 0 && nowMs - lastWriteMs >= HEARTBEAT_MS) {
            delta.append(": still here\n\n");
        }
        byte[] fullBytes = full.getBytes(StandardCharsets.UTF_8);
        byte[] deltaBytes = delta.toString().getBytes(StandardCharsets.UTF_8);
        for (Page p : pages) {
            byte[] b = p.fresh ? fullBytes : deltaBytes;
            p.fresh = false;
            if (b.length == 0) {
                continue;
            }
            try {
                p.out.write(b);
                p.out.flush();
            } catch (IOException e) {
                pages.remove(p);
                close(p);
            }
        }
        if (deltaBytes.length > 0) {
            lastWriteMs = nowMs;
        }
        sentVersion = s.version();
        sentGeneration = t.generation();
        sentPoints = t.torqueNm().length;
        sentBlows = t.blowNm().length;
        sentRunning = t.running();
        sentJoints = jointsStored;
        sentEvents = eventsStored;
    }

    private static void close(Page p) {
        try {
            p.out.close();
        } catch (IOException e) {
            // the page has gone
        }
    }

    private String event(String name, Object data) throws JsonProcessingException {
        return "event: " + name + "\ndata: " + json.writeValueAsString(data) + "\n\n";
    }

    private String trailEvent(Trail t, int fromPoint, int fromBlow) throws JsonProcessingException {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("generation", t.generation());
        m.put("point_ms", t.pointMs());
        m.put("from", fromPoint);
        m.put("torque_nm", round(t.torqueNm(), fromPoint));
        m.put("blows_from", fromBlow);
        m.put("blow_ms", round(t.blowMs(), fromBlow));
        m.put("blow_nm", round(t.blowNm(), fromBlow));
        m.put("running", t.running());
        return event("trail", m);
    }

    private static double[] round(float[] v, int from) {
        double[] out = new double[v.length - from];
        for (int i = from; i < v.length; i++) {
            out[i - from] = Math.round(v[i] * 10) / 10.0;
        }
        return out;
    }

    /** The snapshot as the page reads it; a figure that is not known is null (JSON has no NaN). */
    static Map<String, Object> stateJson(LiveSnapshot s) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("version", s.version());
        m.put("phase", s.phase());
        m.put("part_serial", s.partSerial());
        m.put("model", s.model());
        m.put("pattern", s.pattern());
        m.put("positions", s.positions());
        m.put("position_lamps", s.positionLamps());
        m.put("tower_lamps", s.towerLamps());
        m.put("pass", s.pass());
        m.put("pass_number", s.passNumber());
        m.put("passes", s.passes());
        m.put("prompted", s.prompted());
        m.put("rework", s.rework());
        m.put("tool_enabled", s.toolEnabled());
        m.put("storage", s.storage());
        m.put("signal_faults", s.signalFaults());
        m.put("zero_nm", finite(s.zeroNm()));
        m.put("tool_weak", s.toolWeak());
        m.put("station_errors", s.errors());
        m.put("program", s.program());
        m.put("torque_min_nm", finite(s.torqueMinNm()));
        m.put("torque_max_nm", finite(s.torqueMaxNm()));
        m.put("target_nm", finite(s.targetNm()));
        m.put("shutoff_nm", finite(s.shutoffNm()));
        return m;
    }

    private static Double finite(double v) {
        return Double.isFinite(v) ? v : null;
    }

    static List<Map<String, Object>> jointsJson(List<JointRow> joints) {
        List<Map<String, Object>> out = new ArrayList<>();
        for (int i = joints.size() - 1; i >= 0 && out.size() < LAST_JOINTS; i--) {
            JointRow row = joints.get(i);
            JointResult r = row.joint().result();
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("id", row.id());
            m.put("seq", row.seq());
            m.put("at", row.joint().at().toString());
            m.put("part_serial", row.joint().partSerial());
            m.put("position", row.joint().position());
            m.put("pass", row.joint().pass());
            m.put("program", r.program().id());
            m.put("final_torque_nm", Math.round(r.finalTorqueNm() * 100) / 100.0);
            m.put("blows", r.blows());
            m.put("verdict", r.verdict().name());
            m.put("reasons", r.reasons().stream().map(Enum::name).toList());
            out.add(m);
        }
        return out;
    }

    static List<Map<String, Object>> eventsJson(List<EventRow> events) {
        List<Map<String, Object>> out = new ArrayList<>();
        for (int i = events.size() - 1; i >= 0 && out.size() < LAST_EVENTS; i--) {
            StationEvent e = events.get(i).event();
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("at", e.at() == null ? "" : e.at().toString());
            m.put("severity", e.severity().name());
            m.put("code", e.code());
            m.put("message", e.message());
            out.add(m);
        }
        return out;
    }
}
