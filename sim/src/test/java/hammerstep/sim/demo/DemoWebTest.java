package hammerstep.sim.demo;

import org.junit.jupiter.api.Test;

import java.io.ByteArrayOutputStream;
import java.io.OutputStream;
import java.io.PrintStream;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicInteger;

import static org.assertj.core.api.Assertions.assertThat;

/** {@code demo --web}: the simulated station's view on loopback, served after the parts until stopped. */
class DemoWebTest {

    private static final Path STATION = Path.of("../config/demo/station.yaml");

    @Test
    void servesTheStationsResultsAfterItsPartsUntilStopped() throws Exception {
        int port;
        try (ServerSocket free = new ServerSocket(0)) {
            port = free.getLocalPort();
        }
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        CountDownLatch partsDone = new CountDownLatch(1);
        OutputStream watched = new OutputStream() {
            @Override
            public synchronized void write(int b) {
                bytes.write(b);
                if (b == '\n' && bytes.toString(StandardCharsets.UTF_8).contains("parts done")) {
                    partsDone.countDown();
                }
            }
        };
        PrintStream out = new PrintStream(watched, true, StandardCharsets.UTF_8);
        DemoRunner runner = new DemoRunner(new DemoOptions(STATION, 1, 3, true, true), out, port);
        AtomicInteger exit = new AtomicInteger(-1);
        Thread demo = new Thread(() -> {
            try {
                exit.set(runner.run());
            } catch (Exception e) {
                exit.set(99);
            }
        }, "demo");
        demo.start();
        assertThat(partsDone.await(120, TimeUnit.SECONDS)).as("the demo ran its part").isTrue();
        String printed = bytes.toString(StandardCharsets.UTF_8);
        assertThat(printed).contains("web view: http://127.0.0.1:" + port + "/ (bound to loopback: open on this"
                + " computer, no login asked)").contains("until Ctrl-C");
        assertThat(demo.isAlive()).as("still serving after its parts").isTrue();

        HttpClient http = HttpClient.newBuilder().connectTimeout(Duration.ofSeconds(5)).build();
        String results = http.send(HttpRequest.newBuilder(URI.create("http://127.0.0.1:" + port + "/results"))
                .build(), HttpResponse.BodyHandlers.ofString()).body();
        assertThat(results).contains("/joint?id=").containsPattern("[1-9][0-9]* joints match");

        runner.stopServing();
        demo.join(30_000);
        assertThat(demo.isAlive()).isFalse();
        assertThat(exit.get()).isZero();
    }
}
