package hammerstep.mqtt.paho;

import org.eclipse.paho.mqttv5.common.MqttException;
import org.junit.jupiter.api.Test;

import java.io.EOFException;
import java.net.SocketException;

import static org.assertj.core.api.Assertions.assertThat;

class PahoLinkDescribeTest {

    @Test
    void aLostConnectionWithoutAMessageSaysWhatHappenedNotNull() {
        String text = PahoLink.describe(new MqttException(org.eclipse.paho.mqttv5.client.MqttClientException.REASON_CODE_CONNECTION_LOST, new EOFException()));

        assertThat(text).isEqualTo("Connection lost (32109): the broker closed the connection").doesNotContain("null");
    }

    @Test
    void aCauseWithItsOwnMessageKeepsIt() {
        assertThat(PahoLink.describe(new MqttException(org.eclipse.paho.mqttv5.client.MqttClientException.REASON_CODE_CONNECTION_LOST,
                new SocketException("Connection reset")))).endsWith(": Connection reset");
        assertThat(PahoLink.readable(new SocketException())).isEqualTo("socket exception");
    }
}
