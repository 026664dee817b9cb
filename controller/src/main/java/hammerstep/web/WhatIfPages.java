package hammerstep.web;

import hammerstep.analysis.WhatIf;
import hammerstep.joint.JointEvents;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.sequence.Pattern;
import hammerstep.trace.StationReplay;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceException;

import java.nio.file.Files;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Future;
import java.util.concurrent.SynchronousQueue;
import java.util.concurrent.ThreadPoolExecutor;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.UnaryOperator;

/**
 * The what-if pages (engineer role only): a changed copy of a program, uploaded or edited in the
 * page and validated with {@code check}'s lines, judged over a range of stored traces on one worker
 * thread of its own (never the station's, never the pages' threads), one what-if at a time; the
 * result counts the verdicts that would change as {@code hammerstep replay --compare} counts them,
 * and opens each changed joint's trace with both windows drawn. Nothing on the station changes.
 *
 * <p>Element ids, kept stable for the browser tests:
 * <ul>
 *   <li>{@code whatif-form}: the form (POST /whatif, multipart); its fields {@code whatif-program}
 *       (textarea, name {@code program}), {@code whatif-file} (file, name {@code file}),
 *       {@code whatif-from}, {@code whatif-to} (UTC times like 2026-03-02T06:15, names {@code from},
 *       {@code to}), {@code whatif-serials} (part serials, name {@code serials}), the hidden
 *       cross-site token {@code csrf} (name {@code csrf}) and the button {@code whatif-run}</li>
 *   <li>{@code whatif-problems}: the list of check's lines for a program refused (one {@code li} each)</li>
 *   <li>{@code whatif-refused}: why a what-if was not started (one already running)</li>
 *   <li>{@code whatif-status}: {@code data-state} is {@code running}, {@code done} or {@code failed}</li>
 *   <li>{@code whatif-compared}, {@code whatif-changed-count}, {@code whatif-go-to-nogo},
 *       {@code whatif-nogo-to-go}, {@code whatif-other-reasons}: the counts, digits only</li>
 *   <li>{@code whatif-by-reason}, {@code whatif-by-position}, {@code whatif-changed}: the tables;
 *       each changed joint's link has class {@code whatif-joint} (GET /whatif/joint?n=K)</li>
 *   <li>{@code whatif-trace}: the figure of a changed joint, both windows drawn</li>
 * </ul>
 */
final class WhatIfPages {

    /** Largest form the view takes (a program file is a few hundred bytes). */
    static final int MAX_FORM_BYTES = 256 * 1024;

    private final Pages pages;
    private final WebStation station;
    private final LiveBoard board;
    private final ExecutorService worker;
    private final AtomicReference<WhatIfRun> last = new AtomicReference<>();
    private volatile Future<?> running;
    private final java.util.concurrent.Semaphore traceLoads = new java.util.concurrent.Semaphore(1);

    WhatIfPages(Pages pages, LiveBoard board, WebStation station) {
        this(pages, board, station, new ThreadPoolExecutor(1, 1, 0, TimeUnit.SECONDS, new SynchronousQueue<>(), r -> {
            Thread t = new Thread(r, "web-whatif");
            t.setDaemon(true);
            t.setPriority(Thread.MIN_PRIORITY);
            return t;
        }));
    }

    /** With the worker given (a test holds the what-if under way with one that does not run it). */
    WhatIfPages(Pages pages, LiveBoard board, WebStation station, ExecutorService worker) {
        this.pages = pages;
        this.board = board;
        this.station = station;
        this.worker = worker;
    }

    void close() {
        worker.shutdownNow();
    }

    /** The what-if last started (running or done), or null. */
    WhatIfRun last() {
        return last.get();
    }

    /** Waits for the what-if under way to end (tests). */
    void awaitIdle(long timeoutMs) throws Exception {
        Future<?> f = running;
        if (f != null) {
            f.get(timeoutMs, TimeUnit.MILLISECONDS);
        }
    }

    // ---- the form and the last result ------------------------------------------------------------

