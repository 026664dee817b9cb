package hammerstep.mqtt.paho;

import javax.net.SocketFactory;
import javax.net.ssl.SSLSocketFactory;
import java.io.IOException;
import java.io.InputStream;
import java.net.InetAddress;
import java.net.Socket;

/**
 * Socket factories that switch Nagle's algorithm off (TCP_NODELAY) on every socket they make. Paho
 * writes an MQTT packet in more than one write and leaves Nagle on; a small command or answer
 * then waits for the peer's delayed acknowledgement (about 40 ms on Linux) on each hop. The
 * request/response round trip through a broker measured about 90 ms that way, about 1 ms without
 * ({@code CommandBenchmark} in the simulator).
 */
final class NoDelay {

    private NoDelay() {
    }

    static Socket set(Socket s) throws IOException {
        s.setTcpNoDelay(true);
        return s;
    }

    /** For {@code tcp://}. */
    static SocketFactory plain() {
        SocketFactory d = SocketFactory.getDefault();
        return new SocketFactory() {
            @Override
            public Socket createSocket() throws IOException {
                return set(d.createSocket());
            }

            @Override
            public Socket createSocket(String host, int port) throws IOException {
                return set(d.createSocket(host, port));
            }

            @Override
            public Socket createSocket(String host, int port, InetAddress local, int localPort) throws IOException {
                return set(d.createSocket(host, port, local, localPort));
            }

            @Override
            public Socket createSocket(InetAddress host, int port) throws IOException {
                return set(d.createSocket(host, port));
            }

            @Override
            public Socket createSocket(InetAddress host, int port, InetAddress local, int localPort)
                    throws IOException {
                return set(d.createSocket(host, port, local, localPort));
            }
        };
    }

    /** For {@code ssl://}: the TLS factory of {@link Tls}, each socket with Nagle off. */
    static SSLSocketFactory tls(SSLSocketFactory d) {
        return new SSLSocketFactory() {
            @Override
            public String[] getDefaultCipherSuites() {
                return d.getDefaultCipherSuites();
            }

            @Override
            public String[] getSupportedCipherSuites() {
                return d.getSupportedCipherSuites();
            }

            @Override
            public Socket createSocket() throws IOException {
                return set(d.createSocket());
            }

            @Override
            public Socket createSocket(Socket s, String host, int port, boolean autoClose) throws IOException {
                set(s);
                return set(d.createSocket(s, host, port, autoClose));
            }

            @Override
            public Socket createSocket(Socket s, InputStream consumed, boolean autoClose) throws IOException {
                set(s);
                return set(d.createSocket(s, consumed, autoClose));
            }

            @Override
            public Socket createSocket(String host, int port) throws IOException {
                return set(d.createSocket(host, port));
            }

            @Override
            public Socket createSocket(String host, int port, InetAddress local, int localPort) throws IOException {
                return set(d.createSocket(host, port, local, localPort));
            }

            @Override
            public Socket createSocket(InetAddress host, int port) throws IOException {
                return set(d.createSocket(host, port));
            }

            @Override
            public Socket createSocket(InetAddress host, int port, InetAddress local, int localPort)
                    throws IOException {
                return set(d.createSocket(host, port, local, localPort));
            }
        };
    }
}
