package hammerstep.hardware;

import java.io.ByteArrayOutputStream;

/** An {@link SpiLink} wired to a simulated part; records the bytes sent and counts chip-select frames. */
final class PartLink implements SpiLink {

    final SimulatedPart part;
    final ByteArrayOutputStream sent = new ByteArrayOutputStream();
    int selects;
    int releases;
    boolean selected;
    long pausedNs;

    PartLink(SimulatedPart part) {
        this.part = part;
    }

    @Override
    public void select() {
        selects++;
        selected = true;
    }

    @Override
    public void release() {
        releases++;
        selected = false;
        part.deselected();
    }

    @Override
    public void exchange(byte[] tx, byte[] rx, int length) {
        sent.write(tx, 0, length);
        part.exchange(tx, 0, rx, 0, length);
    }

    @Override
    public void pauseNs(long ns) {
        pausedNs += ns;
    }

    String sentHex() {
        StringBuilder s = new StringBuilder();
        for (byte b : sent.toByteArray()) {
            s.append(s.length() == 0 ? "" : " ").append(String.format("%02X", b & 0xFF));
        }
        return s.toString();
    }
}
