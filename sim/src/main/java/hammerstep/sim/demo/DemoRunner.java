package hammerstep.sim.demo;

import hammerstep.app.StationExtras;
import hammerstep.app.StationSections;
import hammerstep.app.UserError;
import hammerstep.trace.StoredTrace;
import hammerstep.trace.TraceKeeper;
import hammerstep.trace.TracesSection;
import hammerstep.config.ConfigException;
import hammerstep.joint.JointMonitor;
import hammerstep.results.JointOutcome;
import hammerstep.results.JournalWriter;
import hammerstep.results.MemoryOutbox;
import hammerstep.results.OutboxResultSink;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.StationEvent;
import hammerstep.results.StationId;
import hammerstep.sequence.Pattern;
import hammerstep.sequence.Sequence;
import hammerstep.signal.Conditioning;
import hammerstep.sim.station.RigToolModel;
import hammerstep.sim.station.SimulatedStation;
import hammerstep.sim.station.VirtualStation;
import hammerstep.station.PartIdentity;
import hammerstep.station.VirtualClock;
import hammerstep.station.loop.CommandDesk;
import hammerstep.station.loop.StationListener;
import hammerstep.station.setup.IdentitySection;
import hammerstep.station.setup.PartsSection;
import hammerstep.station.setup.MainsSection;
import hammerstep.station.setup.StationConfig;
import hammerstep.station.setup.StationFile;
import hammerstep.station.setup.TimingSection;

import hammerstep.web.Accounts;
import hammerstep.web.LiveBoard;
import hammerstep.web.ResultLog;
import hammerstep.web.WebSettings;
import hammerstep.web.WebStation;
import hammerstep.web.WebView;

import java.io.PrintStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.CountDownLatch;

/**
 * Runs the demo: a station from a station file with its {@code simulation:} section, the scripted
 * operator working through the parts, a live view or one line per event, and a summary. Returns
 * the exit code.
 */
public final class DemoRunner {

    /** Virtual time a part may take before the run is called stuck. */
    private static final long PART_LIMIT_NS = 600_000_000_000L;

    private final DemoOptions options;
    private final PrintStream out;
    private final DemoView view;
    private final WebSettings webSettings;
    private final CountDownLatch stopServing = new CountDownLatch(1);
    private volatile WebView web;

    public DemoRunner(DemoOptions options, PrintStream out) {
        this(options, out, null, (WebSettings) null);
    }

    /**
     * A demo that also serves the engineer's web view on 127.0.0.1:{@code webPort} (0: none; no
     * login, loopback only), and after its parts keeps serving until {@link #stopServing()} or the
     * process is interrupted.
     */
    public DemoRunner(DemoOptions options, PrintStream out, int webPort) {
        this(options, out, null, webPort > 0 ? WebSettings.loopback(webPort) : null);
    }

    /**
     * A demo that serves the web view as {@code web} says (tests: accounts, so that an engineer can
     * run a what-if over the demo's stored traces), and after its parts keeps serving until
     * {@link #stopServing()}.
     */
    public DemoRunner(DemoOptions options, PrintStream out, WebSettings web) {
        this(options, out, null, web);
    }

    /** With a view of the caller's (tests: a live view of a fixed size); null: as the options say. */
    DemoRunner(DemoOptions options, PrintStream out, DemoView view) {
        this(options, out, view, null);
    }

    private DemoRunner(DemoOptions options, PrintStream out, DemoView view, WebSettings webSettings) {
        this.options = options;
        this.out = out;
        this.view = view;
        this.webSettings = webSettings;
    }

    /** Ends the serving after the parts (the demo's Ctrl-C does it by ending the process). */
    public void stopServing() {
        stopServing.countDown();
    }

    /** The web view while the demo serves it, else null. */
    public WebView web() {
        return web;
    }

