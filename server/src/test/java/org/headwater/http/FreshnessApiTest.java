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
import java.time.Clock;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.checks.HiveWorkspaceAccess;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The freshness endpoints on a really started server, over the hive fixture at its Monday-morning clock. */
class FreshnessApiTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    static Path temp;

    static Catalog catalog;
    static ApiServer server;

    @BeforeAll
    static void start() throws IOException {
        Path workspace = HiveWorkspaceAccess.write(temp.resolve("hive-coop"));
        catalog = TestCatalogs.fresh(temp.resolve("catalog"), Clock.fixed(HiveWorkspaceAccess.now(), ZoneOffset.UTC));
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

    record Answer(int status, JsonNode body) {
    }

    static Answer send(String method, String path, String body) throws IOException, InterruptedException {
        HttpRequest.Builder request = HttpRequest.newBuilder(URI.create(server.url() + path.substring(1)))
                .header("Authorization", "Bearer " + editor).header("Content-Type", "application/json");
        request.method(method, body == null ? HttpRequest.BodyPublishers.noBody() : HttpRequest.BodyPublishers.ofString(body));
        HttpResponse<String> response = HTTP.send(request.build(), HttpResponse.BodyHandlers.ofString());
        return new Answer(response.statusCode(), JSON.readTree(response.body()));
    }

    static long id(String name) throws Exception {
        return send("GET", "/api/datasets?match=" + name, null).body().get("items").get(0).get("id").asLong();
    }

    @Test
    void theOverviewKeepsTheAgreedFieldNamesAndCountsEveryState() throws Exception {
        Answer all = send("GET", "/api/freshness", null);

        assertThat(all.status()).isEqualTo(200);
        JsonNode stale = null;
        List<String> names = new ArrayList<>();
        for (JsonNode check : all.body().get("checks")) {
            names.add(check.get("name").asText());
            if (check.get("name").asText().equals("hives/daily_summary.csv")) {
                stale = check;
            }
        }
        assertThat(names).containsExactly("hives/daily_summary.csv", "hives/feed_log.csv", "hives/weights.csv",
                "reference/apiaries.csv", "reports/apiary_tally.csv", "reports/daily_counts.csv", "reports/monthly.csv",
                "reports/weekly.csv");
        // expected: the contract the web UI builds on (issue 6, freshness part): these keys, these spellings.
        assertThat(stale.fieldNames()).toIterable().contains("datasetId", "name", "state", "since", "why", "policy",
                "newerInput");
        assertThat(stale.get("state").asText()).isEqualTo("stale");
        assertThat(stale.get("since").asText()).isEqualTo("2026-12-07T06:30:00Z");
        assertThat(stale.get("policy").isNull()).isTrue();
        assertThat(stale.get("newerInput").get("datasetId").asLong()).isEqualTo(id("hives/weights.csv"));
        assertThat(stale.get("newerInput").get("name").asText()).isEqualTo("hives/weights.csv");
        assertThat(stale.get("newerInput").get("modifiedAt").asText()).isEqualTo("2026-12-07T06:30:00Z");
        assertThat(JSON.writeValueAsString(all.body().get("counts")))
                .isEqualTo("{\"fresh\":3,\"due\":1,\"late\":2,\"stale\":1,\"unknown\":1}");
    }

    @Test
    void aPolicyPutThroughTheApiIsAppliedAndKeptInTheHistory() throws Exception {
        long id = id("reference/apiaries.csv");
        Answer put = send("PUT", "/api/datasets/" + id + "/freshness-policy",
                "{\"policy\": \"max-age 30d\", \"author\": \"Ilse Marrow\"}");

        assertThat(put.status()).isEqualTo(200);
        assertThat(put.body().get("policy").asText()).isEqualTo("max-age 30d");
        assertThat(put.body().get("policyFrom").asText()).isEqualTo("api:Ilse Marrow");
        // Modified 2026-10-01, 30 days ran out on 2026-10-31 (java.time arithmetic).
        assertThat(put.body().get("state").asText()).isEqualTo("late");
        assertThat(put.body().get("since").asText()).isEqualTo("2026-10-31T00:00:00Z");
        assertThat(send("GET", "/api/datasets/" + id + "/freshness", null).body().get("state").asText()).isEqualTo("late");

        Answer history = send("GET", "/api/freshness/history?datasetId=" + id, null);
        assertThat(history.status()).isEqualTo(200);
        assertThat(history.body().get("policies").get(0).get("policy").asText()).isEqualTo("max-age 30d");
        assertThat(history.body().get("policies").get(0).get("setBy").asText()).isEqualTo("api:Ilse Marrow");

        Answer removed = send("PUT", "/api/datasets/" + id + "/freshness-policy", "{\"policy\": null}");
        assertThat(removed.body().get("state").asText()).isEqualTo("unknown");
        assertThat(removed.body().get("policy").isNull()).isTrue();
    }

    @Test
    void badRequestsGetA4xxWithAMessage() throws Exception {
        long id = id("hives/weights.csv");
        Answer badPolicy = send("PUT", "/api/datasets/" + id + "/freshness-policy", "{\"policy\": \"schedule 0 6 * *\"}");
        assertThat(badPolicy.status()).isEqualTo(400);
        assertThat(badPolicy.body().get("code").asText()).isEqualTo("bad_request");
        assertThat(badPolicy.body().get("detail").asText()).startsWith("Not a freshness policy: a schedule has the five"
                + " crontab fields");
        assertThat(send("PUT", "/api/datasets/" + id + "/freshness-policy", "not json").status()).isEqualTo(400);
        assertThat(send("PUT", "/api/datasets/" + id + "/freshness-policy", "{\"policy\": 36}").status()).isEqualTo(400);
        assertThat(send("GET", "/api/freshness/history", null).status()).isEqualTo(400);
        assertThat(send("GET", "/api/freshness/history?datasetId=x", null).status()).isEqualTo(400);
        assertThat(send("GET", "/api/freshness/history?datasetId=999999", null).status()).isEqualTo(404);
        assertThat(send("GET", "/api/datasets/999999/freshness", null).status()).isEqualTo(404);
        // The policy of the dataset is unchanged by the refused requests.
        assertThat(send("GET", "/api/datasets/" + id + "/freshness", null).body().get("policy").asText())
                .isEqualTo("max-age 1d");
    }
}
