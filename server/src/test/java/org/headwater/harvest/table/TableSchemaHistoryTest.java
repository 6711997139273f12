package org.headwater.harvest.table;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.DatasetLookup.dataset;

import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.stream.Stream;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.store.Views.SchemaVersionView;
import org.headwater.testing.Cli;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A table's own versions become the schema history of its one dataset, with the table's timestamps and
 * operations, and grow by exactly the versions the table gained since the last harvest.
 */
class TableSchemaHistoryTest {
    @TempDir
    Path temp;

    @Test
    void everyDeltaCommitIsASchemaVersionWithTheCommitsOwnTimeAndOperation() throws Exception {
        Path lake = copyFixtures();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            List<SchemaVersionView> history = history(catalog, lake, "harbour_tides/");
            // expected: PROTOCOL.md "Delta Log Entries" — versions 0 to 3 are the four commit files;
            // "Commit Provenance Information" — commitInfo.timestamp and operation as each commit wrote them.
            assertThat(history).extracting(SchemaVersionView::tableVersion).containsExactly("0", "1", "2", "3");
            assertThat(history).extracting(SchemaVersionView::operation)
                    .containsExactly("CREATE TABLE", "WRITE", "ADD COLUMNS", "DELETE");
            assertThat(history).extracting(SchemaVersionView::recordedAt).containsExactly(
                    Instant.ofEpochMilli(1767225600000L), Instant.ofEpochMilli(1767229200000L),
                    Instant.ofEpochMilli(1767315600000L), Instant.ofEpochMilli(1767402000000L));
            // expected: "Change Metadata" — version 2's metaData adds sensor_batch; the other commits keep the schema.
            assertThat(history.get(0).drift().added()).containsExactly("gauge_id", "reading_m", "taken_at", "harbour");
            assertThat(history.get(1).drift().added()).isEmpty();
            assertThat(history.get(2).drift().added()).containsExactly("sensor_batch");
            assertThat(history.get(3).drift().added()).isEmpty();
            assertThat(history.get(3).partitionColumns()).containsExactly("harbour");
            // The newest version is the dataset's current schema; the older ones are closed.
            assertThat(history).extracting(v -> v.validTo() == null).containsExactly(false, false, false, true);
            assertThat(dataset(catalog, lake.toRealPath().toUri() + "harbour_tides/").schemaVersion()).isEqualTo(4);
        }
    }

    @Test
    void aReharvestAfterOneMoreCommitAddsExactlyOneVersionWithItsDrift() throws Exception {
        Path lake = copyFixtures();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(history(catalog, lake, "harbour_tides/")).hasSize(4);

            // PROTOCOL.md "Change Metadata": a new metaData action replaces the whole schema; here sensor_batch
            // goes, reading_m becomes a float (written by hand, as a writer would) and quality is new.
            String schema = "{\\\"type\\\":\\\"struct\\\",\\\"fields\\\":["
                    + field("gauge_id", "long", false) + "," + field("reading_m", "float", true) + ","
                    + field("taken_at", "timestamp", false) + "," + field("harbour", "string", true) + ","
                    + field("quality", "string", true) + "]}";
            Files.writeString(lake.resolve("harbour_tides/_delta_log/00000000000000000004.json"),
                    "{\"commitInfo\":{\"timestamp\":1767488400000,\"operation\":\"REPLACE COLUMNS\"}}\n"
                    + "{\"metaData\":{\"id\":\"2f6d1c9e-7a41-4c3b-9e0a-5d8b7c6a1f20\",\"format\":{\"provider\":\"parquet\","
                    + "\"options\":{}},\"schemaString\":\"" + schema + "\",\"partitionColumns\":[\"harbour\"],"
                    + "\"configuration\":{}}}\n");
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            List<SchemaVersionView> history = history(catalog, lake, "harbour_tides/");
            assertThat(history).hasSize(5);
            SchemaVersionView last = history.get(4);
            assertThat(last.tableVersion()).isEqualTo("4");
            assertThat(last.operation()).isEqualTo("REPLACE COLUMNS");
            assertThat(last.recordedAt()).isEqualTo(Instant.ofEpochMilli(1767488400000L));
            assertThat(last.drift().added()).containsExactly("quality");
            assertThat(last.drift().removed()).containsExactly("sensor_batch");
            assertThat(last.drift().retyped()).containsExactly("reading_m: double -> float");
            // The earlier versions are untouched by the second pass.
            assertThat(history.subList(0, 4)).extracting(SchemaVersionView::tableVersion)
                    .containsExactly("0", "1", "2", "3");
        }
    }

    @Test
    void everyIcebergSnapshotIsASchemaVersionWithTheSchemaItWasWrittenWith() throws Exception {
        Path lake = copyFixtures();
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            List<SchemaVersionView> history = history(catalog, lake, "buoy_readings/");
            // expected: Iceberg Table Spec "Snapshots" — snapshot-id, timestamp-ms, summary.operation and
            // schema-id of each snapshot in v2.metadata.json; "Partition Specs" — day(observed_at).
            assertThat(history).extracting(SchemaVersionView::tableVersion).containsExactly("snapshot 3001", "snapshot 3002");
            assertThat(history).extracting(SchemaVersionView::operation).containsExactly("append", "append");
            assertThat(history).extracting(SchemaVersionView::recordedAt).containsExactly(
                    Instant.ofEpochMilli(1767261600000L), Instant.ofEpochMilli(1767348000000L));
            assertThat(history.get(1).drift().added()).containsExactly("sea_state");
            assertThat(history.get(1).partitionColumns()).containsExactly("day(observed_at)");
        }
    }

    @Test
    void theCliShowsTheTablesVersionsWithTheirTimesAndDrift() throws Exception {
        Path lake = copyFixtures();
        Path store = temp.resolve("catalog");
        // The CLI opens the H2 file under --data-dir, as a user's catalog would be.
        assertThat(Cli.run("harvest", lake.toString(), "--data-dir", store.toString()).exit()).isEqualTo(0);
        var run = Cli.run("show", "harbour_tides/", "--history", "--data-dir", store.toString());
        assertThat(run.exit()).isEqualTo(0);
        assertThat(run.out()).contains("table version 2 at 2026-01-02T01:00:00Z (ADD COLUMNS)")
                .contains("    + sensor_batch");
    }

    private static String field(String name, String type, boolean nullable) {
        return "{\\\"name\\\":\\\"" + name + "\\\",\\\"type\\\":\\\"" + type + "\\\",\\\"nullable\\\":" + nullable
                + ",\\\"metadata\\\":{}}";
    }

    private static List<SchemaVersionView> history(Catalog catalog, Path lake, String table) throws Exception {
        return catalog.reader().schemaHistory(dataset(catalog, lake.toRealPath().toUri() + table).id());
    }

    private Path copyFixtures() throws Exception {
        Path source = Path.of(TableSchemaHistoryTest.class.getResource("/tables/harbour_tides").toURI()).getParent();
        Path lake = temp.resolve("lake");
        try (Stream<Path> files = Files.walk(source)) {
            for (Path f : files.filter(Files::isRegularFile).filter(f -> !f.getFileName().toString().equals("README.md")).toList()) {
                Path target = lake.resolve(source.relativize(f).toString());
                Files.createDirectories(target.getParent());
                Files.copy(f, target);
            }
        }
        return lake;
    }
}
