package hammerstep.web;

import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.AbstractExecutorService;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;

/** The what-if's single worker: one what-if at a time, a second refused with a clear message. */
class WhatIfPagesTest {

    private static final String PROGRAM = """
            id: flange-final
            torque: { min: 175.0, target: 200.0, max: 225.0 }
            blows: { count_above: 40.0, min: 4, max: 30 }
            rundown: { start_above: 10.0, end_after_ms: 200, max_ms: 5000 }
            """;

    /** A worker that takes tasks and runs them only when told: the first what-if stays under way. */
    private static final class HeldWorker extends AbstractExecutorService {
        final List<Runnable> held = new ArrayList<>();

        @Override
        public void execute(Runnable r) {
            held.add(r);
        }

        @Override
        public void shutdown() {
        }

        @Override
        public List<Runnable> shutdownNow() {
            return held;
        }

        @Override
        public boolean isShutdown() {
            return false;
        }

        @Override
        public boolean isTerminated() {
            return false;
        }

        @Override
        public boolean awaitTermination(long timeout, TimeUnit unit) {
            return true;
        }
    }

    private static Map<String, FormBody.Field> form(String program) {
        return Map.of("program", new FormBody.Field(null, program.getBytes(StandardCharsets.UTF_8)));
    }

    @Test
    void aSecondWhatIfWhileOneRunsIsRefusedAndTakenOnceTheFirstHasEnded() {
        LiveBoard board = new LiveBoard(20_000, new ResultLog(10));
        HeldWorker worker = new HeldWorker();
        WhatIfPages pages = new WhatIfPages(new Pages(board, "st", false), board, WebStation.none(), worker);

        assertThat(pages.start(form(PROGRAM), "ana", "t").status()).isEqualTo(303);
        Pages.Reply second = pages.start(form(PROGRAM), "ben", "t");
        assertThat(second.status()).isEqualTo(409);
        assertThat(second.html()).contains("id=\"whatif-refused\"").contains("started by ana").contains("one at a time");
        assertThat(worker.held).hasSize(1);
        assertThat(pages.page("t").html()).contains("data-state=\"running\"");

        worker.held.get(0).run(); // the first ends (no traces kept: nothing compared)
        assertThat(pages.page("t").html()).contains("data-state=\"done\"").contains("id=\"whatif-compared\">0<");
        assertThat(pages.start(form(PROGRAM), "ben", "t").status()).isEqualTo(303);
        assertThat(worker.held).hasSize(2);
    }

    @Test
    void anEmptyOrBrokenProgramIsRefusedWithoutStarting() {
        LiveBoard board = new LiveBoard(20_000, new ResultLog(10));
        HeldWorker worker = new HeldWorker();
        WhatIfPages pages = new WhatIfPages(new Pages(board, "st", false), board, WebStation.none(), worker);
        assertThat(pages.start(form(""), "ana", "t").html()).contains("no program");
        Pages.Reply broken = pages.start(form("torque: [1, 2]\n"), "ana", "t");
        assertThat(broken.status()).isEqualTo(400);
        assertThat(broken.html()).contains("id=\"whatif-problems\"").contains("edited.yaml:1:");
        assertThat(worker.held).isEmpty();
    }

    @Test
    void originsOfOtherSitesAreRefusedAndTheViewsOwnTaken() {
        assertThat(WebView.sameOrigin("127.0.0.1:8088", "http://127.0.0.1:8088", null)).isTrue();
        assertThat(WebView.sameOrigin("127.0.0.1:8088", null, "http://127.0.0.1:8088/whatif")).isTrue();
        assertThat(WebView.sameOrigin("127.0.0.1:8088", null, null)).isTrue();
        assertThat(WebView.sameOrigin("127.0.0.1:8088", "http://127.0.0.1:9999", null)).isFalse();
        assertThat(WebView.sameOrigin("127.0.0.1:8088", "https://evil.example", "http://127.0.0.1:8088/")).isFalse();
        assertThat(WebView.sameOrigin("127.0.0.1:8088", "null", null)).isFalse();
        assertThat(WebView.sameOrigin("127.0.0.1:8088", null, "not a uri at all %%")).isFalse();
    }
}
