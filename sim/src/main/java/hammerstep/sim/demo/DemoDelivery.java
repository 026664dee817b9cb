package hammerstep.sim.demo;

import hammerstep.app.UserError;
import hammerstep.mqtt.BrokerSettings;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.mqtt.Topics;
import hammerstep.mqtt.paho.PahoLink;
import hammerstep.mqtt.paho.QualityClient;
import hammerstep.results.JournalWriter;
import hammerstep.results.MessageKind;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.ResultMessages;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationId;
import hammerstep.results.StorageSettings;
import hammerstep.results.journal.FileOutbox;
import hammerstep.sim.broker.EmbeddedBroker;
import hammerstep.station.SystemStationClock;
import hammerstep.station.VirtualClock;
import org.agrona.concurrent.AgentRunner;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Comparator;
import java.util.EnumMap;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Set;
import java.util.UUID;
import java.util.stream.Stream;

/**
 * The demo's way from the station to the quality system, as on a real station: a file outbox
 * (the {@code --state} folder, or a temporary one) written by its {@link JournalWriter} (stepped in
 * virtual time by the simulated station, and here while the demo waits for delivery), the MQTT
 * publisher on its own thread (its delivered marks go to the writer), a broker
 * (embedded on loopback, or {@code --broker URL}) and a subscriber playing the quality system,
 * which writes every message the station published (joint, part, event, status) to {@code --results-out}
 * as one JSON line: not the commands that others publish under the station's {@code cmd/} topics, nor
 * their replies, nor an empty payload (a cleared retained message).
 */
final class DemoDelivery implements AutoCloseable {

    private static final long WAIT_NS = 30_000_000_000L;

    private final StationId station;
    private final Topics topics;
    private final Path stateDir;
    private final boolean temporaryState;
    private final FileOutbox outbox;
    private final JournalWriter journal;
    private final EmbeddedBroker broker;
    private final String url;
    private final QualityClient subscriber;
    private AgentRunner runner;
    private final BufferedWriter resultsOut;
    private final Map<MessageKind, Long> firstSeq = new EnumMap<>(MessageKind.class);
    private final Map<MessageKind, Set<String>> receivedIds = new EnumMap<>(MessageKind.class);
    private final Map<MessageKind, Long> receivedMaxSeq = new EnumMap<>(MessageKind.class);

    private DemoDelivery(StationId station, Path stateDir, boolean temporaryState, FileOutbox outbox,
                         JournalWriter journal, EmbeddedBroker broker, String url, QualityClient subscriber,
                         BufferedWriter resultsOut) {
        this.station = station;
        this.topics = new Topics(station);
        this.stateDir = stateDir;
        this.temporaryState = temporaryState;
        this.outbox = outbox;
        this.journal = journal;
        this.broker = broker;
        this.url = url;
        this.subscriber = subscriber;
        this.resultsOut = resultsOut;
    }

    /**
     * @param storage the station file's {@code storage:} section, or null; its folder is replaced by
     *                {@code --state} or a temporary folder
     * @param brokerSection the station file's {@code broker:} section, or null; used with {@code --broker}
     * @param commands      where the plant's commands go: the demo station's desk
     * @param clock         the demo station's virtual clock: the sink's own events (a loss found in the
     *                      journal, its repair) carry the station's time, as the results beside them do
     */
    static DemoDelivery open(DemoOptions o, StationId station, StorageSettings storage, BrokerSettings brokerSection,
                             StationCommands commands, VirtualClock clock) {
        Path state = o.stateDir();
        boolean temporary = state == null;
        FileOutbox outbox = null;
        EmbeddedBroker broker = null;
        QualityClient subscriber = null;
        BufferedWriter out = null;
        try {
            if (temporary) {
                state = Files.createTempDirectory("hammerstep-demo-outbox-");
            }
            StorageSettings s = storage == null ? StorageSettings.defaults(state)
                    : new StorageSettings(state, storage.segmentBytes(), storage.retainBytes(), storage.maxBytes(),
                    storage.lowFreeBytes(), storage.minFreeBytes());
            outbox = FileOutbox.open(s);
            String url;
            if (o.brokerUrl() == null) {
                broker = EmbeddedBroker.start(0);
                url = broker.url();
            } else {
                url = o.brokerUrl();
            }
            String clientId = station.site() + "-" + station.line() + "-" + station.station();
            BrokerSettings settings = brokerSection == null || o.brokerUrl() == null
                    ? BrokerSettings.plain(url, clientId) : brokerSection.withUrl(url);
            if (settings.clientId().isEmpty()) {
                settings = settings.withClientId(clientId);
            }
            if (o.resultsOut() != null) {
                out = Files.newBufferedWriter(o.resultsOut(), StandardCharsets.UTF_8);
            }
            DemoDelivery[] self = new DemoDelivery[1];
            subscriber = QualityClient.connect(url, "quality-" + clientId,
                    (topic, payload, retained, correlation) -> self[0].received(topic, payload));
            Topics topics = new Topics(station);
            BrokerSettings fixed = settings;
            // ids are random UUIDs, so a resumed run never repeats one
            JournalWriter journal = new JournalWriter(new OutboxResultSink(outbox, station,
                    () -> UUID.randomUUID().toString(), clock), outbox,
                    JournalWriter.DEFAULT_CAPACITY);
            ResultPublisher publisher = new ResultPublisher(journal.forDelivery(), station, () -> new PahoLink(fixed),
                    commands, fixed, new SystemStationClock(), o.seed(),
                    "hammerstep-sim demo");
            DemoDelivery d = new DemoDelivery(station, state, temporary, outbox, journal, broker, url, subscriber,
                    out);
            self[0] = d;
            for (MessageKind k : MessageKind.values()) {
                d.firstSeq.put(k, outbox.nextSeq(k));
                d.receivedIds.put(k, new HashSet<>());
                d.receivedMaxSeq.put(k, 0L);
            }
            subscriber.subscribe(topics.prefix() + "#");
            d.runner = ResultPublisher.start(publisher);
            return d;
        } catch (IOException | ResultStoreException | RuntimeException e) {
            if (subscriber != null) {
                subscriber.close();
            }
            if (outbox != null) {
                outbox.close();
            }
            if (broker != null) {
                broker.close();
            }
            closeQuietly(out);
            if (e instanceof UserError u) {
                throw u;
            }
            throw new UserError("demo: cannot set up result delivery: " + e.getMessage(), 1);
        }
    }

