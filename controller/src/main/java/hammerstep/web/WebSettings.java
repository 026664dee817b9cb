package hammerstep.web;

import hammerstep.config.MapReader;
import hammerstep.mqtt.PasswordFile;
import hammerstep.mqtt.PemFiles;
import hammerstep.config.StationSection;

import java.net.InetAddress;
import java.net.UnknownHostException;
import java.nio.file.Path;

/**
 * The {@code web:} section of the station file: the line engineer's web view. Without the section
 * the station serves nothing.
 *
 * <pre>
 * web:
 *   bind: 127.0.0.1                          # default: loopback only
 *   port: 8080                               # default 8080
 *   users_file: /etc/hammerstep/web.users    # name:role:hash lines (hammerstep web-user); chmod 600
 *   cert_file: /etc/hammerstep/station.pem   # optional: serve https with this certificate (PEM, chain allowed)
 *   key_file: /etc/hammerstep/station.key    # its private key: PEM, unencrypted PKCS#8; chmod 600
 * </pre>
 *
 * Bound to loopback, {@code users_file} may be left out: the view is then open, as a viewer, to
 * whoever can reach the station's own loopback. Bound anywhere else it is required.
 * {@code cert_file} and {@code key_file} are the broker section's keys with the same formats and
 * the same checks; with them the view speaks HTTPS only (TLS 1.2 or 1.3).
 *
 * @param usersFile the accounts file, or null for an open loopback view
 * @param certFile  the server certificate for HTTPS, or null for plain HTTP
 * @param keyFile   its private key, or null
 */
public record WebSettings(String bind, int port, Path usersFile, Path certFile, Path keyFile) {

    /** Plain HTTP settings. */
    public WebSettings(String bind, int port, Path usersFile) {
        this(bind, port, usersFile, null, null);
    }

    /** The section as a station file section; registered in {@code hammerstep.app.StationSections}. */
    public static final StationSection<WebSettings> SECTION = new StationSection<>() {
        @Override
        public String key() {
            return "web";
        }

        @Override
        public boolean required() {
            return false;
        }

        @Override
        public WebSettings read(MapReader section, Path base) {
            return WebSettings.read(section, base);
        }
    };

    /** An open view on loopback at {@code port} (the demo's {@code --web}). */
    public static WebSettings loopback(int port) {
        return new WebSettings("127.0.0.1", port, null);
    }

    /** True when the view speaks HTTPS. */
    public boolean tls() {
        return certFile != null;
    }

    /** {@code https} or {@code http}. */
    public String scheme() {
        return tls() ? "https" : "http";
    }

    /** True when the address is a loopback address (127.0.0.0/8, ::1, localhost). */
    public boolean loopbackOnly() {
        return isLoopback(bind);
    }

    static boolean isLoopback(String host) {
        if (host.equals("localhost")) {
            return true;
        }
        if (!host.matches("[0-9.]+|[0-9A-Fa-f:]+")) {
            return false; // a name: never resolved here, never taken for loopback
        }
        try {
            return InetAddress.getByName(host).isLoopbackAddress();
        } catch (UnknownHostException e) {
            return false;
        }
    }

    static WebSettings read(MapReader r, Path base) {
        String bind = r.string("bind", "127.0.0.1");
        int port = r.integer("port", 8080, 1, 65535);
        String users = r.has("users_file") ? r.string("users_file") : null;
        String cert = r.has("cert_file") ? r.string("cert_file") : null;
        String key = r.has("key_file") ? r.string("key_file") : null;
        r.finish();
        boolean literal = bind.matches("[0-9.]+|[0-9A-Fa-f:]+") && !bind.isEmpty();
        boolean bindOk = true;
        if (!literal && !bind.equals("localhost")) {
            bindOk = false;
            r.problem("bind", "'" + r.path("bind") + "' is \"" + bind
                    + "\": expected an address of this station (127.0.0.1, 0.0.0.0, 192.168.10.5, ::1)");
        } else if (literal) {
            try {
                InetAddress.getByName(bind);
            } catch (UnknownHostException e) {
                bindOk = false;
                r.problem("bind", "'" + r.path("bind") + "' is \"" + bind + "\": not an IP address");
            }
        }
        Path usersFile = users == null ? null : base.resolve(users).normalize();
        if (bindOk && usersFile == null && !isLoopback(bind)) {
            r.problem("bind", "'" + r.path("bind") + "' is " + bind
                    + ": a view reachable from the network needs 'users_file' (accounts with hashed passwords)");
        }
        if (usersFile != null) {
            String why = PasswordFile.problem(usersFile);
            if (why != null) {
                r.problem("users_file", "'" + r.path("users_file") + "': " + why);
            } else {
                try {
                    Accounts.read(usersFile);
                } catch (Accounts.AccountsException e) {
                    r.problem("users_file", "'" + r.path("users_file") + "': " + e.getMessage());
                }
            }
        }
        PemFiles.checkCertificateAndKey(r, base, cert, key, "the view's certificate");
        return new WebSettings(bind, port, usersFile, cert == null ? null : base.resolve(cert).normalize(),
                key == null ? null : base.resolve(key).normalize());
    }
}
