package org.headwater.harvest.objectstore;

import static org.assertj.core.api.Assertions.assertThat;

import com.sun.net.httpserver.HttpServer;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Map;
import java.util.concurrent.atomic.AtomicInteger;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.config.DatabaseHarvests;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourcesConfig;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A store that throttles every request (HTTP 503 SlowDown) on loopback: the SDK retries, then the source fails. */
class RetriesTest {
    @TempDir
    Path temp;

    @Test
    void aThrottlingStoreIsAskedAsOftenAsTheSourceAllowsAndTheSourceFailsWithTheStoresCode() throws Exception {
        AtomicInteger requests = new AtomicInteger();
        HttpServer store = HttpServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 0);
        // expected: Amazon S3 API Reference, "List of error codes": SlowDown, HTTP 503, "Please reduce your request rate".
        byte[] body = """
                <?xml version="1.0" encoding="UTF-8"?>
                <Error><Code>SlowDown</Code><Message>Please reduce your request rate.</Message></Error>"""
                .getBytes(StandardCharsets.UTF_8);
        store.createContext("/", exchange -> {
            requests.incrementAndGet();
            exchange.getResponseHeaders().add("Content-Type", "application/xml");
            exchange.sendResponseHeaders(503, body.length);
            exchange.getResponseBody().write(body);
            exchange.close();
        });
        store.start();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            SourcesConfig config = SourcesConfig.parse("""
                    sources:
                      - name: busy
                        kind: s3
                        url: s3://busy-harbour/
                        endpoint: http://127.0.0.1:%d
                        path-style: true
                        access-key-env: K
                        secret-key-env: S
                        attempts: 3
                    """.formatted(store.getAddress().getPort()), null, "test");
            var outcome = new SourceRunner(catalog, DatabaseHarvests.NONE, Map.of("K", "id", "S", "secret")::get)
                    .run(config, null, false, s -> HarvestProgress.NONE).get(0);
            // expected: AWS SDK for Java 2.x developer guide, "Retry strategies": the standard strategy retries
            // throttling and 5xx errors up to maxAttempts, the first attempt included.
            assertThat(requests.get()).isEqualTo(3);
            assertThat(outcome.status()).isEqualTo("failed");
            assertThat(outcome.message()).isEqualTo("s3://busy-harbour/ at http://127.0.0.1:" + store.getAddress().getPort()
                    + ": the store answered HTTP 503 [SlowDown]");
        } finally {
            store.stop(0);
        }
    }
}
