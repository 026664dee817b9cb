package hammerstep.sequence;

import hammerstep.results.JointOutcome;
import hammerstep.results.PartOutcome;
import hammerstep.results.StationEvent;

/** A record the sequence asks the station to store, in the order asked. */
public sealed interface Store {

    record Joint(JointOutcome outcome) implements Store { }

    record Part(PartOutcome outcome) implements Store { }

    record Event(StationEvent event) implements Store { }
}
