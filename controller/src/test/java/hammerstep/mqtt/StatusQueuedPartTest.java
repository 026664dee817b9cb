package hammerstep.mqtt;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.MessageSchemas;
import hammerstep.results.StationId;
import hammerstep.station.VirtualClock;
import org.junit.jupiter.api.Test;

import java.time.Instant;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;

import static org.assertj.core.api.Assertions.assertThat;

/** The status shows the part the plant queued for the fixture, so it can see (and cancel) what it asked for. */
class StatusQueuedPartTest {

    private static final ObjectMapper JSON = new ObjectMapper();

    private static JsonNode status(StationCommands.Activity activity) throws Exception {
        StationCommands station = new StationCommands() {
            @Override
            public CompletionStage<Reply> startPart(String serial, String model) {
                return CompletableFuture.completedFuture(Reply.accepted(""));
            }

            @Override
            public CompletionStage<Reply> endPart(String reason) {
                return CompletableFuture.completedFuture(Reply.accepted(""));
            }

            @Override
            public CompletionStage<Reply> reloadPrograms() {
                return CompletableFuture.completedFuture(Reply.accepted(""));
            }

            @Override
            public Activity activity() {
                return activity;
            }
        };
        StatusMessage s = new StatusMessage(new MemoryOutbox(), new StationId("plant-north", "axle-2", "hub-fit-1"),
                station, BrokerSettings.plain("tcp://127.0.0.1:1883", "hub-fit-1"),
                new VirtualClock(Instant.parse("2026-03-04T05:06:07Z")), "1.0");
        byte[] bytes = s.bytes("online");
        MessageSchemas.assertValid(bytes);
        return JSON.readTree(bytes);
    }

    @Test
    void carriesTheQueuedPartInTheActivity() throws Exception {
        JsonNode a = status(new StationCommands.Activity("WAITING", null, null, null, "WH-0003", "hub-5"))
                .get("activity");
        assertThat(a.get("part_serial").isNull()).isTrue();
        assertThat(a.get("queued_part").get("serial").asText()).isEqualTo("WH-0003");
        assertThat(a.get("queued_part").get("model").asText()).isEqualTo("hub-5");
    }

    @Test
    void saysNullWhenNoPartIsQueued() throws Exception {
        JsonNode a = status(new StationCommands.Activity("PROMPT", "WH-0002", "hub-5", "hub-5-cross")).get("activity");
        assertThat(a.get("queued_part").isNull()).isTrue();
    }
}
