package org.headwater.harvest.table;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.DatasetLookup.columns;
import static org.headwater.testing.DatasetLookup.dataset;
import static org.headwater.testing.DatasetLookup.datasetNames;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.harvest.config.DatabaseHarvests;
import org.headwater.harvest.config.SourceRunner;
import org.headwater.harvest.config.SourcesConfig;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.S3TestServer;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Table folders (fixtures under {@code tables/}, written after the Delta Lake protocol and the Iceberg table
 * spec; see its README) harvested from a local folder and from an S3-compatible bucket.
 */
class TableFormatsTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;

    @Test
    void aDeltaTableFolderIsOneDatasetWithItsLogsSchemaVersionsAndLiveFiles() throws Exception {
        Path lake = copyFixtures();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            String root = lake.toRealPath().toUri().toString();
            // A table folder is one dataset: none of its log or data files is a dataset of its own.
            assertThat(datasetNames(catalog, root)).containsExactly("buoy_readings/", "harbour_tides/", "quay_list.csv");
            checkDelta(dataset(catalog, root + "harbour_tides/"));
        }
    }

    @Test
    void anIcebergTableFolderIsOneDatasetWithTheCurrentMetadataFilesSchemaAndSnapshots() throws Exception {
        Path lake = copyFixtures();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            checkIceberg(dataset(catalog, lake.toRealPath().toUri() + "buoy_readings/"));
        }
    }

    @Test
    void tableFoldersInABucketReadTheSameAsOnDisk() throws Exception {
        Path lake = copyFixtures();
        try (S3TestServer server = S3TestServer.start(); Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            server.createBucket("wave-buoys");
            try (Stream<Path> files = Files.walk(lake)) {
                for (Path f : files.filter(Files::isRegularFile).toList()) {
                    server.put("wave-buoys", "warehouse/" + lake.relativize(f).toString().replace('\\', '/'),
                            Files.readAllBytes(f));
                }
            }
            SourcesConfig config = SourcesConfig.parse("""
                    sources:
                      - name: buoys
                        kind: s3
                        url: s3://wave-buoys/warehouse/
                        endpoint: %s
                        path-style: true
                        access-key-env: KEY
                        secret-key-env: SECRET
                    """.formatted(server.endpoint()), null, "test");
            var env = java.util.Map.of("KEY", S3TestServer.ACCESS_KEY, "SECRET", S3TestServer.SECRET_KEY);
            var outcome = new SourceRunner(catalog, DatabaseHarvests.NONE, env::get).run(config, null, false,
                    s -> HarvestProgress.NONE).get(0);
            assertThat(outcome.status()).isEqualTo("ok");
            assertThat(datasetNames(catalog, server.endpoint() + "/wave-buoys/warehouse/"))
                    .containsExactly("buoy_readings/", "harbour_tides/", "quay_list.csv");
            checkDelta(dataset(catalog, server.endpoint() + "/wave-buoys/warehouse/harbour_tides/"));
            checkIceberg(dataset(catalog, server.endpoint() + "/wave-buoys/warehouse/buoy_readings/"));
        }
    }

    @Test
    void aDeltaLogWithoutItsEarlyCommitsAndWithoutACheckpointIsReportedNotGuessed() throws Exception {
        // PROTOCOL.md "Checkpoints": commits before a checkpoint may be removed; here only version 5 remains.
        List<TableFile> files = List.of(new TableFile("_delta_log/00000000000000000005.json", 10, Instant.EPOCH,
                () -> "{\"commitInfo\":{\"timestamp\":1767225600000,\"operation\":\"WRITE\"}}\n".getBytes()));
        assertThat(org.assertj.core.api.Assertions.catchThrowable(() -> DeltaLog.read(files)))
                .isInstanceOf(UnreadableTableException.class)
                .hasMessage("The log starts at version 5 and no checkpoint holds the table's state before it");
    }

    @Test
    void aDamagedCheckpointIsReportedNotGuessed() throws Exception {
        List<TableFile> files = List.of(
                new TableFile("_delta_log/00000000000000000004.checkpoint.parquet", 10, Instant.EPOCH, () -> new byte[10]),
                new TableFile("_delta_log/00000000000000000005.json", 10, Instant.EPOCH,
                        () -> "{\"commitInfo\":{\"timestamp\":1767225600000,\"operation\":\"WRITE\"}}\n".getBytes()));
        assertThat(org.assertj.core.api.Assertions.catchThrowable(() -> DeltaLog.read(files)))
                .isInstanceOf(UnreadableTableException.class)
                .hasMessage("The checkpoint is not a Parquet file (no PAR1 magic at both ends)");
    }

    private static void checkDelta(DatasetView table) throws Exception {
        assertThat(table.kind()).isEqualTo("table");
        assertThat(table.format()).isEqualTo("delta");
        // expected: PROTOCOL.md "Change Metadata" — the latest metaData action (version 2) is the schema;
        // "Schema Serialization Format" — primitive type names as written.
        assertThat(columns(table)).containsExactly("gauge_id long", "reading_m double", "taken_at timestamp",
                "harbour string", "sensor_batch string");
        assertThat(table.columns()).extracting(c -> c.nullable()).containsExactly(false, true, false, true, true);
        // expected: PROTOCOL.md "Add File and Remove File" + "Per-file Statistics": live files are the adds
        // not removed later: 80 + 100 records, 1536 + 1800 bytes.
        assertThat(table.rowCount()).isEqualTo(180L);
        assertThat(table.rowCountExact()).isTrue();
        assertThat(table.sizeBytes()).isEqualTo(3_336L);
        // expected: the commitInfo timestamp of version 3, 1767402000000 ms after the epoch.
        assertThat(table.modifiedAt()).isEqualTo(Instant.parse("2026-01-03T01:00:00Z"));
        JsonNode details = JSON.readTree(table.details());
        assertThat(details.get("current_version").asLong()).isEqualTo(3);
        assertThat(texts(details.get("partition_columns"))).containsExactly("harbour");
        assertThat(versions(details.get("versions"), "operation")).containsExactly("CREATE TABLE", "WRITE", "ADD COLUMNS", "DELETE");
        assertThat(versions(details.get("versions"), "timestamp")).containsExactly("2026-01-01T00:00:00Z",
                "2026-01-01T01:00:00Z", "2026-01-02T01:00:00Z", "2026-01-03T01:00:00Z");
        // Two schemas: created at version 0, a column added at version 2, each with the table's own time.
        assertThat(versions(details.get("schemas"), "from_version")).containsExactly("0", "2");
        assertThat(versions(details.get("schemas"), "timestamp")).containsExactly("2026-01-01T00:00:00Z", "2026-01-02T01:00:00Z");
        assertThat(details.get("protocol").get("min_writer_version").asInt()).isEqualTo(2);
    }

    private static void checkIceberg(DatasetView table) throws Exception {
        assertThat(table.kind()).isEqualTo("table");
        assertThat(table.format()).isEqualTo("iceberg");
        // expected: Iceberg Table Spec "Table Metadata Fields" — current-schema-id 1 in v2.metadata.json, the file
        // version-hint.text names ("File System Tables"); "Schemas and Data Types": required=false is nullable.
        assertThat(columns(table)).containsExactly("buoy_id long", "observed_at timestamptz", "wave_height_m double",
                "sea_state string");
        assertThat(table.columns()).extracting(c -> c.nullable()).containsExactly(false, false, true, true);
        // expected: Table Spec "Snapshots" — the current snapshot's summary: total-records 750, total-files-size 61440.
        assertThat(table.rowCount()).isEqualTo(750L);
        assertThat(table.sizeBytes()).isEqualTo(61_440L);
        // expected: last-updated-ms 1767348000000.
        assertThat(table.modifiedAt()).isEqualTo(Instant.parse("2026-01-02T10:00:00Z"));
        JsonNode details = JSON.readTree(table.details());
        assertThat(details.get("metadata_file").asText()).isEqualTo("metadata/v2.metadata.json");
        assertThat(details.get("current_snapshot_id").asLong()).isEqualTo(3002);
        assertThat(versions(details.get("snapshots"), "operation")).containsExactly("append", "append");
        assertThat(versions(details.get("snapshots"), "timestamp")).containsExactly("2026-01-01T10:00:00Z", "2026-01-02T10:00:00Z");
        assertThat(versions(details.get("snapshots"), "schema_id")).containsExactly("0", "1");
        // expected: Table Spec "Partition Specs" — spec 0 partitions by day(observed_at).
        JsonNode part = details.get("partition_columns").get(0);
        assertThat(part.get("name").asText()).isEqualTo("observed_at_day");
        assertThat(part.get("source_column").asText()).isEqualTo("observed_at");
        assertThat(part.get("transform").asText()).isEqualTo("day");
        assertThat(details.has("properties")).isFalse();
    }

    private Path copyFixtures() throws Exception {
        Path source = Path.of(TableFormatsTest.class.getResource("/tables/harbour_tides").toURI()).getParent();
        Path lake = temp.resolve("lake");
        try (Stream<Path> files = Files.walk(source)) {
            for (Path f : files.filter(Files::isRegularFile).filter(f -> !f.getFileName().toString().equals("README.md")).toList()) {
                Path target = lake.resolve(source.relativize(f).toString());
                Files.createDirectories(target.getParent());
                Files.copy(f, target);
            }
        }
        Files.writeString(lake.resolve("quay_list.csv"), "quay,berths\nNorth,4\nSouth,6\n");
        return lake;
    }

    private static List<String> texts(JsonNode array) {
        List<String> out = new ArrayList<>();
        array.forEach(n -> out.add(n.asText()));
        return out;
    }

    private static List<String> versions(JsonNode array, String field) {
        List<String> out = new ArrayList<>();
        array.forEach(n -> out.add(n.get(field).asText()));
        return out;
    }
}
