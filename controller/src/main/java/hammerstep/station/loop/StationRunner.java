package hammerstep.station.loop;

import org.agrona.concurrent.AgentRunner;
import org.agrona.concurrent.BackoffIdleStrategy;
import org.agrona.concurrent.IdleStrategy;
import org.agrona.concurrent.status.AtomicCounter;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Runs a {@link StationAgent} on its own thread with an idle strategy (spin briefly, then yield,
 * then park up to 100 µs: the station reacts within a block while leaving a core to others).
 */
public final class StationRunner implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(StationRunner.class);

    private final AgentRunner runner;

    public StationRunner(StationAgent agent) {
        this(agent, new BackoffIdleStrategy(100, 10, 1_000, 100_000));
    }

    public StationRunner(StationAgent agent, IdleStrategy idle) {
        this.runner = new AgentRunner(idle, t -> LOG.error("station cycle failed", t), (AtomicCounter) null, agent);
    }

    public StationRunner start() {
        AgentRunner.startOnThread(runner);
        return this;
    }

    /** Stops the thread; the agent drops tool enable on close. */
    @Override
    public void close() {
        runner.close();
    }
}
