package org.headwater.harvest.objectstore;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.DatasetLookup.columns;
import static org.headwater.testing.DatasetLookup.dataset;
import static org.headwater.testing.DatasetLookup.datasetNames;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import org.apache.hadoop.conf.Configuration;
import org.apache.parquet.example.data.Group;
import org.apache.parquet.example.data.simple.SimpleGroupFactory;
import org.apache.parquet.hadoop.ParquetWriter;
import org.apache.parquet.hadoop.example.ExampleParquetWriter;
import org.apache.parquet.io.LocalOutputFile;
import org.apache.parquet.schema.MessageType;
import org.apache.parquet.schema.MessageTypeParser;
import org.apache.parquet.schema.Type;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.HarvestSummary;
import org.headwater.harvest.config.DatabaseHarvests;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourcesConfig;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.S3TestServer;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Harvests buckets of a real S3-compatible server (S3Proxy on loopback) through the sources file. */
class ObjectStoreHarvestTest {
    private static S3TestServer server;

    @TempDir
    Path temp;

    private static final Map<String, String> ENV = Map.of("GAUGE_KEY", S3TestServer.ACCESS_KEY,
            "GAUGE_SECRET", S3TestServer.SECRET_KEY, "WRONG_SECRET", "a-secret-the-server-does-not-know");

    /** Invented harbour gauge readings: parquet-mr's own schema text is the reference for the columns. */
    private static final MessageType READINGS = MessageTypeParser.parseMessageType("""
            message reading {
              required int64 gauge_id;
              optional binary harbour (STRING);
              optional double level_m;
            }
            """);

    @BeforeAll
    static void startServer() throws Exception {
        server = S3TestServer.start();
    }

    @AfterAll
    static void stopServer() throws Exception {
        // Null when the set-up was skipped (no such component here): nothing to close.
        if (server != null) {
            server.close();
        }
    }

