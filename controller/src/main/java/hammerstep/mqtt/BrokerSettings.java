package hammerstep.mqtt;

import hammerstep.config.MapReader;

import java.net.URI;
import java.net.URISyntaxException;
import java.nio.file.Path;

/**
 * The {@code broker:} section of the station file.
 *
 * <pre>
 * broker:
 *   url: ssl://mqtt.plant.example:8883    # tcp://host:port or ssl://host:port
 *   client_id: hub-fit-1                  # default: site-line-station
 *   username: hub-fit-1                   # optional
 *   password_file: /etc/hammerstep/mqtt.pass   # read at connect; must not be readable by others
 *   ca_file: /etc/hammerstep/plant-ca.pem      # ssl only: trust these CAs instead of the JVM's
 *   cert_file: /etc/hammerstep/station.pem     # ssl only, optional: client certificate (PEM, chain allowed)
 *   key_file: /etc/hammerstep/station.key      # its private key: PEM, unencrypted PKCS#8; chmod 600
 *   keep_alive_s: 30
 *   connect_timeout_s: 5
 *   reconnect: { min_ms: 500, max_ms: 30000 }
 *   session_expiry_s: 3600   # how long the broker keeps our command subscription while we are away
 *   command_max_expiry_s: 300
 *   status_interval_s: 60
 *   inflight: 32             # results published and not yet acknowledged, at most
 * </pre>
 *
 * {@link #toString()} never shows the password (it is not held here at all). The files are
 * checked when the section is read (they exist; the password and key files are not open to every
 * user) and read at each connect.
 */
