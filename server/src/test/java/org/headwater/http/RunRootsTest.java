package org.headwater.http;

import static org.assertj.core.api.Assertions.assertThat;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.access.Role;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.TestTokens;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Run records may name only paths inside the server's roots; what lies outside is refused with a reason. */
class RunRootsTest {
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final HttpClient HTTP = HttpClient.newHttpClient();

    @TempDir
    Path temp;

    static String io(Path path, String direction) {
        return "{\"path\": \"" + path + "\", \"direction\": \"" + direction + "\"}";
    }

    @Test
    void inputsAndOutputsOutsideTheRootsAreLeftOutWithTheirReasonsAndAudited() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path outside = Files.createDirectories(temp.resolve("elsewhere"));
        Files.writeString(outside.resolve("secret.csv"), "a\n1\n");
        Files.writeString(lake.resolve("levels.csv"), "site,level\nA,1\n");
        Path escape = Files.createSymbolicLink(lake.resolve("escape.csv"), outside.resolve("secret.csv"));
        String record = "{\"run_id\": \"roots-1\", \"script\": {\"path\": \"" + lake.resolve("fit.py") + "\"},"
                + " \"started_at\": \"2026-06-01T08:00:00Z\", \"io\": ["
                + String.join(", ", io(lake.resolve("levels.csv"), "read"), io(outside.resolve("secret.csv"), "read"),
                        io(escape, "read"), "{\"path\": \"" + lake + "/../elsewhere/out.csv\", \"direction\": \"write\"}")
                + "]}";
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0,
                        ServerSettings.defaults().withRoots(List.of(lake)))) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            HttpResponse<String> answer = post(server, token, record);
            assertThat(answer.statusCode()).isEqualTo(201);
            JsonNode refused = JSON.readTree(answer.body()).get("refused");
            assertThat(refused).extracting(r -> r.get("path").asText()).containsExactly(
                    outside.resolve("secret.csv").toString(), escape.toString(), outside.resolve("out.csv").toString());
            assertThat(refused.get(0).get("reason").asText()).startsWith("outside the configured roots");
            assertThat(refused.get(1).get("reason").asText()).startsWith("a symbolic link that leads outside");
            assertThat(refused.get(2).get("reason").asText()).startsWith("outside the configured roots");
            var run = catalog.reader().runs(10).get(0);
            assertThat(run.reads()).isEqualTo(1);
            assertThat(run.writes()).isZero();
            var audit = new org.headwater.access.Audit(catalog.store(), java.time.Clock.systemUTC())
                    .list(null, "run.io_refused", 10);
            assertThat(audit).hasSize(3);
        }
    }

    @Test
    void aScriptOutsideTheRootsRefusesTheWholeRun() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        String record = "{\"run_id\": \"roots-2\", \"script\": {\"path\": \"" + temp.resolve("other/fit.py") + "\"},"
                + " \"started_at\": \"2026-06-01T08:00:00Z\"}";
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"));
                ApiServer server = ApiServer.start(catalog, "127.0.0.1", 0,
                        ServerSettings.defaults().withRoots(List.of(lake)))) {
            String token = TestTokens.create(catalog, Role.HARVESTER);
            HttpResponse<String> answer = post(server, token, record);
            assertThat(answer.statusCode()).isEqualTo(403);
            assertThat(JSON.readTree(answer.body()).get("code").asText()).isEqualTo("path_outside_roots");
            assertThat(catalog.reader().runs(10)).isEmpty();
        }
    }

    static HttpResponse<String> post(ApiServer server, String token, String body) throws Exception {
        return HTTP.send(HttpRequest.newBuilder(URI.create(server.url() + "api/runs"))
                .header("Authorization", TestTokens.bearer(token)).header("Content-Type", "application/json")
                .POST(HttpRequest.BodyPublishers.ofString(body)).build(), HttpResponse.BodyHandlers.ofString());
    }
}
