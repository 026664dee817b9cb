package hammerstep.web;

import hammerstep.config.MapReader;
import hammerstep.config.Problems;
import hammerstep.config.YamlDocument;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

import javax.net.ssl.HttpsURLConnection;
import javax.net.ssl.SSLContext;
import javax.net.ssl.SSLHandshakeException;
import javax.net.ssl.SSLSession;
import javax.net.ssl.SSLSocket;
import javax.net.ssl.TrustManagerFactory;
import java.io.IOException;
import java.io.InputStream;
import java.net.HttpURLConnection;
import java.net.URL;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.PosixFilePermissions;
import java.security.KeyStore;
import java.security.cert.CertificateFactory;
import java.security.cert.X509Certificate;
import java.util.Base64;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

/**
 * The view over HTTPS with the test-only certificates of src/test/resources/tls (a test CA and
 * {@code station.pem}, CN hub-fit-1, signed by it): real TLS handshakes on a loopback port.
 */
class WebViewTlsTest {

    static final Path TLS = Path.of("src/test/resources/tls");

    @TempDir
    Path dir;

    private final LiveBoard board = new LiveBoard(20_000, new ResultLog(100));
    private WebView view;

    @AfterEach
    void stop() {
        if (view != null) {
            view.close();
        }
    }

    private Path tlsFile(String name) throws IOException {
        Path p = dir.resolve(name);
        Files.copy(TLS.resolve(name), p);
        Files.setPosixFilePermissions(p, PosixFilePermissions.fromString("rw-------"));
        return p;
    }

    private WebSettings read(String yaml, Problems problems) throws Exception {
        YamlDocument doc = YamlDocument.parse("station.yaml", yaml.getBytes(StandardCharsets.UTF_8));
        return WebSettings.read(MapReader.of(problems, doc.root()), dir);
    }

    /** A client that trusts only the test CA. The test certificate names no address, so its name is checked by hand. */
    private static SSLContext trustingTheTestCa() throws Exception {
        KeyStore store = KeyStore.getInstance(KeyStore.getDefaultType());
        store.load(null, null);
        try (InputStream in = Files.newInputStream(TLS.resolve("ca.pem"))) {
            store.setCertificateEntry("ca", CertificateFactory.getInstance("X.509").generateCertificate(in));
        }
        TrustManagerFactory tmf = TrustManagerFactory.getInstance(TrustManagerFactory.getDefaultAlgorithm());
        tmf.init(store);
        SSLContext ctx = SSLContext.getInstance("TLS");
        ctx.init(null, tmf.getTrustManagers(), null);
        return ctx;
    }

    private static boolean isTheStation(String host, SSLSession session) {
        try {
            X509Certificate peer = (X509Certificate) session.getPeerCertificates()[0];
            return peer.getSubjectX500Principal().getName().contains("CN=hub-fit-1");
        } catch (IOException e) {
            return false;
        }
    }

    private HttpsURLConnection https(String path, SSLContext client) throws Exception {
        HttpsURLConnection c = (HttpsURLConnection) new URL("https://127.0.0.1:" + view.port() + path).openConnection();
        c.setSSLSocketFactory(client.getSocketFactory());
        c.setHostnameVerifier(WebViewTlsTest::isTheStation);
        c.setConnectTimeout(5000);
        c.setReadTimeout(10_000);
        return c;
    }

    private void serveWithTheTestCertificate(Path usersFile) throws Exception {
        Joints.add(board.log(), "id-1", 1, Joints.joint(Joints.FLANGE, "P-1", "D1", "final", 210, 8, List.of(), 0));
        view = WebView.start(new WebSettings("127.0.0.1", 0, usersFile, tlsFile("station.pem"), tlsFile("station.key")),
                board, "plant/line/st-1");
    }

    @Test
    void servesPagesOverHttpsWithTheStationsCertificate() throws Exception {
        serveWithTheTestCertificate(null);
        HttpsURLConnection c = https("/results", trustingTheTestCa());
        assertThat(c.getResponseCode()).isEqualTo(200);
        String body = new String(c.getInputStream().readAllBytes(), StandardCharsets.UTF_8);
        assertThat(body).contains("1 joints match").contains("/joint?id=id-1");
        X509Certificate served = (X509Certificate) c.getServerCertificates()[0];
        assertThat(served.getSubjectX500Principal().getName()).isEqualTo("CN=hub-fit-1 (test only)");
        c.disconnect();
    }

