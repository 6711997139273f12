package org.headwater.cli;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.testing.ChildServer;
import org.headwater.testing.TestTokens;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A real {@code serve --config} lists the sources of its file and harvests one when a harvester asks; the
 * answer names no secret and no variable that holds one.
 */
class ServeSourcesTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    Path temp;

    @Test
    void aHarvesterStartsAHarvestOfAConfiguredSourceAndAReaderMayNot() throws Exception {
        Path bakery = Files.createDirectories(temp.resolve("bakery"));
        Files.writeString(bakery.resolve("oven_temperatures.csv"), "oven,celsius\nO1,220\nO2,235\n");
        Path config = temp.resolve("sources.yaml");
        Files.writeString(config, """
                sources:
                  - {name: ovens, kind: folder, path: %s}
                  - name: crates
                    kind: s3
                    url: s3://crate-ledger/
                    endpoint: http://127.0.0.1:1
                    access-key-env: CRATE_LEDGER_KEY_VARIABLE
                    secret-key-env: CRATE_LEDGER_SECRET_VARIABLE
                    every: 12h
                """.formatted(bakery));
        Path dataDir = temp.resolve("catalog");
        String harvester;
        String reader;
        try (Catalog catalog = Catalog.open(dataDir)) {
            harvester = TestTokens.create(catalog, Role.HARVESTER);
            reader = TestTokens.create(catalog, Role.READER);
        }
        try (ChildServer child = ChildServer.start(temp.resolve("serve.log"), List.of(), "serve", "--data-dir",
                dataDir.toString(), "--port", "0", "--config", config.toString(), "--check-every", "off")) {
            String url = child.awaitUrl(Duration.ofSeconds(120));

            HttpResponse<String> listed = get(url + "api/sources");
            assertThat(listed.statusCode()).isEqualTo(200);
            JsonNode sources = JSON.readTree(listed.body());
            assertThat(sources).hasSize(2);
            assertThat(sources.get(0).get("name").asText()).isEqualTo("ovens");
            assertThat(sources.get(0).get("every_seconds").isNull()).isTrue();
            // With an endpoint, the root is the bucket's path-style address on that store (README, "Object stores").
            assertThat(sources.get(1).get("root").asText()).isEqualTo("http://127.0.0.1:1/crate-ledger/");
            assertThat(sources.get(1).get("every_seconds").asLong()).isEqualTo(12 * 3600);
            assertThat(listed.body()).doesNotContain("CRATE_LEDGER_KEY_VARIABLE").doesNotContain("SECRET");

            // README, "Security model": starting harvests is the harvester role's right, not a reader's.
            assertThat(post(url + "api/sources/ovens/harvest", reader, "").statusCode()).isEqualTo(403);
            assertThat(post(url + "api/sources/bread/harvest", harvester, "").statusCode()).isEqualTo(404);
            assertThat(post(url + "api/sources/ovens/harvest", harvester, "{\"full\": \"yes\"}").statusCode())
                    .isEqualTo(400);
            HttpResponse<String> accepted = post(url + "api/sources/ovens/harvest", harvester, "{\"full\": true}");
            // expected: RFC 9110 section 15.3.3, 202 Accepted: "accepted for processing, but the processing
            // has not been completed"
            assertThat(accepted.statusCode()).isEqualTo(202);
            assertThat(JSON.readTree(accepted.body()).get("source").asText()).isEqualTo("ovens");

            JsonNode harvest = awaitHarvest(url, "ovens", Duration.ofSeconds(60));
            assertThat(harvest.get("status").asText()).isEqualTo("ok");
            assertThat(harvest.get("datasets").asInt()).isEqualTo(1);
            JsonNode datasets = JSON.readTree(get(url + "api/datasets").body());
            List<String> names = new ArrayList<>();
            (datasets.isArray() ? datasets : datasets.get("items")).forEach(d -> names.add(d.get("name").asText()));
            assertThat(names).containsExactly("oven_temperatures.csv");
        }
    }

    @Test
    void aServerWithoutASourcesFileListsNoneAndSaysSoWhenAskedToHarvest() throws Exception {
        try (Catalog catalog = org.headwater.testing.TestCatalogs.fresh(temp.resolve("catalog"));
                var server = org.headwater.http.ApiServer.start(catalog, "127.0.0.1", 0)) {
            String harvester = TestTokens.create(catalog, Role.HARVESTER);
            assertThat(get(server.url() + "api/sources").body()).isEqualTo("[]");
            HttpResponse<String> refused = post(server.url() + "api/sources/ovens/harvest", harvester, "");
            assertThat(refused.statusCode()).isEqualTo(404);
            assertThat(JSON.readTree(refused.body()).get("code").asText()).isEqualTo("no_sources");
        }
    }

    private static JsonNode awaitHarvest(String url, String source, Duration timeout) throws Exception {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (System.nanoTime() < deadline) {
            for (JsonNode h : JSON.readTree(get(url + "api/harvests").body())) {
                if (h.get("source").asText().equals(source) && !h.get("status").asText().equals("running")) {
                    return h;
                }
            }
            Thread.sleep(100);
        }
        throw new AssertionError("no finished harvest of " + source + " within " + timeout);
    }

    private static HttpResponse<String> get(String url) throws Exception {
        return HTTP.send(HttpRequest.newBuilder(URI.create(url)).build(), HttpResponse.BodyHandlers.ofString());
    }

    private static HttpResponse<String> post(String url, String token, String body) throws Exception {
        return HTTP.send(HttpRequest.newBuilder(URI.create(url)).header("Authorization", TestTokens.bearer(token))
                .header("Content-Type", "application/json").POST(HttpRequest.BodyPublishers.ofString(body)).build(),
                HttpResponse.BodyHandlers.ofString());
    }
}
