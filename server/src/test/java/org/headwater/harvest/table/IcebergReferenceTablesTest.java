package org.headwater.harvest.table;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.DatasetLookup.columns;
import static org.headwater.testing.DatasetLookup.dataset;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.InputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.apache.iceberg.DataFile;
import org.apache.iceberg.DataFiles;
import org.apache.iceberg.FileScanTask;
import org.apache.iceberg.HasTableOperations;
import org.apache.iceberg.ManifestFile;
import org.apache.iceberg.PartitionSpec;
import org.apache.iceberg.Schema;
import org.apache.iceberg.Snapshot;
import org.apache.iceberg.Table;
import org.apache.iceberg.TableMetadata;
import org.apache.iceberg.catalog.Namespace;
import org.apache.iceberg.catalog.TableIdentifier;
import org.apache.iceberg.inmemory.InMemoryCatalog;
import org.apache.iceberg.io.CloseableIterable;
import org.apache.iceberg.io.FileIO;
import org.apache.iceberg.types.Types;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.store.Views.DatasetView;
import org.headwater.store.Views.SchemaVersionView;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Iceberg tables written by the reference implementation, Apache Iceberg's own {@code iceberg-core} (its
 * in-memory catalog and file IO: no Hadoop), copied to disk file by file and harvested. Every expected value
 * is asked of iceberg-core's API for the same table.
 */
class IcebergReferenceTablesTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    @TempDir
    Path temp;

    private InMemoryCatalog iceberg;
    private Path warehouse;

    @BeforeEach
    void openReferenceCatalog() throws Exception {
        warehouse = temp.resolve("warehouse").toAbsolutePath();
        Files.createDirectories(warehouse);
        iceberg = new InMemoryCatalog();
        iceberg.initialize("reference", Map.of("warehouse", warehouse.toString()));
        iceberg.createNamespace(Namespace.of("lagoon"));
    }

    @AfterEach
    void closeReferenceCatalog() throws Exception {
        if (iceberg != null) {
            iceberg.close();
        }
    }

    @Test
    void aTableWrittenByIcebergCoreReadsWithItsSchemaSnapshotsAndManifestCounts() throws Exception {
        Table table = salinityTable();
        copyToDisk(table);
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(warehouse, false, HarvestProgress.NONE);
            DatasetView d = dataset(catalog, warehouse.toRealPath().toUri() + "lagoon/salinity/");
            assertThat(d.format()).isEqualTo("iceberg");
            // expected: iceberg-core's own schema of the table (type words as Iceberg prints them).
            assertThat(columns(d)).containsExactlyElementsOf(table.schema().columns().stream()
                    .map(f -> f.name() + " " + f.type()).toList());
            assertThat(d.columns()).extracting(c -> c.nullable())
                    .containsExactlyElementsOf(table.schema().columns().stream().map(Types.NestedField::isOptional).toList());

            // expected: iceberg-core's scan planning of each snapshot: files it would read and their records.
            JsonNode details = JSON.readTree(d.details());
            List<Snapshot> snapshots = snapshots(table);
            assertThat(details.get("snapshots")).hasSize(snapshots.size());
            for (int i = 0; i < snapshots.size(); i++) {
                JsonNode s = details.get("snapshots").get(i);
                long[] planned = planned(table, snapshots.get(i).snapshotId());
                assertThat(s.get("snapshot_id").asLong()).isEqualTo(snapshots.get(i).snapshotId());
                assertThat(s.get("data_files").asLong()).as("files of snapshot %d", i).isEqualTo(planned[0]);
                assertThat(s.get("records").asLong()).as("records of snapshot %d", i).isEqualTo(planned[1]);
            }
            long[] current = planned(table, table.currentSnapshot().snapshotId());
            // The reference agrees with the operations above: b (80) and c (45) are live once a is deleted.
            assertThat(current).containsExactly(2, 125);
            assertThat(d.rowCount()).isEqualTo(current[1]);
            assertThat(details.get("data_files").asLong()).isEqualTo(current[0]);

            // expected: iceberg-core's snapshot list: ids, commit times and operations, in commit order.
            List<SchemaVersionView> history = catalog.reader().schemaHistory(d.id());
            assertThat(history).extracting(SchemaVersionView::tableVersion)
                    .containsExactlyElementsOf(snapshots.stream().map(s -> "snapshot " + s.snapshotId()).toList());
            assertThat(history).extracting(SchemaVersionView::recordedAt)
                    .containsExactlyElementsOf(snapshots.stream().map(s -> Instant.ofEpochMilli(s.timestampMillis())).toList());
            assertThat(history).extracting(SchemaVersionView::operation)
                    .containsExactlyElementsOf(snapshots.stream().map(Snapshot::operation).toList());
            // The schema change between the first and second append is the drift of the second version.
            assertThat(history.get(1).drift().added()).containsExactly("probe_depth_m");
            assertThat(history.get(2).drift().added()).isEmpty();
            assertThat(history.get(0).partitionColumns()).containsExactly("day(measured_at)");
        }
    }

    @Test
    void oneMoreCommitByIcebergCoreIsExactlyOneMoreVersion() throws Exception {
        Table table = salinityTable();
        copyToDisk(table);
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(warehouse, false, HarvestProgress.NONE);
            String uri = warehouse.toRealPath().toUri() + "lagoon/salinity/";
            int before = catalog.reader().schemaHistory(dataset(catalog, uri).id()).size();

            table.newAppend().appendFile(file(table, "d.parquet", "2026-03-03", 70)).commit();
            copyToDisk(table);
            catalog.harvestFolder(warehouse, false, HarvestProgress.NONE);

            List<SchemaVersionView> history = catalog.reader().schemaHistory(dataset(catalog, uri).id());
            assertThat(history).hasSize(before + 1);
            Snapshot last = table.currentSnapshot();
            assertThat(history.get(before).tableVersion()).isEqualTo("snapshot " + last.snapshotId());
            assertThat(history.get(before).operation()).isEqualTo(last.operation());
            assertThat(dataset(catalog, uri).rowCount()).isEqualTo(planned(table, last.snapshotId())[1]);
        }
    }

    /** Two appends around a schema change, then a delete, through iceberg-core's table API. */
    private Table salinityTable() {
        Schema schema = new Schema(
                Types.NestedField.required(1, "probe_id", Types.LongType.get()),
                Types.NestedField.required(2, "measured_at", Types.TimestampType.withZone()),
                Types.NestedField.optional(3, "psu", Types.DoubleType.get()));
        PartitionSpec spec = PartitionSpec.builderFor(schema).day("measured_at").build();
        Table table = iceberg.createTable(TableIdentifier.of("lagoon", "salinity"), schema, spec,
                Map.of("format-version", "2"));
        DataFile a = file(table, "a.parquet", "2026-03-01", 120);
        table.newAppend().appendFile(a).appendFile(file(table, "b.parquet", "2026-03-01", 80)).commit();
        table.updateSchema().addColumn("probe_depth_m", Types.DoubleType.get()).commit();
        table.newAppend().appendFile(file(table, "c.parquet", "2026-03-02", 45)).commit();
        table.newDelete().deleteFile(a).commit();
        return table;
    }

    private static DataFile file(Table table, String name, String day, long records) {
        return DataFiles.builder(table.spec())
                .withPath(table.location() + "/data/measured_at_day=" + day + "/" + name)
                .withPartitionPath("measured_at_day=" + day)
                .withFileSizeInBytes(1_000 + records)
                .withRecordCount(records)
                .withFormat("parquet")
                .build();
    }

    private static List<Snapshot> snapshots(Table table) {
        List<Snapshot> list = new ArrayList<>();
        table.snapshots().forEach(list::add);
        list.sort(java.util.Comparator.comparingLong(Snapshot::sequenceNumber));
        return list;
    }

    /** Files and records iceberg-core's scan of a snapshot plans. */
    private static long[] planned(Table table, long snapshotId) throws Exception {
        long files = 0;
        long records = 0;
        try (CloseableIterable<FileScanTask> tasks = table.newScan().useSnapshot(snapshotId).planFiles()) {
            for (FileScanTask t : tasks) {
                files++;
                records += t.file().recordCount();
            }
        }
        return new long[] {files, records};
    }

    /** Writes every metadata file, manifest list and manifest the in-memory file IO holds for the table. */
    private static void copyToDisk(Table table) throws Exception {
        FileIO io = table.io();
        TableMetadata current = ((HasTableOperations) table).operations().current();
        Set<String> locations = new LinkedHashSet<>();
        locations.add(current.metadataFileLocation());
        current.previousFiles().forEach(e -> locations.add(e.file()));
        for (Snapshot s : table.snapshots()) {
            locations.add(s.manifestListLocation());
            for (ManifestFile m : s.allManifests(io)) {
                locations.add(m.path());
            }
        }
        for (String location : locations) {
            Path target = Path.of(location.replaceFirst("^file:", ""));
            Files.createDirectories(target.getParent());
            try (InputStream in = io.newInputFile(location).newStream()) {
                Files.write(target, in.readAllBytes());
            }
        }
    }
}
