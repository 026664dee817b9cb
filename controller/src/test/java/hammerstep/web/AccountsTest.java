package hammerstep.web;

import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

class AccountsTest {

    @TempDir
    Path dir;

    private Path file(String... lines) throws Exception {
        Path f = dir.resolve("web.users");
        Files.write(f, List.of(lines));
        return f;
    }

    @Test
    void aRightPasswordGivesTheAccountsRoleAndAWrongOneNothing() throws Exception {
        byte[] salt = "0123456789abcdef".getBytes();
        Accounts a = Accounts.read(file("# line engineers", Accounts.line("ana", Role.ENGINEER, "torque-200".toCharArray(),
                salt, 10_000), "", Accounts.line("ben", Role.VIEWER, "look".toCharArray(), salt, 10_000)));
        assertThat(a.check("ana", "torque-200".toCharArray())).isEqualTo(Role.ENGINEER);
        assertThat(a.check("ben", "look".toCharArray())).isEqualTo(Role.VIEWER);
        assertThat(a.check("ana", "torque-201".toCharArray())).isNull();
        assertThat(a.check("ben", "torque-200".toCharArray())).isNull();
        assertThat(a.check("carl", "look".toCharArray())).isNull();
    }

    @Test
    void theFileHoldsNoPasswordAndEachLineItsOwnSalt() {
        String one = Accounts.line("ana", Role.VIEWER, "secret-pw".toCharArray());
        String two = Accounts.line("ana", Role.VIEWER, "secret-pw".toCharArray());
        assertThat(one).doesNotContain("secret-pw").startsWith("ana:viewer:pbkdf2-sha256:100000:");
        assertThat(one).isNotEqualTo(two);
    }

    @Test
    void anEngineerMayDoWhatAViewerMayNotTheOtherWayRound() {
        assertThat(Role.ENGINEER.covers(Role.VIEWER)).isTrue();
        assertThat(Role.ENGINEER.covers(Role.ENGINEER)).isTrue();
        assertThat(Role.VIEWER.covers(Role.VIEWER)).isTrue();
        assertThat(Role.VIEWER.covers(Role.ENGINEER)).isFalse();
    }

    @Test
    void refusesAFileItCannotTrustNamingTheLine() throws Exception {
        String good = Accounts.line("ana", Role.VIEWER, "pw".toCharArray(), new byte[16], 10_000);
        assertThatThrownBy(() -> Accounts.read(file("ana:viewer:plain"))).hasMessageStartingWith("line 1: expected");
        assertThatThrownBy(() -> Accounts.read(file(good.replace(":viewer:", ":admin:"))))
                .hasMessage("line 1: role 'admin': expected viewer or engineer");
        assertThatThrownBy(() -> Accounts.read(file(good.replace("pbkdf2-sha256", "md5"))))
                .hasMessageContaining("hash scheme 'md5'");
        assertThatThrownBy(() -> Accounts.read(file(good.replace(":10000:", ":10:"))))
                .hasMessageContaining("iterations must be");
        assertThatThrownBy(() -> Accounts.read(file("# nobody"))).hasMessageContaining("lists no account");
        assertThatThrownBy(() -> Accounts.read(file(good, "", good))).hasMessage("line 3: account 'ana' is listed twice");
    }
}
