package hammerstep.web;

import hammerstep.analysis.Capability;
import hammerstep.analysis.CapabilityStudy;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.results.JointOutcome;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceException;
import hammerstep.web.ResultLog.JointRow;
import hammerstep.web.ResultLog.PartRow;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.Semaphore;

/** The view's pages other than the live one, drawn on the server as plain HTML with inline SVG. */
final class Pages {

    /** Said on every page of a view that asks no login. */
    static final String OPEN_NOTE = "<p class=\"note\">Open view on this computer only (loopback): no login asked.</p>";
    /** Biggest stored trace the view loads to draw (a 5 s rundown at 50 kHz in float32 is 1 MB). */
    static final long MAX_TRACE_BYTES = 16L << 20;
    private static final int MAX_CHARTED_GROUPS = 12;

    record Reply(int status, String html) { }

    private final LiveBoard board;
    private final String station;
    private final boolean open;
    private final Semaphore traceLoads = new Semaphore(1);

    Pages(LiveBoard board, String station, boolean open) {
        this.board = board;
        this.station = station;
        this.open = open;
    }

    LiveBoard board() {
        return board;
    }

    String station() {
        return station;
    }

    // ---- results ---------------------------------------------------------------------------------

    Reply results(Map<String, String> q) {
        JointFilter f;
        try {
            f = JointFilter.of(q);
        } catch (JointFilter.BadQuery e) {
            return new Reply(400, head("Results") + "<p class=\"error\">" + Html.esc(e.getMessage()) + "</p>" + foot());
        }
        List<JointRow> matching = f.apply(board.log().joints());
        List<JointRow> page = f.page(matching);
        StringBuilder b = new StringBuilder(head("Results"));
        b.append("<form class=\"filter\" method=\"get\" action=\"/results\">");
        input(b, "from", "from (UTC)", q, "2026-03-02T06:00");
        input(b, "to", "to (UTC)", q, "2026-03-02T18:00");
        input(b, "serial", "part serial", q, "");
        input(b, "program", "program", q, "");
        input(b, "position", "position", q, "");
        input(b, "pass", "pass", q, "");
        b.append("<label>verdict <select name=\"verdict\">");
        for (String v : new String[] {"", "GO", "NO_GO"}) {
            b.append("<option").append(v.equals(f.verdict()) ? " selected" : "").append(" value=\"").append(v)
                    .append("\">").append(v.isEmpty() ? "any" : v).append("</option>");
        }
        b.append("</select></label>");
        input(b, "reason", "reason", q, "TORQUE_LOW");
        b.append("<button type=\"submit\">Show</button> <a href=\"/results\">clear</a></form>");
        String qs = f.query();
        b.append("<p>").append(matching.size()).append(" joints match (of ").append(board.log().joints().size())
                .append(" kept). <a href=\"/results.csv").append(qs.isEmpty() ? "" : "?" + Html.esc(qs))
                .append("\">CSV of all ").append(matching.size()).append("</a> · <a href=\"/capability")
                .append(qs.isEmpty() ? "" : "?" + Html.esc(qs)).append("\">capability of these</a></p>");
        b.append("<table class=\"joints\"><thead><tr><th>seq</th><th>time (UTC)</th><th>part</th><th>position</th>")
                .append("<th>pass</th><th>attempt</th><th>program</th><th>final N·m</th><th>blows</th><th>verdict</th>")
                .append("<th>reasons</th></tr></thead><tbody>");
        for (JointRow r : page) {
            jointRow(b, r);
        }
        b.append("</tbody></table>");
        int pages = (matching.size() + f.pageSize() - 1) / f.pageSize();
        if (pages > 1) {
            b.append("<p class=\"pager\">page ").append(f.page() + 1).append(" of ").append(pages);
            if (f.page() > 0) {
                b.append(" · <a href=\"/results?").append(Html.esc(pageQuery(qs, f.page() - 1))).append("\">newer</a>");
            }
            if (f.page() + 1 < pages) {
                b.append(" · <a href=\"/results?").append(Html.esc(pageQuery(qs, f.page() + 1))).append("\">older</a>");
            }
            b.append("</p>");
        }
        return new Reply(200, b.append(foot()).toString());
    }