    Pages.Reply page(String csrf) {
        return new Pages.Reply(200, render(csrf, "", Map.of(), List.of(), null));
    }

    /** A what-if asked for with the form's fields; its answer (303 to the page when started). */
    Pages.Reply start(Map<String, FormBody.Field> form, String who, String csrf) {
        Map<String, String> text = new java.util.HashMap<>();
        form.forEach((k, v) -> {
            if (!k.equals("file") && !k.equals("program")) {
                text.put(k, v.text());
            }
        });
        FormBody.Field file = form.get("file");
        FormBody.Field edited = form.get("program");
        String programText = edited == null ? "" : edited.text();
        byte[] bytes;
        String name;
        if (file != null && file.value().length > 0) {
            bytes = file.value();
            name = ProgramCheck.safeName(file.fileName());
        } else {
            bytes = programText.getBytes(java.nio.charset.StandardCharsets.UTF_8);
            name = ProgramCheck.EDITED;
        }
        if (bytes.length == 0) {
            return new Pages.Reply(400, render(csrf, programText, text,
                    List.of("no program: upload a program file or edit one in the text box"), null));
        }
        ProgramCheck.Checked checked = ProgramCheck.of(name, bytes);
        if (checked.program() == null) {
            return new Pages.Reply(400, render(csrf, programText, text, checked.problems(), null));
        }
        JointFilter range;
        try {
            range = JointFilter.of(Map.of("from", text.getOrDefault("from", ""), "to", text.getOrDefault("to", "")));
        } catch (JointFilter.BadQuery e) {
            return new Pages.Reply(400, render(csrf, programText, text, List.of(e.getMessage()), null));
        }
        Set<String> serials = new LinkedHashSet<>();
        for (String s : text.getOrDefault("serials", "").split("[\\s,;]+")) {
            if (!s.isEmpty() && serials.size() < 1000) {
                serials.add(s);
            }
        }
        WhatIfRun.Ask ask = new WhatIfRun.Ask(checked.program(), name, range.from(), range.to(), serials, who);
        synchronized (this) {
            WhatIfRun now = last.get();
            if (now != null && !now.finished()) {
                return new Pages.Reply(409, render(csrf, programText, text, List.of(), "A what-if is running (started by "
                        + now.ask().who() + " at " + now.startedAt() + ", " + Math.max(0, now.done()) + " of "
                        + Math.max(0, now.total()) + " traces): one at a time; start yours when it has ended."));
            }
            WhatIfRun run = new WhatIfRun(ask, station.tracesDir(), board.log().joints(), Instant.now());
            last.set(run);
            running = worker.submit(run::run);
        }
        return new Pages.Reply(303, "/whatif");
    }

    private String render(String csrf, String programText, Map<String, String> fields, List<String> problems,
                          String refused) {
        StringBuilder b = new StringBuilder(pages.head("What-if"));
        b.append("<p class=\"note\">Judges stored traces again with a changed copy of a program and counts the")
                .append(" verdicts that would change, as <code>hammerstep replay --compare</code> does. Nothing on the")
                .append(" station changes: the program in use stays, the traces are only read. Traces of other programs")
                .append(" (by the program id in their header) are left out. ")
                .append(station.tracesDir() == null ? "<strong>This station keeps no traces (no <code>traces</code>"
                        + " section): there is nothing to judge again.</strong>" : "")
                .append("</p>");
        if (refused != null) {
            b.append("<p class=\"error\" id=\"whatif-refused\">").append(Html.esc(refused)).append("</p>");
        }
        if (!problems.isEmpty()) {
            b.append("<p class=\"error\">The program was not taken:</p><ul class=\"problems\" id=\"whatif-problems\">");
            for (String p : problems) {
                b.append("<li><code>").append(Html.esc(p)).append("</code></li>");
            }
            b.append("</ul>");
        }
        b.append("<form id=\"whatif-form\" class=\"whatif\" method=\"post\" action=\"/whatif\" ")
                .append("enctype=\"multipart/form-data\">")
                .append("<input type=\"hidden\" id=\"csrf\" name=\"csrf\" value=\"").append(Html.esc(csrf)).append("\">")
                .append("<label>changed program (YAML, as a program file; its <code>id</code> picks the traces)")
                .append("<textarea id=\"whatif-program\" name=\"program\" rows=\"12\" cols=\"72\" spellcheck=\"false\">")
                .append(Html.esc(programText)).append("</textarea></label>")
                .append("<label>or upload a program file <input type=\"file\" id=\"whatif-file\" name=\"file\" ")
                .append("accept=\".yaml,.yml\"></label><div class=\"filter\">");
        field(b, "from", "traces from (UTC)", fields, "2026-03-02T06:00");
        field(b, "to", "to (UTC)", fields, "2026-03-02T18:00");
        field(b, "serials", "part serials (any when empty)", fields, "HX-1001 HX-1002");
        b.append("<button type=\"submit\" id=\"whatif-run\">Run what-if</button></div></form>");
        result(b);
        return b.append(Pages.foot()).toString();
    }

