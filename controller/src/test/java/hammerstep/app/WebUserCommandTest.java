package hammerstep.app;

import hammerstep.web.Accounts;
import hammerstep.web.Role;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.InputStream;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

import static org.assertj.core.api.Assertions.assertThat;

class WebUserCommandTest {

    @TempDir
    Path dir;

    private static synchronized String[] run(String stdin, String... args) {
        PrintStream savedOut = System.out;
        InputStream savedIn = System.in;
        ByteArrayOutputStream bytes = new ByteArrayOutputStream();
        StringWriter err = new StringWriter();
        try (PrintStream capture = new PrintStream(bytes, true, StandardCharsets.UTF_8)) {
            System.setIn(new ByteArrayInputStream(stdin.getBytes(StandardCharsets.UTF_8)));
            System.setOut(capture);
            var cl = Main.commandLine(args);
            cl.setErr(new PrintWriter(err, true));
            int exit = cl.execute(args);
            return new String[] {Integer.toString(exit), bytes.toString(StandardCharsets.UTF_8), err.toString()};
        } finally {
            System.setOut(savedOut);
            System.setIn(savedIn);
        }
    }

    @Test
    void printsALineTheViewAcceptsForThatPasswordOnly() throws Exception {
        String[] r = run("fixture-7 torque\n", "web-user", "ana", "--role", "engineer");
        assertThat(r[0]).isEqualTo("0");
        assertThat(r[1]).doesNotContain("fixture-7").startsWith("ana:engineer:pbkdf2-sha256:");
        Path users = dir.resolve("web.users");
        Files.writeString(users, r[1]);
        Accounts accounts = Accounts.read(users);
        assertThat(accounts.check("ana", "fixture-7 torque".toCharArray())).isEqualTo(Role.ENGINEER);
        assertThat(accounts.check("ana", "fixture-7".toCharArray())).isNull();
    }

    @Test
    void refusesAShortPasswordAnUnknownRoleAndABadNameInOneLine() {
        assertThat(run("short\n", "web-user", "ana")[2]).isEqualTo("web-user: the password must have at least 8 characters\n");
        String[] role = run("long enough\n", "web-user", "ana", "--role", "admin");
        assertThat(role[0]).isEqualTo("2");
        assertThat(role[2]).contains("--role must be viewer or engineer, got admin");
        assertThat(run("long enough\n", "web-user", "a:b")[2]).contains("NAME must be");
    }
}