    private static String pageQuery(String qs, int page) {
        return (qs.isEmpty() ? "" : qs + "&") + "page=" + page;
    }

    private static void input(StringBuilder b, String name, String label, Map<String, String> q, String hint) {
        b.append("<label>").append(label).append(" <input name=\"").append(name).append("\" value=\"")
                .append(Html.esc(q.getOrDefault(name, ""))).append("\"")
                .append(hint.isEmpty() ? "" : " placeholder=\"" + Html.esc(hint) + "\"").append("></label>");
    }

    private static void jointRow(StringBuilder b, JointRow row) {
        JointOutcome j = row.joint();
        JointResult r = j.result();
        String verdict = r.verdict().name();
        b.append("<tr class=\"").append(verdict.equals("GO") ? "go" : "nogo").append("\"><td><a href=\"/joint?id=")
                .append(Html.esc(url(row.id()))).append("\">").append(row.seq()).append("</a></td><td>")
                .append(Html.esc(time(j))).append("</td><td><a href=\"/part?serial=").append(Html.esc(url(j.partSerial())))
                .append("\">").append(Html.esc(j.partSerial())).append("</a></td><td>").append(Html.esc(j.position()))
                .append("</td><td>").append(Html.esc(j.pass())).append("</td><td>").append(j.attempt()).append("</td><td>")
                .append(Html.esc(r.program().id())).append("</td><td class=\"num\">").append(Html.num(r.finalTorqueNm(), 1))
                .append("</td><td class=\"num\">").append(r.blows()).append("</td><td class=\"verdict\">").append(verdict)
                .append("</td><td>").append(Html.esc(String.join(" ", r.reasons().stream().map(Enum::name).toList())))
                .append("</td></tr>");
    }

    private static String time(JointOutcome j) {
        String t = j.at().toString();
        return t.length() > 19 ? t.substring(0, 19).replace('T', ' ') : t.replace('T', ' ');
    }

    private static String url(String s) {
        return java.net.URLEncoder.encode(s == null ? "" : s, java.nio.charset.StandardCharsets.UTF_8);
    }

    // ---- one joint -------------------------------------------------------------------------------

