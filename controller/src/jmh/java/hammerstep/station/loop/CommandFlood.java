package hammerstep.station.loop;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.Link;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.StationId;
import hammerstep.station.SystemStationClock;
import org.agrona.concurrent.AgentRunner;

import java.nio.charset.StandardCharsets;

/**
 * A command burst beside the station thread, for {@code ShutoffLatencyBenchmark -p commands=burst}:
 * a {@link ResultPublisher} on its own thread (as in the service) over a link that takes every
 * publish at once, and a feeder thread playing the network, handing it status requests and
 * malformed part commands (each answered with a response, the status requests with the whole
 * status) as fast as it answers them, keeping about 500 answers queued. No broker, no sockets: what
 * competes with the station thread is the delivery side's own work and the feeder.
 */
final class CommandFlood {

    private static final String PREFIX = "hammerstep/v1/b/b/b/cmd/";

    private final LoopLink link = new LoopLink();
    private final ResultPublisher publisher;
    private final AgentRunner runner;
    private final Thread feeder;
    private volatile boolean running = true;

    private CommandFlood() {
        publisher = new ResultPublisher(new MemoryOutbox(), new StationId("b", "b", "b"), () -> link,
                StationCommands.NONE, BrokerSettings.plain("tcp://127.0.0.1:1883", "b"), 
                new SystemStationClock(), 1, "bench");
        runner = ResultPublisher.start(publisher);
        feeder = new Thread(this::feed, "command-flood");
        feeder.setDaemon(true);
        feeder.start();
    }

    static CommandFlood start() {
        return new CommandFlood();
    }

    private void feed() {
        byte[] malformed = "{\"serial\":".getBytes(StandardCharsets.UTF_8);
        long n = 0;
        while (running) {
            Link.Events e = link.events;
            if (e == null || publisher.commandFigures().received() - publisher.commandFigures().answered() > 500) {
                Thread.onSpinWait();
                continue;
            }
            if ((n++ & 1) == 0) {
                e.message(PREFIX + "status", new byte[0], null, "qs/replies/qs/b", null);
            } else {
                e.message(PREFIX + "part", malformed, 30L, "qs/replies/qs/b", null);
            }
        }
    }

    /** Stops both threads; returns the commands answered. */
    long stop() {
        running = false;
        try {
            feeder.join(5000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        runner.close();
        return publisher.commandFigures().answered();
    }

    /** A broker that takes every publish at once and acknowledges results. */
    private static final class LoopLink implements Link {
        volatile Events events;

        @Override
        public int connect(Will will, Events ev) {
            events = ev;
            return 65_535;
        }

        @Override
        public void subscribe(String filter) {
            // nothing retained, nothing to send back
        }

        @Override
        public boolean publish(String topic, byte[] payload, boolean retained, long tag) {
            if (tag > 0) {
                events.acknowledged(tag, true, "");
            }
            return true;
        }

        @Override
        public boolean respond(String topic, byte[] payload, byte[] correlation, long expiryS) {
            return true;
        }

        @Override
        public void publishAndWait(String topic, byte[] payload, boolean retained, long timeoutMs) {
            // taken
        }

        @Override
        public void disconnect() {
            events = null;
        }

        @Override
        public void close() {
            events = null;
        }
    }
}
