package hammerstep.sequence;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.util.Arrays;

import static org.assertj.core.api.Assertions.assertThat;

class OrderTest {

    /** Order as 1-based bolt numbers, as standards print them. */
    private static int[] numbers(int[] order) {
        return Arrays.stream(order).map(i -> i + 1).toArray();
    }

    @Test
    @DisplayName("4 bolts: 1-3-2-4 (ASME PCC-1 legacy cross pattern, as quoted publicly)")
    void fourBoltCrossOrderMatchesPcc1() {
        assertThat(numbers(Order.cross(4))).containsExactly(1, 3, 2, 4);
    }

    @Test
    @DisplayName("8 bolts: 1-5-3-7-2-6-4-8 (ASME PCC-1 legacy cross pattern, as quoted publicly)")
    void eightBoltCrossOrderMatchesPcc1() {
        assertThat(numbers(Order.cross(8))).containsExactly(1, 5, 3, 7, 2, 6, 4, 8);
    }

    @Test
    @DisplayName("12 bolts: 1-7-4-10-2-8-5-11-3-9-6-12 (ASME PCC-1 legacy cross pattern, as quoted publicly)")
    void twelveBoltCrossOrderMatchesPcc1() {
        assertThat(numbers(Order.cross(12))).containsExactly(1, 7, 4, 10, 2, 8, 5, 11, 3, 9, 6, 12);
    }

    @Test
    @DisplayName("16 bolts: 1-9-5-13-3-11-7-15-2-10-6-14-4-12-8-16 (ASME PCC-1 legacy cross pattern, as quoted publicly)")
    void sixteenBoltCrossOrderMatchesPcc1() {
        assertThat(numbers(Order.cross(16)))
                .containsExactly(1, 9, 5, 13, 3, 11, 7, 15, 2, 10, 6, 14, 4, 12, 8, 16);
    }

    @Test
    @DisplayName("five-stud wheel: 1-3-5-2-4 (common practice)")
    void fiveStudWheelGoesRoundAsAStar() {
        assertThat(numbers(Order.cross(5))).containsExactly(1, 3, 5, 2, 4);
    }

    @Test
    void evenCountsFollowEachBoltByTheOneOpposite() {
        assertThat(numbers(Order.cross(6))).containsExactly(1, 4, 2, 5, 3, 6);
        assertThat(numbers(Order.cross(10))).containsExactly(1, 6, 3, 8, 5, 10, 2, 7, 4, 9);
    }

    @Test
    void oddCountsJumpAlmostHalfTheCircle() {
        assertThat(numbers(Order.cross(7))).containsExactly(1, 4, 7, 3, 6, 2, 5);
        assertThat(numbers(Order.cross(3))).containsExactly(1, 2, 3);
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 3, 9, 11, 14, 18, 20, 24, 31, 36, 48, 64, 100, 127, 128})
    void crossOrderVisitsEveryBoltOnce(int n) {
        int[] order = Order.cross(n);
        assertThat(order).hasSize(n);
        assertThat(Arrays.stream(order).sorted().toArray()).isEqualTo(Order.circular(n));
        assertThat(order[0]).isZero();
    }

    @Test
    void circularGoesRoundInNumberOrder() {
        assertThat(numbers(Order.circular(5))).containsExactly(1, 2, 3, 4, 5);
    }
}
