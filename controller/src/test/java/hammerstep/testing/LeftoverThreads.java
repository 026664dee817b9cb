package hammerstep.testing;

import org.junit.platform.launcher.TestExecutionListener;
import org.junit.platform.launcher.TestPlan;

import java.util.Map;

/**
 * Prints every non-daemon thread still alive when the test run ends, with its stack: such a
 * thread keeps the test JVM from exiting (Surefire then waits and kills its fork) and is a leak in
 * the code under test. Registered through META-INF/services; prints nothing when all is clean.
 */
public final class LeftoverThreads implements TestExecutionListener {

    @Override
    public void testPlanExecutionFinished(TestPlan testPlan) {
        for (Map.Entry<Thread, StackTraceElement[]> e : Thread.getAllStackTraces().entrySet()) {
            Thread t = e.getKey();
            if (t.isDaemon() || !t.isAlive() || t == Thread.currentThread() || t.getName().equals("main")
                    || t.getName().startsWith("surefire-") || t.getName().equals("DestroyJavaVM")) {
                continue;
            }
            StringBuilder sb = new StringBuilder("LEFTOVER non-daemon thread after the tests: \"")
                    .append(t.getName()).append("\" ").append(t.getState());
            for (StackTraceElement s : e.getValue()) {
                sb.append("\n\tat ").append(s);
            }
            System.err.println(sb);
        }
    }
}
