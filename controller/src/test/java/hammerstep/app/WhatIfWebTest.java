package hammerstep.app;

import hammerstep.joint.Direction;
import hammerstep.joint.JointProgram;
import hammerstep.joint.JointResult;
import hammerstep.joint.ProgramFile;
import hammerstep.joint.Reason;
import hammerstep.joint.Verdict;
import hammerstep.results.JointOutcome;
import hammerstep.results.ResultSink;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.SyntheticRundown;
import hammerstep.trace.TraceStore;
import hammerstep.web.Accounts;
import hammerstep.web.LiveBoard;
import hammerstep.web.ResultLog;
import hammerstep.web.Role;
import hammerstep.web.WebSettings;
import hammerstep.web.WebStation;
import hammerstep.web.WebView;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Base64;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * The web view's what-if against {@code replay --compare} on the same stored traces and the same
 * stored joints: the counts must be the same. The stored program is {@code good.yaml} (torque
 * 180..230 N·m); the changed copy widens the bottom to 165 and lowers the top to 220 N·m, so a joint
 * of 225 N·m turns NO_GO and one of 170 N·m turns GO (invented joints, as in ArchiveReplayTest).
 */
class WhatIfWebTest {

    private static final String CHANGED = """
            id: hub-final
            torque: { min: 165.0, target: 200.0, max: 220.0 }
            blows: { count_above: 40.0, min: 4, max: 30 }
            rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 5000 }
            shutoff_at: 205.0
            rehit_blows: 2
            """;

    @TempDir
    Path dir;

    private final HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
    private final LiveBoard board = new LiveBoard(20_000, new ResultLog(100));
    private final List<String> names = new ArrayList<>();
    private final List<String> results = new ArrayList<>();
    private Path archive;
    private JointProgram stored;
    private WebView view;

    @AfterEach
    void stop() {
        if (view != null) {
            view.close();
        }
    }

    private void store(TraceStore store, String part, String position, String program, double lastPeakNm,
                       String verdict) throws Exception {
        float[] x = SyntheticRundown.samples(8, Math.min(130, lastPeakNm - 30), lastPeakNm, 55);
        Map<String, String> meta = new LinkedHashMap<>();
        meta.put("part_serial", part);
        meta.put("position", position);
        meta.put("pass", "final");
        meta.put("attempt", "1");
        meta.put("program", program);
        meta.put("program_revision", "0123456789ab");
        meta.put("verdict", verdict);
        Path p = store.save(part + "_" + position + "_final_1", meta, x, x.length, SyntheticRundown.RATE_HZ, 5_000_000_000L);
        names.add(p.getFileName().toString());
    }

    /** A joint as the station stored it: in the view's log and in the results file replay --compare reads. */
    private void joint(String id, long seq, String part, String position, double finalNm, List<Reason> reasons,
                       String trace) {
        String path = trace == null ? null : "/var/lib/hammerstep/traces/" + trace;
        JointResult r = new JointResult(stored, 0, 1, 8, new double[] {finalNm}, new long[] {0}, new double[1],
                new double[1], finalNm, 400, Long.MIN_VALUE, 0, 0, reasons.isEmpty() ? Verdict.GO : Verdict.NO_GO,
                reasons, Direction.TIGHTEN);
        board.onJoint(new JointOutcome(part, "hub-5", "hub-5", position, 1, "final", 1, r, "TQ-1", null,
                Instant.parse("2026-03-04T05:06:07Z"), path), new ResultSink.Receipt(id, seq));
        results.add("{\"schema\":\"hammerstep.joint.v1\",\"id\":\"" + id + "\",\"seq\":" + seq
                + ",\"part_serial\":\"" + part + "\",\"position\":\"" + position + "\",\"pass\":\"final\",\"attempt\":1,"
                + "\"program\":\"hub-final\",\"blows\":8,\"final_torque_nm\":" + finalNm + ",\"verdict\":\""
                + (reasons.isEmpty() ? "GO" : "NO_GO") + "\",\"reasons\":["
                + String.join(",", reasons.stream().map(x -> "\"" + x.name() + "\"").toList()) + "]"
                + (path == null ? "" : ",\"trace\":\"" + path + "\"") + "}");
    }

