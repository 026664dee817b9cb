package hammerstep.station.loop;

import hammerstep.station.Lamps;
import hammerstep.station.OperatorInputs;
import hammerstep.station.PartIdentity;
import hammerstep.station.PartIdentitySource;
import hammerstep.station.ToolEnable;
import hammerstep.station.TowerLamp;

import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;

/** Hand-written fakes of the station's hardware ports. */
final class Fakes {

    private Fakes() {
    }

    static final class RecordingLamps implements Lamps {
        final boolean[] positions;
        final Map<TowerLamp, Boolean> tower = new EnumMap<>(TowerLamp.class);
        int writes;

        RecordingLamps(int n) {
            positions = new boolean[n];
        }

        @Override
        public int positionLamps() {
            return positions.length;
        }

        @Override
        public void position(int index, boolean lit) {
            positions[index] = lit;
            writes++;
        }

        @Override
        public void tower(TowerLamp lamp, boolean lit) {
            tower.put(lamp, lit);
            writes++;
        }

        boolean lit(TowerLamp lamp) {
            return tower.getOrDefault(lamp, false);
        }
    }

    static final class RecordingTool implements ToolEnable {
        boolean enabled;
        final List<Boolean> commands = new ArrayList<>();

        @Override
        public void set(boolean on) {
            enabled = on;
            commands.add(on);
        }
    }

    static final class Inputs implements OperatorInputs {
        boolean ack;
        boolean key;
        boolean present = true;
        boolean partSensor;
        boolean confirm;
        int at = NO_POSITION;
        /** Thrown (an unchecked exception or an Error) from the next read of the button, then cleared. */
        Throwable failWith;

        @Override
        public boolean acknowledge() {
            Throwable t = failWith;
            if (t != null) {
                failWith = null;
                if (t instanceof Error e) {
                    throw e;
                }
                throw (RuntimeException) t;
            }
            return ack;
        }

        @Override
        public boolean supervisorKey() {
            return key;
        }

        @Override
        public boolean hasPartPresent() {
            return partSensor;
        }

        @Override
        public boolean partPresent() {
            return present;
        }

        @Override
        public boolean hasConfirmSensors() {
            return confirm;
        }

        @Override
        public int confirmedPosition() {
            return at;
        }

        @Override
        public boolean hasTrigger() {
            return false;
        }

        @Override
        public boolean trigger() {
            return false;
        }
    }

    static final class Scanner implements PartIdentitySource {
        final ArrayDeque<PartIdentity> queue = new ArrayDeque<>();

        @Override
        public PartIdentity poll() {
            return queue.poll();
        }
    }

    /** A tool output that keeps only its state (the recording fake would grow by every command). */
    static final class Relay implements ToolEnable {
        boolean enabled;

        @Override
        public void set(boolean on) {
            enabled = on;
        }
    }
}
