package hammerstep.signal;

import java.lang.reflect.Array;
import java.lang.reflect.Constructor;
import java.lang.reflect.InvocationTargetException;
import java.lang.reflect.RecordComponent;
import java.util.Map;
import java.util.StringJoiner;

/**
 * The one way the input stage's settings ({@link Conditioning}) and carried state
 * ({@link Conditioner.State}) are written as text and read back: one {@code key=value} per record
 * component, keys {@code conditioning.<component>} and {@code conditioner.<component>} (a nested
 * record adds its own name, {@code conditioning.hum.hz}). Numbers are written so that they read
 * back to the same bits. The stored trace keeps them in its metadata.
 *
 * <p>It walks the records' components, so a component added to either record is written and read
 * without a change here; a key a file lacks (written before the component existed) takes the value
 * of the fallback given to {@link #read}. Not for the sample path.
 */
public final class ConditionerText {

    public static final String SETTINGS = "conditioning";
    public static final String STATE = "conditioner";

    private ConditionerText() {
    }

    /** The input stage as a trace carries it: its settings and its state at one block boundary. */
    public record Snapshot(Conditioning settings, Conditioner.State state) {
    }

    /** Writes {@code settings} and {@code state} into {@code into}. */
    public static void write(Conditioning settings, Conditioner.State state, Map<String, String> into) {
        put(SETTINGS, settings, into);
        put(STATE, state, into);
    }

    /**
     * Reads what {@link #write} wrote, or null when {@code from} holds no conditioner state.
     * {@code fallbackSettings} stands in for settings keys that are missing; missing state keys take a
     * fresh conditioner's value (for those settings at {@code rateHz}).
     *
     * @throws IllegalArgumentException naming the key when a value cannot be read
     */
    public static Snapshot read(Map<String, String> from, Conditioning fallbackSettings, double rateHz) {
        if (!hasAny(from, STATE)) {
            return null;
        }
        Conditioning settings = get(SETTINGS, Conditioning.class, fallbackSettings, from);
        Conditioner.State fresh = new Conditioner(settings, rateHz).state();
        return new Snapshot(settings, get(STATE, Conditioner.State.class, fresh, from));
    }

    private static boolean hasAny(Map<String, String> from, String prefix) {
        for (String k : from.keySet()) {
            if (k.startsWith(prefix + ".")) {
                return true;
            }
        }
        return false;
    }

    private static void put(String prefix, Record r, Map<String, String> into) {
        for (RecordComponent c : r.getClass().getRecordComponents()) {
            Object v = value(c, r);
            String key = prefix + "." + c.getName();
            if (v instanceof Record nested) {
                put(key, nested, into);
            } else if (v != null && v.getClass().isArray()) {
                StringJoiner j = new StringJoiner(",");
                for (int i = 0; i < Array.getLength(v); i++) {
                    j.add(String.valueOf(Array.get(v, i)));
                }
                into.put(key, j.toString());
            } else if (v instanceof Enum<?> e) {
                into.put(key, e.name());
            } else {
                // Float/Double.toString read back by parseFloat/parseDouble give the same bits
                into.put(key, String.valueOf(v));
            }
        }
    }

    private static <R extends Record> R get(String prefix, Class<R> type, R fallback, Map<String, String> from) {
        RecordComponent[] cs = type.getRecordComponents();
        Object[] args = new Object[cs.length];
        Class<?>[] types = new Class<?>[cs.length];
        for (int i = 0; i < cs.length; i++) {
            RecordComponent c = cs[i];
            types[i] = c.getType();
            String key = prefix + "." + c.getName();
            Object dflt = fallback == null ? null : value(c, fallback);
            if (c.getType().isRecord()) {
                @SuppressWarnings("unchecked")
                Class<Record> nested = (Class<Record>) c.getType();
                // an absent part (the hum canceller of a stage without one) is written "null"
                args[i] = "null".equals(from.get(key)) ? null
                        : hasAny(from, key) ? get(key, nested, (Record) dflt, from) : dflt;
                continue;
            }
            String text = from.get(key);
            if (text == null) {
                if (fallback == null) {
                    throw new IllegalArgumentException("no " + key);
                }
                args[i] = dflt;
                continue;
            }
            try {
                args[i] = parse(c.getType(), text.trim());
            } catch (RuntimeException e) {
                throw new IllegalArgumentException(key + "=" + text + " is not a " + c.getType().getSimpleName());
            }
        }
        try {
            Constructor<R> k = type.getDeclaredConstructor(types);
            return k.newInstance(args);
        } catch (InvocationTargetException e) {
            throw new IllegalArgumentException(prefix + ": " + e.getCause().getMessage());
        } catch (ReflectiveOperationException e) {
            throw new IllegalStateException(e);
        }
    }

    @SuppressWarnings({"unchecked", "rawtypes"})
    private static Object parse(Class<?> t, String s) {
        if (t == double.class || t == Double.class) {
            return Double.parseDouble(s);
        }
        if (t == float.class || t == Float.class) {
            return Float.parseFloat(s);
        }
        if (t == long.class || t == Long.class) {
            return Long.parseLong(s);
        }
        if (t == int.class || t == Integer.class) {
            return Integer.parseInt(s);
        }
        if (t == short.class || t == Short.class) {
            return Short.parseShort(s);
        }
        if (t == byte.class || t == Byte.class) {
            return Byte.parseByte(s);
        }
        if (t == boolean.class || t == Boolean.class) {
            if (!s.equals("true") && !s.equals("false")) {
                throw new IllegalArgumentException(s);
            }
            return Boolean.parseBoolean(s);
        }
        if (t == String.class) {
            return s;
        }
        if (t.isEnum()) {
            return Enum.valueOf((Class<Enum>) t, s);
        }
        if (t.isArray()) {
            String[] parts = s.isEmpty() ? new String[0] : s.split(",");
            Object a = Array.newInstance(t.getComponentType(), parts.length);
            for (int i = 0; i < parts.length; i++) {
                Array.set(a, i, parse(t.getComponentType(), parts[i].trim()));
            }
            return a;
        }
        throw new IllegalArgumentException("cannot read a " + t.getSimpleName());
    }

    private static Object value(RecordComponent c, Record r) {
        try {
            return c.getAccessor().invoke(r);
        } catch (ReflectiveOperationException e) {
            throw new IllegalStateException(e);
        }
    }
}
