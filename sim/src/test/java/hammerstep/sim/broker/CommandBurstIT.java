package hammerstep.sim.broker;

import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.paho.QualityClient;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.TimeUnit;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

/**
 * 20 000 commands on loopback against Mosquitto, from four {@code mosquitto_pub -l} processes at
 * once (no waiting per message): status requests, valid parts, malformed parts and unknown commands.
 * Every command the station received is answered (OK, a refusal, or BUSY) or, beyond the answer
 * queue's bound, dropped and counted; the quality system's count of answers equals the station's.
 * Prints the figures. Skipped when mosquitto or mosquitto_pub is missing.
 */
class CommandBurstIT {

    private static final Duration WAIT = Duration.ofSeconds(180);
    private static final int PER_KIND = 5000;
    private static final String PREFIX = "hammerstep/v1/plant-north/axle-2/hub-fit-1/";
    private static final String REPLIES = "qs/replies/qs/hub-fit-1";

    @TempDir
    Path dir;

    @BeforeEach
    void needsMosquitto() {
        assumeTrue(Mosquitto.binary() != null, "mosquitto is not installed");
        assumeTrue(Files.isExecutable(Path.of("/usr/bin/mosquitto_pub")), "mosquitto_pub is not installed");
    }

    @Test
    void everyCommandOfABurstIsAnsweredOrDroppedAndCounted() throws Exception {
        Received got = new Received();
        // the broker must not drop commands for the station itself: a queue as long as the burst
        try (Mosquitto broker = new Mosquitto(dir.resolve("broker"), "max_queued_messages 100000\n", false)) {
            broker.start();
            hammerstep.mqtt.RecordingStation commands = new hammerstep.mqtt.RecordingStation();
            try (QualityClient qs = QualityClient.connect(broker.url(), "qs", got::add);
                 StationHarness station = new StationHarness(broker.url(), dir.resolve("state"), commands)) {
                qs.subscribe(REPLIES);
                Received.await("station connected", WAIT, () -> station.publisher.figures().connected());
                long t0 = System.nanoTime();
                List<Process> senders = new ArrayList<>();
                senders.add(send(broker, "cmd/status", "{}", false));
                senders.add(send(broker, "cmd/part", "{\"serial\":\"WH-1\",\"model\":\"hub-5\"}", true));
                senders.add(send(broker, "cmd/part", "{\"serial\":", true));
                senders.add(send(broker, "cmd/launch", "{}", true));
                for (Process p : senders) {
                    assertThat(p.waitFor(WAIT.toSeconds(), TimeUnit.SECONDS)).isTrue();
                    assertThat(p.exitValue()).as(new String(p.getInputStream().readAllBytes())).isZero();
                }
                long sentNs = System.nanoTime() - t0;
                int sent = 4 * PER_KIND;
                Received.await("every command received and every answer sent", WAIT, () -> {
                    ResultPublisher.CommandFigures f = station.publisher.commandFigures();
                    return f.received() == sent && f.waiting() == 0 && got.all.size() == f.answered();
                });
                long doneNs = System.nanoTime() - t0;
                ResultPublisher.CommandFigures f = station.publisher.commandFigures();
                Map<String, Integer> codes = new TreeMap<>();
                for (Received.Message m : got.all) {
                    codes.merge(m.json().get("code").asText(), 1, Integer::sum);
                }
                System.out.printf("command burst: sent %d in %.1f s; received %d; answered %d (%s); BUSY %d; "
                                + "dropped and counted %d; all answered after %.1f s%n", sent, sentNs / 1e9,
                        f.received(), f.answered(), codes, f.busy(), f.dropped(), doneNs / 1e9);
                assertThat(f.received()).isEqualTo(sent);
                assertThat(got.all).hasSize((int) f.answered());
                assertThat(f.answered() + f.dropped()).as("each command answered, or dropped and counted")
                        .isEqualTo(sent);
                assertThat(codes.getOrDefault("BUSY", 0)).isEqualTo((int) f.busy());
                assertThat(codes.getOrDefault("MALFORMED", 0) + codes.getOrDefault("UNKNOWN_COMMAND", 0)
                        + codes.getOrDefault("BUSY", 0) + codes.getOrDefault("OK", 0) + f.dropped()).isEqualTo(sent);
                assertThat(commands.started).hasSize(codes.getOrDefault("OK", 0) - count(got, "status"));
                for (Received.Message m : got.all) {
                    assertThat(m.topic()).isEqualTo(REPLIES);
                }
            }
        }
    }

    private static int count(Received got, String command) {
        int n = 0;
        for (Received.Message m : got.all) {
            if (m.json().get("command").asText().equals(command) && m.json().get("code").asText().equals("OK")) {
                n++;
            }
        }
        return n;
    }

    /** One mosquitto_pub sending {@link #PER_KIND} lines as fast as the broker takes them, at QoS 1. */
    private Process send(Mosquitto broker, String command, String payload, boolean expiry) throws IOException {
        Path lines = dir.resolve(command.replace('/', '-') + payload.length() + ".txt");
        Files.writeString(lines, (payload + "\n").repeat(PER_KIND), StandardCharsets.UTF_8);
        List<String> cmd = new ArrayList<>(List.of("/usr/bin/mosquitto_pub", "-V", "mqttv5", "-h", "127.0.0.1",
                "-p", String.valueOf(broker.port()), "-q", "1", "-t", PREFIX + command, "-l",
                "-D", "publish", "response-topic", REPLIES));
        if (expiry) {
            cmd.addAll(List.of("-D", "publish", "message-expiry-interval", "60"));
        }
        return new ProcessBuilder(cmd).redirectErrorStream(true).redirectInput(lines.toFile()).start();
    }
}
