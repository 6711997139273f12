package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Path;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.access.Role;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestTokens;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The API, tested against a really started server on a free loopback port. */
class ApiServerTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    static Path temp;

    static Catalog catalog;
    static ApiServer server;

    @BeforeAll
    static void start() throws IOException {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
        server = ApiServer.start(catalog, "127.0.0.1", 0);
        editor = TestTokens.create(catalog, Role.EDITOR);
    }

    static String editor;

    @AfterAll
    static void stop() {
        if (server != null) {
            server.close();
        }
        if (catalog != null) {
            catalog.close();
        }
    }

    record Answer(int status, JsonNode body, HttpResponse<String> raw) {
    }

    static Answer get(String path) throws IOException, InterruptedException {
        return send(HttpRequest.newBuilder(URI.create(server.url() + path.substring(1))).GET().build());
    }

    static Answer send(HttpRequest request) throws IOException, InterruptedException {
        HttpResponse<String> response = HTTP.send(request, HttpResponse.BodyHandlers.ofString());
        String type = response.headers().firstValue("content-type").orElse("");
        boolean json = type.startsWith("application/json") || type.startsWith(Problem.MEDIA_TYPE);
        return new Answer(response.statusCode(), json ? JSON.readTree(response.body()) : null, response);
    }

    @Test
    void healthAnswersWithTheCatalogCounts() throws Exception {
        Answer health = get("/api/health");
        assertThat(health.status()).isEqualTo(200);
        assertThat(health.body().get("status").asText()).isEqualTo("ok");
        // The demo holds 22 non-script files; 8 are partitions of 2 sets, so 16 datasets (and 8 scripts).
        // sql/views.sql defines 3 tables and 2 views: 21 datasets in all.
        assertThat(health.body().get("datasets").asInt()).isEqualTo(21);
        assertThat(health.body().get("scripts").asInt()).isEqualTo(8);
    }

    @Test
    void listsDatasetsInPagesAndGetsOneWithItsColumns() throws Exception {
        Answer page = get("/api/datasets?limit=5&offset=0&kind=file");
        assertThat(page.status()).isEqualTo(200);
        // Of the 16 datasets, 2 are file sets, 3 figures and 1 (the README) other: 10 are plain files.
        assertThat(page.body().get("total").asInt()).isEqualTo(10);
        assertThat(page.body().get("items")).hasSize(5);

        Answer found = get("/api/datasets?match=lab/nitrate_results_2025.csv");
        long id = found.body().get("items").get(0).get("id").asLong();
        Answer one = get("/api/datasets/" + id);
        assertThat(one.status()).isEqualTo(200);
        assertThat(one.body().get("name").asText()).isEqualTo("lab/nitrate_results_2025.csv");
        assertThat(one.body().get("row_count").asInt()).isEqualTo(48);
        assertThat(one.body().get("details").get("delimiter").asText()).isEqualTo(",");
        assertThat(one.body().get("columns")).extracting(c -> c.get("name").asText()).containsExactly(
                "sample_id", "station_code", "sampled_on", "nitrate_mg_l", "nitrite_mg_l", "detection_limit_mg_l",
                "analyst");
        assertThat(get("/api/datasets/" + id + "/schema-history").body()).hasSize(1);
    }

    @Test
    void searchReturnsTheNitrateDatasetFirst() throws Exception {
        Answer answer = get("/api/search?q=nitrate");
        assertThat(answer.status()).isEqualTo(200);
        assertThat(answer.body().get("hits").get(0).get("name").asText()).isEqualTo("lab/nitrate_results_2025.csv");
    }

    @Test
    void badRequestsGetA4xxWithAMessageAndNeverAStackTrace() throws Exception {
        Answer noQuery = get("/api/search");
        assertThat(noQuery.status()).isEqualTo(400);
        assertThat(noQuery.body().get("detail").asText()).contains("'q' is required");
        Answer badLimit = get("/api/datasets?limit=abc");
        assertThat(badLimit.status()).isEqualTo(400);
        assertThat(badLimit.body().get("detail").asText()).contains("'limit' must be a whole number");
        Answer badId = get("/api/datasets/xyz");
        assertThat(badId.status()).isEqualTo(400);
        Answer missing = get("/api/datasets/999999");
        assertThat(missing.status()).isEqualTo(404);
        // expected: RFC 9457 section 3.1, the members type, title, status, detail and instance
        assertThat(missing.raw().headers().firstValue("content-type").orElse("")).startsWith("application/problem+json");
        assertThat(missing.body().get("code").asText()).isEqualTo("not_found");
        assertThat(missing.body().get("status").asInt()).isEqualTo(404);
        // expected: RFC 9457 section 4.2.1, with type about:blank the title is the status phrase (RFC 9110 15.5.5)
        assertThat(missing.body().get("type").asText()).isEqualTo("about:blank");
        assertThat(missing.body().get("title").asText()).isEqualTo("Not Found");
        assertThat(missing.body().get("instance").asText()).isEqualTo("/api/datasets/999999");
        Answer badTime = get("/api/datasets?as_of=yesterday");
        assertThat(badTime.status()).isEqualTo(400);
        Answer noRoute = get("/api/nothing-here");
        assertThat(noRoute.status()).isEqualTo(404);
        assertThat(noRoute.raw().body()).doesNotContain("Exception").doesNotContain("at org.");
    }

    @Test
    void aNoteWrittenThroughTheApiIsStoredAndSearchable() throws Exception {
        long id = get("/api/datasets?match=stations/station_register.csv").body().get("items").get(0).get("id").asLong();
        HttpRequest put = HttpRequest.newBuilder(URI.create(server.url() + "api/datasets/" + id + "/note"))
                .header("content-type", "application/json").header("authorization", TestTokens.bearer(editor))
                .PUT(HttpRequest.BodyPublishers.ofString(
                        "{\"description\": \"Register of every sampling station with its river kilometre\","
                                + " \"tags\": [\"reference\"], \"author\": \"t.vale\"}"))
                .build();
        Answer answer = send(put);
        assertThat(answer.status()).isEqualTo(200);
        assertThat(answer.body().get("tags").get(0).asText()).isEqualTo("reference");
        assertThat(get("/api/search?q=kilometre").body().get("hits").get(0).get("id").asLong()).isEqualTo(id);

        Answer notJson = send(HttpRequest.newBuilder(URI.create(server.url() + "api/datasets/" + id + "/note"))
                .header("content-type", "application/json").header("authorization", TestTokens.bearer(editor))
                .PUT(HttpRequest.BodyPublishers.ofString("{not json")).build());
        assertThat(notJson.status()).isEqualTo(400);
    }

    @Test
    void servesTheWebPagesAtTheRoot() throws Exception {
        HttpResponse<String> page = HTTP.send(HttpRequest.newBuilder(URI.create(server.url())).GET().build(),
                HttpResponse.BodyHandlers.ofString());
        assertThat(page.statusCode()).isEqualTo(200);
        assertThat(page.body()).contains("<title>Headwater</title>");
    }
}