    private static void field(StringBuilder b, String name, String label, Map<String, String> q, String hint) {
        b.append("<label>").append(label).append(" <input id=\"whatif-").append(name).append("\" name=\"").append(name)
                .append("\" value=\"").append(Html.esc(q.getOrDefault(name, ""))).append("\" placeholder=\"")
                .append(Html.esc(hint)).append("\"></label>");
    }

    private void result(StringBuilder b) {
        WhatIfRun run = last.get();
        if (run == null) {
            return;
        }
        WhatIfRun.Ask ask = run.ask();
        b.append("<section id=\"whatif-result\"><h2>Last what-if: ").append(Html.esc(ask.program().id()))
                .append(" from ").append(Html.esc(ask.programName())).append(" (rev ")
                .append(Html.esc(ask.program().revision())).append("), by ").append(Html.esc(ask.who()))
                .append(" at ").append(run.startedAt()).append("</h2><p class=\"note\">traces ")
                .append(ask.from() == null ? "from the first" : "from " + ask.from())
                .append(ask.to() == null ? " to the last" : " to " + ask.to())
                .append(ask.serials().isEmpty() ? ", every part" : ", parts " + Html.esc(String.join(" ", ask.serials())))
                .append("</p>");
        if (!run.finished()) {
            b.append("<p id=\"whatif-status\" data-state=\"running\">Running: ").append(run.done()).append(" of ")
                    .append(Math.max(0, run.total())).append(" traces looked at. <a href=\"/whatif\">reload</a></p>")
                    .append("</section>");
            return;
        }
        if (run.failure() != null) {
            b.append("<p id=\"whatif-status\" data-state=\"failed\" class=\"error\">Stopped: ")
                    .append(Html.esc(run.failure())).append("</p></section>");
            return;
        }
        WhatIf t = run.tally();
        WhatIf.Counts all = t.all();
        b.append("<p id=\"whatif-status\" data-state=\"done\"><span id=\"whatif-compared\">").append(all.joints())
                .append("</span> joints compared: <strong><span id=\"whatif-changed-count\">")
                .append(all.goToNoGo() + all.noGoToGo()).append("</span> would change verdict</strong> (<span ")
                .append("id=\"whatif-go-to-nogo\">").append(all.goToNoGo()).append("</span> GO→NO_GO, <span ")
                .append("id=\"whatif-nogo-to-go\">").append(all.noGoToGo()).append("</span> NO_GO→GO), <span ")
                .append("id=\"whatif-other-reasons\">").append(all.otherReasons())
                .append("</span> keep their verdict with other reasons.</p><p class=\"note\">")
                .append(run.total()).append(" stored traces; ").append(run.otherPrograms())
                .append(" of other programs left out; ").append(run.withoutResult())
                .append(" compared with the verdict in their header (no joint kept for them)");
        if (run.refused() > 0) {
            b.append("; ").append(run.refused()).append(" refused (unreadable), the first: ")
                    .append(Html.esc(run.firstRefusal()));
        }
        b.append(".</p>");
        b.append("<table id=\"whatif-by-reason\"><thead><tr><th>reason</th><th>joints gaining it</th>")
                .append("<th>joints losing it</th></tr></thead><tbody>");
        t.byReason().forEach((r, n) -> b.append("<tr><td>").append(Html.esc(r)).append("</td><td class=\"num\">")
                .append(n[0]).append("</td><td class=\"num\">").append(n[1]).append("</td></tr>"));
        b.append("</tbody></table><table id=\"whatif-by-position\"><thead><tr><th>program</th><th>position</th>")
                .append("<th>joints</th><th>GO→NO_GO</th><th>NO_GO→GO</th><th>other reasons</th></tr></thead><tbody>");
        String prefix = ask.program().id() + " ";
        t.byPosition().forEach((k, c) -> b.append("<tr><td>").append(Html.esc(ask.program().id())).append("</td><td>")
                .append(Html.esc(k.startsWith(prefix) ? k.substring(prefix.length()) : k)).append("</td><td class=\"num\">")
                .append(c.joints()).append("</td><td class=\"num\">").append(c.goToNoGo())
                .append("</td><td class=\"num\">").append(c.noGoToGo()).append("</td><td class=\"num\">")
                .append(c.otherReasons()).append("</td></tr>"));
        b.append("</tbody></table>");
        List<WhatIfRun.Changed> changed = run.changed();
        b.append("<h3>Joints that would change</h3>");
        if (changed.size() >= WhatIfRun.MAX_LISTED) {
            b.append("<p class=\"note\">The first ").append(WhatIfRun.MAX_LISTED).append(" listed.</p>");
        }
        b.append("<table id=\"whatif-changed\" class=\"joints\"><thead><tr><th>trace</th><th>part</th><th>position</th>")
                .append("<th>pass</th><th>stored</th><th>new</th><th>new final N·m</th><th>change</th></tr></thead><tbody>");
        for (int i = 0; i < changed.size(); i++) {
            WhatIfRun.Changed c = changed.get(i);
            b.append("<tr class=\"").append("GO".equals(c.newVerdict()) ? "go" : "nogo").append("\"><td><a class=\"")
                    .append("whatif-joint\" href=\"/whatif/joint?n=").append(i).append("\">")
                    .append(Html.esc(c.trace().getFileName().toString())).append("</a></td><td>")
                    .append(Html.esc(c.part())).append("</td><td>").append(Html.esc(c.position())).append("</td><td>")
                    .append(Html.esc(c.pass())).append("</td><td>").append(Html.esc(verdict(c.storedVerdict(),
                            c.storedReasons()))).append("</td><td class=\"verdict\">")
                    .append(Html.esc(verdict(c.newVerdict(), c.newReasons()))).append("</td><td class=\"num\">")
                    .append(Html.num(c.newFinalNm(), 2)).append("</td><td>").append(Html.esc(c.change()))
                    .append("</td></tr>");
        }
        b.append("</tbody></table></section>");
    }

