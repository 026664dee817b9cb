package hammerstep.app;

import hammerstep.web.Accounts;
import hammerstep.web.Role;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

import java.io.BufferedReader;
import java.io.Console;
import java.io.IOException;
import java.io.InputStreamReader;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;
import java.util.concurrent.Callable;

/** {@code hammerstep web-user}: one line of the web view's users file, with the password hashed. */
@Command(name = "web-user", mixinStandardHelpOptions = true,
        description = {"Prints one line for the web view's users file (the station file's web.users_file).",
                "The line holds NAME, its role and a PBKDF2-HMAC-SHA256 hash of the password with a fresh salt; the password itself",
                "is never written. Asks for the password twice on a terminal, or reads one line from standard input.",
                "Example: hammerstep web-user ana --role engineer >> /etc/hammerstep/web.users"})
public final class WebUserCommand implements Callable<Integer> {

    @Parameters(index = "0", paramLabel = "NAME", description = "account name: 1 to 64 letters, digits, '.', '_' or '-'")
    String name;

    @Option(names = "--role", paramLabel = "ROLE", defaultValue = "viewer",
            description = "viewer (looks) or engineer (may also run what-if studies; default: ${DEFAULT-VALUE})")
    String role;

    @Override
    public Integer call() throws IOException {
        if (!name.matches("[A-Za-z0-9._-]{1,64}")) {
            throw new UserError("web-user: NAME must be 1 to 64 letters, digits, '.', '_' or '-', got " + cut(name), 2);
        }
        Role r = switch (role) {
            case "viewer" -> Role.VIEWER;
            case "engineer" -> Role.ENGINEER;
            default -> throw new UserError("web-user: --role must be viewer or engineer, got " + cut(role), 2);
        };
        char[] password = password();
        try {
            if (password.length < 8) {
                throw new UserError("web-user: the password must have at least 8 characters", 2);
            }
            System.out.println(Accounts.line(name, r, password));
        } finally {
            Arrays.fill(password, '\0');
        }
        return 0;
    }

    private static char[] password() throws IOException {
        Console console = System.console();
        if (console != null) {
            char[] a = console.readPassword("password: ");
            char[] b = console.readPassword("again: ");
            if (a == null || b == null || !Arrays.equals(a, b)) {
                throw new UserError("web-user: the two passwords differ", 2);
            }
            Arrays.fill(b, '\0');
            return a;
        }
        BufferedReader in = new BufferedReader(new InputStreamReader(System.in, StandardCharsets.UTF_8), 256);
        char[] buf = new char[257];
        int n = 0;
        int c;
        while (n < buf.length && (c = in.read()) >= 0 && c != '\n' && c != '\r') {
            buf[n++] = (char) c;
        }
        if (n == buf.length) {
            throw new UserError("web-user: the password is longer than 256 characters", 2);
        }
        char[] pw = Arrays.copyOf(buf, n);
        Arrays.fill(buf, '\0');
        return pw;
    }

    private static String cut(String s) {
        return s.length() > 40 ? s.substring(0, 40) + "..." : s;
    }
}
