package hammerstep.sim.demo;

import java.io.PrintStream;

/** Where the demo command writes: standard output, spelt in ASCII ({@code N.m}) when its character set cannot show {@code N·m}. */
public final class DemoOutput {

    private DemoOutput() {
    }

    public static PrintStream stdout() {
        return DemoText.forCharset(System.out, DemoText.stdoutCharset());
    }
}
