package hammerstep.mqtt;

import java.util.List;
import java.util.concurrent.CompletableFuture;
import java.util.concurrent.CompletionStage;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * A station for the command side of MQTT tests: accepts every part and records it as
 * {@code serial/model} (safe to read from the test thread while a client thread adds), has no part
 * to end, reloads without complaint and is always READY.
 */
public final class RecordingStation implements StationCommands {

    public final List<String> started = new CopyOnWriteArrayList<>();

    @Override
    public CompletionStage<Reply> startPart(String serial, String model) {
        started.add(serial + "/" + model);
        return CompletableFuture.completedFuture(Reply.accepted("part " + serial + " started"));
    }

    @Override
    public CompletionStage<Reply> endPart(String reason) {
        return CompletableFuture.completedFuture(Reply.refused("NO_PART", "no part in progress"));
    }

    @Override
    public CompletionStage<Reply> reloadPrograms() {
        return CompletableFuture.completedFuture(Reply.accepted("reloaded"));
    }

    @Override
    public Activity activity() {
        return new Activity("READY", null, null, null);
    }

    @Override
    public DataGaps dataGaps() {
        return new DataGaps(3, 1);
    }
}