    Reply joint(String id) {
        JointRow row = board.log().joint(id);
        if (row == null) {
            return new Reply(404, head("Joint") + "<p class=\"error\">No joint " + Html.esc(id)
                    + " is kept here (the view keeps the last " + ResultLog.DEFAULT_JOINTS + ").</p>" + foot());
        }
        JointOutcome j = row.joint();
        JointResult r = j.result();
        JointProgram p = r.program();
        StringBuilder b = new StringBuilder(head("Joint " + row.seq()));
        b.append("<h2 class=\"").append(r.verdict().name().equals("GO") ? "go" : "nogo").append("\">")
                .append(r.verdict().name()).append(r.reasons().isEmpty() ? "" : " · "
                        + Html.esc(String.join(" ", r.reasons().stream().map(Enum::name).toList()))).append("</h2>");
        String note = "";
        StoredTrace.Loaded trace = null;
        if (j.tracePath() != null) {
            Path path = Path.of(j.tracePath());
            try {
                if (!Files.isRegularFile(path)) {
                    note = "its stored trace " + j.tracePath() + " is no longer there: blow peaks only";
                } else if (Files.size(path) > MAX_TRACE_BYTES) {
                    note = "its stored trace is larger than the view draws: blow peaks only (use hammerstep plot)";
                } else if (traceLoads.tryAcquire()) {
                    try {
                        trace = StoredTrace.load(path);
                    } finally {
                        traceLoads.release();
                    }
                } else {
                    note = "another trace is being drawn: blow peaks only (reload in a moment)";
                }
            } catch (java.io.IOException | TraceException e) {
                note = "its stored trace could not be read (" + e.getMessage() + "): blow peaks only";
            }
        } else {
            note = "no trace stored for this joint: blow peaks only";
        }
        JointResult drawn = r;
        if (board.log().restored(id)) {
            // read back from the journal: no blow times; the stored trace judged again gives them
            JointResult again = trace == null ? null : judgeAgain(Path.of(j.tracePath()), trace, p);
            if (again != null) {
                drawn = again;
                note = (note.isEmpty() ? "" : note + "; ") + "read back from the journal after a restart: its stored"
                        + " trace judged again with its program";
            } else {
                trace = null;
                note = (note.isEmpty() ? "" : note + "; ") + "read back from the journal after a restart, which keeps"
                        + " no blow times: the peaks drawn in order over the rundown's duration";
            }
        }
        b.append("<figure>").append(TraceSvg.of(drawn, trace));
        if (!note.isEmpty()) {
            b.append("<figcaption>").append(Html.esc(note)).append("</figcaption>");
        }
        b.append("</figure><table class=\"fields\">");
        field(b, "id", row.id());
        field(b, "seq", Long.toString(row.seq()));
        field(b, "time (UTC)", j.at().toString());
        field(b, "part", j.partSerial() + " (" + j.partModel() + ")");
        field(b, "pattern", j.pattern());
        field(b, "position", j.position() + " (" + j.positionIndex() + ")");
        field(b, "pass", j.pass());
        field(b, "attempt", Integer.toString(j.attempt()));
        field(b, "program", p.id() + (p.revision() == null ? "" : " rev " + p.revision()));
        field(b, "final torque", Html.num(r.finalTorqueNm(), 2) + " N·m ("
                + p.finalTorque().name().toLowerCase(java.util.Locale.ROOT) + ")");
        field(b, "window", Html.num(p.torque().minNm(), 1) + " to " + Html.num(p.torque().maxNm(), 1) + " N·m, target "
                + Html.num(p.torque().targetNm(), 1) + (p.hasShutoff() ? ", shut-off " + Html.num(p.shutoffAtNm(), 1) : ""));
        field(b, "blows", r.blows() + " (window " + p.blows().min() + " to " + p.blows().max() + ", counted above "
                + Html.num(p.blows().countAboveNm(), 1) + " N·m)");
        field(b, "blow rate", Html.num(r.blowRatePerMin(), 0) + " per minute");
        field(b, "duration", Html.num(r.durationMs(), 1) + " ms");
        field(b, "blows after shut-off", Integer.toString(r.blowsAfterShutoff()));
        field(b, "direction", r.direction().name().toLowerCase(java.util.Locale.ROOT));
        field(b, "transducer", j.transducerSerial() + (j.calibrationDue() == null ? "" : ", calibration due "
                + j.calibrationDue()));
        field(b, "trace", j.tracePath() == null ? "-" : j.tracePath());
        StringBuilder peaks = new StringBuilder();
        for (double v : r.peaksNm()) {
            peaks.append(peaks.length() == 0 ? "" : ", ").append(Html.num(v, 1));
        }
        field(b, "blow peaks, N·m", peaks.toString());
        b.append("</table>");
        return new Reply(200, b.append(foot()).toString());
    }

    /** The stored trace judged again with {@code program} (null when it cannot be: a program known by its limits only). */
    private static JointResult judgeAgain(Path path, StoredTrace.Loaded trace, JointProgram program) {
        if (!Double.isFinite(program.rundown().startAboveNm()) || !Double.isFinite(program.blows().countAboveNm())) {
            return null;
        }
        List<JointResult> rundowns = new ArrayList<>();
        hammerstep.joint.JointEvents collect = rundowns::add;
        try {
            hammerstep.trace.StationReplay.replay(path, trace, program, java.util.function.UnaryOperator.identity(),
                    4096, collect, w -> { });
        } catch (TraceException | RuntimeException e) {
            return null;
        }
        return WhatIfRun.theJoint(rundowns);
    }

    private static void field(StringBuilder b, String name, String value) {
        b.append("<tr><th>").append(Html.esc(name)).append("</th><td>").append(Html.esc(value)).append("</td></tr>");
    }

