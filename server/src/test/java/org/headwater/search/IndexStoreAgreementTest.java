package org.headwater.search;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.apache.lucene.document.Document;
import org.apache.lucene.document.Field;
import org.apache.lucene.document.StringField;
import org.apache.lucene.index.IndexWriter;
import org.apache.lucene.index.IndexWriterConfig;
import org.apache.lucene.store.FSDirectory;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.ingest.Observation;
import org.headwater.testing.IndexKeys;
import org.headwater.testing.Workspaces;
import org.headwater.testing.FlatFolders;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The index holds exactly one document per present dataset, current column, present script and owner of a
 * present dataset, as the store's own tables list them, after harvests, deletions and simulated crashes.
 */
class IndexStoreAgreementTest {
    @TempDir
    Path temp;

    static List<String> expectedKeys(Catalog catalog) {
        return IndexKeys.expected(catalog);
    }

    @Test
    void indexAndStoreAgreeAfterAHarvestAnOwnerAndDeletions() throws IOException {
        Path lab = Workspaces.demoCopy(temp);
        try (Catalog catalog = Catalog.open(temp.resolve("catalog"))) {
            catalog.harvestFolder(lab, false, HarvestProgress.NONE);
            assertThat(catalog.index().keys()).isEqualTo(expectedKeys(catalog)).hasSize(21 + 8 + 133);

            String uri = catalog.reader().findDatasets("lab/turbidity_bench_2025.txt").get(0).uri();
            catalog.ingestor().apply("test", List.of(new Observation.OwnerAssigned(uri, "Bench Team", "team", "test")));
            assertThat(catalog.index().keys()).isEqualTo(expectedKeys(catalog)).contains("owner:1");
            assertThat(catalog.index().search("bench team", "team", 5)).extracting(SearchHit::name).containsExactly("Bench Team");
            assertThat(catalog.index().search("owner=\"bench team\"", "file", 5)).extracting(SearchHit::name)
                    .containsExactly("lab/turbidity_bench_2025.txt");

            Files.delete(lab.resolve("lab/turbidity_bench_2025.txt"));
            Files.delete(lab.resolve("scripts/config.py"));
            catalog.harvestFolder(lab, false, HarvestProgress.NONE);
            // The dataset, its 5 columns, the script and the owner (who owns nothing present now) leave the index.
            assertThat(catalog.index().keys()).isEqualTo(expectedKeys(catalog)).hasSize(21 + 8 + 133 - 1 - 5 - 1);
            assertThat(catalog.index().search("turbidity_bench", null, 50)).extracting(SearchHit::name)
                    .doesNotContain("lab/turbidity_bench_2025.txt", "lab/turbidity_bench_2025.txt#turbidity_ntu");
            assertThat(catalog.index().search("shared path constants", "script", 5)).extracting(SearchHit::name)
                    .doesNotContain("scripts/config.py");
        }
    }

    @Test
    void anIndexLeftWithAFlushedButUncommittedSegmentRecoversWithoutItsDocuments() throws IOException {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("reservoir_levels.csv"), "gauge_id,level_cm\nG1,120\n");
        Path dataDir = temp.resolve("catalog");
        try (Catalog catalog = Catalog.open(dataDir)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
        }
        // A crash image: segment files written for a document that was never committed, and a stale lock file.
        Path index = dataDir.resolve("index");
        Path image = temp.resolve("crash-image");
        try (IndexWriter writer = new IndexWriter(FSDirectory.open(index), new IndexWriterConfig())) {
            Document junk = new Document();
            junk.add(new StringField("key", "dataset:999999", Field.Store.YES));
            writer.addDocument(junk);
            writer.flush();
            FlatFolders.copy(index, image);
            writer.rollback();
        }
        FlatFolders.delete(index);
        FlatFolders.copy(image, index);
        try (Catalog catalog = Catalog.open(dataDir)) {
            assertThat(catalog.index().keys()).isEqualTo(expectedKeys(catalog)).doesNotContain("dataset:999999");
            assertThat(catalog.index().search("reservoir levels", null, 5)).extracting(SearchHit::name)
                    .first().isEqualTo("reservoir_levels.csv");
        }
    }

    @Test
    void anIndexWhoseCommitIsBehindTheStoreCatchesUpWithDeletionsAndNewFiles() throws IOException {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("first_gauge.csv"), "gauge_id\nG1\n");
        Files.writeString(lake.resolve("old_gauge.csv"), "gauge_id,level_cm\nG1,3\n");
        Path dataDir = temp.resolve("catalog");
        Path stale = temp.resolve("stale-index");
        try (Catalog catalog = Catalog.open(dataDir)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
        }
        FlatFolders.copy(dataDir.resolve("index"), stale);
        Files.delete(lake.resolve("old_gauge.csv"));
        Files.writeString(lake.resolve("new_gauge.csv"), "gauge_id,flow\nG2,7\n");
        try (Catalog catalog = Catalog.open(dataDir)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
        }
        // As if the process died after the store committed and before the index did.
        FlatFolders.delete(dataDir.resolve("index"));
        FlatFolders.copy(stale, dataDir.resolve("index"));
        try (Catalog catalog = Catalog.open(dataDir)) {
            assertThat(catalog.index().keys()).isEqualTo(expectedKeys(catalog));
            assertThat(catalog.index().search("gauge", null, 10)).extracting(SearchHit::name)
                    .contains("new_gauge.csv", "first_gauge.csv").doesNotContain("old_gauge.csv");
        }
    }

    @Test
    void aHalfWrittenCommitPointIsRebuiltFromTheStore() throws IOException {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("weir_heights.csv"), "weir,height_m\nW1,2.5\n");
        Path dataDir = temp.resolve("catalog");
        try (Catalog catalog = Catalog.open(dataDir)) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
        }
        try (Stream<Path> files = Files.list(dataDir.resolve("index"))) {
            for (Path f : (Iterable<Path>) files::iterator) {
                if (f.getFileName().toString().startsWith("segments_")) {
                    byte[] bytes = Files.readAllBytes(f);
                    Files.write(f, java.util.Arrays.copyOf(bytes, bytes.length / 2));
                }
            }
        }
        try (Catalog catalog = Catalog.open(dataDir)) {
            assertThat(catalog.index().keys()).isEqualTo(expectedKeys(catalog)).hasSize(1 + 2);
        }
    }
}
