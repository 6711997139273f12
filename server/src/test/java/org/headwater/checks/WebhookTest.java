package org.headwater.checks;

import static org.assertj.core.api.Assertions.assertThat;

import com.sun.net.httpserver.HttpServer;
import java.io.IOException;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.URI;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.List;
import java.util.concurrent.CopyOnWriteArrayList;
import java.util.concurrent.atomic.AtomicInteger;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.Test;

class WebhookTest {
    private HttpServer server;

    /** What the receiver saw: each request's method, content type, body and arrival (nanoTime). */
    record Received(String method, String contentType, String body, long at) {
    }

    private final List<Received> received = new CopyOnWriteArrayList<>();

    /** A real receiver on loopback that answers {@code failures} times with {@code failStatus}, then 204. */
    private URI receiver(int failures, int failStatus) throws IOException {
        server = HttpServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 0);
        AtomicInteger seen = new AtomicInteger();
        server.createContext("/hooks/freshness", exchange -> {
            String body = new String(exchange.getRequestBody().readAllBytes(), StandardCharsets.UTF_8);
            received.add(new Received(exchange.getRequestMethod(),
                    exchange.getRequestHeaders().getFirst("Content-Type"), body, System.nanoTime()));
            int status = seen.incrementAndGet() <= failures ? failStatus : 204;
            exchange.sendResponseHeaders(status, -1);
            exchange.close();
        });
        server.start();
        return URI.create("http://127.0.0.1:" + server.getAddress().getPort() + "/hooks/freshness?token=kept-out-of-logs");
    }

    @AfterEach
    void stop() {
        if (server != null) {
            server.stop(0);
        }
    }

    @Test
    void aReceiverThatFailsTwiceGetsTheSamePostAThirdTimeAfterGrowingWaits() throws IOException {
        URI url = receiver(2, 503);
        Webhook hook = new Webhook(new Webhook.Settings(url, 5, Duration.ofMillis(50), Duration.ofSeconds(5)));

        Webhook.Delivery delivery = hook.send("{\"event\":\"freshness-changed\"}");

        assertThat(delivery).isEqualTo(new Webhook.Delivery(true, 3, null));
        assertThat(received).hasSize(3);
        assertThat(received).extracting(Received::method).containsOnly("POST");
        assertThat(received).extracting(Received::contentType).containsOnly("application/json");
        assertThat(received).extracting(Received::body).containsOnly("{\"event\":\"freshness-changed\"}");
        // Exponential backoff: at least 50 ms before the second attempt, at least 100 ms before the third.
        assertThat(Duration.ofNanos(received.get(1).at() - received.get(0).at())).isGreaterThanOrEqualTo(Duration.ofMillis(50));
        assertThat(Duration.ofNanos(received.get(2).at() - received.get(1).at())).isGreaterThanOrEqualTo(Duration.ofMillis(100));
    }

    @Test
    void aReceiverThatAlwaysFailsGetsExactlyTheBoundedNumberOfAttemptsAndNothingIsThrown() throws IOException {
        URI url = receiver(Integer.MAX_VALUE, 500);
        Webhook hook = new Webhook(new Webhook.Settings(url, 3, Duration.ofMillis(10), Duration.ofSeconds(5)));

        Webhook.Delivery delivery = hook.send("{}");

        assertThat(delivery).isEqualTo(new Webhook.Delivery(false, 3, "answered 500"));
        assertThat(received).hasSize(3);
    }

    @Test
    void aClientErrorOtherThanTimeoutOrTooManyRequestsIsNotRetried() throws IOException {
        // expected: RFC 9110 section 15.5 — a 4xx says the request itself is wrong, so repeating it cannot help;
        // 408 (15.5.9) and 429 (RFC 6585 section 4) invite a retry.
        URI url = receiver(Integer.MAX_VALUE, 404);
        Webhook hook = new Webhook(new Webhook.Settings(url, 5, Duration.ofMillis(10), Duration.ofSeconds(5)));

        assertThat(hook.send("{}")).isEqualTo(new Webhook.Delivery(false, 1, "answered 404, which a retry would not change"));
        assertThat(received).hasSize(1);
    }

    @Test
    void aTooManyRequestsAnswerIsRetried() throws IOException {
        URI url = receiver(1, 429);
        Webhook hook = new Webhook(new Webhook.Settings(url, 5, Duration.ofMillis(10), Duration.ofSeconds(5)));

        assertThat(hook.send("{}")).isEqualTo(new Webhook.Delivery(true, 2, null));
    }

    @Test
    void aReceiverThatIsNotListeningIsTriedTheBoundedNumberOfTimesWithoutAnException() throws IOException {
        URI url = receiver(0, 500);
        server.stop(0);
        server = null;
        Webhook hook = new Webhook(new Webhook.Settings(url, 2, Duration.ofMillis(10), Duration.ofSeconds(2)));

        Webhook.Delivery delivery = hook.send("{}");

        assertThat(delivery.delivered()).isFalse();
        assertThat(delivery.attempts()).isEqualTo(2);
        assertThat(delivery.problem()).startsWith("ConnectException");
    }

    @Test
    void logsNameTheReceiverWithoutItsPathOrQueryWhereTokensLive() {
        assertThat(Webhook.redact(URI.create("https://hooks.example.test:8443/T0/secret?token=abc")))
                .isEqualTo("https://hooks.example.test:8443/…");
    }
}