    public int run() throws ConfigException, InterruptedException {
        if (!Files.exists(options.station())) {
            throw new UserError(options.station() + ": no such file (run from the repository root, or give --config)", 2);
        }
        // the same sections 'hammerstep-sim check' reads the file with
        StationConfig config = StationFile.load(options.station(), SimulationSection.withStationSections());
        SimulationSection.Simulation sim = config.get(SimulationSection.INSTANCE);
        if (sim == null) {
            throw new UserError(options.station() + ": no 'simulation' section: the demo needs one", 2);
        }
        StationId id = config.get(IdentitySection.INSTANCE);
        Map<String, Pattern> patterns = config.get(PartsSection.INSTANCE).byModel();
        TimingSection.Timing timing = config.get(TimingSection.INSTANCE);
        DemoState state = DemoState.read(options.stateDir());
        List<PartIdentity> parts = parts(sim, patterns, state.partsRun());

        // the view first: the embedded broker takes seconds to come up, the view shows at once that it does
        DemoView view = this.view != null ? this.view : options.plain() ? new PlainView(out) : new LiveView(out);
        view.start(id, config, parts.size());
        if (options.delivery()) {
            view.status(options.brokerUrl() == null ? "starting: the embedded MQTT broker is coming up on 127.0.0.1"
                    : "starting: connecting to the MQTT broker " + options.brokerUrl());
        }
        if (state.partsRun() > 0) {
            view.status("continuing the runs on " + options.stateDir() + ": " + DemoText.count(state.partsRun(), "part")
                    + " before, virtual time from " + state.start());
        }

        VirtualClock clock = new VirtualClock(state.start());
        RigToolModel tool = new RigToolModel(sim.tool(), sim.joint(), sim.transducer(), sim.rateHz(), options.seed(),
                sim.fixture().positions(), sim.internalRateHz());
        tool.setBlowThresholdNm(lowestCountAbove(patterns));
        if (!Double.isNaN(sim.supplyBar())) {
            tool.setSupplyPressureBar(sim.supplyBar());
        }
        if (!Double.isNaN(sim.batteryV())) {
            tool.setBatteryVoltage(sim.batteryV());
        }
        VirtualStation hardware = new VirtualStation(tool, sim.fixture(), sim.rateHz(), sim.blockSamples(), 64,
                timing.blinkPeriodNs() + timing.blinkPeriodNs() / 5);
        // the plant's commands over MQTT: the same desk as on a board; reload reads the station file again
        CommandDesk desk = new CommandDesk(() -> StationFile.load(options.station(), SimulationSection.withStationSections())
                .get(PartsSection.INSTANCE).byModel());
        DemoDelivery delivery = options.delivery()
                ? DemoDelivery.open(options, id, config.get(StationSections.STORAGE), config.get(StationSections.BROKER),
                desk, clock)
                : null;
        try {
            return run(config, sim, id, patterns, timing, parts, clock, tool, hardware, delivery, desk, view, state);
        } finally {
            if (delivery != null) {
                delivery.close();
            }
        }
    }

    private int run(StationConfig config, SimulationSection.Simulation sim, StationId id, Map<String, Pattern> patterns,
                    TimingSection.Timing timing, List<PartIdentity> parts, VirtualClock clock, RigToolModel tool,
                    VirtualStation hardware, DemoDelivery delivery, CommandDesk desk, DemoView view, DemoState state)
            throws InterruptedException {
        long[] ids = {0};
        JournalWriter journal = delivery != null ? delivery.journal()
                : new JournalWriter(new OutboxResultSink(new MemoryOutbox(), id, () -> id.station() + "-" + (++ids[0]),
                new VirtualClock(state.start())));
        Set<String> serials = new HashSet<>();
        for (PartIdentity p : parts) {
            serials.add(p.serial());
        }
        DemoTally tally = new DemoTally(serials);
        Pattern first = patterns.values().iterator().next();
        Conditioning conditioning = JointMonitor.replayConditioning(first.passes().get(0).program())
                .withOverRange(sim.transducer().ratedTorqueNm())
                .withMains(config.get(MainsSection.INSTANCE).frequencyHz());
        List<Throwable> errors = new ArrayList<>();
        StationListener listener = listener(tally, view, clock);
        LiveBoard board = null;
        if (webSettings != null) {
            board = new LiveBoard(sim.rateHz(), new ResultLog(ResultLog.DEFAULT_JOINTS));
            listener = StationListener.both(listener, board);
        }
        SimulatedStation station = new SimulatedStation(clock, hardware, journal, patterns,
                new Sequence.Settings(sim.transducerSerial(), sim.calibrationDue(), timing.completeHoldMs()),
                conditioning, timing.blinkPeriodNs(), sim.habits(), parts, options.seed(),
                listener, errors::add);
        if (board != null) {
            web = startWeb(board, id, patterns);
        }
        StationExtras.attach(station.agent(), config, sim.rateHz());
        station.agent().takeCommands(desk);
        if (options.tracesDir() != null) {
            try {
                station.agent().keepTraces(TraceKeeper.open(new TracesSection.Traces(options.tracesDir(), 100_000,
                        1_000_000_000L, StoredTrace.Encoding.INT16, 50, 12), sim.rateHz()));
            } catch (java.io.IOException e) {
                throw new UserError("--traces " + options.tracesDir() + ": " + e.getMessage(), 2);
            }
        }
        SupplyFade fade = new SupplyFade(tool, sim.tool(), SupplyFade.nominalOf(sim.tool(), sim.supplyBar(), sim.batteryV()),
                options.supplyDropPercent(), parts.size());

        long wallStart = System.nanoTime();
        long limit = PART_LIMIT_NS * Math.max(1, parts.size());
        while (!station.finished() && station.nowNs() < limit && errors.isEmpty()) {
            String supply = fade.update(tally.parts);
            if (supply != null) {
                view.line(station.nowNs(), supply);
            }
            station.step();
            view.frame(station, tally);
            if (!options.fast()) {
                long ahead = station.nowNs() - (System.nanoTime() - wallStart);
                if (ahead > 20_000_000L) {
                    Thread.sleep(ahead / 1_000_000L);
                }
            }
        }
        station.settle(1_000); // the last records on disk and heard of, as a board's writer thread would finish them
        view.end(station, tally);
        station.agent().onClose(); // the station has stopped: a command from now on is answered UNAVAILABLE
        boolean finished = station.finished();
        state.write(options.stateDir(), parts.size(), clock.instantOf(station.nowNs()));
        new DemoSummary(tally, station, tool, parts.size(), System.nanoTime() - wallStart, finished).print(out);
        for (Throwable t : errors) {
            out.println("station error: " + t);
        }
        int exit = errors.isEmpty() ? 0 : 1;
        if (delivery != null && !delivery.finish(out, options.summaryOut())) {
            exit = 1;
        } else if (!finished) {
            out.println("the run did not finish: the simulated operator got stuck (see the events above)");
            exit = 1;
        }
        if (web != null) {
            try {
                out.println("parts done; the web view stays at " + webSettings.scheme() + "://" + webSettings.bind() + ":"
                        + web.port() + "/ until Ctrl-C");
                stopServing.await();
            } finally {
                web.close();
                web = null;
            }
        }
        return exit;
    }

