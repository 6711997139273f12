package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.URLEncoder;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** {@code /api/search} over a small invented lake: the answer's shape, paging, and 400s for malformed queries. */
class SearchApiTest {
    private static final HttpClient HTTP = HttpClient.newHttpClient();
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    static Path temp;

    static Catalog catalog;
    static ApiServer server;

    @BeforeAll
    static void start() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("heron_counts.csv"), "colony_id,heron_count,survey_date\nC1,12,2026-04-01\n");
        Files.writeString(lake.resolve("heron_colonies.csv"), "colony_id,colony_name\nC1,Reedmouth\n");
        Files.writeString(lake.resolve("otter_sightings.csv"), "sighting_id,otter_count\nS1,2\n");
        // The heron counts were last written in 2020 against a one-day maximum age: late; the otter file is new
        // against ten years: fresh; the colonies have no policy and no inputs: unknown (README, Freshness).
        Files.writeString(lake.resolve(".headwater-freshness"), "heron_counts.csv max-age 1d\notter_sightings.csv max-age 3650d\n");
        Files.setLastModifiedTime(lake.resolve("heron_counts.csv"),
                java.nio.file.attribute.FileTime.from(java.time.Instant.parse("2020-01-01T00:00:00Z")));
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(lake, false, HarvestProgress.NONE);
        catalog.freshness().record();
        server = ApiServer.start(catalog, "127.0.0.1", 0);
    }

    @AfterAll
    static void stop() {
        if (server != null) {
            server.close();
        }
        if (catalog != null) {
            catalog.close();
        }
    }

    static HttpResponse<String> get(String query) throws Exception {
        URI uri = URI.create(server.url() + "api/search?" + query);
        return HTTP.send(HttpRequest.newBuilder(uri).GET().build(), HttpResponse.BodyHandlers.ofString());
    }

    static String q(String text) {
        return "q=" + URLEncoder.encode(text, StandardCharsets.UTF_8);
    }

    @Test
    void theAnswerHasTotalFacetsSuggestionAndPerHitSnippetAndExplanation() throws Exception {
        HttpResponse<String> response = get(q("heron kind=file") + "&size=1&explain=true");
        assertThat(response.statusCode()).isEqualTo(200);
        JsonNode body = JSON.readTree(response.body());
        // Two files have heron in their name; one page of one.
        assertThat(body.get("total").asInt()).isEqualTo(2);
        assertThat(body.get("hits")).hasSize(1);
        assertThat(body.get("facets").get("kind").get("file").asInt()).isEqualTo(2);
        assertThat(body.get("facets").get("format").get("csv").asInt()).isEqualTo(2);
        assertThat(body.get("suggestion").isNull()).isTrue();
        JsonNode hit = body.get("hits").get(0);
        assertThat(hit.get("name").asText()).startsWith("heron_");
        assertThat(hit.get("explain").get("mode").asText()).isEqualTo("all words");
        assertThat(hit.get("explain").get("matched").toString()).contains("name:heron");

        JsonNode second = JSON.readTree(get(q("heron kind=file") + "&size=1&page=2").body());
        assertThat(second.get("hits").get(0).get("name").asText()).startsWith("heron_")
                .isNotEqualTo(hit.get("name").asText());
        assertThat(second.get("hits").get(0).get("explain").isNull()).isTrue();
    }

    @Test
    void aColumnIsAHitOfItsOwnWithAMarkedSnippet() throws Exception {
        JsonNode body = JSON.readTree(get(q("otter count")).body());
        JsonNode first = body.get("hits").get(0);
        assertThat(first.get("kind").asText()).isEqualTo("column");
        assertThat(first.get("name").asText()).isEqualTo("otter_sightings.csv#otter_count");
        assertThat(first.get("snippet").asText()).isEqualTo("<mark>otter_count</mark>");
    }

    @Test
    void malformedQueriesAndParametersAreA400WithAMessage() throws Exception {
        HttpResponse<String> unclosed = get(q("heron \"colony"));
        assertThat(unclosed.statusCode()).isEqualTo(400);
        assertThat(JSON.readTree(unclosed.body()).get("detail").asText())
                .isEqualTo("The quote opened at position 7 is never closed");
        HttpResponse<String> unknown = get(q("size=large"));
        assertThat(unknown.statusCode()).isEqualTo(400);
        assertThat(JSON.readTree(unknown.body()).get("detail").asText()).startsWith("Unknown filter 'size'");
        assertThat(get(q("heron") + "&page=0").statusCode()).isEqualTo(400);
        assertThat(get(q("heron") + "&explain=maybe").statusCode()).isEqualTo(400);
        assertThat(get(q("heron") + "&page=100&size=100").statusCode()).isEqualTo(400);
    }

    @Test
    void theFreshParameterKeepsOnlyDatasetsAndTheirColumnsInTheRecordedStates() throws Exception {
        JsonNode late = JSON.readTree(get(q("heron") + "&fresh=late").body());
        assertThat(late.get("hits")).extracting(h -> h.get("name").asText()).isNotEmpty()
                .allMatch(name -> name.startsWith("heron_counts.csv"));
        assertThat(late.get("facets").get("freshness").toString()).isEqualTo("{\"late\":1}");
        // The parameter means the same as the filter written in the text.
        JsonNode written = JSON.readTree(get(q("heron fresh=late")).body());
        assertThat(written.get("total").asInt()).isEqualTo(late.get("total").asInt());
        JsonNode either = JSON.readTree(get(q("kind=file") + "&fresh=fresh,unknown").body());
        assertThat(either.get("hits")).extracting(h -> h.get("name").asText())
                .containsExactlyInAnyOrder("heron_colonies.csv", "otter_sightings.csv");
        HttpResponse<String> bad = get(q("heron") + "&fresh=rotten");
        assertThat(bad.statusCode()).isEqualTo(400);
        assertThat(JSON.readTree(bad.body()).get("detail").asText())
                .isEqualTo("Parameter 'fresh' takes freshness states separated by commas: fresh, due, late, stale, unknown (not 'rotten')");
        HttpResponse<String> badInText = get(q("heron fresh=rotten"));
        assertThat(badInText.statusCode()).isEqualTo(400);
        assertThat(JSON.readTree(badInText.body()).get("detail").asText()).startsWith("The filter 'fresh=' at position 7");
    }

    @Test
    void aMisspelledWordIsAnsweredWithASuggestion() throws Exception {
        JsonNode body = JSON.readTree(get(q("otetr")).body());
        assertThat(body.get("suggestion").asText()).isEqualTo("otter");
    }
}
