package org.headwater.harvest.table;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.testing.DatasetLookup.columns;
import static org.headwater.testing.DatasetLookup.dataset;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.time.Instant;
import java.util.List;
import java.util.stream.Stream;
import org.apache.hadoop.conf.Configuration;
import org.apache.parquet.column.ParquetProperties.WriterVersion;
import org.apache.parquet.example.data.Group;
import org.apache.parquet.example.data.simple.SimpleGroupFactory;
import org.apache.parquet.hadoop.ParquetWriter;
import org.apache.parquet.hadoop.example.ExampleParquetWriter;
import org.apache.parquet.hadoop.metadata.CompressionCodecName;
import org.apache.parquet.io.LocalOutputFile;
import org.apache.parquet.schema.MessageType;
import org.apache.parquet.schema.MessageTypeParser;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.store.Views.DatasetView;
import org.headwater.store.Views.SchemaVersionView;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

/**
 * A Delta table whose early commits were cleaned up reads from its Parquet checkpoint. The checkpoints are
 * written by parquet-hadoop (the reference Parquet writer) in the layout of PROTOCOL.md "Checkpoint Schema",
 * holding the state of the {@code harbour_tides} fixture after version 2; the expected values are what the
 * complete log of the same fixture gives.
 *
 * <p>Why not Delta's own libraries: {@code io.delta:delta-standalone_2.13:3.3.0} is not served here (Maven:
 * "Missing POM"); {@code io.delta:delta-kernel-defaults:4.0.0} resolves but pins parquet-hadoop 1.12.3,
 * hadoop-client-runtime 3.4.0 and Jackson 2.13.5 against this build's 1.17.1, 3.4.1 and 2.23.0, and was not
 * tried in the time there was.
 */
class DeltaCheckpointTest {
    private static final ObjectMapper JSON = new ObjectMapper();

    /** PROTOCOL.md "Checkpoint Schema": one optional struct per action kind (commitInfo and txn left out). */
    private static final MessageType CHECKPOINT = MessageTypeParser.parseMessageType("""
            message spark_schema {
              optional group add {
                optional binary path (STRING);
                optional group partitionValues (MAP) {
                  repeated group key_value {
                    required binary key (STRING);
                    optional binary value (STRING);
                  }
                }
                optional int64 size;
                optional int64 modificationTime;
                optional boolean dataChange;
                optional binary stats (STRING);
              }
              optional group remove {
                optional binary path (STRING);
                optional int64 deletionTimestamp;
                optional boolean dataChange;
              }
              optional group metaData {
                optional binary id (STRING);
                optional group format {
                  optional binary provider (STRING);
                }
                optional binary schemaString (STRING);
                optional group partitionColumns (LIST) {
                  repeated group list {
                    optional binary element (STRING);
                  }
                }
                optional int64 createdTime;
              }
              optional group protocol {
                optional int32 minReaderVersion;
                optional int32 minWriterVersion;
              }
            }
            """);

    /**
     * Ways writers lay pages out: Snappy with dictionaries on data page v1 (what Spark writes by default), gzip
     * on data page v2 (where parquet-mr's writer falls back to the DELTA_* encodings), and plain values.
     */
    enum Layout { SNAPPY_DICTIONARY_V1, GZIP_DELTA_V2, UNCOMPRESSED_V1 }

    private static final Instant CHECKPOINT_WRITTEN = Instant.parse("2026-01-02T02:00:00Z");

    @TempDir
    Path temp;

