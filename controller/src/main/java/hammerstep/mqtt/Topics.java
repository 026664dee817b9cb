package hammerstep.mqtt;

import hammerstep.results.MessageKind;
import hammerstep.results.StationId;

/** The station's topics: {@code hammerstep/v1/{site}/{line}/{station}/} then joint, part, event, status, cmd/NAME. */
public final class Topics {

    private final String prefix;

    public Topics(StationId station) {
        this.prefix = "hammerstep/v1/" + station.site() + "/" + station.line() + "/" + station.station() + "/";
    }

    public String prefix() {
        return prefix;
    }

    public String result(MessageKind kind) {
        return prefix + kind.topic();
    }

    public String status() {
        return prefix + "status";
    }

    /** The filter the station subscribes to for its commands. */
    public String commands() {
        return prefix + "cmd/+";
    }

    /** The command name of a topic under {@code cmd/}, or null when the topic is not one. */
    public String commandName(String topic) {
        String cmd = prefix + "cmd/";
        // an empty last level ("cmd/") is a legal topic that cmd/+ delivers: it gets an UNKNOWN_COMMAND answer
        return topic.startsWith(cmd) ? topic.substring(cmd.length()) : null;
    }
}
