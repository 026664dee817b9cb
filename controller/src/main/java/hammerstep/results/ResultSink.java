package hammerstep.results;

/**
 * Where the station hands every result. An implementation stores each one durably before it
 * returns (the station shows a verdict lamp only after), and delivers it onward on its own thread.
 * Called from the station thread only.
 */
public interface ResultSink {

    /** How much room the store has left: the station warns when LOW and starts no new part when FULL. */
    enum Storage { OK, LOW, FULL }

    /** Stores a judged joint and returns its identity. */
    Receipt joint(JointOutcome joint) throws ResultStoreException;

    /** Stores a finished or abandoned part. */
    Receipt part(PartOutcome part) throws ResultStoreException;

    /** Stores an alarm, warning or notice of the station. */
    Receipt event(StationEvent event) throws ResultStoreException;

    Storage storage();

    /**
     * The part that was in work when the station last stopped and has joints stored but no part
     * record, or null. Read once, when the station starts. A sink that keeps nothing across a
     * restart has none.
     */
    default UnfinishedPart unfinishedPart() {
        return null;
    }

    /** The stable id and the per-station sequence number a stored record was given. */
    record Receipt(String id, long seq) { }
}