    @Test
    void objectsOfAPrefixBecomeTheDatasetsTheSameBytesBecomeInAFolder() throws Exception {
        Path folder = temp.resolve("lake");
        Map<String, byte[]> files = lake(folder);
        server.createBucket("harbour-lake");
        files.forEach((name, bytes) -> server.put("harbour-lake", "raw/" + name, bytes));
        server.put("harbour-lake", "raw/.staging/half-written.csv", "a,b\n1,2\n".getBytes(StandardCharsets.UTF_8));
        server.put("harbour-lake", "elsewhere/not-in-prefix.csv", "a\n1\n".getBytes(StandardCharsets.UTF_8));

        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            List<SourceRunner.Outcome> outcomes = run(catalog, source("lake-s3", "s3://harbour-lake/raw/", "GAUGE_SECRET", "")
                    + folderSource("lake-local", folder));
            assertThat(outcomes).extracting(SourceRunner.Outcome::status).containsExactly("ok", "ok");

            // expected: the keys put under raw/ (S3 ListObjectsV2 lists a prefix, Amazon S3 API Reference), hidden
            // names left out as in a folder; the partitions of tides/ form one set.
            assertThat(datasetNames(catalog, server.endpoint() + "/harbour-lake/raw/")).containsExactly(
                    "gauges.parquet", "notes.json", "stations.csv", "tides/month=*/levels.csv");
            // expected: the same bytes harvested from a local folder, the path the folder tests check.
            for (String name : List.of("stations.csv", "notes.json", "gauges.parquet")) {
                DatasetView s3 = dataset(catalog, server.endpoint() + "/harbour-lake/raw/" + name);
                DatasetView local = dataset(catalog, folder.toRealPath().resolve(name).toUri().toString());
                assertThat(columns(s3)).as(name).isEqualTo(columns(local));
                assertThat(s3.format()).isEqualTo(local.format());
                assertThat(s3.sizeBytes()).isEqualTo((long) files.get(name).length);
            }
            // expected: parquet-mr's schema (the writer's MessageType) names the columns in order.
            assertThat(columns(dataset(catalog, server.endpoint() + "/harbour-lake/raw/gauges.parquet")))
                    .extracting(c -> c.split(" ")[0])
                    .containsExactlyElementsOf(READINGS.getFields().stream().map(Type::getName).toList());
            // The store's ETag is the content identity of an object: an MD5 of the bytes for a single-part upload
            // (Amazon S3 API Reference, "Common Response Headers": ETag).
            assertThat(dataset(catalog, server.endpoint() + "/harbour-lake/raw/stations.csv").contentHash())
                    .isEqualTo("etag:" + md5(files.get("stations.csv")));
        }
    }

    @Test
    void onlyTheSampleIsFetchedAndParquetFootersComeFromTheEnd() throws Exception {
        Path folder = temp.resolve("lake");
        Map<String, byte[]> files = lake(folder);
        server.createBucket("harbour-sample");
        files.forEach((name, bytes) -> server.put("harbour-sample", name, bytes));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            run(catalog, source("sample", "s3://harbour-sample/", "GAUGE_SECRET", "    sample-kib: 1\n"));
            DatasetView csv = dataset(catalog, server.endpoint() + "/harbour-sample/stations.csv");
            // A 1 KiB head of a longer CSV gives an estimated row count, not an exact one: only the head was read.
            assertThat(files.get("stations.csv").length).isGreaterThan(1024);
            assertThat(csv.rowCountExact()).isFalse();
            // expected: parquet-mr's footer (written by ExampleParquetWriter) holds the row count: 3,000 rows.
            DatasetView parquet = dataset(catalog, server.endpoint() + "/harbour-sample/gauges.parquet");
            assertThat(parquet.rowCount()).isEqualTo(3_000L);
            assertThat(parquet.rowCountExact()).isTrue();
        }
    }

    @Test
    void unchangedObjectsAreSkippedAndARewrittenObjectIsReadAgain() throws Exception {
        Path folder = temp.resolve("lake");
        Map<String, byte[]> files = lake(folder);
        server.createBucket("harbour-again");
        files.forEach((name, bytes) -> server.put("harbour-again", name, bytes));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            String config = source("again", "s3://harbour-again/", "GAUGE_SECRET", "");
            HarvestSummary first = run(catalog, config).get(0).summary();
            HarvestSummary second = run(catalog, config).get(0).summary();
            assertThat(second.filesSeen()).isEqualTo(first.filesSeen()).isEqualTo(files.size());
            assertThat(second.filesUnchanged()).isEqualTo(files.size());
            assertThat(second.changes()).isZero();

            server.put("harbour-again", "stations.csv", "station,depth_m\nQuay,4\n".getBytes(StandardCharsets.UTF_8));
            server.delete("harbour-again", "notes.json");
            HarvestSummary third = run(catalog, config).get(0).summary();
            assertThat(third.filesUnchanged()).isEqualTo(files.size() - 2);
            assertThat(columns(dataset(catalog, server.endpoint() + "/harbour-again/stations.csv")))
                    .containsExactly("station text", "depth_m integer");
            assertThat(dataset(catalog, server.endpoint() + "/harbour-again/notes.json").present()).isFalse();
            assertThat(third.removed()).isEqualTo(1);
        }
    }

    @Test
    void aFailingSourceIsRecordedAsFailedAndLeavesItsCatalogStateAndTheOtherSourcesAlone() throws Exception {
        Path folder = temp.resolve("lake");
        Map<String, byte[]> files = lake(folder);
        server.createBucket("harbour-errors");
        files.forEach((name, bytes) -> server.put("harbour-errors", name, bytes));
        int closedPort;
        try (var socket = new java.net.ServerSocket(0, 1, java.net.InetAddress.getLoopbackAddress())) {
            closedPort = socket.getLocalPort();
        }
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            run(catalog, source("harbour", "s3://harbour-errors/", "GAUGE_SECRET", ""));
            int before = datasetNames(catalog, server.endpoint() + "/harbour-errors/").size();

            // The same source, now with a wrong secret, between others that work or fail differently.
            String config = source("harbour", "s3://harbour-errors/", "WRONG_SECRET", "")
                    + source("no-bucket", "s3://no-such-harbour/", "GAUGE_SECRET", "")
                    + source("unreachable", "s3://harbour-errors/", "GAUGE_SECRET", "    attempts: 1\n")
                            .replace(server.endpoint().toString(), "http://127.0.0.1:" + closedPort)
                    + source("harbour-old-key", "s3://harbour-errors/", "WRONG_SECRET", "")
                    + folderSource("local", folder);
            List<SourceRunner.Outcome> outcomes = run(catalog, config);
            Map<String, String> status = new TreeMap<>();
            outcomes.forEach(o -> status.put(o.source(), o.status()));
            assertThat(status).containsExactlyInAnyOrderEntriesOf(Map.of("harbour", "failed", "no-bucket", "failed",
                    "unreachable", "failed", "harbour-old-key", "failed", "local", "ok"));
            // expected: S3 error codes (Amazon S3 API Reference, "List of error codes"): a wrong secret gives
            // SignatureDoesNotMatch, a missing bucket NoSuchBucket; a closed port refuses the connection.
            assertThat(message(outcomes, "harbour")).contains("wrong secret key").contains("[SignatureDoesNotMatch]");
            assertThat(message(outcomes, "no-bucket")).contains("the bucket does not exist").contains("[NoSuchBucket]");
            assertThat(message(outcomes, "unreachable")).contains("cannot reach the store");

            // Nothing of the failed source was ended or changed.
            List<String> after = datasetNames(catalog, server.endpoint() + "/harbour-errors/");
            assertThat(after).hasSize(before);
            for (String name : after) {
                assertThat(dataset(catalog, server.endpoint() + "/harbour-errors/" + name).present()).as(name).isTrue();
            }
            // The failure is on the source's own harvest record, as the API shows it.
            long failedId = outcomes.get(0).harvestId();
            var harvest = catalog.reader().harvest(failedId).orElseThrow();
            assertThat(harvest.status()).isEqualTo("failed");
            assertThat(harvest.source()).isEqualTo("harbour");
            assertThat(harvest.errorList()).extracting(e -> e.kind()).containsExactly("harvest_failed");
            assertThat(harvest.errorList().get(0).message()).contains("[SignatureDoesNotMatch]");
            // "harbour-old-key" names the same bucket on the same store, so the catalog holds one source for
            // both; its harvest record still says which entry of the file ran it, so the failure is not read as
            // harbour's.
            long oldKeyId = outcomes.stream().filter(o -> o.source().equals("harbour-old-key")).findFirst()
                    .orElseThrow().harvestId();
            assertThat(catalog.reader().harvest(oldKeyId).orElseThrow().source()).isEqualTo("harbour-old-key");
        }
    }

    // ---- helpers

    static Map<String, byte[]> lake(Path folder) throws Exception {
        Files.createDirectories(folder.resolve("tides/month=01"));
        Files.createDirectories(folder.resolve("tides/month=02"));
        Map<String, byte[]> files = new TreeMap<>();
        StringBuilder stations = new StringBuilder("station,depth_m,opened\n");
        for (int i = 0; i < 200; i++) {
            stations.append("Pier ").append(i).append(',').append(3 + i % 9).append(",2019-0").append(1 + i % 9).append("-15\n");
        }
        files.put("stations.csv", stations.toString().getBytes(StandardCharsets.UTF_8));
        files.put("notes.json", "[{\"gauge\": 1, \"note\": \"reset\"}, {\"gauge\": 2, \"note\": \"cleaned\"}]"
                .getBytes(StandardCharsets.UTF_8));
        files.put("tides/month=01/levels.csv", "gauge_id,level_m\n1,2.5\n2,3.0\n".getBytes(StandardCharsets.UTF_8));
        files.put("tides/month=02/levels.csv", "gauge_id,level_m\n1,2.7\n2,2.9\n".getBytes(StandardCharsets.UTF_8));
        Path parquet = folder.resolve("gauges.parquet");
        SimpleGroupFactory factory = new SimpleGroupFactory(READINGS);
        try (ParquetWriter<Group> writer = ExampleParquetWriter.builder(new LocalOutputFile(parquet))
                .withConf(new Configuration(false)).withType(READINGS).build()) {
            for (int i = 0; i < 3_000; i++) {
                writer.write(factory.newGroup().append("gauge_id", (long) i).append("harbour", "H" + (i % 5))
                        .append("level_m", i / 10.0));
            }
        }
        files.put("gauges.parquet", Files.readAllBytes(parquet));
        for (Map.Entry<String, byte[]> e : files.entrySet()) {
            Files.write(folder.resolve(e.getKey()), e.getValue());
        }
        return files;
    }

    private String source(String name, String url, String secretEnv, String extra) {
        return "  - name: " + name + "\n    kind: s3\n    url: " + url + "\n    endpoint: " + server.endpoint()
                + "\n    path-style: true\n    access-key-env: GAUGE_KEY\n    secret-key-env: " + secretEnv + "\n" + extra;
    }

    static String folderSource(String name, Path folder) {
        return "  - name: " + name + "\n    kind: folder\n    path: " + folder + "\n";
    }

    static List<SourceRunner.Outcome> run(Catalog catalog, String entries) {
        SourcesConfig config = SourcesConfig.parse("sources:\n" + entries, null, "test sources");
        return new SourceRunner(catalog, DatabaseHarvests.NONE, ENV::get).run(config, null, false, s -> HarvestProgress.NONE);
    }

    private static String message(List<SourceRunner.Outcome> outcomes, String source) {
        return outcomes.stream().filter(o -> o.source().equals(source)).findFirst().orElseThrow().message();
    }

    private static String md5(byte[] bytes) throws Exception {
        return java.util.HexFormat.of().formatHex(java.security.MessageDigest.getInstance("MD5").digest(bytes));
    }
}
