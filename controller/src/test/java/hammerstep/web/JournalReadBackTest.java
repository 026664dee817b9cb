package hammerstep.web;

import hammerstep.joint.Reason;
import hammerstep.results.JointOutcome;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationId;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.sequence.Acknowledge;
import hammerstep.sequence.AfterNoGo;
import hammerstep.sequence.Pattern;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * After a restart the view shows the joints and parts the station stored before it: read back from
 * the journal once, delivered or not, beside the joints stored after the start, none twice.
 */
class JournalReadBackTest {

    @TempDir
    Path dir;

    private final HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
    private WebView view;

    @AfterEach
    void stop() {
        if (view != null) {
            view.close();
        }
    }

    private StorageSettings storage() {
        return new StorageSettings(dir.resolve("journal"), 1 << 20, 1 << 20, 1L << 30, 1000, 100);
    }

    private static final Map<String, Pattern> PATTERNS = Map.of("FL-4", new Pattern("flange-4", "r1",
            List.of("D1", "D2"), List.of(new Pattern.Pass("final", Joints.FLANGE, new int[] {0, 1}, 1,
                    Acknowledge.OPERATOR, AfterNoGo.REJECT))));

    private String get(String path) throws Exception {
        HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + view.port() + path))
                .timeout(Duration.ofSeconds(10)).build(), HttpResponse.BodyHandlers.ofString());
        assertThat(r.statusCode()).as(path).isEqualTo(200);
        return r.body();
    }

    private static int count(String html, String needle) {
        return html.split(java.util.regex.Pattern.quote(needle), -1).length - 1;
    }

    @Test
    void theJointsStoredBeforeARestartShowOnceBesideTheNewOnes() throws Exception {
        StationId station = new StationId("plant", "line", "st-1");
        List<String> ids = new java.util.ArrayList<>();
        try (FileOutbox before = FileOutbox.open(storage(), () -> Long.MAX_VALUE)) {
            OutboxResultSink sink = new OutboxResultSink(before, station);
            ids.add(sink.joint(Joints.joint(Joints.FLANGE, "P-1", "D1", "final", 210, 8, List.of(), 0)).id());
            ids.add(sink.joint(Joints.joint(Joints.FLANGE, "P-1", "D2", "final", 170, 8,
                    List.of(Reason.TORQUE_LOW), 1)).id());
            ResultSink.Receipt part = sink.part(new PartOutcome("P-1", "FL-4", "flange-4", "NO_GO", "COMPLETE", ids,
                    Joints.T0, Joints.T0.plusSeconds(90)));
            ids.add(sink.joint(Joints.joint(Joints.FLANGE, "P-2", "D1", "final", 205, 9, List.of(), 3)).id());
            // the first joints and the part were delivered before the stop: they must show all the same
            before.markDelivered(before.pending(0, 10).get(2).position());
            assertThat(part.id()).isNotEmpty();
        }

        // the station starts again: a new log, the journal read back once
        LiveBoard board = new LiveBoard(20_000, new ResultLog(100));
        try (FileOutbox after = FileOutbox.open(storage(), () -> Long.MAX_VALUE)) {
            JournalRows.Restored back = JournalRows.restore(board.log(), after, PATTERNS);
            assertThat(back).isEqualTo(new JournalRows.Restored(3, 1, 0));
            // a second read back finds nothing more: no joint twice
            assertThat(JournalRows.restore(board.log(), after, PATTERNS)).isEqualTo(new JournalRows.Restored(0, 0, 0));
            OutboxResultSink sink = new OutboxResultSink(after, station);
            JointOutcome fresh = Joints.joint(Joints.FLANGE, "P-3", "D1", "final", 212, 8, List.of(), 9);
            board.onJoint(fresh, sink.joint(fresh));
        }
        view = WebView.start(new WebSettings("127.0.0.1", 0, null), board, "plant/line/st-1");

        String results = get("/results");
        assertThat(results).contains("4 joints match");
        for (String id : ids) {
            assertThat(count(results, "/joint?id=" + id + "\"")).as(id).isEqualTo(1);
        }
        assertThat(results).contains("TORQUE_LOW").contains(">P-3<");
        String joint = get("/joint?id=" + ids.get(1));
        assertThat(joint).contains("read back from the journal").contains("170.00 N·m").contains("flange-final rev 3");
        assertThat(get("/part?serial=P-1")).contains("NO_GO").contains("COMPLETE");
        // capability counts each joint once: 4 joints of flange-final
        assertThat(get("/capability?program=flange-final")).contains("4 joints");
    }
}
