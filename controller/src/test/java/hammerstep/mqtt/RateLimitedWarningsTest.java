package hammerstep.mqtt;

import ch.qos.logback.classic.Logger;
import ch.qos.logback.classic.LoggerContext;
import ch.qos.logback.classic.spi.ILoggingEvent;
import ch.qos.logback.core.read.ListAppender;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;

import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/** Warnings a client can cause at will: a burst per interval, then one count; time from a hand-advanced clock. */
class RateLimitedWarningsTest {

    private static final long S = 1_000_000_000L;

    private final ListAppender<ILoggingEvent> logged = new ListAppender<>();
    private RateLimitedWarnings warnings;
    private long now = 5 * S;

    @BeforeEach
    void setUp() {
        Logger log = new LoggerContext().getLogger("test");
        logged.start();
        log.addAppender(logged);
        warnings = new RateLimitedWarnings(log, "refused commands", 3, 60 * S);
    }

    private List<String> lines() {
        return logged.list.stream().map(ILoggingEvent::getFormattedMessage).toList();
    }

    @Test
    void logsTheFirstOfAnIntervalAndCountsTheRest() {
        for (int i = 1; i <= 1000; i++) {
            warnings.warn(now, "refused command {}", i);
            now += 10_000_000L; // 100 a second: 10 s in all
        }
        assertThat(lines()).containsExactly("refused command 1", "refused command 2", "refused command 3");
        assertThat(warnings.leftOut()).isEqualTo(997);
    }

    @Test
    void reportsTheCountOnceTheIntervalIsOverEvenWithoutAFurtherWarning() {
        for (int i = 1; i <= 10; i++) {
            warnings.warn(now, "refused command {}", i);
        }
        warnings.poll(now + 60 * S - 1);
        assertThat(lines()).hasSize(3);
        warnings.poll(now + 60 * S);
        assertThat(lines()).hasSize(4).last()
                .isEqualTo("7 more refused commands in the last 60 s not logged (7 in all since start)");
        warnings.poll(now + 600 * S);
        assertThat(lines()).as("the count is logged once").hasSize(4);
    }

    @Test
    void aNewIntervalLogsAgainAndTheTotalKeepsCounting() {
        for (int i = 1; i <= 5; i++) {
            warnings.warn(now, "refused command {}", i);
        }
        now += 61 * S;
        for (int i = 6; i <= 10; i++) {
            warnings.warn(now, "refused command {}", i);
        }
        warnings.poll(now + 60 * S);
        assertThat(lines()).containsExactly("refused command 1", "refused command 2", "refused command 3",
                "2 more refused commands in the last 60 s not logged (2 in all since start)",
                "refused command 6", "refused command 7", "refused command 8",
                "2 more refused commands in the last 60 s not logged (4 in all since start)");
    }

    @Test
    void aQuietIntervalEndsWithoutASummaryAndTheNextWarningIsLoggedAtOnce() {
        warnings.warn(now, "refused command {}", 1);
        warnings.poll(now + 60 * S);
        warnings.warn(now + 3600 * S, "refused command {}", 2);
        assertThat(lines()).containsExactly("refused command 1", "refused command 2");
        assertThat(warnings.leftOut()).isZero();
    }

    @Test
    void worksAcrossTheWrapOfTheNanosecondClock() {
        now = Long.MAX_VALUE - 30 * S;
        for (int i = 1; i <= 4; i++) {
            warnings.warn(now, "refused command {}", i);
        }
        warnings.poll(now + 59 * S); // wraps to a negative value
        assertThat(lines()).hasSize(3);
        warnings.poll(now + 60 * S);
        assertThat(lines()).hasSize(4);
    }

    @Test
    void refusesANonsensicalLimit() {
        Logger log = new LoggerContext().getLogger("x");
        assertThatThrownBy(() -> new RateLimitedWarnings(log, "x", 0, S)).isInstanceOf(IllegalArgumentException.class);
        assertThatThrownBy(() -> new RateLimitedWarnings(log, "x", 1, 0)).isInstanceOf(IllegalArgumentException.class);
    }
}
