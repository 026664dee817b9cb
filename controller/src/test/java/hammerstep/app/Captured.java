package hammerstep.app;

import picocli.CommandLine;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;

/** Runs a {@code hammerstep} command line in-process and keeps what it printed. */
record Captured(int exit, String out, String err) {

    static synchronized Captured run(String... args) {
        PrintStream saved = System.out;
        java.io.InputStream savedIn = System.in;
        // `run` reads part identities from standard input on a thread of its own; in a Surefire fork
        // standard input is Maven's command channel, and a reader there swallowed its end-of-run
        // acknowledgement (the fork then waited 30 s and killed itself). Give commands an empty input.
        System.setIn(new java.io.ByteArrayInputStream(new byte[0]));
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        StringWriter err = new StringWriter();
        try (PrintStream capture = new PrintStream(bytes, true, StandardCharsets.UTF_8)) {
            System.setOut(capture);
            CommandLine cl = Main.commandLine(args);
            cl.setErr(new PrintWriter(err, true));
            cl.setOut(new PrintWriter(capture, true));
            int exit = cl.execute(args);
            capture.flush();
            return new Captured(exit, bytes.toString(StandardCharsets.UTF_8), err.toString());
        } finally {
            System.setOut(saved);
            System.setIn(savedIn);
        }
    }
}