    /** The journal's writer, for the station to hand its records to; stepped on the demo's thread. */
    JournalWriter journal() {
        return journal;
    }

    /** True for the topics the station itself publishes on: its results and its status. */
    private boolean publishedByTheStation(String topic) {
        if (topic.equals(topics.status())) {
            return true;
        }
        for (MessageKind k : MessageKind.values()) {
            if (topic.equals(topics.result(k))) {
                return true;
            }
        }
        return false;
    }

    private synchronized void received(String topic, byte[] payload) {
        if (!publishedByTheStation(topic) || payload.length == 0) {
            return; // a command (even a malformed one) or its reply, or a cleared retained status
        }
        if (resultsOut != null) {
            try {
                resultsOut.write(new String(payload, StandardCharsets.UTF_8));
                resultsOut.newLine();
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        for (MessageKind k : MessageKind.values()) {
            if (topic.equals(topics.result(k))) {
                String text = new String(payload, StandardCharsets.UTF_8);
                String id = field(text, "\"id\":\"", '"');
                String seq = field(text, "\"seq\":", ',');
                if (id != null && receivedIds.computeIfAbsent(k, x -> new HashSet<>()).add(id) && seq != null) {
                    receivedMaxSeq.merge(k, Long.parseLong(seq), Math::max);
                }
            }
        }
    }

    private static String field(String json, String start, char end) {
        int a = json.indexOf(start);
        if (a < 0) {
            return null;
        }
        int b = json.indexOf(end, a + start.length());
        return b < 0 ? null : json.substring(a + start.length(), b);
    }

    private synchronized boolean allReceived() {
        for (MessageKind k : MessageKind.values()) {
            long last = outbox.nextSeq(k) - 1;
            if (last >= firstSeq.get(k) && receivedMaxSeq.getOrDefault(k, 0L) < last) {
                return false;
            }
        }
        return outbox.backlog() == 0;
    }

    /**
     * Waits (up to 30 s) until the broker has acknowledged every stored result and the subscriber has
     * received them, prints one line and writes {@code --summary-out}.
     *
     * @return true when everything arrived
     */
    boolean finish(PrintStream out, Path summaryOut) throws InterruptedException {
        long end = System.nanoTime() + WAIT_NS;
        while (!allReceived() && System.nanoTime() - end < 0) {
            while (journal.doWork() > 0) {
                // the writer applies the publisher's delivered marks (it runs on this thread)
            }
            Thread.sleep(20);
        }
        boolean all = allReceived();
        Map<String, Object> summary = new LinkedHashMap<>();
        Map<String, Object> lastSeq = new LinkedHashMap<>();
        Map<String, Object> received = new LinkedHashMap<>();
        StringBuilder line = new StringBuilder("results  ");
        synchronized (this) {
            if (resultsOut != null) {
                try {
                    resultsOut.flush(); // whole before the demo goes on serving its web view until Ctrl-C
                } catch (IOException e) {
                    throw new UserError("--results-out: " + e.getMessage(), 2);
                }
            }
            for (MessageKind k : MessageKind.values()) {
                long produced = outbox.nextSeq(k) - firstSeq.get(k);
                summary.put(k.topic() + "s", produced);
                lastSeq.put(k.topic(), outbox.nextSeq(k) - 1);
                received.put(k.topic(), receivedIds.get(k).size());
                line.append(produced).append(' ').append(k.topic()).append(produced == 1 ? ", " : "s, ");
            }
        }
        summary.put("last_seq", lastSeq);
        summary.put("received", received);
        summary.put("backlog", outbox.backlog());
        line.setLength(line.length() - 2);
        line.append(all ? " stored and received by the quality system (seq without gaps)"
                : "; " + outbox.backlog() + " not yet delivered, kept in " + (temporaryState ? "a temporary folder"
                : stateDir.toString()));
        out.println(line);
        if (summaryOut != null) {
            try {
                Files.write(summaryOut, ResultMessages.bytes(summary));
                Files.writeString(summaryOut, "\n", java.nio.file.StandardOpenOption.APPEND);
            } catch (IOException e) {
                throw new UserError("--summary-out " + summaryOut + ": " + e.getMessage(), 2);
            }
        }
        return all;
    }

    @Override
    public void close() {
        if (runner != null) {
            runner.close();
        }
        subscriber.close();
        synchronized (this) {
            closeQuietly(resultsOut);
        }
        outbox.close();
        if (broker != null) {
            broker.closeInBackground(); // the summary is out: the process need not wait for the broker to stop
        }
        if (temporaryState) {
            try (Stream<Path> s = Files.walk(stateDir)) {
                s.sorted(Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            } catch (IOException e) {
                // a temporary folder left behind is harmless
            }
        }
    }

    private static void closeQuietly(BufferedWriter w) {
        if (w != null) {
            try {
                w.close();
            } catch (IOException e) {
                // closing
            }
        }
    }
}
