package hammerstep.results;

import java.time.Instant;

/**
 * An alarm, warning or notice of the station (sensor fault, calibration due, storage low, tool
 * slowing, rework acknowledged, ...).
 *
 * @param code    upper-case code, e.g. {@code SENSOR_FAULT}, {@code STORAGE_LOW}
 * @param message one line for a person
 */
public record StationEvent(Severity severity, String code, String message, String partSerial, Instant at) {

    public enum Severity { ALARM, WARNING, NOTICE }
}
