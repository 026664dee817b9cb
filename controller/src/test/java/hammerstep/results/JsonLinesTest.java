package hammerstep.results;

import com.fasterxml.jackson.databind.ObjectMapper;
import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import java.io.IOException;
import java.math.BigDecimal;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;

import static org.assertj.core.api.Assertions.assertThat;

class JsonLinesTest {

    private static final ObjectMapper JACKSON = new ObjectMapper();

    /** The oracle: Jackson's own serialization of the same plain values, with its default settings. */
    private static String jackson(Map<String, ?> value) throws IOException {
        return JACKSON.writeValueAsString(value);
    }

    @ParameterizedTest(name = "seed {0}")
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8})
    @DisplayName("random nested values: the same text as jackson-core's generator")
    void writesWhatJacksonWrites(long seed) throws IOException {
        Random rnd = new Random(seed);
        for (int n = 0; n < 500; n++) {
            Map<String, Object> value = map(rnd, 0);
            assertThat(JsonLines.of(value)).as("seed %d, value %d", seed, n).isEqualTo(jackson(value));
        }
    }

    @Test
    @DisplayName("every character below 0x80 and some beyond, in keys and values, escaped as jackson does")
    void escapesLikeJackson() throws IOException {
        StringBuilder all = new StringBuilder();
        for (char c = 0; c < 0x80; c++) {
            all.append(c);
        }
        all.append("é€\u2028\u2029\uD83D\uDD27\uFFFF");
        Map<String, Object> value = new LinkedHashMap<>();
        value.put(all.toString(), all.toString());
        value.put("\"", "\\");
        assertThat(JsonLines.of(value)).isEqualTo(jackson(value));
    }

    @Test
    @DisplayName("numbers without a JSON form are strings; the line parses back to the same values")
    void numbersParseBack() throws IOException {
        Map<String, Object> value = new LinkedHashMap<>();
        value.put("nan", Double.NaN);
        value.put("inf", Double.NEGATIVE_INFINITY);
        value.put("peaks_nm", List.of(204.04, -0.0, 1e-7, 1.0e7, 12.5f));
        value.put("seq", Long.MAX_VALUE);
        String line = JsonLines.of(value);
        assertThat(line).isEqualTo("{\"nan\":\"NaN\",\"inf\":\"-Infinity\","
                + "\"peaks_nm\":[204.04,-0.0,1.0E-7,1.0E7,12.5],\"seq\":9223372036854775807}");
        Map<?, ?> back = JACKSON.readValue(line, Map.class);
        assertThat(back.get("peaks_nm")).isEqualTo(List.of(204.04, -0.0, 1e-7, 1.0e7, 12.5));
        assertThat(back.get("seq")).isEqualTo(Long.MAX_VALUE);
    }

    private static Map<String, Object> map(Random rnd, int depth) {
        Map<String, Object> m = new LinkedHashMap<>();
        int n = rnd.nextInt(6);
        for (int i = 0; i < n; i++) {
            m.put(string(rnd), value(rnd, depth + 1));
        }
        return m;
    }

    private static Object value(Random rnd, int depth) {
        int kind = rnd.nextInt(depth < 4 ? 14 : 12);
        switch (kind) {
            case 0: return null;
            case 1: return string(rnd);
            case 2: return rnd.nextInt();
            case 3: return rnd.nextLong();
            case 4: return rnd.nextGaussian() * Math.pow(10, rnd.nextInt(40) - 20);
            case 5: return Math.round(rnd.nextDouble() * 100_000) / 100.0;
            case 6: return special(rnd);
            case 7: return (float) (rnd.nextGaussian() * 1000);
            case 8: return rnd.nextBoolean();
            case 9: return new BigDecimal(rnd.nextInt(100_000)).movePointLeft(rnd.nextInt(8) - 2);
            case 10: return (short) rnd.nextInt(1000);
            case 11: return Thread.State.values()[rnd.nextInt(Thread.State.values().length)];
            case 12: return map(rnd, depth);
            default: {
                List<Object> l = new ArrayList<>();
                for (int i = rnd.nextInt(5); i > 0; i--) {
                    l.add(value(rnd, depth + 1));
                }
                return l;
            }
        }
    }

    private static double special(Random rnd) {
        double[] values = {Double.NaN, Double.POSITIVE_INFINITY, Double.NEGATIVE_INFINITY, -0.0, 0.0,
                Double.MIN_VALUE, Double.MAX_VALUE, 1e-3, 9.999999e-4, 1e7, 9_999_999.99, 2e23};
        return values[rnd.nextInt(values.length)];
    }

    private static String string(Random rnd) {
        StringBuilder sb = new StringBuilder();
        for (int i = rnd.nextInt(12); i > 0; i--) {
            int pick = rnd.nextInt(10);
            if (pick < 5) {
                sb.append((char) ('a' + rnd.nextInt(26)));
            } else if (pick < 7) {
                sb.append((char) rnd.nextInt(0x80));
            } else if (pick < 8) {
                sb.append("\"\\/");
            } else if (pick < 9) {
                sb.append((char) (0x80 + rnd.nextInt(0x3000)));
            } else {
                sb.append("\uD83D\uDD29");
            }
        }
        return sb.toString();
    }
}
