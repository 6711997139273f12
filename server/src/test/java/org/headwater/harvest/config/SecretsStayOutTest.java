package org.headwater.harvest.config;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.ByteArrayOutputStream;
import java.io.PrintStream;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.http.ApiServer;
import org.headwater.testing.S3TestServer;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A harvest with credentials, right and wrong, leaves the secret nowhere: not in the store, the search index,
 * the logs or the API's answers. Each scan is first shown to find something it should (the bucket's name), so
 * an empty scan cannot pass for a clean one.
 */
class SecretsStayOutTest {
    private static final String WRONG = "wrong-secret-Zr8-also-never-stored";

    @TempDir
    Path temp;

    @Test
    void noSecretReachesTheStoreTheIndexTheLogsOrTheApi() throws Exception {
        PrintStream out = System.out;
        PrintStream err = System.err;
        ByteArrayOutputStream captured = new ByteArrayOutputStream();
        try (S3TestServer server = S3TestServer.start(); Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            server.createBucket("kelp-survey");
            server.put("kelp-survey", "plots.csv", "plot,kelp_kg\nA1,12\nA2,9\n".getBytes(StandardCharsets.UTF_8));
            SourcesConfig config = SourcesConfig.parse("""
                    sources:
                      - name: kelp
                        kind: s3
                        url: s3://kelp-survey/
                        endpoint: %1$s
                        path-style: true
                        access-key-env: KELP_KEY
                        secret-key-env: KELP_SECRET
                      - name: kelp-wrong
                        kind: s3
                        url: s3://kelp-survey/
                        endpoint: %1$s
                        path-style: true
                        access-key-env: KELP_KEY
                        secret-key-env: KELP_WRONG
                    """.formatted(server.endpoint()), null, "test");
            Map<String, String> env = Map.of("KELP_KEY", S3TestServer.ACCESS_KEY, "KELP_SECRET", S3TestServer.SECRET_KEY,
                    "KELP_WRONG", WRONG);
            List<SourceRunner.Outcome> outcomes;
            PrintStream capture = new PrintStream(captured, true, StandardCharsets.UTF_8);
            System.setOut(capture);
            System.setErr(capture);
            try {
                outcomes = new SourceRunner(catalog, DatabaseHarvests.NONE, env::get).run(config, null, false,
                        s -> HarvestProgress.NONE);
                outcomes.forEach(o -> capture.println(o));
            } finally {
                System.setOut(out);
                System.setErr(err);
            }
            assertThat(outcomes).extracting(SourceRunner.Outcome::status).containsExactly("ok", "failed");

            String store = storeDump(catalog);
            String index = indexBytes(catalog.dataDir().resolve("index"));
            String api = apiAnswers(catalog);
            String logs = captured.toString(StandardCharsets.UTF_8);
            // The scans see what they should: the object's URI is in the store and the API, the outcome in the logs.
            assertThat(store).contains(server.endpoint() + "/kelp-survey/plots.csv");
            assertThat(api).contains(server.endpoint() + "/kelp-survey/plots.csv").contains("SignatureDoesNotMatch");
            assertThat(logs).contains("kelp-wrong");
            assertThat(catalog.index().search("plots", null, 10)).isNotEmpty();
            assertThat(index).contains("plot");
            for (String secret : List.of(S3TestServer.SECRET_KEY, WRONG)) {
                assertThat(store).doesNotContain(secret);
                assertThat(index).doesNotContain(secret);
                assertThat(api).doesNotContain(secret);
                assertThat(logs).doesNotContain(secret);
                assertThat(catalog.index().search(secret, null, 10)).isEmpty();
            }
        } finally {
            System.setOut(out);
            System.setErr(err);
        }
    }

    /** Every row of every table, as H2's SCRIPT statement writes the database out. */
    private static String storeDump(Catalog catalog) {
        StringBuilder dump = new StringBuilder();
        catalog.store().dsl().fetch("SCRIPT").forEach(r -> dump.append(r.get(0)).append('\n'));
        return dump.toString();
    }

    /** The index files' bytes; stored fields are also searched above, since Lucene may compress them. */
    private static String indexBytes(Path folder) throws Exception {
        StringBuilder all = new StringBuilder();
        try (Stream<Path> files = Files.walk(folder)) {
            for (Path f : files.filter(Files::isRegularFile).toList()) {
                all.append(new String(Files.readAllBytes(f), StandardCharsets.ISO_8859_1));
            }
        }
        return all.toString();
    }

    private static String apiAnswers(Catalog catalog) throws Exception {
        try (ApiServer api = ApiServer.start(catalog, "127.0.0.1", 0)) {
            HttpClient http = HttpClient.newHttpClient();
            List<String> bodies = new ArrayList<>();
            List<String> paths = new ArrayList<>(List.of("/api/harvests", "/api/datasets", "/api/search?q=kelp"));
            for (var h : catalog.reader().harvests(50)) {
                paths.add("/api/harvests/" + h.id());
            }
            for (var d : catalog.reader().datasets(null, 0, 50, null)) {
                paths.add("/api/datasets/" + d.id());
            }
            for (String p : paths) {
                HttpResponse<String> r = http.send(HttpRequest.newBuilder(URI.create(api.url() + p.substring(1))).build(),
                        HttpResponse.BodyHandlers.ofString());
                assertThat(r.statusCode()).as(p).isEqualTo(200);
                bodies.add(r.body());
            }
            return String.join("\n", bodies);
        }
    }
}
