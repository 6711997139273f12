package org.headwater.ops;

import static org.assertj.core.api.Assertions.assertThat;
import static org.junit.jupiter.api.Assertions.assertThrows;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.ByteArrayInputStream;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Clock;
import java.util.ArrayList;
import java.util.List;
import java.util.zip.ZipEntry;
import java.util.zip.ZipInputStream;
import org.headwater.Catalog;
import org.headwater.cli.Main;
import org.headwater.harvest.HarvestProgress;
import org.headwater.store.Store;
import org.headwater.store.StoreConfig;
import org.headwater.testing.StoreCounts;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CatalogOperationsTest {
    @TempDir
    Path temp;

    private static byte[] export(Store store) throws IOException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        CatalogExport.write(store, out);
        return out.toByteArray();
    }

    private Catalog harvestedDemo(String name) throws IOException {
        Catalog catalog = TestCatalogs.fresh(temp.resolve(name));
        catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
        return catalog;
    }

    @Test
    void exportThenImportIntoAFreshStoreThenExportAgainGivesTheSameBytes() throws IOException {
        try (Catalog original = harvestedDemo("original")) {
            byte[] first = export(original.store());
            try (Catalog copy = Catalog.open(temp.resolve("copy"), TestCatalogs.freshStore("import"), Clock.systemUTC())) {
                long rows = CatalogImport.read(copy.store(), new ByteArrayInputStream(first));
                copy.index().rebuild();

                byte[] second = export(copy.store());
                assertThat(new String(second, StandardCharsets.UTF_8)).isEqualTo(new String(first, StandardCharsets.UTF_8));
                assertThat(StoreCounts.of(copy)).isEqualTo(StoreCounts.of(original));
                // expected: RFC 8259 JSON, read back by Jackson's tree parser: the version and every row.
                JsonNode doc = new ObjectMapper().readTree(first);
                assertThat(doc.get("format").asText()).isEqualTo("headwater-catalog");
                assertThat(doc.get("version").asInt()).isEqualTo(1);
                long inDocument = 0;
                for (JsonNode table : (Iterable<JsonNode>) doc.get("tables")::elements) {
                    inDocument += table.size();
                }
                assertThat(rows).isEqualTo(inDocument);
                // The demo's 21 datasets and 8 scripts (ApiServerTest); the index counts 29 (SearchIndexTest).
                assertThat(doc.get("tables").get("dataset").size()).isEqualTo(21);
                assertThat(doc.get("tables").get("script").size()).isEqualTo(8);
                assertThat(copy.index().documentCount()).isEqualTo(original.index().documentCount()).isEqualTo(162); // 21 datasets, 8 scripts, 133 columns (IndexStoreAgreementTest)
                assertThat(copy.index().search("nitrate", null, 1).get(0).name()).isEqualTo("lab/nitrate_results_2025.csv");
            }
        }
    }

    @Test
    void anImportedCatalogTakesNewHarvestsWithoutReusingIds() throws IOException {
        try (Catalog original = harvestedDemo("original")) {
            byte[] document = export(original.store());
            try (Catalog copy = Catalog.open(temp.resolve("copy"), TestCatalogs.freshStore("import"), Clock.systemUTC())) {
                CatalogImport.read(copy.store(), new ByteArrayInputStream(document));
                long lastSeq = copy.reader().lastChangeSeq();
                Path more = Files.createDirectories(temp.resolve("more"));
                Files.writeString(more.resolve("tide_gauges.csv"), "gauge,level_cm\nnorth,41\n");

                copy.harvestFolder(more, false, HarvestProgress.NONE);

                assertThat(copy.reader().lastChangeSeq()).isGreaterThan(lastSeq);
                assertThat(copy.store().dsl().fetchCount(org.headwater.store.schema.Tables.DATASET)).isEqualTo(22);
            }
        }
    }

    @Test
    void importIntoACatalogThatHasRowsIsRefusedAndChangesNothing() throws IOException {
        try (Catalog original = harvestedDemo("original")) {
            byte[] document = export(original.store());
            StoreCounts before = StoreCounts.of(original);
            var refused = assertThrows(CatalogImport.ImportException.class,
                    () -> CatalogImport.read(original.store(), new ByteArrayInputStream(document)));
            assertThat(refused).hasMessageContaining("not empty");
            assertThat(StoreCounts.of(original)).isEqualTo(before);
        }
    }

    @Test
    void aDocumentWithAnUnknownTableIsRefusedAndLeavesTheStoreEmpty() throws IOException {
        String document = "{\"format\":\"headwater-catalog\",\"version\":1,\"tables\":{"
                + "\"owner\":[{\"id\":1,\"name\":\"estuary-team\",\"kind\":\"team\"}],\"weather\":[]}}";
        try (Store store = Store.open(TestCatalogs.freshStore("bad"))) {
            var refused = assertThrows(CatalogImport.ImportException.class,
                    () -> CatalogImport.read(store, new ByteArrayInputStream(document.getBytes(StandardCharsets.UTF_8))));
            assertThat(refused).hasMessageContaining("\"weather\" is not one of them");
            // One transaction: the owner row written before the bad table is gone too.
            assertThat(store.dsl().fetchCount(org.headwater.store.schema.Tables.OWNER)).isZero();
        }
    }

    @Test
    void aBackupRestoredIntoAnEmptyDirectoryHoldsTheSameCatalogAndARestoreOverOneNeedsForce() throws IOException {
        Assumptions.assumeFalse(TestCatalogs.onPostgres(), "backup and restore are for the embedded H2 store");
        Path dir = temp.resolve("catalog");
        StoreCounts counts;
        try (Catalog catalog = Catalog.open(dir)) {
            catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            counts = StoreCounts.of(catalog);
        }
        Path zip = temp.resolve("backups/catalog.zip");
        assertThat(run("backup", zip.toString(), "--data-dir", dir.toString())).isEqualTo(Main.OK);
        // expected: H2 docs, BACKUP TO: the database files in a .zip; read here with java.util.zip.
        assertThat(zipEntries(zip)).contains("catalog.mv.db");
        assertThat(run("backup", zip.toString(), "--data-dir", dir.toString())).isEqualTo(Main.USAGE);

        Path restored = temp.resolve("restored");
        assertThat(run("restore", zip.toString(), "--data-dir", restored.toString())).isEqualTo(Main.OK);
        try (Catalog catalog = Catalog.open(restored)) {
            assertThat(StoreCounts.of(catalog)).isEqualTo(counts);
            assertThat(catalog.index().documentCount()).isEqualTo(162); // 21 datasets, 8 scripts, 133 columns (IndexStoreAgreementTest)
            assertThat(catalog.index().search("nitrate", null, 1).get(0).name()).isEqualTo("lab/nitrate_results_2025.csv");
        }
        assertThat(run("restore", zip.toString(), "--data-dir", restored.toString())).isEqualTo(Main.USAGE);
        assertThat(run("restore", zip.toString(), "--data-dir", restored.toString(), "--force")).isEqualTo(Main.OK);
        assertThat(run("restore", temp.resolve("missing.zip").toString(), "--data-dir", temp.resolve("x").toString()))
                .isEqualTo(Main.USAGE);
    }

    @Test
    void theExportAndImportCommandsCopyACatalogBetweenDirectories() throws IOException {
        Assumptions.assumeFalse(TestCatalogs.onPostgres(), "the commands' default store is the embedded one");
        Path dir = temp.resolve("catalog");
        try (Catalog catalog = Catalog.open(dir)) {
            catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
        }
        Path json = temp.resolve("catalog.json");
        assertThat(run("export", "--catalog", json.toString(), "--data-dir", dir.toString())).isEqualTo(Main.OK);
        Path copy = temp.resolve("copy");
        assertThat(run("import", json.toString(), "--data-dir", copy.toString())).isEqualTo(Main.OK);
        Path again = temp.resolve("again.json");
        assertThat(run("export", "--catalog", again.toString(), "--data-dir", copy.toString())).isEqualTo(Main.OK);
        assertThat(Files.readString(again)).isEqualTo(Files.readString(json));
        assertThat(run("import", json.toString(), "--data-dir", copy.toString())).isEqualTo(Main.USAGE);
    }

    private static int run(String... args) {
        StringWriter sink = new StringWriter();
        return Main.run(new PrintWriter(sink), new PrintWriter(sink), args);
    }

    private static List<String> zipEntries(Path zip) throws IOException {
        List<String> names = new ArrayList<>();
        try (InputStream in = Files.newInputStream(zip); ZipInputStream z = new ZipInputStream(in)) {
            for (ZipEntry e = z.getNextEntry(); e != null; e = z.getNextEntry()) {
                names.add(e.getName());
            }
        }
        return names;
    }
}