    // ---- one part --------------------------------------------------------------------------------

    Reply part(String serial) {
        List<JointRow> joints = new ArrayList<>();
        for (JointRow r : board.log().joints()) {
            if (serial.equals(r.joint().partSerial())) {
                joints.add(r);
            }
        }
        PartRow part = null;
        for (PartRow p : board.log().parts()) {
            if (serial.equals(p.part().partSerial())) {
                part = p;
            }
        }
        if (joints.isEmpty() && part == null) {
            return new Reply(404, head("Part") + "<p class=\"error\">No part " + Html.esc(serial) + " is kept here.</p>"
                    + foot());
        }
        StringBuilder b = new StringBuilder(head("Part " + serial));
        if (part != null) {
            b.append("<h2 class=\"").append(part.part().verdict().equals("GO") ? "go" : "nogo").append("\">")
                    .append(Html.esc(part.part().verdict())).append(" · ").append(Html.esc(part.part().ended()))
                    .append("</h2><p>").append(Html.esc(part.part().partModel())).append(", pattern ")
                    .append(Html.esc(part.part().pattern())).append(", started ").append(part.part().started())
                    .append(", ended ").append(part.part().at()).append("</p>");
        } else {
            b.append("<p>in work</p>");
        }
        // the pattern: one lamp-like cell per position and pass, coloured by its last attempt's verdict
        Map<Integer, String> positions = new TreeMap<>();
        Map<String, Map<Integer, JointRow>> byPass = new LinkedHashMap<>();
        for (JointRow r : joints) {
            positions.put(r.joint().positionIndex(), r.joint().position());
            byPass.computeIfAbsent(r.joint().pass(), k -> new LinkedHashMap<>()).put(r.joint().positionIndex(), r);
        }
        for (Map.Entry<String, Map<Integer, JointRow>> pass : byPass.entrySet()) {
            b.append("<h3>pass ").append(Html.esc(pass.getKey())).append("</h3><div class=\"pattern\">");
            for (Map.Entry<Integer, String> pos : positions.entrySet()) {
                JointRow r = pass.getValue().get(pos.getKey());
                String cls = r == null ? "none" : r.joint().result().verdict().name().equals("GO") ? "go" : "nogo";
                b.append("<a class=\"pos ").append(cls).append("\"")
                        .append(r == null ? "" : " href=\"/joint?id=" + Html.esc(url(r.id())) + "\"").append(">")
                        .append(Html.esc(pos.getValue())).append("<small>")
                        .append(r == null ? "not run" : Html.num(r.joint().result().finalTorqueNm(), 1) + " N·m")
                        .append("</small></a>");
            }
            b.append("</div>");
        }
        b.append("<table class=\"joints\"><thead><tr><th>seq</th><th>time (UTC)</th><th>part</th><th>position</th>")
                .append("<th>pass</th><th>attempt</th><th>program</th><th>final N·m</th><th>blows</th><th>verdict</th>")
                .append("<th>reasons</th></tr></thead><tbody>");
        for (JointRow r : joints) {
            jointRow(b, r);
        }
        b.append("</tbody></table>");
        return new Reply(200, b.append(foot()).toString());
    }

    // ---- capability ------------------------------------------------------------------------------

