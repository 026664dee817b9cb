package hammerstep.mqtt;

import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageKind;
import hammerstep.results.StationId;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;

/** The publisher's jobs on their own: the delivery window and the connection's backoff. */
class PublisherJobsTest {

    private static final StationId STATION = new StationId("s", "l", "st");

    @Test
    void theWindowKeepsAtMostItsSizeInFlightAndMarksOnlyWhatTheBrokerAccepted() throws Exception {
        MemoryOutbox outbox = new MemoryOutbox();
        for (int k = 1; k <= 5; k++) {
            outbox.append(MessageKind.JOINT, k, "j" + k, new byte[] {(byte) k});
        }
        DeliveryWindow window = new DeliveryWindow(outbox, new Topics(STATION));
        FakeLink link = new FakeLink();
        window.restart(2);
        assertThat(window.send(link)).isEqualTo(2);
        assertThat(window.send(link)).as("the window is full").isZero();
        assertThat(link.results()).extracting(FakeLink.Sent::tag).containsExactly(1L, 2L);

        assertThat(window.acknowledged(1, true)).isTrue();
        assertThat(window.acknowledged(2, false)).as("a refusal").isFalse();
        assertThat(outbox.backlog()).isEqualTo(4);
        assertThat(window.send(link)).isEqualTo(2);
        assertThat(link.results()).extracting(FakeLink.Sent::tag).containsExactly(1L, 2L, 3L, 4L);

        window.restart(8); // a new connection: everything not acknowledged goes again
        assertThat(window.send(link)).isEqualTo(4);
        assertThat(link.results()).extracting(FakeLink.Sent::tag).containsExactly(1L, 2L, 3L, 4L, 2L, 3L, 4L, 5L);
        assertThat(window.refused()).isEqualTo(1);
        assertThat(window.acknowledgedCount()).isEqualTo(1);
    }

    @Test
    void theBackoffDoublesFromTheMinimumUpToTheMaximumWithinTwentyPercent() {
        BrokerSettings settings = BrokerSettings.plain("tcp://localhost:1883", "c");
        List<FakeLink> links = new ArrayList<>();
        Connection connection = new Connection(() -> {
            FakeLink l = new FakeLink();
            l.refuseConnect = true;
            links.add(l);
            return l;
        }, settings, 7, 0);
        long now = 0;
        long min = settings.reconnectMinMs();
        long max = settings.reconnectMaxMs();
        for (int failure = 1; failure <= 20; failure++) {
            assertThat(connection.attemptDue(now)).isTrue();
            assertThat(connection.connect(now, new Link.Will("t", new byte[0]), g -> null, "c/#")).isEqualTo(-1);
            long base = Math.min(max, min << Math.min(failure - 1, 30));
            long delayMs = connection.backoffMs(); // a fresh draw at this failure count
            assertThat(delayMs).isBetween(Math.max(1, (long) Math.floor(base * 0.8)), Math.round(base * 1.2));
            assertThat(connection.attemptDue(now + 1)).as("not due at once").isFalse();
            now += max * 2 * 1_000_000L;
        }
        assertThat(links).hasSize(20).allSatisfy(l -> assertThat(l.closed).isTrue());
        assertThat(connection.connected()).isFalse();
    }
}
