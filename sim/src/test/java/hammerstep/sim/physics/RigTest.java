package hammerstep.sim.physics;

import org.junit.jupiter.api.Test;

import static org.assertj.core.api.Assertions.assertThat;

class RigTest {

    private static Rig rig(String tool, String joint, long seed) throws Exception {
        return Rig.create(Presets.tool(tool), Presets.joint(joint), Presets.defaultTransducer(), 20_000, seed);
    }

    private static float[] run(Rig rig, int lead, int hold) {
        float[] out = new float[lead + hold];
        rig.fill(out, 0, lead);
        rig.setTrigger(true);
        rig.fill(out, lead, hold);
        return out;
    }

    @Test
    void sameSeedGivesTheSameSamples() throws Exception {
        float[] a = run(rig("cordless-two-dog", "iso-hard", 7), 1000, 10_000);
        float[] b = run(rig("cordless-two-dog", "iso-hard", 7), 1000, 10_000);
        float[] c = run(rig("cordless-two-dog", "iso-hard", 8), 1000, 10_000);
        assertThat(a).containsExactly(b);
        assertThat(a).isNotEqualTo(c);
    }

    @Test
    void motorRunsOnlyWithTriggerAndEnable() throws Exception {
        Rig r = rig("cordless-two-dog", "iso-hard", 1);
        r.setEnabled(false);
        run(r, 100, 10_000);
        assertThat(r.angleDeg()).isZero();
        assertThat(r.blows()).isZero();
        r.setEnabled(true);
        r.fill(new float[10_000], 0, 10_000);
        assertThat(r.angleDeg()).isGreaterThan(360.0);
    }

    @Test
    void newFastenerStartsLooseWithNoBlows() throws Exception {
        Rig r = rig("cordless-two-dog", "iso-hard", 1);
        run(r, 100, 20_000);
        assertThat(r.blows()).isGreaterThan(3);
        assertThat(r.residualTorqueNm()).isGreaterThan(100.0);
        r.setTrigger(false);
        r.newFastener(Presets.joint("iso-soft"));
        assertThat(r.blows()).isZero();
        assertThat(r.angleDeg()).isZero();
        assertThat(r.joint().name()).isEqualTo("iso-soft");
        assertThat(r.samplesElapsed()).isEqualTo(20_100);
    }

    @Test
    void fillAllocatesNothing() throws Exception {
        Rig r = rig("cordless-two-dog", "iso-hard", 4);
        float[] block = new float[512];
        r.setTrigger(true);
        for (int i = 0; i < 200; i++) {
            r.fill(block, 0, block.length);
        }
        com.sun.management.ThreadMXBean mx =
                (com.sun.management.ThreadMXBean) java.lang.management.ManagementFactory.getThreadMXBean();
        long id = Thread.currentThread().getId();
        long before = mx.getThreadAllocatedBytes(id);
        for (int i = 0; i < 200; i++) {
            r.fill(block, 0, block.length);
        }
        long allocated = mx.getThreadAllocatedBytes(id) - before;
        assertThat(allocated).as("bytes allocated by 200 fills").isLessThan(1024);
        assertThat(r.blows()).isPositive();
    }
}
