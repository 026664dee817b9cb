package hammerstep.testing;

import org.junit.jupiter.api.extension.AfterEachCallback;
import org.junit.jupiter.api.extension.BeforeEachCallback;
import org.junit.jupiter.api.extension.ExtensionContext;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;

/**
 * Captures {@code System.out} and {@code System.err} (UTF-8) during each test and puts the
 * originals back after it, for tests of what a command prints. Register it on an instance field:
 * {@code @RegisterExtension final StandardStreams streams = new StandardStreams();}. Not for tests
 * that run concurrently: the streams are the JVM's.
 */
public final class StandardStreams implements BeforeEachCallback, AfterEachCallback {

    private final ByteArrayOutputStream out = new ByteArrayOutputStream();
    private final ByteArrayOutputStream err = new ByteArrayOutputStream();
    private PrintStream savedOut;
    private PrintStream savedErr;

    @Override
    public void beforeEach(ExtensionContext context) {
        savedOut = System.out;
        savedErr = System.err;
        System.setOut(new PrintStream(out, true, StandardCharsets.UTF_8));
        System.setErr(new PrintStream(err, true, StandardCharsets.UTF_8));
    }

    @Override
    public void afterEach(ExtensionContext context) {
        System.setOut(savedOut);
        System.setErr(savedErr);
    }

    /** All printed to standard output so far in this test. */
    public String out() {
        return out.toString(StandardCharsets.UTF_8);
    }

    /** All printed to standard error so far in this test, or since {@link #clearErr()}. */
    public String err() {
        return err.toString(StandardCharsets.UTF_8);
    }

    /** The lines printed to standard output while {@code command} ran. */
    public java.util.List<String> linesOf(Runnable command) {
        long before = out().lines().count();
        command.run();
        return out().lines().skip(before).toList();
    }

    /** Forgets what was printed to standard error, so that the next command's lines stand alone. */
    public void clearErr() {
        err.reset();
    }

    /** Forgets what was printed to both streams, for a test that runs several commands in turn. */
    public void clear() {
        out.reset();
        err.reset();
    }
}
