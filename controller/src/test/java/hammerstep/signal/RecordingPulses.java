package hammerstep.signal;

import java.util.ArrayList;
import java.util.List;

/** Keeps every pulse a detector reports. */
final class RecordingPulses implements PulseSink {

    record Pulse(long startNs, double peakNm, long peakNs, double widthMs, double impulseNms) { }

    final List<Pulse> pulses = new ArrayList<>();

    @Override
    public void onPulse(long startNs, double peakNm, long peakNs, double widthMs, double impulseNms) {
        pulses.add(new Pulse(startNs, peakNm, peakNs, widthMs, impulseNms));
    }
}
