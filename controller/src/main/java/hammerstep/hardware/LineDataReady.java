package hammerstep.hardware;

/**
 * Data-ready from the part's DRDY line (active low, applied by the {@link DigitalIn}). A conversion
 * is taken at most once: after a read the line must be seen again no sooner than half a period
 * later, so a line that stays low between conversions cannot make the reader take one twice.
 */
public final class LineDataReady implements DataReady {

    private final DigitalIn line;
    private final long minGapNs;
    private long lastNs;
    private boolean taken;

    public LineDataReady(DigitalIn line, double rateHz) {
        this.line = line;
        this.minGapNs = Math.round(0.5e9 / rateHz);
    }

    @Override
    public boolean ready(long nowNs) {
        if (taken && nowNs - lastNs < minGapNs) {
            return false;
        }
        return line.active();
    }

    @Override
    public void taken(long nowNs) {
        taken = true;
        lastNs = nowNs;
    }
}
