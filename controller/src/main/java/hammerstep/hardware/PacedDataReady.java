package hammerstep.hardware;

/**
 * Data-ready from a timer: for parts that convert on request (MCP3208) and for the simulated ADC.
 * Ready once per sample period; when the reader falls more than a period behind, the schedule
 * restarts from now rather than bursting to catch up (the acquisition counts the missed samples).
 */
public final class PacedDataReady implements DataReady {

    private final long periodNs;
    private long nextNs;
    private boolean started;

    public PacedDataReady(double rateHz) {
        if (!(rateHz > 0)) {
            throw new IllegalArgumentException("rate must be positive");
        }
        this.periodNs = Math.round(1e9 / rateHz);
    }

    @Override
    public boolean ready(long nowNs) {
        if (!started) {
            started = true;
            nextNs = nowNs;
        }
        return nowNs - nextNs >= 0;
    }

    @Override
    public void taken(long nowNs) {
        nextNs += periodNs;
        if (nowNs - nextNs >= periodNs) {
            nextNs = nowNs + periodNs;
        }
    }
}
