package hammerstep.sequence;

import hammerstep.joint.JointResult;
import hammerstep.results.StationEvent;
import hammerstep.station.PartIdentity;

import java.time.LocalDate;
import java.util.List;

/**
 * What the {@link Sequence} asks the station to store, as typed values: a judged joint, the record of a
 * part that ended, or one of its events. Each carries {@code atNs}, the station-clock time of the call
 * that made it; the sequence reads no clock and builds no text. The station loop, which hands records
 * to the journal, stamps them with wall-clock time and words the events
 * ({@code hammerstep.station.loop.SequenceRecords}).
 */
public sealed interface SequenceRecord {

    /** Station-clock time (ns) of the event or call that made this record. */
    long atNs();

    /** A pattern position: {@code number} 1-based, {@code name} as the pattern names it. */
    record Position(int number, String name) {
    }

    /** A judged joint on {@code position} of {@code patternId}, with the fitted transducer. */
    record JointJudged(PartIdentity part, String patternId, Position position, String pass, int attempt,
                       JointResult result, String transducerSerial, LocalDate calibrationDue, long atNs)
            implements SequenceRecord {
    }

    /**
     * The record of a part that ended: {@code verdict} GO or NO_GO, {@code ended} how (COMPLETE,
     * ABANDONED, REJECTED, a rejected-as name, INTERRUPTED); {@code startedNs} null when the start is
     * not known (a part interrupted by a stop).
     */
    record PartClosed(PartIdentity part, String patternId, String verdict, String ended, List<String> jointIds,
                      Long startedNs, long atNs) implements SequenceRecord {
        public PartClosed {
            jointIds = List.copyOf(jointIds); // the part's list goes on changing after the record is queued
        }
    }

    /** A station event raised by the sequence; {@code partSerial} the part it concerns, or null. */
    sealed interface Event extends SequenceRecord {

        StationEvent.Severity severity();

        /** The event's code in the results contract. */
        String code();

        String partSerial();
    }

    /** A part was named while another is in work ({@code inWork}), or while faulted ({@code inWork} null). */
    record IdentityIgnored(String partSerial, String inWork, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.WARNING;
        }

        public String code() {
            return "IDENTITY_IGNORED";
        }
    }

    /** A part of a model the station file has no pattern for. */
    record UnknownModel(String partSerial, String model, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.WARNING;
        }

        public String code() {
            return "UNKNOWN_MODEL";
        }
    }

    /** At start: the part was in work when the station stopped, {@code jointsStored} joints on record. */
    record PartInterrupted(String partSerial, int jointsStored, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.ALARM;
        }

        public String code() {
            return "PART_INTERRUPTED";
        }
    }

    /** The plant ended the part in work ({@code cmd/end-part}) for {@code reason}. */
    record PartEndedByPlant(String partSerial, String reason, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.NOTICE;
        }

        public String code() {
            return "PART_ENDED";
        }
    }

    /** A rundown while no position was prompted. */
    record UnexpectedRundown(String partSerial, int blows, double finalTorqueNm, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.ALARM;
        }

        public String code() {
            return "UNEXPECTED_RUNDOWN";
        }
    }

    /** A rundown on {@code position} while {@code prompted} was prompted; {@code rehit} when it was done already. */
    record WrongPosition(String partSerial, Position position, Position prompted, boolean rehit, long atNs)
            implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.ALARM;
        }

        public String code() {
            return rehit ? "REHIT" : "OUT_OF_SEQUENCE";
        }
    }

    /**
     * A loosening of {@code position}: {@code voided} when it was judged GO in this pass (an alarm);
     * {@code inferred} when, without confirm sensors, it was taken as the position judged GO last.
     */
    record Loosened(String partSerial, Position position, boolean voided, boolean inferred, long atNs)
            implements Event {
        public StationEvent.Severity severity() {
            return voided ? StationEvent.Severity.ALARM : StationEvent.Severity.NOTICE;
        }

        public String code() {
            return "LOOSENED";
        }
    }

    /** A fault of the torque signal ({@code faultNames}) locked the tool out. */
    record SensorFault(String partSerial, String faultNames, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.ALARM;
        }

        public String code() {
            return "SENSOR_FAULT";
        }
    }

    /** The signal is healthy again and the supervisor released the lockout. */
    record SensorFaultCleared(String partSerial, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.NOTICE;
        }

        public String code() {
            return "SENSOR_FAULT_CLEARED";
        }
    }

    /** {@code position} is NO_GO after {@code attempts} attempts in {@code pass}. */
    record PositionFailed(String partSerial, Position position, int attempts, String pass, long atNs)
            implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.ALARM;
        }

        public String code() {
            return "POSITION_FAILED";
        }
    }

    /** The NO_GO on {@code position} was acknowledged {@code by} the operator or the supervisor. */
    record ReworkAcknowledged(String partSerial, Position position, String by, long atNs) implements Event {
        public StationEvent.Severity severity() {
            return StationEvent.Severity.NOTICE;
        }

        public String code() {
            return "REWORK_ACKNOWLEDGED";
        }
    }
}
