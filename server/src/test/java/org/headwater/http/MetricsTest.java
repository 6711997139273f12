package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code /metrics} in the Prometheus text exposition format. */
class MetricsTest {
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    Path temp;

    static double value(String scrape, String series) {
        // expected: Prometheus text exposition format 0.0.4, one "name{labels} value" sample per line
        Matcher m = Pattern.compile("(?m)^" + Pattern.quote(series) + " ([0-9.eE+-]+)$").matcher(scrape);
        assertThat(m.find()).as(series).isTrue();
        return Double.parseDouble(m.group(1));
    }

    @Test
    void countsRequestsPerRouteIngestionIndexDocumentsAndTheJvm() throws Exception {
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0)) {
            catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            for (int i = 0; i < 3; i++) {
                HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + "api/datasets/" + (1000 + i))).build(),
                        HttpResponse.BodyHandlers.ofString());
            }
            HttpResponse<String> scrape = HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + "metrics")).build(),
                    HttpResponse.BodyHandlers.ofString());
            assertThat(scrape.statusCode()).isEqualTo(200);
            // expected: Prometheus exposition formats documentation, text format content type
            assertThat(scrape.headers().firstValue("content-type").orElse("")).startsWith("text/plain; version=0.0.4");
            String text = scrape.body();
            // Three requests, one series: the route template, not each id.
            assertThat(value(text, "headwater_http_requests_seconds_count{method=\"GET\",route=\"/api/datasets/{id}\",status=\"404\"}"))
                    .isEqualTo(3);
            assertThat(value(text, "headwater_index_documents")).isEqualTo(catalog.index().documentCount());
            assertThat(value(text, "headwater_catalog_datasets")).isEqualTo(catalog.reader().datasetCount());
            assertThat(value(text, "headwater_harvests{status=\"ok\"}")).isEqualTo(1);
            assertThat(value(text, "headwater_ingest_batches_total")).isGreaterThan(0);
            assertThat(text).contains("jvm_memory_used_bytes{", "jvm_threads_live_threads", "process_uptime_seconds");
        }
    }
}