    private static String verdict(String verdict, List<String> reasons) {
        if (reasons == null) {
            return verdict + " (trace header)";
        }
        return reasons.isEmpty() ? verdict : verdict + " " + String.join(" ", reasons);
    }

    // ---- one changed joint -----------------------------------------------------------------------

    Pages.Reply joint(String n) {
        WhatIfRun run = last.get();
        int k;
        try {
            k = Integer.parseInt(n);
        } catch (NumberFormatException e) {
            k = -1;
        }
        if (run == null || !run.finished() || run.failure() != null || k < 0 || k >= run.changed().size()) {
            return new Pages.Reply(404, pages.head("What-if joint") + "<p class=\"error\">No such joint in the last"
                    + " what-if. <a href=\"/whatif\">back</a></p>" + Pages.foot());
        }
        WhatIfRun.Changed c = run.changed().get(k);
        JointProgram changedProgram = run.ask().program();
        JointProgram stored = c.storedProgram() != null ? c.storedProgram() : inUse(changedProgram.id());
        StringBuilder b = new StringBuilder(pages.head("What-if joint " + c.trace().getFileName()));
        b.append("<h2 class=\"").append("GO".equals(c.newVerdict()) ? "go" : "nogo").append("\">")
                .append(Html.esc(verdict(c.storedVerdict(), c.storedReasons()))).append(" → ")
                .append(Html.esc(verdict(c.newVerdict(), c.newReasons()))).append("</h2>");
        if (!traceLoads.tryAcquire()) {
            return new Pages.Reply(503, b.append("<p class=\"error\">Another trace is being drawn: reload in a moment.</p>")
                    .append(Pages.foot()).toString());
        }
        try {
            if (Files.size(c.trace()) > Pages.MAX_TRACE_BYTES) {
                return new Pages.Reply(200, b.append("<p>The stored trace is larger than the view draws (use"
                        + " <code>hammerstep plot</code>).</p>").append(Pages.foot()).toString());
            }
            StoredTrace.Loaded trace = StoredTrace.load(c.trace());
            JointResult again = judge(c, trace, changedProgram);
            JointResult before = stored == null ? null : judge(c, trace, stored);
            JointResult drawn = again != null ? again : before;
            if (drawn == null) {
                b.append("<p>No rundown found in the trace under either program.</p>");
            } else {
                b.append("<figure id=\"whatif-trace\">").append(TraceSvg.compare(drawn, trace, stored, changedProgram))
                        .append("<figcaption>The trace judged with the changed program (its blows marked); the stored")
                        .append(" program's window shaded")
                        .append(stored == null ? " (not known here: not drawn)" : " (" + window(stored) + ")")
                        .append(", the changed program's window in blue dashes (").append(window(changedProgram))
                        .append(").</figcaption></figure>");
            }
        } catch (java.io.IOException | TraceException e) {
            b.append("<p class=\"error\">The stored trace could not be read: ").append(Html.esc(e.getMessage()))
                    .append("</p>");
        } finally {
            traceLoads.release();
        }
        b.append("<table class=\"fields\">");
        row(b, "trace", c.trace().toString());
        row(b, "part", c.part());
        row(b, "position", c.position());
        row(b, "pass", c.pass());
        row(b, "stored program", stored == null ? "-" : stored.id() + " rev " + stored.revision());
        row(b, "changed program", changedProgram.id() + " rev " + changedProgram.revision() + " ("
                + run.ask().programName() + ")");
        row(b, "new final torque", Html.num(c.newFinalNm(), 2) + " N·m, " + c.newBlows() + " blows");
        b.append("</table><p><a href=\"/whatif\">back to the what-if</a></p>");
        return new Pages.Reply(200, b.append(Pages.foot()).toString());
    }

    private static String window(JointProgram p) {
        return Html.num(p.torque().minNm(), 1) + " to " + Html.num(p.torque().maxNm(), 1) + " N·m, " + p.blows().min()
                + " to " + p.blows().max() + " blows";
    }

    private static void row(StringBuilder b, String name, String value) {
        b.append("<tr><th>").append(Html.esc(name)).append("</th><td>").append(Html.esc(value)).append("</td></tr>");
    }

    private static JointResult judge(WhatIfRun.Changed c, StoredTrace.Loaded trace, JointProgram program)
            throws TraceException {
        List<JointResult> rundowns = new ArrayList<>();
        JointEvents collect = rundowns::add;
        StationReplay.whatIf(c.trace(), trace, program, UnaryOperator.identity(), 4096, collect, w -> { });
        return WhatIfRun.theJoint(rundowns);
    }

    /** The station's program in use with this id, or null. */
    private JointProgram inUse(String id) {
        for (Pattern p : station.patterns().values()) {
            for (Pattern.Pass pass : p.passes()) {
                if (pass.program().id().equals(id)) {
                    return pass.program();
                }
            }
        }
        return null;
    }
}