    Reply capability(Map<String, String> q) {
        JointFilter f;
        try {
            f = JointFilter.of(q);
        } catch (JointFilter.BadQuery e) {
            return new Reply(400, head("Capability") + "<p class=\"error\">" + Html.esc(e.getMessage()) + "</p>"
                    + foot());
        }
        List<JointRow> rows = f.apply(board.log().joints());
        Collections.reverse(rows);
        CapabilityStudy.Report report = CapabilityView.of(rows);
        StringBuilder b = new StringBuilder(head("Capability"));
        b.append("<form class=\"filter\" method=\"get\" action=\"/capability\">");
        input(b, "from", "from (UTC)", q, "2026-03-02T06:00");
        input(b, "to", "to (UTC)", q, "2026-03-02T18:00");
        input(b, "program", "program", q, "");
        input(b, "position", "position", q, "");
        b.append("<button type=\"submit\">Show</button></form>");
        b.append("<p>").append(report.joints()).append(" joints").append(report.sensorFaults() > 0 ? ", "
                + report.sensorFaults() + " with a sensor fault left out" : "")
                .append(". Cm = (USL − LSL) / 6s, Cmk = min(USL − mean, mean − LSL) / 3s; figures below ")
                .append(Html.num(Capability.REQUIRED, 2)).append(" and studies under ").append(Capability.MIN_STUDY)
                .append(" joints are flagged (machine capability as usually asked, VDI/VDE 2645-2 style). The same")
                .append(" figures as <code>hammerstep stats</code>.</p>");
        b.append("<table class=\"cap\"><thead><tr><th>program</th><th>position</th><th>n</th><th>mean N·m</th>")
                .append("<th>s N·m</th><th>Cm</th><th>Cmk</th><th>blows mean</th><th>s</th><th>Cm</th><th>Cmk</th>")
                .append("<th>flags</th></tr></thead><tbody>");
        for (CapabilityStudy.Entry e : report.entries()) {
            Capability t = e.torque();
            Capability bl = e.blows();
            b.append("<tr").append(e.flags().isEmpty() ? "" : " class=\"flagged\"").append("><td>")
                    .append(Html.esc(e.program())).append("</td><td>")
                    .append(e.perPosition() ? Html.esc(e.position()) : "all")
                    .append("</td><td class=\"num\">").append(t.n()).append("</td>");
            cell(b, t.mean(), 2, false);
            cell(b, t.sd(), 3, false);
            cell(b, t.cm(), 2, t.cmLow());
            cell(b, t.cmk(), 2, t.cmkLow());
            cell(b, bl.mean(), 2, false);
            cell(b, bl.sd(), 2, false);
            cell(b, bl.cm(), 2, bl.cmLow());
            cell(b, bl.cmk(), 2, bl.cmkLow());
            b.append("<td>").append(Html.esc(String.join(" ", e.flags().stream().map(Enum::name).toList())))
                    .append("</td></tr>");
        }
        b.append("</tbody></table>");
        int charted = 0;
        for (CapabilityStudy.Entry e : report.entries()) {
            if (charted++ >= MAX_CHARTED_GROUPS) {
                b.append("<p>Charts of the first ").append(MAX_CHARTED_GROUPS)
                        .append(" groups only: filter by program or position for the others.</p>");
                break;
            }
            b.append("<h3>").append(Html.esc(e.program())).append(e.perPosition() ? " · " + Html.esc(e.position()) : "")
                    .append(" (").append(e.limits()).append(")</h3><div class=\"pair\">")
                    .append(CapabilitySvg.histogram(e)).append(CapabilitySvg.runChart(e)).append("</div>");
        }
        return new Reply(200, b.append(foot()).toString());
    }

    private static void cell(StringBuilder b, double v, int decimals, boolean low) {
        b.append("<td class=\"num").append(low ? " low" : "").append("\">").append(Html.num(v, decimals)).append("</td>");
    }

    /** A page refused to this account (403). */
    Reply refused(String why) {
        return new Reply(403, head("Not for this account") + "<p class=\"error\" id=\"refused\">" + Html.esc(why)
                + "</p>" + foot());
    }

    // ---- frame -----------------------------------------------------------------------------------

    String head(String title) {
        return "<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" "
                + "content=\"width=device-width, initial-scale=1\"><title>" + Html.esc(title) + " · "
                + Html.esc(station) + "</title><link rel=\"stylesheet\" href=\"/style.css\"></head><body><header>"
                + "<strong>" + Html.esc(station) + "</strong><nav><a href=\"/\">Station</a><a href=\"/results\">Results</a>"
                + "<a href=\"/capability\">Capability</a><a href=\"/programs\">Programs</a><a href=\"/whatif\">What-if</a></nav></header><main><h1>" + Html.esc(title) + "</h1>"
                + (open ? OPEN_NOTE : "");
    }

    static String foot() {
        return "</main></body></html>";
    }
}
