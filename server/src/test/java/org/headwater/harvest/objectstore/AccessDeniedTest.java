package org.headwater.harvest.objectstore;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.DatasetLookup.columns;
import static org.headwater.testing.DatasetLookup.dataset;
import static org.headwater.testing.DatasetLookup.datasetNames;

import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.cli.Main;
import org.headwater.http.ApiServer;
import org.headwater.store.StoreConfig;
import org.headwater.testing.Cli;
import org.headwater.testing.S3TestServer;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A store that refuses a bucket or an object ({@code 403 AccessDenied}, answered over HTTP by the in-process
 * S3 server) fails that source or that object alone, says so on the harvest record, in the CLI and the API,
 * and leaves what the catalog knew of it as it was. Credentials come from the SDK's default provider chain
 * (its system-property step), as a deployment's would.
 */
class AccessDeniedTest {
    @TempDir
    Path temp;

    private S3TestServer server;
    private String previousKey;
    private String previousSecret;

    @BeforeEach
    void start() throws Exception {
        server = S3TestServer.start();
        server.createBucket("reef-counts");
        server.put("reef-counts", "surveys/transects.csv", "transect,fish,coral_pct\nT1,41,62.5\nT2,17,40.0\n"
                .getBytes(StandardCharsets.UTF_8));
        server.put("reef-counts", "surveys/divers.json", "[{\"diver\": \"d-03\", \"dives\": 12}]"
                .getBytes(StandardCharsets.UTF_8));
        server.createBucket("reef-open");
        server.put("reef-open", "tides.csv", "day,high_m\n1,2.4\n".getBytes(StandardCharsets.UTF_8));
        // The SDK's DefaultCredentialsProvider looks at these system properties first (AWS SDK for Java 2.x
        // developer guide, "Default credentials provider chain").
        previousKey = System.setProperty("aws.accessKeyId", S3TestServer.ACCESS_KEY);
        previousSecret = System.setProperty("aws.secretAccessKey", S3TestServer.SECRET_KEY);
    }

    @AfterEach
    void stop() {
        restore("aws.accessKeyId", previousKey);
        restore("aws.secretAccessKey", previousSecret);
        if (server != null) {
            server.close();
        }
    }

    @Test
    void aDeniedBucketFailsItsSourceAloneWithTheStoresCodeAndKeepsWhatWasKnown() throws Exception {
        Path dataDir = temp.resolve("catalog");
        Path sources = sourcesFile();
        assertThat(Cli.run("harvest", "--config", sources.toString(), "--data-dir", dataDir.toString()).exit())
                .isEqualTo(Main.OK);
        String root = server.endpoint() + "/reef-counts/surveys/";
        List<String> before;
        try (Catalog catalog = open(dataDir)) {
            before = datasetNames(catalog, root);
            assertThat(before).containsExactly("divers.json", "transects.csv");
        }

        server.deny("reef-counts");
        var run = Cli.run("harvest", "--config", sources.toString(), "--data-dir", dataDir.toString());

        // expected: Amazon S3 API Reference, "Error responses": AccessDenied is the code of a 403 refusal.
        assertThat(run.exit()).isEqualTo(Main.PROBLEMS);
        assertThat(run.out()).contains("counts (s3): FAILED (harvest ")
                .contains("s3://reef-counts/surveys/ at " + server.endpoint()
                        + ": access denied: the credentials may not list or read this prefix [AccessDenied]")
                .contains("open (s3): 1 files");
        try (Catalog catalog = open(dataDir)) {
            // Nothing of the refused source was ended or changed: same datasets, still present, same columns.
            assertThat(datasetNames(catalog, root)).isEqualTo(before);
            assertThat(dataset(catalog, root + "transects.csv").present()).isTrue();
            assertThat(columns(dataset(catalog, root + "transects.csv")))
                    .containsExactly("transect text", "fish integer", "coral_pct decimal");
            var failed = catalog.reader().harvests(10).stream().filter(h -> h.source().equals("counts")
                    && h.status().equals("failed")).findFirst().orElseThrow();
            var record = catalog.reader().harvest(failed.id()).orElseThrow();
            assertThat(record.errorList()).extracting(e -> e.kind()).containsExactly("harvest_failed");
            assertThat(record.errorList().get(0).message()).endsWith("[AccessDenied]");
            try (ApiServer api = ApiServer.start(catalog, "127.0.0.1", 0)) {
                HttpResponse<String> answer = HttpClient.newHttpClient().send(HttpRequest.newBuilder(
                        URI.create(api.url() + "api/harvests/" + failed.id())).build(), HttpResponse.BodyHandlers.ofString());
                assertThat(answer.statusCode()).isEqualTo(200);
                assertThat(answer.body()).contains("\"status\":\"failed\"").contains("[AccessDenied]");
            }
        }
    }

    @Test
    void aDeniedObjectIsAnErrorOfThatObjectWhileTheRestOfTheBucketIsHarvested() throws Exception {
        Path dataDir = temp.resolve("catalog");
        Path sources = sourcesFile();
        server.put("reef-counts", "surveys/permits.csv", "permit,holder\nP-1,station 4\n".getBytes(StandardCharsets.UTF_8));
        server.deny("reef-counts/surveys/permits.csv");

        var run = Cli.run("harvest", "--config", sources.toString(), "--data-dir", dataDir.toString());

        assertThat(run.exit()).isEqualTo(Main.PROBLEMS);
        assertThat(run.out()).contains("counts (s3): 3 files").contains("1 errors");
        String root = server.endpoint() + "/reef-counts/surveys/";
        try (Catalog catalog = open(dataDir)) {
            assertThat(columns(dataset(catalog, root + "transects.csv")))
                    .containsExactly("transect text", "fish integer", "coral_pct decimal");
            var permits = dataset(catalog, root + "permits.csv");
            assertThat(permits.error()).contains("[AccessDenied]");
            assertThat(permits.columns()).isEmpty();
        }
    }

    private Path sourcesFile() throws Exception {
        Path file = temp.resolve("sources.yaml");
        Files.writeString(file, """
                sources:
                  - name: counts
                    kind: s3
                    url: s3://reef-counts/surveys/
                    endpoint: %1$s
                    path-style: true
                  - name: open
                    kind: s3
                    url: s3://reef-open/
                    endpoint: %1$s
                    path-style: true
                """.formatted(server.endpoint()));
        return file;
    }

    private static Catalog open(Path dataDir) {
        return Catalog.open(dataDir, StoreConfig.embedded(dataDir.toAbsolutePath().normalize()), Clock.systemUTC());
    }

    private static void restore(String property, String previous) {
        if (previous == null) {
            System.clearProperty(property);
        } else {
            System.setProperty(property, previous);
        }
    }
}