    /** The view with the demo's stored traces (--traces) and patterns, for the what-if and programs pages. */
    private WebView startWeb(LiveBoard board, StationId id, Map<String, Pattern> patterns) {
        int port = webSettings.port();
        try {
            WebView v = WebView.start(webSettings, board, id.site() + "/" + id.line() + "/" + id.station()
                    + " (simulated)", new WebStation(options.tracesDir(), patterns, null));
            out.println("web view: " + webSettings.scheme() + "://" + webSettings.bind() + ":" + v.port() + "/ "
                    + (v.open() ? "(bound to loopback: open on this computer, no login asked)"
                    : "(accounts of " + webSettings.usersFile() + ")"));
            return v;
        } catch (java.io.IOException | Accounts.AccountsException e) {
            throw new UserError("--web " + port + ": cannot serve on " + webSettings.bind() + ":" + port + ": "
                    + e.getMessage(), 2);
        }
    }

    /** The ground truth counts blows as the most sensitive program of the station does. */
    static double lowestCountAbove(Map<String, Pattern> patterns) {
        double lowest = Double.POSITIVE_INFINITY;
        for (Pattern p : patterns.values()) {
            for (Pattern.Pass pass : p.passes()) {
                lowest = Math.min(lowest, pass.program().blows().countAboveNm());
            }
        }
        return lowest;
    }

    /** The parts of this run: the simulation's part streams in turn, from the {@code before}-th part on. */
    private List<PartIdentity> parts(SimulationSection.Simulation sim, Map<String, Pattern> patterns, int before) {
        List<SimulationSection.PartStream> streams = sim.parts();
        for (SimulationSection.PartStream s : streams) {
            if (!patterns.containsKey(s.model())) {
                throw new UserError(options.station() + ": simulation part model " + s.model()
                        + " has no pattern under 'parts'", 2);
            }
        }
        int n = options.parts() > 0 ? options.parts() : streams.size();
        List<PartIdentity> list = new ArrayList<>(n);
        for (int k = before; k < before + n; k++) {
            SimulationSection.PartStream s = streams.get(k % streams.size());
            list.add(new PartIdentity(s.serial(k / streams.size()), s.model()));
        }
        return list;
    }

    private static StationListener listener(DemoTally tally, DemoView view, VirtualClock clock) {
        return new StationListener() {
            @Override
            public void onBlow(int index, double peakNm, long peakNs) {
                tally.blow(index, peakNm);
            }

            @Override
            public void onJoint(JointOutcome joint, ResultSink.Receipt receipt) {
                tally.joint(joint);
                view.joint(clock.nanoTime(), joint);
            }

            @Override
            public void onPart(PartOutcome part, ResultSink.Receipt receipt) {
                tally.part(part);
                view.line(clock.nanoTime(), DemoLines.part(part));
            }

            @Override
            public void onEvent(StationEvent event, ResultSink.Receipt receipt) {
                tally.event(event);
                view.line(clock.nanoTime(), DemoLines.event(event));
            }

            @Override
            public void onStoreFailed(String message) {
                view.line(clock.nanoTime(), "store failed: " + message);
            }
        };
    }
}
