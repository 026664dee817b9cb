package hammerstep.sim.broker;

import org.junit.jupiter.api.extension.AfterAllCallback;
import org.junit.jupiter.api.extension.BeforeAllCallback;
import org.junit.jupiter.api.extension.ExtensionContext;

/** An embedded broker on a free loopback port for a test class: {@code @RegisterExtension static final}. */
final class LoopbackBroker implements BeforeAllCallback, AfterAllCallback {

    private EmbeddedBroker broker;

    @Override
    public void beforeAll(ExtensionContext context) throws Exception {
        broker = EmbeddedBroker.start(0);
    }

    @Override
    public void afterAll(ExtensionContext context) {
        broker.close();
    }

    String url() {
        return broker.url();
    }

    int port() {
        return broker.port();
    }
}
