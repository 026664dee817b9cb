package hammerstep.station;

/**
 * Who the part in the fixture is.
 *
 * @param serial the part's serial number as scanned
 * @param model  the part model, which the station file maps to a pattern
 */
public record PartIdentity(String serial, String model) {

    public PartIdentity {
        if (serial == null || serial.isBlank()) {
            throw new IllegalArgumentException("a part needs a serial number");
        }
        if (model == null || model.isBlank()) {
            throw new IllegalArgumentException("a part needs a model");
        }
    }
}
