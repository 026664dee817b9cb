package hammerstep.sequence;

import hammerstep.results.JointOutcome;
import hammerstep.results.JournalWriter;
import hammerstep.results.PartOutcome;
import hammerstep.results.ResultSink;
import hammerstep.results.ResultStoreException;
import hammerstep.results.StationEvent;

/** A record the sequence asks the station to store, in the order asked. */
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
