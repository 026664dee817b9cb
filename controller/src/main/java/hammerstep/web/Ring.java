package hammerstep.web;

import java.util.ArrayList;
import java.util.List;

/**
 * The last {@code capacity} items added, for one writer thread and any number of readers, without a
 * lock: the writer fills a slot, then publishes the new count through a volatile field; a reader
 * reads the count first, then the slots, and skips a slot the writer has meanwhile filled anew
 * (its index tells). Items must be immutable.
 */
final class Ring<T> {

    private record Slot<T>(long index, T item) { }

    private final Slot<T>[] slots;
    private volatile long written;

    @SuppressWarnings("unchecked")
    Ring(int capacity) {
        if (capacity < 1) {
            throw new IllegalArgumentException("capacity must be at least 1");
        }
        this.slots = (Slot<T>[]) new Slot<?>[capacity];
    }

    /** Writer thread only. */
    void add(T item) {
        long n = written;
        slots[(int) (n % slots.length)] = new Slot<>(n, item);
        written = n + 1;
    }

    /** Items added so far, including those no longer kept. */
    long added() {
        return written;
    }

    /** The items kept, oldest first. */
    List<T> items() {
        long n = written;
        long from = Math.max(0, n - slots.length);
        List<T> out = new ArrayList<>((int) (n - from));
        for (long i = from; i < n; i++) {
            Slot<T> s = slots[(int) (i % slots.length)];
            if (s != null && s.index() == i) {
                out.add(s.item());
            }
        }
        return out;
    }
}