    @BeforeEach
    void archive() throws Exception {
        stored = ProgramFile.load(Path.of("src/test/resources/programs/good.yaml"));
        archive = dir.resolve("traces");
        TraceStore monday = new TraceStore(archive.resolve("monday"), 100, 1 << 30, StoredTrace.Encoding.FLOAT32);
        store(monday, "WH-1", "1", "hub-final", 200, "GO");
        store(monday, "WH-1", "2", "hub-final", 225, "GO");
        store(monday, "WH-1", "3", "hub-final", 170, "NO_GO");
        TraceStore tuesday = new TraceStore(archive.resolve("tuesday"), 100, 1 << 30, StoredTrace.Encoding.FLOAT32);
        store(tuesday, "WH-2", "1", "hub-final", 240, "NO_GO");
        store(tuesday, "WH-2", "2", "hub-final", 210, "GO");
        store(tuesday, "WH-2", "snug", "hub-snug", 60, "GO");
        joint("j1", 1, "WH-1", "1", 200.0, List.of(), names.get(0));
        joint("j2", 2, "WH-1", "2", 225.0, List.of(), names.get(1));
        joint("j3", 3, "WH-1", "3", 170.0, List.of(Reason.TORQUE_LOW), names.get(2));
        joint("j4", 4, "WH-2", "1", 240.0, List.of(Reason.TORQUE_HIGH), null); // matched by part, position, pass
    }

    private WebView start(Role role) throws Exception {
        Path users = dir.resolve("web.users");
        Files.write(users, List.of(Accounts.line("eng", Role.ENGINEER, "pw-e".toCharArray()),
                Accounts.line("viewer", Role.VIEWER, "pw-v".toCharArray())));
        Files.setPosixFilePermissions(users, PosixFilePermissions.fromString("rw-------"));
        view = WebView.start(new WebSettings("127.0.0.1", 0, users), board, "plant/line/st-1",
                new WebStation(archive, Map.of(), null));
        return view;
    }

    static String basic(String user, String password) {
        return "Basic " + Base64.getEncoder().encodeToString((user + ":" + password).getBytes(StandardCharsets.UTF_8));
    }