    @ParameterizedTest
    @EnumSource(Layout.class)
    void aLogCleanedUpBeforeItsCheckpointGivesTheSameTableAsTheWholeLog(Layout layout) throws Exception {
        Path whole = copyFixture(temp.resolve("whole"));
        Path pruned = copyFixture(temp.resolve("pruned"));
        writeCheckpoint(pruned.resolve("harbour_tides/_delta_log"), layout);
        for (int v = 0; v <= 2; v++) {
            Files.delete(pruned.resolve("harbour_tides/_delta_log/" + commitName(v)));
        }
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(whole, false, HarvestProgress.NONE);
            catalog.harvestFolder(pruned, false, HarvestProgress.NONE);
            DatasetView expected = dataset(catalog, whole.toRealPath().toUri() + "harbour_tides/");
            DatasetView table = dataset(catalog, pruned.toRealPath().toUri() + "harbour_tides/");
            assertThat(table.error()).isNull();
            // expected: the replay of the complete log (PROTOCOL.md "Action Reconciliation") of the same table.
            assertThat(columns(table)).isEqualTo(columns(expected));
            assertThat(table.columns()).extracting(c -> c.nullable())
                    .isEqualTo(expected.columns().stream().map(c -> c.nullable()).toList());
            assertThat(table.rowCount()).isEqualTo(expected.rowCount()).isEqualTo(180L);
            assertThat(table.rowCountExact()).isTrue();
            assertThat(table.sizeBytes()).isEqualTo(expected.sizeBytes()).isEqualTo(3_336L);
            JsonNode details = JSON.readTree(table.details());
            JsonNode wholeDetails = JSON.readTree(expected.details());
            assertThat(details.get("current_version").asLong()).isEqualTo(wholeDetails.get("current_version").asLong())
                    .isEqualTo(3);
            assertThat(details.get("data_files").asInt()).isEqualTo(wholeDetails.get("data_files").asInt()).isEqualTo(2);
            assertThat(details.get("partition_columns")).isEqualTo(wholeDetails.get("partition_columns"));
            assertThat(details.get("protocol")).isEqualTo(wholeDetails.get("protocol"));
            assertThat(details.get("checkpoint_read").asLong()).isEqualTo(2);

            // Versions: the checkpoint's (its commit is gone, so the time the checkpoint was written) and commit 3.
            List<SchemaVersionView> history = catalog.reader().schemaHistory(table.id());
            assertThat(history).extracting(SchemaVersionView::tableVersion).containsExactly("2", "3");
            assertThat(history.get(0).recordedAt()).isEqualTo(CHECKPOINT_WRITTEN);
            assertThat(history.get(1).operation()).isEqualTo("DELETE");
        }
    }

    @Test
    void cleanupAfterAHarvestKeepsTheHistoryAndTheNextCommitAddsOneVersion() throws Exception {
        Path lake = copyFixture(temp.resolve("lake"));
        Path log = lake.resolve("harbour_tides/_delta_log");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            String uri = lake.toRealPath().toUri() + "harbour_tides/";

            writeCheckpoint(log, Layout.SNAPPY_DICTIONARY_V1);
            for (int v = 0; v <= 2; v++) {
                Files.delete(log.resolve(commitName(v)));
            }
            // PROTOCOL.md "Add File and Remove File": version 4 removes a file (b1, 80 records, 1536 bytes).
            Files.writeString(log.resolve(commitName(4)),
                    "{\"commitInfo\":{\"timestamp\":1767488400000,\"operation\":\"DELETE\"}}\n"
                    + "{\"remove\":{\"path\":\"harbour=south/part-00000-b1.snappy.parquet\","
                    + "\"deletionTimestamp\":1767488400000,\"dataChange\":true}}\n");
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            List<SchemaVersionView> history = catalog.reader().schemaHistory(dataset(catalog, uri).id());
            assertThat(history).extracting(SchemaVersionView::tableVersion).containsExactly("0", "1", "2", "3", "4");
            assertThat(dataset(catalog, uri).rowCount()).isEqualTo(100L);
            assertThat(dataset(catalog, uri).sizeBytes()).isEqualTo(1_800L);
        }
    }

    /** The state after version 2 of harbour_tides, as a checkpoint file and the _last_checkpoint pointer. */
    private static void writeCheckpoint(Path log, Layout layout) throws Exception {
        JsonNode metaData = null;
        for (String line : Files.readAllLines(log.resolve(commitName(2)))) {
            JsonNode action = JSON.readTree(line);
            if (action.has("metaData")) {
                metaData = action.get("metaData");
            }
        }
        Path file = log.resolve(String.format("%020d.checkpoint.parquet", 2));
        var builder = ExampleParquetWriter.builder(new LocalOutputFile(file)).withConf(new Configuration(false))
                .withType(CHECKPOINT);
        switch (layout) {
            case SNAPPY_DICTIONARY_V1 -> builder.withCompressionCodec(CompressionCodecName.SNAPPY).withDictionaryEncoding(true)
                    .withWriterVersion(WriterVersion.PARQUET_1_0);
            case GZIP_DELTA_V2 -> builder.withCompressionCodec(CompressionCodecName.GZIP).withDictionaryEncoding(false)
                    .withWriterVersion(WriterVersion.PARQUET_2_0);
            case UNCOMPRESSED_V1 -> builder.withCompressionCodec(CompressionCodecName.UNCOMPRESSED)
                    .withDictionaryEncoding(false).withWriterVersion(WriterVersion.PARQUET_1_0);
        }
        SimpleGroupFactory rows = new SimpleGroupFactory(CHECKPOINT);
        try (ParquetWriter<Group> writer = builder.build()) {
            Group protocol = rows.newGroup();
            protocol.addGroup("protocol").append("minReaderVersion", 1).append("minWriterVersion", 2);
            writer.write(protocol);
            Group meta = rows.newGroup();
            Group m = meta.addGroup("metaData");
            m.append("id", metaData.get("id").asText());
            m.addGroup("format").append("provider", "parquet");
            m.append("schemaString", metaData.get("schemaString").asText());
            Group parts = m.addGroup("partitionColumns");
            for (JsonNode p : metaData.get("partitionColumns")) {
                parts.addGroup("list").append("element", p.asText());
            }
            m.append("createdTime", 1767225600000L);
            writer.write(meta);
            writer.write(add(rows, "harbour=north/part-00000-a1.snappy.parquet", "north", 2048, "{\"numRecords\":120}"));
            writer.write(add(rows, "harbour=south/part-00000-b1.snappy.parquet", "south", 1536, "{\"numRecords\":80}"));
        }
        Files.setLastModifiedTime(file, FileTime.from(CHECKPOINT_WRITTEN));
        // PROTOCOL.md "Last Checkpoint File": the newest checkpoint's version and its number of actions.
        Files.writeString(log.resolve("_last_checkpoint"), "{\"version\":2,\"size\":4}");
    }

    private static Group add(SimpleGroupFactory rows, String path, String harbour, long size, String stats) {
        Group row = rows.newGroup();
        Group add = row.addGroup("add");
        add.append("path", path);
        add.addGroup("partitionValues").addGroup("key_value").append("key", "harbour").append("value", harbour);
        add.append("size", size).append("modificationTime", 1767229199000L).append("dataChange", true).append("stats", stats);
        return row;
    }

    private static String commitName(int version) {
        return String.format("%020d.json", version);
    }

    private static Path copyFixture(Path lake) throws Exception {
        Path source = Path.of(DeltaCheckpointTest.class.getResource("/tables/harbour_tides").toURI());
        try (Stream<Path> files = Files.walk(source)) {
            for (Path f : files.filter(Files::isRegularFile).toList()) {
                Path target = lake.resolve("harbour_tides").resolve(source.relativize(f).toString());
                Files.createDirectories(target.getParent());
                Files.copy(f, target);
            }
        }
        return lake;
    }
}
