package hammerstep.hardware;

import hammerstep.station.OperatorInputs;
import hammerstep.station.StationClock;

import java.util.List;

/**
 * The station's {@link OperatorInputs} on digital inputs, each debounced by time on the injected
 * clock: a level reaches the station only after it held for the line's debounce time. Reads the pin
 * on every call, on the station thread.
 */
public final class GpioOperatorInputs implements OperatorInputs {

    private final StationClock clock;
    private final Line acknowledge;
    private final Line supervisorKey;
    private final Line partPresent;
    private final Line trigger;
    private final Line[] confirm;

    /** Optional lines ({@code partPresent}, {@code trigger}) may be null; {@code confirm} may be empty. */
    public GpioOperatorInputs(StationClock clock, Line acknowledge, Line supervisorKey, Line partPresent, Line trigger,
                              List<Line> confirm) {
        this.clock = clock;
        this.acknowledge = acknowledge;
        this.supervisorKey = supervisorKey;
        this.partPresent = partPresent;
        this.trigger = trigger;
        this.confirm = confirm.toArray(new Line[0]);
    }

    /** One input and its debouncer. */
    public static final class Line {
        private final DigitalIn in;
        private final Debouncer debouncer;

        public Line(DigitalIn in, long debounceNs) {
            this.in = in;
            this.debouncer = new Debouncer(debounceNs, false);
        }

        boolean read(long nowNs) {
            return debouncer.update(in.active(), nowNs);
        }
    }

    @Override
    public boolean acknowledge() {
        return acknowledge.read(clock.nanoTime());
    }

    @Override
    public boolean supervisorKey() {
        return supervisorKey.read(clock.nanoTime());
    }

    @Override
    public boolean hasPartPresent() {
        return partPresent != null;
    }

    @Override
    public boolean partPresent() {
        return partPresent != null && partPresent.read(clock.nanoTime());
    }

    @Override
    public boolean hasConfirmSensors() {
        return confirm.length > 0;
    }

    @Override
    public int confirmedPosition() {
        long now = clock.nanoTime();
        int found = NO_POSITION;
        for (int i = 0; i < confirm.length; i++) {
            if (confirm[i].read(now)) {
                if (found != NO_POSITION) {
                    found = -2;
                } else {
                    found = i;
                }
            }
        }
        return found < 0 ? NO_POSITION : found;
    }

    @Override
    public boolean hasTrigger() {
        return trigger != null;
    }

    @Override
    public boolean trigger() {
        return trigger != null && trigger.read(clock.nanoTime());
    }
}