    private HttpResponse<String> get(String path, String user, String password) throws Exception {
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + view.port() + path))
                .header("Authorization", basic(user, password)).timeout(Duration.ofSeconds(20)).build(),
                HttpResponse.BodyHandlers.ofString());
    }

    /** The what-if form as a browser sends it (multipart), with the page's own token. */
    private HttpResponse<String> post(String user, String password, String program, String fileName,
                                      Map<String, String> fields) throws Exception {
        String boundary = "----hammerstep" + System.nanoTime();
        StringBuilder b = new StringBuilder();
        Map<String, String> all = new LinkedHashMap<>(fields);
        all.putIfAbsent("csrf", token(user, password));
        all.forEach((k, v) -> b.append("--").append(boundary).append("\r\nContent-Disposition: form-data; name=\"")
                .append(k).append("\"\r\n\r\n").append(v).append("\r\n"));
        b.append("--").append(boundary).append("\r\nContent-Disposition: form-data; name=\"file\"; filename=\"")
                .append(fileName).append("\"\r\nContent-Type: application/x-yaml\r\n\r\n").append(program).append("\r\n");
        b.append("--").append(boundary).append("\r\nContent-Disposition: form-data; name=\"program\"\r\n\r\n\r\n");
        b.append("--").append(boundary).append("--\r\n");
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + view.port() + "/whatif"))
                .header("Authorization", basic(user, password))
                .header("Content-Type", "multipart/form-data; boundary=" + boundary)
                .POST(HttpRequest.BodyPublishers.ofString(b.toString())).timeout(Duration.ofSeconds(20)).build(),
                HttpResponse.BodyHandlers.ofString());
    }

    /** The token the what-if page hands this account (empty when the page has none). */
    private String token(String user, String password) throws Exception {
        Matcher m = Pattern.compile("name=\"csrf\" value=\"([^\"]*)\"").matcher(get("/whatif", user, password).body());
        return m.find() ? m.group(1) : "";
    }

    private static String count(String html, String id) {
        Matcher m = Pattern.compile("id=\"" + id + "\">([0-9]+)<").matcher(html);
        assertThat(m.find()).as(id + " in the page").isTrue();
        return m.group(1);
    }

    @Test
    void theWebWhatIfCountsAsReplayCompareDoesOnTheSameTracesAndJoints() throws Exception {
        start(Role.ENGINEER);
        HttpResponse<String> started = post("eng", "pw-e", CHANGED, "hub-final-wider.yaml", Map.of());
        assertThat(started.statusCode()).as(started.body()).isEqualTo(303);
        view.awaitWhatIf(Duration.ofSeconds(60));
        String page = get("/whatif", "eng", "pw-e").body();
        assertThat(page).contains("data-state=\"done\"");

        Path changed = Files.writeString(dir.resolve("changed.yaml"), CHANGED);
        Path resultsFile = Files.write(dir.resolve("results.jsonl"), results);
        Captured c = Captured.run("replay", archive.toString(), "--program", changed.toString(), "--compare",
                resultsFile.toString(), "--summary");
        assertThat(c.exit()).as(c.err()).isZero();
        Matcher m = Pattern.compile("(\\d+) joints compared: (\\d+) would change verdict \\((\\d+) GO->NO_GO, (\\d+)"
                + " NO_GO->GO\\), (\\d+) keep their verdict with other reasons").matcher(c.out());
        assertThat(m.find()).as(c.out()).isTrue();

        assertThat(count(page, "whatif-compared")).isEqualTo(m.group(1)).isEqualTo("5");
        assertThat(count(page, "whatif-changed-count")).isEqualTo(m.group(2)).isEqualTo("2");
        assertThat(count(page, "whatif-go-to-nogo")).isEqualTo(m.group(3));
        assertThat(count(page, "whatif-nogo-to-go")).isEqualTo(m.group(4));
        assertThat(count(page, "whatif-other-reasons")).isEqualTo(m.group(5));
        // by reason and by position, as replay's summary has them
        assertThat(c.out()).containsPattern("TORQUE_HIGH +1 +0").containsPattern("TORQUE_LOW +0 +1");
        assertThat(page).contains("<tr><td>TORQUE_HIGH</td><td class=\"num\">1</td><td class=\"num\">0</td></tr>")
                .contains("<tr><td>TORQUE_LOW</td><td class=\"num\">0</td><td class=\"num\">1</td></tr>")
                .contains("<tr><td>hub-final</td><td>2</td><td class=\"num\">2</td><td class=\"num\">1</td>"
                        + "<td class=\"num\">0</td>");
        // a changed joint opens with both windows: the stored one shaded, the changed one dashed
        assertThat(page).contains("class=\"whatif-joint\" href=\"/whatif/joint?n=0\"");
        HttpResponse<String> joint = get("/whatif/joint?n=0", "eng", "pw-e");
        assertThat(joint.statusCode()).isEqualTo(200);
        assertThat(joint.body()).contains("id=\"whatif-trace\"").contains("class=\"window\"")
                .contains("new max 220.0").contains("max 230.0").contains("class=\"curve\"");
    }

    @Test
    void aProgramWithProblemsIsRefusedWithCheckLinesAndNothingRuns() throws Exception {
        start(Role.ENGINEER);
        String broken = CHANGED.replace("max: 220.0", "max: 150.0");
        HttpResponse<String> r = post("eng", "pw-e", broken, "hub-final-tight.yaml", Map.of());
        assertThat(r.statusCode()).isEqualTo(400);

        Path file = Files.writeString(dir.resolve("hub-final-tight.yaml"), broken);
        java.io.PrintStream savedErr = System.err;
        java.io.ByteArrayOutputStream errBytes = new java.io.ByteArrayOutputStream();
        Captured c;
        try (java.io.PrintStream capture = new java.io.PrintStream(errBytes, true, StandardCharsets.UTF_8)) {
            System.setErr(capture);
            c = Captured.run("check", file.toString()); // check prints its problems on standard error
        } finally {
            System.setErr(savedErr);
        }
        assertThat(c.exit()).isEqualTo(2);
        List<String> lines = new ArrayList<>();
        Matcher m = Pattern.compile("<li><code>([^<]*)</code></li>").matcher(r.body());
        while (m.find()) {
            lines.add(m.group(1).replace("&#39;", "'").replace("&quot;", "\""));
        }
        // the same lines as check prints, the file named as the engineer's file was named
        String checkLines = errBytes.toString(StandardCharsets.UTF_8);
        assertThat(lines).isNotEmpty();
        for (String line : lines) {
            assertThat(line).startsWith("hub-final-tight.yaml:");
            assertThat(checkLines).contains(file.toString() + line.substring("hub-final-tight.yaml".length()));
        }
        assertThat(lines).hasSize((int) checkLines.lines().filter(l -> !l.isBlank()).count());
        assertThat(get("/whatif", "eng", "pw-e").body()).doesNotContain("whatif-result");
    }

    @Test
    void aFormWithoutItsTokenOrFromAnotherSiteIsRefusedAndAViewerGetsNoWhatIf() throws Exception {
        start(Role.ENGINEER);
        String page = get("/whatif", "eng", "pw-e").body();
        assertThat(page).contains("<input type=\"hidden\" id=\"csrf\" name=\"csrf\" value=\"");
        String token = token("eng", "pw-e");
        assertThat(token).hasSizeGreaterThan(20);

        HttpResponse<String> none = post("eng", "pw-e", CHANGED, "a.yaml", Map.of("csrf", ""));
        assertThat(none.statusCode()).isEqualTo(403);
        assertThat(none.body()).contains("token");
        assertThat(post("eng", "pw-e", CHANGED, "a.yaml", Map.of("csrf", token.substring(1) + "x")).statusCode())
                .isEqualTo(403);
        HttpResponse<String> elsewhere = postFrom("https://evil.example", token);
        assertThat(elsewhere.statusCode()).isEqualTo(403);
        assertThat(elsewhere.body()).contains("another site");
        assertThat(get("/whatif", "eng", "pw-e").body()).as("nothing was started").doesNotContain("whatif-result");

        assertThat(postFrom("http://127.0.0.1:" + view.port(), token).statusCode()).isEqualTo(303);
        view.awaitWhatIf(Duration.ofSeconds(60));

        // a viewer: neither the page nor the form, even with a token of its own
        HttpResponse<String> viewerPage = get("/whatif", "viewer", "pw-v");
        assertThat(viewerPage.statusCode()).isEqualTo(403);
        assertThat(viewerPage.body()).contains("engineer");
        assertThat(post("viewer", "pw-v", CHANGED, "a.yaml", Map.of("csrf", token)).statusCode()).isEqualTo(403);
        assertThat(get("/whatif/joint?n=0", "viewer", "pw-v").statusCode()).isEqualTo(403);
        assertThat(get("/results", "viewer", "pw-v").statusCode()).isEqualTo(200);
    }

    private HttpResponse<String> postFrom(String origin, String token) throws Exception {
        String body = "csrf=" + java.net.URLEncoder.encode(token, StandardCharsets.UTF_8) + "&program="
                + java.net.URLEncoder.encode(CHANGED, StandardCharsets.UTF_8);
        return http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + view.port() + "/whatif"))
                .header("Authorization", basic("eng", "pw-e")).header("Origin", origin)
                .header("Content-Type", "application/x-www-form-urlencoded")
                .POST(HttpRequest.BodyPublishers.ofString(body)).timeout(Duration.ofSeconds(20)).build(),
                HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void anOversizedFormIsRefusedAsTooLarge() throws Exception {
        start(Role.ENGINEER);
        String big = "#" + "x".repeat(300 * 1024) + "\n" + CHANGED;
        assertThat(post("eng", "pw-e", big, "big.yaml", Map.of()).statusCode()).isEqualTo(413);
        assertThat(get("/whatif", "eng", "pw-e").body()).doesNotContain("whatif-result");
    }
}
