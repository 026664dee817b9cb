package hammerstep.sequence;

import hammerstep.results.JointOutcome;
import hammerstep.results.JournalWriter;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationEvent;

/**
 * A record as the journal stores it, stamped with wall-clock time: the sequence's records once the
 * station loop stamped and worded them ({@code hammerstep.station.loop.SequenceRecords}), and the loop's
 * own events (tool health, interference).
 */
public sealed interface Store extends JournalWriter.Storable {

    record Joint(JointOutcome outcome) implements Store {
        @Override
        public ResultSink.Receipt storeIn(ResultSink sink) throws ResultStoreException {
            return sink.joint(outcome);
        }
    }

    record Part(PartOutcome outcome) implements Store {
        @Override
        public ResultSink.Receipt storeIn(ResultSink sink) throws ResultStoreException {
            return sink.part(outcome);
        }
    }

    record Event(StationEvent event) implements Store {
        @Override
        public ResultSink.Receipt storeIn(ResultSink sink) throws ResultStoreException {
            return sink.event(event);
        }
    }
}
