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
import java.nio.file.Path;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.impact.SeedLibraryAccess;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Upstream, downstream, impact and owner endpoints on a served seed-library catalog. Expected sets come
 * from the fixture's code (// reference: src/test/resources/impact/seed-library, read by hand); status
 * codes follow RFC 9110 section 15 (400 for a malformed request, 404 for a target that does not exist,
 * 409 for a request that conflicts with the state of the resource).
 */
class LineageApiTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    static Path temp;

    static Catalog catalog;
    static ApiServer server;

    @BeforeAll
    static void start() throws Exception {
        Path workspace = SeedLibraryAccess.copy(temp);
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(workspace, false, HarvestProgress.NONE);
        server = ApiServer.start(catalog, "127.0.0.1", 0);
        editor = org.headwater.testing.TestTokens.create(catalog, org.headwater.access.Role.EDITOR);
    }

    /** Writes need an editor's token (README, "Security model"). */
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

    record Answer(int status, String type, JsonNode body, String text) {
    }

    static Answer send(HttpRequest.Builder request) throws Exception {
        request.header("Authorization", "Bearer " + editor).header("Content-Type", "application/json");
        HttpResponse<String> r = HTTP.send(request.build(), HttpResponse.BodyHandlers.ofString());
        String type = r.headers().firstValue("content-type").orElse("");
        // Errors are RFC 9457 problem documents (application/problem+json), with the message in "detail".
        boolean json = type.startsWith("application/json") || type.startsWith("application/problem+json");
        return new Answer(r.statusCode(), type, json ? JSON.readTree(r.body()) : null, r.body());
    }

    static Answer get(String path) throws Exception {
        return send(HttpRequest.newBuilder(URI.create(server.url() + path.substring(1))).GET());
    }

    static long id(String name) throws Exception {
        return get("/api/datasets?match=" + URLEncoder.encode(name, StandardCharsets.UTF_8)).body().get("items").get(0)
                .get("id").asLong();
    }

    static String q(String text) {
        return URLEncoder.encode(text, StandardCharsets.UTF_8);
    }

    @Test
    void downstreamAndUpstreamAnswerWithDistancesAndPaths() throws Exception {
        Answer down = get("/api/datasets/" + id("raw/varieties.csv") + "/downstream?depth=2");
        assertThat(down.status()).isEqualTo(200);
        assertThat(down.body().get("direction").asText()).isEqualTo("downstream");
        assertThat(down.body().get("count").asInt()).isEqualTo(3);
        JsonNode first = down.body().get("results").get(0);
        assertThat(first.get("name").asText()).isEqualTo("work/trays_enriched.csv");
        assertThat(first.get("path").get(0).get("script").asText()).isEqualTo("scripts/enrich.py");
        assertThat(first.get("path").get(0).get("evidence").asText()).isEqualTo("static");

        Answer up = get("/api/datasets/" + id("work/season.csv") + "/upstream?column=mean_rate");
        // reference: season.py copies rates.mean_rate, which rates.py computes from seeds_sprouted and
        // seeds_sown, which enrich.py copies from trays_all, which combine_trays.py copies from the weeks.
        assertThat(up.body().get("target").get("dataset").asText()).isEqualTo("work/season.csv");
        assertThat(up.body().get("target").get("column").asText()).isEqualTo("mean_rate");
        assertThat(up.body().get("results")).extracting(r -> r.get("distance").asInt() + " " + r.get("name").asText() + "."
                + r.get("column").asText()).containsExactlyInAnyOrder(
                "1 work/rates.csv.mean_rate",
                "2 work/trays_enriched.csv.seeds_sown", "2 work/trays_enriched.csv.seeds_sprouted",
                "3 work/trays_all.csv.seeds_sown", "3 work/trays_all.csv.seeds_sprouted",
                "4 raw/trays/week=*/trays.csv.seeds_sown", "4 raw/trays/week=*/trays.csv.seeds_sprouted");
        Answer figures = get("/api/datasets/" + id("raw/varieties.csv") + "/downstream?kind=figure&evidence=static&minConfidence=0.5");
        assertThat(figures.body().get("results")).extracting(r -> r.get("name").asText()).containsExactly("figures/season_rates.png");
    }

    @Test
    void badWalkRequestsAre400And404WithAMessage() throws Exception {
        long varieties = id("raw/varieties.csv");
        Answer depth = get("/api/datasets/" + varieties + "/downstream?depth=deep");
        assertThat(depth.status()).isEqualTo(400);
        assertThat(depth.body().get("detail").asText()).isEqualTo("depth must be a whole number, got 'deep'");
        Answer kind = get("/api/datasets/" + varieties + "/downstream?kind=spreadsheet");
        assertThat(kind.status()).isEqualTo(400);
        assertThat(kind.body().get("detail").asText()).isEqualTo("unknown kind 'spreadsheet'; use file, file_set, table, view, figure, other");
        Answer source = get("/api/datasets/" + varieties + "/downstream?source=nowhere");
        assertThat(source.status()).isEqualTo(400);
        assertThat(source.body().get("detail").asText()).isEqualTo("no source is called 'nowhere'");
        Answer confidence = get("/api/datasets/" + varieties + "/downstream?minConfidence=2");
        assertThat(confidence.status()).isEqualTo(400);
        Answer noDataset = get("/api/datasets/999999/upstream");
        assertThat(noDataset.status()).isEqualTo(404);
        assertThat(noDataset.body().get("detail").asText()).isEqualTo("No dataset with id 999999");
        Answer noColumn = get("/api/datasets/" + varieties + "/downstream?column=colour");
        assertThat(noColumn.status()).isEqualTo(404);
        assertThat(noColumn.body().get("detail").asText()).isEqualTo("Dataset raw/varieties.csv has no column 'colour'");
    }

    @Test
    void impactAnswersJsonWithCountsAndMarkdownAsText() throws Exception {
        Answer json = get("/api/impact?target=" + q("work/rates.csv.mean_rate") + "&change=drop");
        assertThat(json.status()).isEqualTo(200);
        JsonNode counts = json.body().get("counts");
        // reference: season.py copies mean_rate; plot_rates.py draws it; running_log.py copies it on.
        assertThat(counts.get("columns").asInt()).isEqualTo(2);
        assertThat(counts.get("scripts").asInt()).isEqualTo(3);
        assertThat(counts.get("figures").asInt()).isEqualTo(1);
        assertThat(json.body().get("affected")).extracting(a -> a.get("kind").asText() + " " + a.get("name").asText())
                .containsExactly("dataset work/season.csv", "column work/season.csv.mean_rate", "script scripts/season.py",
                        "dataset work/running_log.csv", "figure figures/season_rates.png",
                        "column work/running_log.csv.mean_rate", "script scripts/plot_rates.py",
                        "script scripts/running_log.py");
        JsonNode figure = json.body().get("affected").get(4);
        assertThat(figure.get("owners")).extracting(o -> o.get("name").asText()).containsExactly("newsletter", "Tamsin Reed");
        assertThat(figure.get("distance").asInt()).isEqualTo(2);
        assertThat(figure.get("indirect").asBoolean()).isFalse();

        Answer markdown = get("/api/impact?target=" + id("work/trays_enriched.csv") + "&change=stale&format=markdown");
        assertThat(markdown.status()).isEqualTo(200);
        assertThat(markdown.type()).startsWith("text/markdown");
        assertThat(markdown.text()).startsWith("# Impact of work/trays_enriched.csv being late or stale\n\n**10 affected**");
    }

    @Test
    void badImpactRequestsAre400And404WithAMessage() throws Exception {
        Answer missing = get("/api/impact");
        assertThat(missing.status()).isEqualTo(400);
        assertThat(missing.body().get("detail").asText()).startsWith("Parameter 'target' is required");
        Answer unknown = get("/api/impact?target=" + q("work/nothing.csv"));
        assertThat(unknown.status()).isEqualTo(404);
        Answer change = get("/api/impact?target=" + q("work/rates.csv") + "&change=shrink");
        assertThat(change.status()).isEqualTo(400);
        assertThat(change.body().get("detail").asText()).startsWith("unknown change 'shrink'");
        Answer misfit = get("/api/impact?target=" + q("work/rates.csv") + "&change=retype");
        assertThat(misfit.status()).isEqualTo(400);
        assertThat(misfit.body().get("detail").asText()).isEqualTo("retype is a change to a column; name it as dataset.column");
        Answer format = get("/api/impact?target=" + q("work/rates.csv") + "&format=pdf");
        assertThat(format.status()).isEqualTo(400);
    }

    @Test
    void ownersAreAssignedAndRemovedByHandWithClearRefusals() throws Exception {
        long lowTrays = id("work/low_trays.csv");
        String owners = server.url() + "api/datasets/" + lowTrays + "/owners";
        Answer put = send(HttpRequest.newBuilder(URI.create(owners))
                .PUT(HttpRequest.BodyPublishers.ofString("{\"owner\": \"seed-keepers\", \"kind\": \"team\"}")));
        assertThat(put.status()).isEqualTo(200);
        // The hand-made owner replaces the file's rule (work/** team:trial-analysts) for this dataset.
        assertThat(put.body().get("owners")).extracting(o -> o.get("name").asText() + " " + o.get("origin").asText())
                .containsExactly("seed-keepers manual", "Wren Maddox git");
        JsonNode shown = get("/api/datasets/" + lowTrays).body().get("owners").get(0);
        assertThat(shown.get("name").asText()).isEqualTo("seed-keepers");
        assertThat(shown.get("kind").asText()).isEqualTo("team");
        assertThat(shown.get("reason").asText()).isEqualTo("assigned by hand (api)");
        assertThat(shown.get("inherited").asBoolean()).isFalse();

        Answer badKind = send(HttpRequest.newBuilder(URI.create(owners))
                .PUT(HttpRequest.BodyPublishers.ofString("{\"owner\": \"x\", \"kind\": \"robot\"}")));
        assertThat(badKind.status()).isEqualTo(400);
        assertThat(badKind.body().get("detail").asText()).isEqualTo("kind must be 'person' or 'team', got 'robot'");
        Answer notJson = send(HttpRequest.newBuilder(URI.create(owners)).PUT(HttpRequest.BodyPublishers.ofString("owner=x")));
        assertThat(notJson.status()).isEqualTo(400);

        Answer notOwner = send(HttpRequest.newBuilder(URI.create(owners + "/nobody-here")).DELETE());
        assertThat(notOwner.status()).isEqualTo(404);
        assertThat(notOwner.body().get("detail").asText()).isEqualTo("nobody-here is not an owner of work/low_trays.csv");
        String ratesOwners = server.url() + "api/datasets/" + id("work/rates.csv") + "/owners/trial-analysts";
        Answer fromFile = send(HttpRequest.newBuilder(URI.create(ratesOwners)).DELETE());
        assertThat(fromFile.status()).isEqualTo(409);
        assertThat(fromFile.body().get("detail").asText()).startsWith("trial-analysts owns work/rates.csv through headwater.owners line 5");
        Answer removed = send(HttpRequest.newBuilder(URI.create(owners + "/seed-keepers")).DELETE());
        assertThat(removed.status()).isEqualTo(200);
        assertThat(removed.body().get("owners")).extracting(o -> o.get("name").asText()).containsExactly("Wren Maddox");
    }
}
