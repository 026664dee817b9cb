package hammerstep.signal;

import org.junit.jupiter.api.Test;

import java.util.LinkedHashMap;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * A conditioner's carried state can be taken, copied, written as text and put back, and a conditioner
 * put back into it conditions the samples that follow exactly as the original does (what the replay of a
 * stored trace rests on).
 */
class ConditionerStateTest {

    private static final double RATE = 20_000;
    private static final int BLOCK = 16;
    private static final Conditioning SETTINGS = new Conditioning(5.0, 3.0, 200.0, 900.0, 2.0, 2_000.0);

    /** Quiet with an offset (zero tracks), a flat stretch, a NaN, a rise: every part of the state moves. */
    private static float[] signal(long seed, int n) {
        Random r = new Random(seed);
        float[] x = new float[n];
        for (int i = 0; i < n; i++) {
            double t = i / RATE;
            x[i] = (float) (0.7 + 0.05 * r.nextGaussian() + (t > 0.05 ? 150 * Math.sin(Math.PI * (t - 0.05) / 0.02) : 0));
        }
        for (int i = 400; i < 480; i++) {
            x[i] = 0.75f;
        }
        x[300] = Float.NaN;
        return x;
    }

    private static Conditioner fedWith(float[] x, int upTo) {
        Conditioner c = new Conditioner(SETTINGS, RATE);
        float[] out = new float[BLOCK];
        for (int at = 0; at < upTo; at += BLOCK) {
            c.process(x, at, BLOCK, out, true);
        }
        return c;
    }

    /** A state as its text: compares array components by content, which a record's equals does not. */
    private static Map<String, String> text(Conditioner.State state) {
        Map<String, String> m = new LinkedHashMap<>();
        ConditionerText.write(SETTINGS, state, m);
        return m;
    }

    @Test
    void aConditionerPutBackIntoAStateConditionsTheRestAlike() {
        float[] x = signal(3, 4096);
        for (int split : new int[] {0, 304, 464, 960, 1216}) {
            Conditioner original = fedWith(x, split);
            Conditioner restored = new Conditioner(SETTINGS, RATE);
            restored.restore(original.state());
            assertThat(text(restored.state())).isEqualTo(text(original.state()));

            float[] a = new float[BLOCK];
            float[] b = new float[BLOCK];
            for (int at = split; at < x.length; at += BLOCK) {
                boolean idle = at < 1000;
                int fa = original.process(x, at, BLOCK, a, idle);
                int fb = restored.process(x, at, BLOCK, b, idle);
                assertThat(fb).isEqualTo(fa);
                assertThat(b).containsExactly(a);
            }
        }
    }

    @Test
    void copyStateToCarriesEveryComponent() {
        float[] x = signal(4, 1024);
        Conditioner original = fedWith(x, 1024);
        Conditioner copy = new Conditioner(SETTINGS, RATE);

        original.copyStateTo(copy);

        assertThat(text(copy.state())).isEqualTo(text(original.state()));
        assertThat(original.state().zeroSet()).isTrue();
        assertThat(original.state().z1()).isNotZero();
    }

    @Test
    void settingsAndStateReadBackFromTextToTheSameBits() {
        float[] x = signal(5, 2048);
        for (int upTo : new int[] {0, 304, 2048}) {
            Conditioner c = fedWith(x, upTo);
            Map<String, String> text = new LinkedHashMap<>();

            ConditionerText.write(SETTINGS, c.state(), text);
            ConditionerText.Snapshot back = ConditionerText.read(text, null, RATE);

            assertThat(back.settings()).isEqualTo(SETTINGS);
            assertThat(text(back.state())).isEqualTo(text(c.state()));
            assertThat(text).containsKey("conditioning.lowPassHz").containsKey("conditioner.zeroNm");
        }
    }

    @Test
    void textWithoutStateReadsAsNone() {
        assertThat(ConditionerText.read(Map.of("program", "hub-final"), SETTINGS, RATE)).isNull();
    }

    @Test
    void aMissingStateKeyTakesAFreshConditionersValue() {
        Map<String, String> text = new LinkedHashMap<>();
        ConditionerText.write(SETTINGS, fedWith(signal(6, 512), 512).state(), text);
        text.remove("conditioner.z2");

        ConditionerText.Snapshot back = ConditionerText.read(text, null, RATE);

        assertThat(back.state().z2()).isZero();
        assertThat(back.state().zeroSet()).isTrue();
    }

    @Test
    void anUnreadableValueIsNamedByItsKey() {
        Map<String, String> text = new LinkedHashMap<>();
        ConditionerText.write(SETTINGS, new Conditioner(SETTINGS, RATE).state(), text);
        text.put("conditioner.zeroSet", "maybe");

        assertThatThrownBy(() -> ConditionerText.read(text, null, RATE))
                .isInstanceOf(IllegalArgumentException.class).hasMessage("conditioner.zeroSet=maybe is not a boolean");
    }
}
