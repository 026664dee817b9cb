package hammerstep.sim.app;

import ch.qos.logback.classic.Level;
import hammerstep.app.Logging;
import hammerstep.sim.demo.DemoOptions;
import hammerstep.sim.demo.DemoOutput;
import hammerstep.sim.demo.DemoRunner;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

import java.nio.file.Path;
import java.util.concurrent.Callable;

/** {@code hammerstep-sim demo}: the whole station in simulation, from config/demo/. */
@Command(name = "demo", mixinStandardHelpOptions = true,
        description = {"Runs a whole station in simulation, with a scripted operator who follows the lamps.",
                "Modelled tool and fasteners, the controller's station loop and sequence, an embedded broker.",
                "Ends with a summary; exit 0 when every part was worked through."})
public final class DemoCommand implements Callable<Integer> {

    @Option(names = "--config", paramLabel = "FILE", defaultValue = "config/demo/station.yaml",
            description = "station file with a simulation section (default: ${DEFAULT-VALUE})")
    Path config;

    @Option(names = "--parts", paramLabel = "N", defaultValue = "3", description = "parts to run (default: ${DEFAULT-VALUE})")
    int parts;

    @Option(names = "--seed", paramLabel = "S", defaultValue = "1", description = "random seed (default: ${DEFAULT-VALUE})")
    long seed;

    @Option(names = "--fast", description = "run in virtual time as fast as possible instead of real time")
    boolean fast;

    @Option(names = "--plain", description = "one line per result or event instead of the live view (the default"
            + " when the output is not a terminal)")
    boolean plain;

    @Option(names = "--supply-drop", paramLabel = "PERCENT", defaultValue = "0",
            description = {"after two parts at full supply, let the air pressure (air tool) or battery voltage"
                    + " (cordless) fall part by part until it is PERCENT lower for the last part: the station's"
                    + " tool health raises TOOL_WEAK (default: ${DEFAULT-VALUE}, steady)"})
    double supplyDropPercent;

    @Option(names = "--traces", paramLabel = "DIR",
            description = "keep every joint's torque trace (.hst) in DIR; the results name them (replay and plot read them)")
    Path traces;

    @Option(names = "--broker", paramLabel = "URL",
            description = "deliver to this MQTT 5 broker (tcp://HOST:PORT) instead of the embedded one on 127.0.0.1")
    String broker;

    @Option(names = "--results-out", paramLabel = "FILE",
            description = "write every message the quality system's subscriber receives, one JSON line each")
    Path resultsOut;

    @Option(names = "--summary-out", paramLabel = "FILE",
            description = "write what the station produced (joints, parts, events, last seq of each) as JSON")
    Path summaryOut;

    @Option(names = "--state", paramLabel = "DIR",
            description = "keep the result outbox in DIR, so a restart resumes (default: a temporary folder)")
    Path state;

    @Option(names = "--web", paramLabel = "PORT", defaultValue = "0",
            description = {"serve the engineer's web view on http://127.0.0.1:PORT/ (loopback only, no login);"
                    + " after the parts it keeps serving until Ctrl-C"})
    int webPort;

    @Option(names = "--verbose", description = "log debug detail")
    boolean verbose;

    @Override
    public Integer call() throws Exception {
        Logging.configure(verbose, Level.WARN);
        if (parts < 1 || parts > 100_000) {
            throw new hammerstep.app.UserError("demo: --parts must be from 1 to 100000, got " + parts, 2);
        }
        if (!(supplyDropPercent >= 0 && supplyDropPercent < 90)) {
            throw new hammerstep.app.UserError("demo: --supply-drop must be from 0 to 90 percent, got " + supplyDropPercent, 2);
        }
        if (broker != null && !broker.matches("tcp://[^/:]+:[0-9]{1,5}")) {
            throw new hammerstep.app.UserError("demo: --broker must be tcp://HOST:PORT, got " + broker, 2);
        }
        if (webPort < 0 || webPort > 65535) {
            throw new hammerstep.app.UserError("demo: --web must be a port from 1 to 65535, got " + webPort, 2);
        }
        // the live view redraws a terminal in place; into a pipe or a file it would write escape codes
        boolean terminal = System.console() != null;
        return new DemoRunner(new DemoOptions(config, parts, seed, fast, plain || !terminal, supplyDropPercent, traces,
                true, broker, resultsOut, summaryOut, state), DemoOutput.stdout(), webPort).run();
    }
}