public record BrokerSettings(
        String url,
        String clientId,
        String username,
        Path passwordFile,
        Path caFile,
        Path certFile,
        Path keyFile,
        int keepAliveS,
        int connectTimeoutS,
        long reconnectMinMs,
        long reconnectMaxMs,
        long sessionExpiryS,
        long commandMaxExpiryS,
        long statusIntervalS,
        int inflight) {

    /** Settings for a plain connection to {@code url} with the given client id. */
    public static BrokerSettings plain(String url, String clientId) {
        return new BrokerSettings(url, clientId, null, null, null, null, null, 30, 5, 500, 30_000, 3600, 300, 60, 32);
    }

    public boolean tls() {
        return url.startsWith("ssl://");
    }

    /** A copy with another url (the demo's {@code --broker}). */
    public BrokerSettings withUrl(String newUrl) {
        return new BrokerSettings(newUrl, clientId, username, passwordFile, caFile, certFile, keyFile, keepAliveS,
                connectTimeoutS,
                reconnectMinMs, reconnectMaxMs, sessionExpiryS, commandMaxExpiryS, statusIntervalS, inflight);
    }

    /** A copy with another client id. */
    public BrokerSettings withClientId(String id) {
        return new BrokerSettings(url, id, username, passwordFile, caFile, certFile, keyFile, keepAliveS,
                connectTimeoutS,
                reconnectMinMs, reconnectMaxMs, sessionExpiryS, commandMaxExpiryS, statusIntervalS, inflight);
    }

    /**
     * Reads the section.
     *
     * @param base            folder against which relative file names are resolved
     * @param defaultClientId used when {@code client_id} is absent
     */
    public static BrokerSettings read(MapReader r, Path base, String defaultClientId) {
        String url = r.string("url");
        String clientId = r.string("client_id", defaultClientId);
        String username = r.has("username") ? r.string("username") : null;
        String passwordFile = r.has("password_file") ? r.string("password_file") : null;
        String caFile = r.has("ca_file") ? r.string("ca_file") : null;
        String certFile = r.has("cert_file") ? r.string("cert_file") : null;
        String keyFile = r.has("key_file") ? r.string("key_file") : null;
        int keepAlive = r.integer("keep_alive_s", 30, 5, 3600);
        int connectTimeout = r.integer("connect_timeout_s", 5, 1, 120);
        long minMs = 500;
        long maxMs = 30_000;
        MapReader reconnect = r.optionalMap("reconnect");
        if (reconnect != null) {
            minMs = reconnect.integer("min_ms", 500, 10, 600_000);
            maxMs = reconnect.integer("max_ms", 30_000, 10, 3_600_000);
            reconnect.finish();
            if (maxMs < minMs) {
                reconnect.problem("max_ms", "'" + reconnect.path("max_ms") + "' must be at least min_ms (" + minMs + ")");
            }
        }
        long sessionExpiry = r.integer("session_expiry_s", 3600, 0, Integer.MAX_VALUE);
        long commandMaxExpiry = r.integer("command_max_expiry_s", 300, 1, 86_400);
        long statusInterval = r.integer("status_interval_s", 60, 1, 86_400);
        int inflight = r.integer("inflight", 32, 1, 1000);
        r.finish();
        checkUrl(r, url);
        if (!clientId.isEmpty() && !clientId.matches("[A-Za-z0-9._-]{1,64}")) {
            r.problem("client_id", "'" + r.path("client_id") + "': expected 1 to 64 letters, digits, '.', '_' or '-'");
        }
        if (passwordFile != null && username == null) {
            r.problem("password_file", "'" + r.path("password_file") + "' needs 'username' beside it");
        }
        for (String key : new String[] {"ca_file", "cert_file", "key_file"}) {
            if (r.has(key) && !url.startsWith("ssl://")) {
                r.problem(key, "'" + r.path(key) + "' is for ssl:// brokers; the url is " + url);
            }
        }
        if (caFile != null) {
            Path ca = base.resolve(caFile).normalize();
            String why = java.nio.file.Files.isRegularFile(ca) ? PemFiles.certificateProblem(ca) : "no such file " + ca;
            if (why != null) {
                r.problem("ca_file", "'" + r.path("ca_file") + "': " + why);
            }
        }
        PemFiles.checkCertificateAndKey(r, base, certFile, keyFile, "a client certificate");
        if (passwordFile != null) {
            String why = PasswordFile.problem(base.resolve(passwordFile));
            if (why != null) {
                r.problem("password_file", "'" + r.path("password_file") + "': " + why);
            }
        }
        return new BrokerSettings(url, clientId, username,
                passwordFile == null ? null : base.resolve(passwordFile).normalize(),
                caFile == null ? null : base.resolve(caFile).normalize(),
                certFile == null ? null : base.resolve(certFile).normalize(),
                keyFile == null ? null : base.resolve(keyFile).normalize(),
                keepAlive, connectTimeout, minMs, maxMs, sessionExpiry, commandMaxExpiry, statusInterval, inflight);
    }

    /** Refuses what the client could never connect to: an empty url, another scheme, no host, a port outside 1..65535. */
    private static void checkUrl(MapReader r, String url) {
        if (!r.has("url")) {
            return; // reported missing
        }
        String expected = "expected tcp://HOST:PORT or ssl://HOST:PORT";
        if (url.isBlank()) {
            r.problem("url", "'" + r.path("url") + "' is empty: " + expected);
            return;
        }
        try {
            URI u = new URI(url);
            if (!("tcp".equals(u.getScheme()) || "ssl".equals(u.getScheme())) || u.getHost() == null
                    || (u.getPath() != null && !u.getPath().isEmpty()) || u.getQuery() != null
                    || u.getFragment() != null || u.getUserInfo() != null) {
                r.problem("url", "'" + r.path("url") + "' is \"" + url + "\": " + expected);
            } else if (u.getPort() < 1 || u.getPort() > 65535) {
                r.problem("url", "'" + r.path("url") + "' is \"" + url + "\": "
                        + (u.getPort() == -1 ? "no port; " + expected : "port " + u.getPort() + " is outside 1 to 65535"));
            }
        } catch (URISyntaxException e) {
            r.problem("url", "'" + r.path("url") + "' is \"" + url + "\": " + expected);
        }
    }
}
