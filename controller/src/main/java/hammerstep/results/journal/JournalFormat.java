package hammerstep.results.journal;

import java.nio.ByteBuffer;
import java.util.zip.CRC32C;

/**
 * The byte layout of the journal. Every record is framed as
 * {@code magic u32 | body length u32 | CRC32C(body) u32 | body}, big-endian. Bodies:
 * <ul>
 *   <li>{@code START}: type u8, segment number u64, next position u64, next seq u64 per kind</li>
 *   <li>{@code RESULT}: type u8, position u64, kind u8, seq u64, id length u16, id UTF-8, payload</li>
 *   <li>{@code DELIVERED}: type u8, position u64</li>
 *   <li>{@code GONE}: type u8, kind u8, reported u8, first seq u64, last seq u64: a range of
 *       results found missing; reported 0 when found by a cross check and not yet reported (a
 *       later start reports it), 1 once reported as an alarm (a later start does not report it again)</li>
 * </ul>
 * The magic lets a reader find the next whole record after damage.
 */
final class JournalFormat {

    static final int MAGIC = 0x48534A31;
    static final int FRAME = 12;
    static final int MAX_BODY = 1 << 20;
    static final byte START = 1;
    static final byte RESULT = 2;
    static final byte DELIVERED = 3;
    static final byte GONE = 4;
    /** Bytes of a RESULT body before the id. */
    static final int RESULT_FIXED = 1 + 8 + 1 + 8 + 2;
    static final int DELIVERED_BODY = 1 + 8;
    static final int GONE_BODY = 1 + 1 + 1 + 8 + 8;

    private JournalFormat() {
    }

    /** Length of the valid body framed at {@code at}, or -1 when no whole, intact record starts there. */
    static int validAt(ByteBuffer buf, int at, int end, CRC32C crc) {
        if (end - at < FRAME || buf.getInt(at) != MAGIC) {
            return -1;
        }
        int length = buf.getInt(at + 4);
        if (length < 1 || length > MAX_BODY || length > end - at - FRAME) {
            return -1;
        }
        crc.reset();
        crc.update(buf.duplicate().position(at + FRAME).limit(at + FRAME + length));
        return (int) crc.getValue() == buf.getInt(at + 8) ? length : -1;
    }

    /** The first offset after {@code from} where an intact record starts, or -1. */
    static int nextValid(ByteBuffer buf, int from, int end, CRC32C crc) {
        for (int at = from; at <= end - FRAME; at++) {
            if (buf.getInt(at) == MAGIC && validAt(buf, at, end, crc) >= 0) {
                return at;
            }
        }
        return -1;
    }

    /** Frames the body written in {@code out} from {@link #FRAME} to its position; leaves it ready to write. */
    static void seal(ByteBuffer out, CRC32C crc) {
        int end = out.position();
        int length = end - FRAME;
        crc.reset();
        crc.update(out.duplicate().position(FRAME).limit(end));
        out.putInt(0, MAGIC).putInt(4, length).putInt(8, (int) crc.getValue());
        out.flip();
    }
}
