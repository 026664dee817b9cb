package hammerstep.mqtt;

import ch.qos.logback.classic.Level;
import ch.qos.logback.classic.Logger;
import ch.qos.logback.classic.spi.ILoggingEvent;
import ch.qos.logback.core.read.ListAppender;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageSchemas;
import hammerstep.results.Samples;
import hammerstep.station.FixedWallClock;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.slf4j.LoggerFactory;

import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Random;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;

import static org.assertj.core.api.Assertions.assertThat;

/**
 * Seeded fuzzing of the command side of the {@link ResultPublisher}, fed through a fake link as the
 * broker would deliver: wrong types, huge strings, deep nesting, invalid UTF-8, truncated JSON,
 * unknown fields and commands, missing or absurd message expiries. Every payload is built to be
 * invalid, so each must get exactly one refusal (with its correlation data back) and the station
 * must never be asked to act. 4 seeds × 25 000 payloads = 100 000 per run; a failure names its seed
 * and payload number.
 */
class CommandFuzzTest {

    private static final int PER_SEED = 25_000;
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final String[] NAMES = {"part", "end-part", "reload", "status"};

    private final List<FakeLink> links = new ArrayList<>();
    private final CountingStation station = new CountingStation();
    private ResultPublisher publisher;
    private final ListAppender<ILoggingEvent> logged = new ListAppender<>();
    private boolean savedAdditive;
    private Random rnd;

    @BeforeEach
    void setUp() {
        Logger log = (Logger) LoggerFactory.getLogger(ResultPublisher.class);
        savedAdditive = log.isAdditive();
        log.setAdditive(false); // kept here, not printed
        logged.start();
        log.addAppender(logged);
        FixedWallClock clock = new FixedWallClock(() -> 1_000_000_000L, Samples.T0);
        publisher = new ResultPublisher(new MemoryOutbox(), Samples.STATION, () -> {
            FakeLink l = new FakeLink();
            links.add(l);
            return l;
        }, station, BrokerSettings.plain("tcp://127.0.0.1:1883", "hub-fit-1"), clock, 7, "test");
    }

