package hammerstep.app;

import ch.qos.logback.classic.Level;
import hammerstep.config.ConfigException;
import hammerstep.hardware.Acquisition;
import hammerstep.hardware.HardwareConfig;
import hammerstep.hardware.HardwareSections;
import hammerstep.hardware.HardwareSettings;
import hammerstep.hardware.TransducerSettings;
import hammerstep.hardware.pi4j.Pi4jHardware;
import hammerstep.mqtt.ResultPublisher;
import hammerstep.mqtt.StationCommands;
import hammerstep.results.StationId;
import hammerstep.sequence.Sequence;
import hammerstep.signal.Conditioning;
import hammerstep.station.PartIdentity;
import hammerstep.station.PartIdentitySource;
import hammerstep.station.SampleRing;
import hammerstep.station.StationClock;
import hammerstep.station.SystemStationClock;
import hammerstep.station.loop.CommandDesk;
import hammerstep.station.loop.StationAgent;
import hammerstep.station.loop.StationListener;
import hammerstep.web.Accounts;
import hammerstep.web.LiveBoard;
import hammerstep.web.ResultLog;
import hammerstep.web.WebSettings;
import hammerstep.web.JournalRows;
import hammerstep.web.WebStation;
import hammerstep.web.WebView;
import hammerstep.station.loop.StationPorts;
import hammerstep.station.loop.StationRunner;
import hammerstep.station.setup.IdentitySection;
import hammerstep.station.setup.MainsSection;
import hammerstep.station.setup.PartsSection;
import hammerstep.station.setup.StationConfig;
import hammerstep.station.setup.StationFile;
import hammerstep.station.setup.TimingSection;
import org.agrona.concurrent.AgentRunner;
import org.agrona.concurrent.BackoffIdleStrategy;
import org.agrona.concurrent.BusySpinIdleStrategy;
import org.agrona.concurrent.IdleStrategy;
import org.agrona.concurrent.status.AtomicCounter;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;

import java.io.BufferedReader;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.ConcurrentLinkedQueue;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.atomic.AtomicLong;

/**
 * {@code hammerstep run}: the station service. Reads the station file, opens the hardware (the
 * Raspberry Pi's GPIO and SPI, or Pi4J's mock GPIO with a simulated ADC), runs the acquisition and
 * the station loop on their own threads until stopped (SIGTERM, Ctrl-C) or {@code --exit-after}.
 * Results go to the outbox journal of {@code storage:} and, with a {@code broker:} section, to the
 * plant's MQTT broker, which also brings the plant's commands ({@link CommandDesk}). Stopping drops
 * the tool enable relay, switches every lamp off, publishes the offline status and closes the journal.
 */
@Command(name = "run", mixinStandardHelpOptions = true,
        description = {"Runs the station on its hardware until stopped.",
                "On a machine without GPIO it says so and exits 1; --hardware mock runs on simulated hardware."})
public final class RunCommand implements java.util.concurrent.Callable<Integer> {

    private static final Logger LOG = LoggerFactory.getLogger("hammerstep.run");
    static final int RING_BLOCKS = 64;

    @Mixin
    HardwareOptions hardware;

    @Option(names = "--exit-after", paramLabel = "SECONDS", description = "stop after this long (for smoke checks)")
    double exitAfterS;

    @Option(names = "--status-every", paramLabel = "SECONDS", defaultValue = "60",
            description = "log a status line this often (default 60)")
    double statusEveryS;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    @Override
    public Integer call() throws ConfigException, InterruptedException {
        Logging.configure(verbose, Level.INFO);
        // everything run refuses at start is refused here, before anything opens, as check refuses it (exit 2)
        StationConfig station = StartChecks.load(hardware.config);
        HardwareSettings hw = station.get(HardwareSections.HARDWARE);
        TransducerSettings td = station.get(HardwareSections.TRANSDUCER);
        StationClock clock = new SystemStationClock();
        StationId id = station.get(IdentitySection.INSTANCE);
        java.nio.file.Path file = hardware.config;
        CommandDesk desk = new CommandDesk(() -> StationFile.load(file, StationSections.all())
                .get(PartsSection.INSTANCE).byModel());
        try (ResultDelivery delivery = ResultDelivery.open(id, station.get(StationSections.STORAGE),
                station.get(StationSections.BROKER), desk, new Version().getVersion()[0]);
             Pi4jHardware io = hardware.open(new HardwareConfig(hw, td), clock)) {
            return run(station, io, hw, td, clock, delivery, desk);
        }
    }

