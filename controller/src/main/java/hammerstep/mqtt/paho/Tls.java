package hammerstep.mqtt.paho;

import javax.net.SocketFactory;
import javax.net.ssl.SSLContext;
import javax.net.ssl.TrustManagerFactory;
import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.GeneralSecurityException;
import java.security.KeyStore;
import java.security.cert.Certificate;
import java.security.cert.CertificateFactory;

/** TLS for the broker connection: the JVM's trusted CAs, or only those of a PEM file. TLS 1.2 or later. */
final class Tls {

    private final Path caFile;

    Tls(Path caFile) {
        this.caFile = caFile;
    }

    SocketFactory socketFactory() throws IOException {
        try {
            SSLContext ctx = SSLContext.getInstance("TLS");
            if (caFile == null) {
                ctx.init(null, null, null);
            } else {
                KeyStore store = KeyStore.getInstance(KeyStore.getDefaultType());
                store.load(null, null);
                int n = 0;
                try (InputStream in = Files.newInputStream(caFile)) {
                    for (Certificate c : CertificateFactory.getInstance("X.509").generateCertificates(in)) {
                        store.setCertificateEntry("ca-" + n++, c);
                    }
                }
                if (n == 0) {
                    throw new IOException(caFile + " holds no certificate");
                }
                TrustManagerFactory tmf = TrustManagerFactory.getInstance(TrustManagerFactory.getDefaultAlgorithm());
                tmf.init(store);
                ctx.init(null, tmf.getTrustManagers(), null);
            }
            return ctx.getSocketFactory();
        } catch (GeneralSecurityException e) {
            throw new IOException("cannot set up TLS with " + caFile + ": " + e.getMessage(), e);
        }
    }
}
