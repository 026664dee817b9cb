package hammerstep.results;

import java.util.concurrent.atomic.AtomicLong;

/**
 * Single-producer, single-consumer rings with their slots allocated once, as {@code SampleRing}
 * hands sample blocks over: the producer writes a slot, then publishes the tail (release); the
 * consumer reads the tail (acquire), takes the slot, then publishes the head. Neither side waits or
 * locks; a full ring refuses the offer. (Agrona's one-to-one queues would do, but they need
 * {@code jdk.internal.misc} exported to run on Java 17; these need nothing.)
 */
final class Spsc {

    private Spsc() {
    }

    private static int checkedCapacity(int capacity) {
        if (capacity < 2 || Integer.bitCount(capacity) != 1) {
            throw new IllegalArgumentException("capacity must be a power of two of at least 2: " + capacity);
        }
        return capacity;
    }

    /** A ring of references. */
    static final class Queue<E> {
        private final Object[] slots;
        private final int mask;
        private final AtomicLong head = new AtomicLong(); // written by the consumer
        private final AtomicLong tail = new AtomicLong(); // written by the producer
        private long cachedHead; // producer's view of head

        Queue(int capacity) {
            this.slots = new Object[checkedCapacity(capacity)];
            this.mask = capacity - 1;
        }

        /** Producer: false when the ring is full. */
        boolean offer(E e) {
            long t = tail.get();
            if (t - cachedHead > mask) {
                cachedHead = head.get();
                if (t - cachedHead > mask) {
                    return false;
                }
            }
            slots[(int) t & mask] = e;
            tail.lazySet(t + 1);
            return true;
        }

        /** Consumer: the oldest element, or null. */
        @SuppressWarnings("unchecked")
        E poll() {
            long h = head.get();
            if (h == tail.get()) {
                return null;
            }
            int slot = (int) h & mask;
            E e = (E) slots[slot];
            slots[slot] = null;
            head.lazySet(h + 1);
            return e;
        }

        /** Consumer: room left (at least this much; the producer may only take more room away). */
        int remainingCapacity() {
            return mask + 1 - size();
        }

        /** Elements waiting (exact on one thread, a snapshot across threads). */
        int size() {
            return (int) (tail.get() - head.get());
        }
    }

    /** A ring of primitive longs (no boxing). */
    static final class Longs {
        private final long[] slots;
        private final int mask;
        private final AtomicLong head = new AtomicLong();
        private final AtomicLong tail = new AtomicLong();
        private long cachedHead;

        Longs(int capacity) {
            this.slots = new long[checkedCapacity(capacity)];
            this.mask = capacity - 1;
        }

        /** Producer: false when the ring is full. */
        boolean offer(long value) {
            long t = tail.get();
            if (t - cachedHead > mask) {
                cachedHead = head.get();
                if (t - cachedHead > mask) {
                    return false;
                }
            }
            slots[(int) t & mask] = value;
            tail.lazySet(t + 1);
            return true;
        }

        /** Consumer: true when a value waits; then {@link #take()} it. */
        boolean isEmpty() {
            return head.get() == tail.get();
        }

        /** Consumer: the oldest value; only after {@link #isEmpty()} said false. */
        long take() {
            long h = head.get();
            long v = slots[(int) h & mask];
            head.lazySet(h + 1);
            return v;
        }
    }
}