    private int run(StationConfig station, Pi4jHardware io, HardwareSettings hw, TransducerSettings td,
                    StationClock clock, ResultDelivery delivery, CommandDesk desk) throws InterruptedException {
        StationId id = station.get(IdentitySection.INSTANCE);
        PartsSection.Parts parts = station.get(PartsSection.INSTANCE);
        TimingSection.Timing timing = station.has(TimingSection.INSTANCE) ? station.get(TimingSection.INSTANCE)
                : TimingSection.Timing.DEFAULT;
        SampleRing ring = new SampleRing(hw.adc().rateHz(), hw.adc().blockSamples(), RING_BLOCKS);
        Acquisition acquisition = new Acquisition(io.adc(), io.dataReady(), clock, io.calibration(),
                td.zeroCounts(), ring);
        Sequence sequence = new Sequence(new Sequence.Settings(td.serial(), td.calibrationDue(),
                timing.completeHoldMs()), !hw.confirm().isEmpty());
        StdinIdentities identities = new StdinIdentities(parts.byModel().keySet().iterator().next());
        StationPorts ports = new StationPorts(ring, io.lamps(), io.toolEnable(), io.inputs(), identities);
        AtomicLong errors = new AtomicLong();
        WebSettings webSettings = station.get(WebSettings.SECTION);
        LiveBoard board = webSettings == null ? null
                : new LiveBoard(hw.adc().rateHz(), new ResultLog(ResultLog.DEFAULT_JOINTS));
        if (board != null) {
            // the results stored before this start, so the view's results and capability show them
            JournalRows.Restored back = JournalRows.restore(board.log(), delivery.outbox(), parts.byModel());
            LOG.info("web view: {} joints and {} parts read back from the journal{}", back.joints(), back.parts(),
                    back.skipped() > 0 ? ", " + back.skipped() + " unreadable messages skipped" : "");
        }
        StationAgent agent = new StationAgent(clock, ports, delivery.journal(), sequence, parts.byModel(),
                conditioning(td).withMains(station.get(MainsSection.INSTANCE).frequencyHz()),
                (long) (timing.blinkPeriodMs() * 1e6), board == null ? StationListener.NONE : board, t -> {
                    errors.incrementAndGet();
                    LOG.error("station cycle failed", t);
                });
        StationExtras.attach(agent, station, hw.adc().rateHz());
        agent.takeCommands(desk);
        IdleStrategy idle = io.isMock() ? new BackoffIdleStrategy(100, 10, 1_000, 10_000) : new BusySpinIdleStrategy();
        AgentRunner acquisitionRunner = new AgentRunner(idle, t -> {
            errors.incrementAndGet();
            LOG.error("acquisition failed", t);
        }, (AtomicCounter) null, acquisition);
        CountDownLatch stop = new CountDownLatch(1);
        CountDownLatch stopped = new CountDownLatch(1);
        Thread hook = new Thread(() -> {
            stop.countDown();
            try {
                stopped.await(10, TimeUnit.SECONDS); // the offline status may take a few seconds
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "hammerstep-stop");
        Runtime.getRuntime().addShutdownHook(hook);
        LOG.info("station {}/{}/{}: {} at {} Hz on {}{}, {} position lamps, transducer {} ({} N·m)", id.site(),
                id.line(), id.station(), io.adc().part(), fmt(io.adc().rateHz()), hw.adc().where(),
                io.isMock() ? " (mock hardware)" : "", hw.positions().size(), td.serial(), fmt(td.fullScaleNm()));
        if (td.calibrationDue(java.time.LocalDate.now())) {
            LOG.warn("transducer {} calibration was due on {}", td.serial(), td.calibrationDue());
        }
        WebView web = board == null ? null : startWeb(webSettings, board, id, webStation(station, parts));
        try (StationRunner stationRunner = new StationRunner(agent)) {
            AgentRunner.startOnThread(acquisitionRunner);
            stationRunner.start();
            delivery.start();
            identities.start();
            long endNs = exitAfterS > 0 ? clock.nanoTime() + (long) (exitAfterS * 1e9) : Long.MAX_VALUE;
            long statusNs = (long) (Math.max(1, statusEveryS) * 1e9);
            while (true) {
                long left = exitAfterS > 0 ? endNs - clock.nanoTime() : statusNs;
                if (left <= 0 || stop.await(Math.min(left, statusNs), TimeUnit.NANOSECONDS)
                        || (exitAfterS > 0 && endNs - clock.nanoTime() <= 0)) {
                    break; // the closing status line follows
                }
                logStatus(acquisition, desk, delivery, errors.get());
            }
        } finally {
            if (web != null) {
                web.close();
            }
            acquisitionRunner.close();
            logStatus(acquisition, desk, delivery, errors.get());
            delivery.close(); // after the station loop: offline status, clean disconnect, journal closed
            stopped.countDown();
            if (exitAfterS > 0) {
                try {
                    Runtime.getRuntime().removeShutdownHook(hook);
                } catch (IllegalStateException e) {
                    // already shutting down
                }
            }
        }
        return 0;
    }

    /**
     * The conditioning of a real transducer: auto-zero within 2 % of full scale (following blocks
     * whose samples stay within 2 % of full scale of their mean), over-range at full scale, impulses
     * of 2.5 % of full scale and more rejected and flat tops beyond that level taken for clipping.
     */
    static Conditioning conditioning(TransducerSettings td) {
        double fs = td.fullScaleNm();
        return new Conditioning(0.02 * fs, 0.02 * fs, 1000.0, fs, 500.0, 0.0,
                Conditioning.IMPULSE_FRACTION_OF_RANGE * fs);
    }

    private static void logStatus(Acquisition a, CommandDesk desk, ResultDelivery d, long errors) {
        ResultPublisher.Figures f = d.figures();
        StationCommands.DataGaps gaps = desk.dataGaps();
        LOG.info("status: {} samples, {} missed, {} blocks dropped, data gaps {} outside rundowns and {} during,"
                        + " {} errors; results: {} not yet delivered{}",
                a.samples(), a.missedSamples(), a.droppedBlocks(), gaps.outsideRundowns(), gaps.duringRundowns(),
                errors, d.outbox().backlog(),
                f == null ? " (no broker)" : f.connected() ? ", broker connected, " + f.acknowledged() + " acknowledged"
                        : ", broker not connected");
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }

    /**
     * Part identities typed on standard input, one per line: {@code SERIAL [MODEL]} (a scanner in
     * keyboard mode, or the line computer through a pipe). Without a model the station's first one.
     */
    static final class StdinIdentities implements PartIdentitySource {
        private final ConcurrentLinkedQueue<PartIdentity> queue = new ConcurrentLinkedQueue<>();
        private final String defaultModel;

        StdinIdentities(String defaultModel) {
            this.defaultModel = defaultModel;
        }

        void start() {
            java.io.InputStream source = System.in; // read now: the thread must not pick up a later System.in
            Thread t = new Thread(() -> {
                try (BufferedReader in = new BufferedReader(new InputStreamReader(source, StandardCharsets.UTF_8))) {
                    String line;
                    while ((line = in.readLine()) != null) {
                        String[] f = line.trim().split("\\s+");
                        if (f.length >= 1 && !f[0].isEmpty()) {
                            queue.add(new PartIdentity(f[0], f.length > 1 ? f[1] : defaultModel));
                        }
                    }
                } catch (java.io.IOException | RuntimeException e) {
                    LOG.warn("part identities on standard input stopped: {}", e.getMessage());
                }
            }, "part-identity");
            t.setDaemon(true);
            t.start();
        }

        @Override
        public PartIdentity poll() {
            return queue.poll();
        }
    }


    /** What the web view knows of the station's files: its stored traces and its patterns. */
    private WebStation webStation(StationConfig station, PartsSection.Parts parts) {
        hammerstep.trace.TracesSection.Traces traces = station.get(hammerstep.trace.TracesSection.INSTANCE);
        java.nio.file.Path file = hardware.config;
        return new WebStation(traces == null ? null : traces.dir(), parts.byModel(), () -> checkLines(file));
    }

    /** What {@code hammerstep check} prints for the station file (and the files it names), one line a problem. */
    static java.util.List<String> checkLines(java.nio.file.Path stationFile) {
        try {
            ConfigFiles.check(stationFile);
            return java.util.List.of();
        } catch (hammerstep.config.ConfigException e) {
            return e.problems().stream().map(p -> hammerstep.config.InputFiles.errorLine(p.toString())).toList();
        }
    }

    /** Serves the web view as the station file's {@code web} section says; a port it cannot bind stops the start. */
    private static WebView startWeb(WebSettings settings, LiveBoard board, StationId id, WebStation files) {
        try {
            WebView web = WebView.start(settings, board, id.site() + "/" + id.line() + "/" + id.station(), files);
            LOG.info("web view on {}://{}:{}/ ({})", settings.scheme(), settings.bind(), web.port(),
                    web.open() ? "loopback, no login" : "accounts of " + settings.usersFile());
            return web;
        } catch (java.io.IOException | Accounts.AccountsException e) {
            throw new UserError("web: cannot serve on " + settings.bind() + ":" + settings.port() + ": " + e.getMessage());
        }
    }
}
