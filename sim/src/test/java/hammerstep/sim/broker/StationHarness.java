package hammerstep.sim.broker;

import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultSink;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.station.SystemStationClock;
import org.agrona.concurrent.AgentRunner;

import java.nio.file.Path;

/** The results side of a station, wired as in the service: file outbox, sink, publisher on its own thread. */
final class StationHarness implements AutoCloseable {

    final FileOutbox outbox;
    final OutboxResultSink sink;
    final ResultPublisher publisher;
    private final AgentRunner runner;

    StationHarness(String url, Path state, StationCommands commands) throws Exception {
        outbox = FileOutbox.open(new StorageSettings(state, 1 << 20, 1 << 20, 1L << 30, 0, 0));
        sink = new OutboxResultSink(outbox, TestResults.STATION);
        BrokerSettings s = new BrokerSettings(url, "hub-fit-1", null, null, null, null, null, 10, 5, 100, 1000, 600, 300, 60, 32);
        publisher = new ResultPublisher(outbox, TestResults.STATION, () -> new PahoLink(s), commands, s,
                new SystemStationClock(), 1, "test");
        runner = ResultPublisher.start(publisher);
    }

    ResultSink.Receipt joint(int n) throws Exception {
        return sink.joint(TestResults.joint(n));
    }

    @Override
    public void close() {
        runner.close();
        outbox.close();
    }
}