    @AfterEach
    void restore() {
        Logger log = (Logger) LoggerFactory.getLogger(ResultPublisher.class);
        log.detachAppender(logged);
        log.setAdditive(savedAdditive);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 2, 3, 4})
    void everyInvalidCommandIsRefusedOnceAndNothingActs(long seed) throws Exception {
        rnd = new Random(seed);
        for (int i = 0; i < 5; i++) {
            publisher.doWork();
        }
        FakeLink l = links.get(0);
        String prefix = publisher.topics().prefix() + "cmd/";
        int before = l.sent.size();
        for (int n = 0; n < PER_SEED; n++) {
            String name = rnd.nextInt(20) == 0 ? randomName() : NAMES[rnd.nextInt(NAMES.length)];
            byte[] payload = invalidPayload(name);
            Long expiry = rnd.nextInt(10) == 0 ? null : (long) (1 + rnd.nextInt(30));
            byte[] correlation = {(byte) (n >> 16), (byte) (n >> 8), (byte) n};
            l.events.message(prefix + name, payload, expiry, "fuzz/" + seed, correlation);
            if (n % 64 == 63) {
                publisher.doWork();
            }
        }
        for (int i = 0; i < 5; i++) {
            publisher.doWork();
        }
        List<FakeLink.Sent> replies = l.sent.subList(before, l.sent.size()).stream()
                .filter(s -> s.topic().equals("fuzz/" + seed)).toList();
        assertThat(station.calls).as("station asked to act").isZero();
        assertThat(links).as("the link stayed up").hasSize(1);
        assertThat(replies).hasSize(PER_SEED);
        for (int n = 0; n < replies.size(); n++) {
            FakeLink.Sent r = replies.get(n);
            assertThat(r.correlation()).as("seed %d payload %d", seed, n)
                    .containsExactly((byte) (n >> 16), (byte) (n >> 8), (byte) n);
            JsonNode j = JSON.readTree(r.payload());
            assertThat(j.get("ok").asBoolean()).as("seed %d payload %d: %s", seed, n, j).isFalse();
            if (n < 300) {
                MessageSchemas.assertValid(r.payload());
            }
        }
        assertThat(publisher.figures().commandsRefused()).isEqualTo(PER_SEED);
        assertThat(logged.list.stream().filter(e -> e.getLevel() == Level.WARN))
                .as("the flood does not reach the log: 10 warnings a minute at most").hasSize(10)
                .allSatisfy(e -> assertThat(e.getFormattedMessage()).startsWith("refused command "));
    }

    private String randomName() {
        String[] odd = {"Part", "part ", "", "reload/now", "status\u0000", "x".repeat(300), "ÿÿ", "end_part", "+", "#"};
        return odd[rnd.nextInt(odd.length)];
    }

    /** A payload that no command accepts: each branch breaks one rule. */
    private byte[] invalidPayload(String name) {
        int kind = rnd.nextInt(12);
        return switch (kind) {
            case 0 -> wrongTypes(name);
            case 1 -> utf8("{\"serial\":\"" + "S".repeat(65 + rnd.nextInt(2000)) + "\",\"model\":\"M\",\"x\":1}");
            case 2 -> nested(9 + rnd.nextInt(5000));
            case 3 -> invalidUtf8();
            case 4 -> truncated(name);
            case 5 -> utf8(topLevelNonObject());
            case 6 -> utf8("{\"serial\":\"A\",\"model\":\"B\",\"" + word() + "x\":" + rnd.nextInt() + "}");
            case 7 -> utf8("{\"serial\":\"A\",\"serial\":\"B\",\"model\":\"C\",\"reason\":\"r\",\"z\":0}");
            case 8 -> huge();
            case 9 -> randomBytes();
            case 10 -> utf8("{\"reason\":\"" + "r".repeat(201 + rnd.nextInt(500)) + "\",\"q\":1}");
            default -> utf8("{\"serial\":\"A B\",\"model\":\"" + word() + "\",\"extra\":[]}");
        };
    }

    private byte[] wrongTypes(String name) {
        String[] values = {"1", "-0.5e308", "true", "false", "null", "[]", "{}", "[\"a\"]", "{\"a\":\"b\"}", "\"\"",
                "1e400", "\"\\u0000\""};
        String v = values[rnd.nextInt(values.length)];
        String w = values[rnd.nextInt(values.length)];
        // the reason must be text, the serial and model printable text; status and reload take no fields
        return utf8("{\"serial\":" + v + ",\"model\":" + w + ",\"reason\":" + v + "}");
    }

    private byte[] nested(int depth) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < depth; i++) {
            sb.append(rnd.nextBoolean() ? "{\"a\":" : "[");
        }
        return utf8(sb.toString());
    }

    private byte[] invalidUtf8() {
        byte[] head = "{\"serial\":\"".getBytes(StandardCharsets.UTF_8);
        byte[] tail = "\",\"model\":\"M\"}".getBytes(StandardCharsets.UTF_8);
        byte[][] bad = {{(byte) 0xC3}, {(byte) 0xFF}, {(byte) 0xED, (byte) 0xA0, (byte) 0x80}, {(byte) 0xC0, (byte) 0xAF},
                {(byte) 0xF8, (byte) 0x88, (byte) 0x80, (byte) 0x80, (byte) 0x80}, {(byte) 0x80}};
        byte[] b = bad[rnd.nextInt(bad.length)];
        byte[] out = new byte[head.length + b.length + tail.length];
        System.arraycopy(head, 0, out, 0, head.length);
        System.arraycopy(b, 0, out, head.length, b.length);
        System.arraycopy(tail, 0, out, head.length + b.length, tail.length);
        return out;
    }

    private byte[] truncated(String name) {
        String whole = name.equals("end-part") ? "{\"reason\":\"operator left\"}" : "{\"serial\":\"WH-1\",\"model\":\"hub-5\"}";
        return utf8(whole.substring(0, 1 + rnd.nextInt(whole.length() - 1)));
    }

    private String topLevelNonObject() {
        String[] s = {"[]", "1", "\"part\"", "null", "true", "[{\"serial\":\"A\",\"model\":\"B\"}]", "  ", "\u00a0{}"};
        return s[rnd.nextInt(s.length)];
    }

    private byte[] huge() {
        byte[] b = new byte[4097 + rnd.nextInt(1 << 16)];
        b[0] = '{';
        return b;
    }

    private byte[] randomBytes() {
        byte[] b = new byte[1 + rnd.nextInt(200)];
        rnd.nextBytes(b);
        b[0] = (byte) (0x80 | b[0]); // never a lone "{}"
        return b;
    }

    private String word() {
        char[] c = new char[1 + rnd.nextInt(12)];
        for (int i = 0; i < c.length; i++) {
            c[i] = (char) ('a' + rnd.nextInt(26));
        }
        return new String(c);
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    /** Counts every call that would make the station act. */
    private static final class CountingStation implements StationCommands {
        int calls;

        public CompletionStage<Reply> startPart(String serial, String model) {
            calls++;
            return CompletableFuture.completedFuture(Reply.accepted("started"));
        }

        public CompletionStage<Reply> endPart(String reason) {
            calls++;
            return CompletableFuture.completedFuture(Reply.accepted("ended"));
        }

        public CompletionStage<Reply> reloadPrograms() {
            calls++;
            return CompletableFuture.completedFuture(Reply.accepted("reloaded"));
        }

        public Activity activity() {
            return new Activity("READY", null, null, null);
        }
    }
}
