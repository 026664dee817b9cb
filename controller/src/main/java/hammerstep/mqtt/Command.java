package hammerstep.mqtt;

/** A validated command from the plant. */
public sealed interface Command {

    /** The command's name: the last topic level under {@code cmd/}. */
    String name();

    record StartPart(String serial, String model) implements Command {
        public String name() {
            return "part";
        }
    }

    record EndPart(String reason) implements Command {
        public String name() {
            return "end-part";
        }
    }

    record Reload() implements Command {
        public String name() {
            return "reload";
        }
    }

    record Status() implements Command {
        public String name() {
            return "status";
        }
    }
}