    @Test
    void speaksTls12And13Only() throws Exception {
        serveWithTheTestCertificate(null);
        for (String version : new String[] {"TLSv1.3", "TLSv1.2"}) {
            try (SSLSocket s = (SSLSocket) trustingTheTestCa().getSocketFactory().createSocket("127.0.0.1", view.port())) {
                s.setEnabledProtocols(new String[] {version});
                s.startHandshake();
                assertThat(s.getSession().getProtocol()).isEqualTo(version);
            }
        }
        assertThat(WebView.PROTOCOLS).containsExactly("TLSv1.3", "TLSv1.2");
    }

    @Test
    void aClientThatDoesNotTrustTheCertificateGetsNoPage() throws Exception {
        serveWithTheTestCertificate(null);
        SSLContext jvmDefaults = SSLContext.getInstance("TLS");
        jvmDefaults.init(null, null, null); // the JVM's CAs: the test CA is not among them
        HttpsURLConnection c = https("/", jvmDefaults);
        assertThatThrownBy(c::getResponseCode).isInstanceOf(SSLHandshakeException.class);
    }

    @Test
    void plainHttpToTheHttpsPortGetsNoPage() throws Exception {
        serveWithTheTestCertificate(null);
        HttpURLConnection c = (HttpURLConnection) new URL("http://127.0.0.1:" + view.port() + "/").openConnection();
        c.setConnectTimeout(5000);
        c.setReadTimeout(5000);
        assertThatThrownBy(c::getResponseCode).isInstanceOf(IOException.class);
    }

    @Test
    void loginTravelsInsideTls() throws Exception {
        Path users = dir.resolve("web.users");
        Files.write(users, List.of(Accounts.line("ana", Role.VIEWER, "pw-ana".toCharArray(), new byte[16], 10_000)));
        Files.setPosixFilePermissions(users, PosixFilePermissions.fromString("rw-------"));
        serveWithTheTestCertificate(users);
        assertThat(https("/results", trustingTheTestCa()).getResponseCode()).isEqualTo(401);
        HttpsURLConnection c = https("/results", trustingTheTestCa());
        c.setRequestProperty("Authorization", "Basic "
                + Base64.getEncoder().encodeToString("ana:pw-ana".getBytes(StandardCharsets.UTF_8)));
        assertThat(c.getResponseCode()).isEqualTo(200);
    }

    @Test
    void checkReadsTheCertificateAndKeyAsForTheBroker() throws Exception {
        tlsFile("station.pem");
        tlsFile("station.key");
        tlsFile("other.key");
        Problems fine = new Problems("station.yaml");
        WebSettings s = read("port: 8443\ncert_file: station.pem\nkey_file: station.key\n", fine);
        assertThat(fine.list()).isEmpty();
        assertThat(s.tls()).isTrue();
        assertThat(s.scheme()).isEqualTo("https");
        assertThat(s.certFile()).isEqualTo(dir.resolve("station.pem"));

        Problems alone = new Problems("station.yaml");
        read("cert_file: station.pem\n", alone);
        assertThat(alone.list()).extracting(Object::toString).singleElement()
                .satisfies(m -> assertThat(m).startsWith("station.yaml:1:").contains("needs 'key_file'"));

        Problems otherKey = new Problems("station.yaml");
        read("cert_file: station.pem\nkey_file: other.key\n", otherKey);
        assertThat(otherKey.list()).extracting(Object::toString).singleElement()
                .satisfies(m -> assertThat(m).startsWith("station.yaml:2:").contains("is not the key of the certificate"));

        Files.setPosixFilePermissions(dir.resolve("station.key"), PosixFilePermissions.fromString("rw-r--r--"));
        Problems open = new Problems("station.yaml");
        read("cert_file: station.pem\nkey_file: station.key\n", open);
        assertThat(open.list()).extracting(Object::toString).singleElement()
                .satisfies(m -> assertThat(m).startsWith("station.yaml:2:").contains("readable or writable by every user"));

        Problems missing = new Problems("station.yaml");
        read("cert_file: nowhere.pem\nkey_file: other.key\n", missing);
        assertThat(missing.list()).extracting(Object::toString).singleElement()
                .satisfies(m -> assertThat(m).startsWith("station.yaml:1:").contains("no such file"));
        assertThat(read("port: 8080\n", new Problems("station.yaml")).tls()).isFalse();
    }
}
