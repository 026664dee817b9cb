package hammerstep.web;

import hammerstep.joint.Reason;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.BufferedReader;
import java.io.InputStream;
import java.io.InputStreamReader;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.time.Duration;
import java.util.Base64;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The server on a free loopback port: access, pages, the event stream. */
class WebViewTest {

    @TempDir
    Path dir;

    private final HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
    private final LiveBoard board = new LiveBoard(20_000, new ResultLog(100));
    private WebView view;

    @AfterEach
    void stop() {
        if (view != null) {
            view.close();
        }
    }

    private WebView open() throws Exception {
        Joints.add(board.log(), "id-1", 1, Joints.joint(Joints.FLANGE, "P-1", "D1", "final", 210, 8, List.of(), 0));
        Joints.add(board.log(), "id-2", 2, Joints.joint(Joints.FLANGE, "P-1", "D2", "final", 170, 8,
                List.of(Reason.TORQUE_LOW), 1));
        view = WebView.start(new WebSettings("127.0.0.1", 0, null), board, "plant/line/st-1");
        return view;
    }

    private HttpResponse<String> get(String path, String... headers) throws Exception {
        HttpRequest.Builder b = HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + view.port() + path))
                .timeout(Duration.ofSeconds(10));
        for (int i = 0; i < headers.length; i += 2) {
            b.header(headers[i], headers[i + 1]);
        }
        return http.send(b.build(), HttpResponse.BodyHandlers.ofString());
    }

    @Test
    void servesEveryPageFromTheJarWithItsProtectingHeaders() throws Exception {
        open();
        HttpResponse<String> live = get("/");
        assertThat(live.statusCode()).isEqualTo(200);
        assertThat(live.body()).contains("plant/line/st-1").contains("no login asked").doesNotContain("{{");
        assertThat(live.headers().firstValue("Content-Security-Policy").orElse("")).contains("default-src 'self'");
        assertThat(live.headers().firstValue("X-Frame-Options")).hasValue("DENY");
        assertThat(get("/live.js").body()).contains("EventSource");
        assertThat(get("/style.css").statusCode()).isEqualTo(200);
        assertThat(get("/nothing").statusCode()).isEqualTo(404);
    }

    @Test
    void resultsFilterAndAJointOpensWithItsPicture() throws Exception {
        open();
        String all = get("/results").body();
        assertThat(all).contains("2 joints match").contains("/joint?id=id-1").contains("/joint?id=id-2");
        String low = get("/results?reason=TORQUE_LOW").body();
        assertThat(low).contains("1 joints match").contains("/joint?id=id-2").doesNotContain("/joint?id=id-1\"");
        assertThat(get("/results?verdict=MAYBE").statusCode()).isEqualTo(400);
        String joint = get("/joint?id=id-2").body();
        assertThat(joint).contains("NO_GO").contains("TORQUE_LOW").contains("<svg").contains("class=\"peak\"")
                .contains("shut-off 205.0").contains("no trace stored");
        assertThat(get("/joint?id=nope").statusCode()).isEqualTo(404);
        assertThat(get("/part?serial=P-1").body()).contains("class=\"pos go\"").contains("class=\"pos nogo\"");
        assertThat(get("/capability").body()).contains("flange-final").contains("FEW_JOINTS");
        HttpResponse<String> csv = get("/results.csv?verdict=GO");
        assertThat(csv.headers().firstValue("Content-Type").orElse("")).startsWith("text/csv");
        assertThat(csv.body().split("\r\n")).hasSize(2);
    }

    @Test
    void theViewIsReadOnly() throws Exception {
        open();
        HttpResponse<String> post = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + view.port()
                + "/results")).POST(HttpRequest.BodyPublishers.ofString("x=1")).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(post.statusCode()).isEqualTo(405);
    }

    @Test
    void anOpenViewAnswersOnlyToTheLoopbacksName() throws Exception {
        open();
        // a page elsewhere that rebinds its own name to 127.0.0.1 still sends its own name as Host
        assertThat(statusWithHost("station.attacker.example")).startsWith("HTTP/1.1 421");
        assertThat(statusWithHost("localhost:" + view.port())).startsWith("HTTP/1.1 200");
        assertThat(WebView.loopbackHost("[::1]:8080")).isTrue();
        assertThat(WebView.loopbackHost("127.0.0.1.attacker.example")).isFalse();
    }

    @Test
    void withAccountsEveryPageNeedsARightPassword() throws Exception {
        Path users = dir.resolve("web.users");
        Files.write(users, List.of(Accounts.line("ana", Role.ENGINEER, "pw-ana".toCharArray(), new byte[16], 10_000)));
        Files.setPosixFilePermissions(users, PosixFilePermissions.fromString("rw-------"));
        view = WebView.start(new WebSettings("127.0.0.1", 0, users), board, "st-1");
        assertThat(view.open()).isFalse();
        HttpResponse<String> none = get("/results");
        assertThat(none.statusCode()).isEqualTo(401);
        assertThat(none.headers().firstValue("WWW-Authenticate").orElse("")).startsWith("Basic");
        assertThat(get("/results", "Authorization", basic("ana", "wrong")).statusCode()).isEqualTo(401);
        assertThat(get("/results", "Authorization", basic("bob", "pw-ana")).statusCode()).isEqualTo(401);
        HttpResponse<String> ok = get("/results", "Authorization", basic("ana", "pw-ana"));
        assertThat(ok.statusCode()).isEqualTo(200);
        assertThat(ok.body()).doesNotContain("no login asked");
    }

    @Test
    void theLivePageGetsTheStationPushedAsEvents() throws Exception {
        open();
        HttpResponse<InputStream> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + view.port()
                + "/events")).build(), HttpResponse.BodyHandlers.ofInputStream());
        assertThat(r.headers().firstValue("Content-Type").orElse("")).startsWith("text/event-stream");
        try (BufferedReader in = new BufferedReader(new InputStreamReader(r.body(), StandardCharsets.UTF_8))) {
            StringBuilder seen = new StringBuilder();
            String line;
            while ((line = in.readLine()) != null && !seen.toString().contains("event: events")) {
                seen.append(line).append('\n');
            }
            assertThat(seen.toString()).contains("event: state\ndata: {\"version\":0,\"phase\":\"WAITING\"")
                    .contains("event: trail").contains("event: joints\ndata: [{\"id\":\"id-2\"");
        }
        assertThat(view.livePages()).isEqualTo(1);
    }

    /** The status line of a GET / sent with the given Host header (the JDK's client will not set one). */
    private String statusWithHost(String host) throws Exception {
        try (java.net.Socket socket = new java.net.Socket("127.0.0.1", view.port())) {
            socket.setSoTimeout(10_000);
            socket.getOutputStream().write(("GET / HTTP/1.1\r\nHost: " + host + "\r\nConnection: close\r\n\r\n")
                    .getBytes(StandardCharsets.US_ASCII));
            return new BufferedReader(new InputStreamReader(socket.getInputStream(), StandardCharsets.US_ASCII)).readLine();
        }
    }

    private static String basic(String user, String pw) {
        return "Basic " + Base64.getEncoder().encodeToString((user + ":" + pw).getBytes(StandardCharsets.UTF_8));
    }
}
