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
            var outcome = harvestBusyHarbour(catalog, store, 3);
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

    @Test
    void aStoreThatListsButFailsEveryReadStopsTheHarvestInsteadOfMarkingEachObjectBroken() throws Exception {
        AtomicInteger reads = new AtomicInteger();
        HttpServer store = HttpServer.create(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0), 0);
        // expected: Amazon S3 API Reference, ListObjectsV2 response syntax (ListBucketResult, Contents, Key, ETag, Size).
        byte[] listing = """
                <?xml version="1.0" encoding="UTF-8"?>
                <ListBucketResult xmlns="http://s3.amazonaws.com/doc/2006-03-01/"><Name>busy-harbour</Name><Prefix></Prefix>\
                <KeyCount>2</KeyCount><MaxKeys>1000</MaxKeys><IsTruncated>false</IsTruncated>\
                <Contents><Key>berths.csv</Key><LastModified>2026-01-01T00:00:00.000Z</LastModified><ETag>"a1"</ETag><Size>40</Size></Contents>\
                <Contents><Key>tides.csv</Key><LastModified>2026-01-01T00:00:00.000Z</LastModified><ETag>"b2"</ETag><Size>40</Size></Contents>\
                </ListBucketResult>""".getBytes(StandardCharsets.UTF_8);
        byte[] failure = """
                <?xml version="1.0" encoding="UTF-8"?>
                <Error><Code>InternalError</Code><Message>We encountered an internal error.</Message></Error>"""
                .getBytes(StandardCharsets.UTF_8);
        store.createContext("/", exchange -> {
            boolean list = exchange.getRequestURI().getPath().equals("/busy-harbour")
                    || exchange.getRequestURI().getPath().equals("/busy-harbour/");
            byte[] body = list ? listing : failure;
            if (!list) {
                reads.incrementAndGet();
            }
            exchange.getResponseHeaders().add("Content-Type", "application/xml");
            exchange.sendResponseHeaders(list ? 200 : 500, body.length);
            exchange.getResponseBody().write(body);
            exchange.close();
        });
        store.start();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            var outcome = harvestBusyHarbour(catalog, store, 2);
            assertThat(outcome.status()).isEqualTo("failed");
            // expected: Amazon S3 API Reference, "List of error codes": InternalError is HTTP 500.
            assertThat(outcome.message()).endsWith(": the store answered HTTP 500 [InternalError]");
            assertThat(reads.get()).isGreaterThanOrEqualTo(2);
            // No object was recorded as an unreadable dataset: the failure is the store's, on the harvest record.
            assertThat(catalog.reader().datasetCount()).isZero();
        } finally {
            store.stop(0);
        }
    }

    /** Harvests the bucket busy-harbour on {@code store} as a configured source allowed {@code attempts} tries. */
    private static SourceRunner.Outcome harvestBusyHarbour(Catalog catalog, HttpServer store, int attempts)
            throws Exception {
        SourcesConfig config = SourcesConfig.parse("""
                sources:
                  - name: busy
                    kind: s3
                    url: s3://busy-harbour/
                    endpoint: http://127.0.0.1:%d
                    path-style: true
                    access-key-env: K
                    secret-key-env: S
                    attempts: %d
                """.formatted(store.getAddress().getPort(), attempts), null, "test");
        return new SourceRunner(catalog, DatabaseHarvests.NONE, Map.of("K", "id", "S", "secret")::get)
                .run(config, null, false, s -> HarvestProgress.NONE).get(0);
    }
}
