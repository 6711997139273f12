package org.headwater.harvest;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.time.Instant;
import java.util.List;
import org.headwater.Catalog;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.Drift;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.StoreCounts;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class FolderHarvesterTest {

    @TempDir
    Path temp;

    @Test
    void harvestingTheDemoTwiceLeavesEveryCountAndAllHistoryUnchanged() throws Exception {
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            HarvestSummary first = catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            StoreCounts before = StoreCounts.of(catalog);
            HarvestSummary second = catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            HarvestSummary forced = catalog.harvestFolder(Workspaces.demo(), true, HarvestProgress.NONE);
            StoreCounts after = StoreCounts.of(catalog);

            assertThat(first.changes()).isPositive();
            assertThat(second.changes()).isZero();
            assertThat(second.filesUnchanged()).isEqualTo(first.filesSeen());
            // Reading every file again finds the same facts, so it changes nothing either.
            assertThat(forced.changes()).isZero();
            assertThat(forced.filesUnchanged()).isZero();
            assertThat(List.of(second.datasets(), second.scripts())).isEqualTo(List.of(first.datasets(), first.scripts()));
            assertThat(after).isEqualTo(before);
        }
    }

    @Test
    void aFileWhoseHeaderChangesGetsASecondSchemaVersion() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path file = lake.resolve("flows.csv");
        Files.writeString(file, "site,flow_l_s\nA,1.5\nB,2.0\n");
        Files.setLastModifiedTime(file, FileTime.from(Instant.parse("2026-01-01T00:00:00Z")));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            Files.writeString(file, "site,flow_l_s,temp_c\nA,1.5,4\nB,2.0,5\n");
            Files.setLastModifiedTime(file, FileTime.from(Instant.parse("2026-01-02T00:00:00Z")));
            HarvestSummary second = catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            long id = catalog.reader().findDatasets("flows.csv").get(0).id();
            var history = catalog.reader().schemaHistory(id);
            assertThat(second.changes()).isEqualTo(2); // the physical state, and the schema
            assertThat(history).hasSize(2);
            assertThat(history.get(0).columns()).extracting(ColumnView::name).containsExactly("site", "flow_l_s");
            assertThat(history.get(1).columns()).extracting(ColumnView::name).containsExactly("site", "flow_l_s", "temp_c");
            assertThat(history.get(1).columns()).extracting(ColumnView::type).containsExactly("text", "decimal", "integer");
            assertThat(history.get(1).drift()).isEqualTo(new Drift(List.of("temp_c"), List.of(), List.of()));
        }
    }

    @Test
    void aDeletedFileEndsItsValidityAndLeavesTheSearchIndex() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("keep.csv"), "a,b\n1,2\n");
        Files.writeString(lake.resolve("drop_me.csv"), "a,b\n1,2\n");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(catalog.index().search("drop_me", "file", 5)).hasSize(1);
            Files.delete(lake.resolve("drop_me.csv"));
            HarvestSummary second = catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            assertThat(second.removed()).isEqualTo(1);
            DatasetView gone = catalog.reader().dataset(catalog.reader().findDatasets("drop_me.csv").get(0).id(), null)
                    .orElseThrow();
            assertThat(gone.present()).isFalse();
            assertThat(catalog.reader().datasetCount()).isEqualTo(1);
            assertThat(catalog.index().search("drop_me", null, 5)).isEmpty();
        }
    }

    @Test
    void badFilesAreRecordedWithTheirErrorAndTheHarvestGoesOn() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("broken.json"), "[{\"a\": 1}, {\"a\": ");
        Files.write(lake.resolve("image.csv"), new byte[] {(byte) 0x89, 'P', 'N', 'G', 0, 0, 0, 13});
        Files.writeString(lake.resolve("good.csv"), "a,b\n1,2\n");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            HarvestSummary summary = catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            assertThat(summary.status()).isEqualTo("with_errors");
            assertThat(summary.datasets()).isEqualTo(3);
            assertThat(summary.errorsByKind()).containsEntry("invalid", 1).containsEntry("binary", 1);
            DatasetView broken = catalog.reader().dataset(catalog.reader().findDatasets("broken.json").get(0).id(), null)
                    .orElseThrow();
            assertThat(broken.error()).startsWith("Invalid JSON:");
            DatasetView good = catalog.reader().dataset(catalog.reader().findDatasets("good.csv").get(0).id(), null)
                    .orElseThrow();
            assertThat(good.columns()).extracting(ColumnView::name).containsExactly("a", "b");
            var harvest = catalog.reader().harvest(summary.harvestId()).orElseThrow();
            assertThat(harvest.errorList()).extracting(e -> e.kind()).containsExactlyInAnyOrder("invalid", "binary");
        }
    }

    @Test
    void hiddenFoldersTheCatalogItselfAndLinksAreNeverHarvested() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path outside = Files.createDirectories(temp.resolve("outside"));
        Files.writeString(outside.resolve("secret.csv"), "a\n1\n");
        Files.writeString(Files.createDirectories(lake.resolve(".cache")).resolve("tmp.csv"), "a\n1\n");
        Files.writeString(lake.resolve(".hidden.csv"), "a\n1\n");
        Files.createSymbolicLink(lake.resolve("link.csv"), outside.resolve("secret.csv"));
        Files.createSymbolicLink(lake.resolve("linked_dir"), outside);
        Files.writeString(lake.resolve("real.csv"), "a\n1\n", StandardCharsets.UTF_8);
        // The catalog directory inside the harvested folder must not harvest itself.
        try (Catalog catalog = TestCatalogs.fresh(lake.resolve("catalog-dir"))) {
            HarvestSummary summary = catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            assertThat(summary.filesSeen()).isEqualTo(1);
            assertThat(summary.filesIgnored()).isEqualTo(3); // .hidden.csv and two links
            assertThat(catalog.reader().datasets(null, 0, 10, null)).extracting(d -> d.name()).containsExactly("real.csv");
        }
    }

    @Test
    void scriptsAreRecordedAsScriptsWithTheirContentHash() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("clean.py"), "print('hi')\n");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            HarvestSummary summary = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            assertThat(summary.scripts()).isEqualTo(1);
            var script = catalog.reader().scripts(0, 10).get(0);
            assertThat(script.name()).isEqualTo("clean.py");
            assertThat(script.language()).isEqualTo("python");
            // expected: the JDK's own SHA-256 (java.security.MessageDigest) over the file's bytes
            String expected = java.util.HexFormat.of().formatHex(java.security.MessageDigest.getInstance("SHA-256")
                    .digest("print('hi')\n".getBytes(StandardCharsets.UTF_8)));
            assertThat(script.contentHash()).isEqualTo(expected);
        }
    }

    @Test
    void filesLargerThanTheSampleAreHashedWhole() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.write(lake.resolve("million-a.txt"), "a".repeat(1_000_000).getBytes(StandardCharsets.US_ASCII));
        // Either side of the 64 KiB sample: the whole file in the sample, and one byte beyond it.
        byte[] exact = "x,y\n1,2\n".repeat(65_536 / 8).getBytes(StandardCharsets.US_ASCII);
        byte[] oneMore = java.util.Arrays.copyOf(exact, exact.length + 1);
        oneMore[exact.length] = '\n';
        Files.write(lake.resolve("exact.csv"), exact);
        Files.write(lake.resolve("one-more.csv"), oneMore);
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            java.util.Map<String, String> hashes = new java.util.TreeMap<>();
            for (var d : catalog.reader().datasets(null, 0, 10, null)) {
                hashes.put(d.name(), catalog.reader().dataset(d.id(), null).orElseThrow().contentHash());
            }
            var sha256 = java.security.MessageDigest.getInstance("SHA-256");
            assertThat(exact).hasSize(65_536);
            // expected: FIPS 180-2, Appendix B.3 (one million "a"), from memory; the other two: the JDK's own
            // SHA-256 (java.security.MessageDigest) over the file's bytes
            assertThat(hashes).containsExactly(
                    java.util.Map.entry("exact.csv", java.util.HexFormat.of().formatHex(sha256.digest(exact))),
                    java.util.Map.entry("million-a.txt", "cdc76e5c9914fb9281a1c7e284d73e67f1809a48a497200e046d39ccc7112cd0"),
                    java.util.Map.entry("one-more.csv", java.util.HexFormat.of().formatHex(sha256.digest(oneMore))));
        }
    }

    @Test
    void filesSharingAPartitionPatternBecomeOneSetWithTheUnionSchemaAndItsDrift() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Path jan = Files.createDirectories(lake.resolve("gauges/month=01")).resolve("levels.csv");
        Path feb = Files.createDirectories(lake.resolve("gauges/month=02")).resolve("levels.csv");
        Files.writeString(jan, "site,level_cm\nA,12\nB,13\n");
        Files.writeString(feb, "site,level_cm,temp_c\nA,12.5,4\n");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            HarvestSummary first = catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            assertThat(first.datasets()).isEqualTo(1);
            DatasetView set = catalog.reader().dataset(catalog.reader().findDatasets("gauges/month=*/levels.csv").get(0).id(),
                    null).orElseThrow();
            assertThat(set.kind()).isEqualTo("file_set");
            assertThat(set.rowCount()).isEqualTo(3L);
            assertThat(set.columns()).containsExactly(new ColumnView(1, "site", "text", false),
                    new ColumnView(2, "level_cm", "decimal", false), new ColumnView(3, "temp_c", "integer", true));
            assertThat(set.partitions()).extracting(p -> p.name() + " " + p.keys())
                    .containsExactly("gauges/month=01/levels.csv {\"month\":\"01\"}", "gauges/month=02/levels.csv {\"month\":\"02\"}");
            // January lacks temp_c and holds only whole numbers in level_cm; February matches the union.
            assertThat(set.details()).contains("\"drift\":[{\"missing\":[\"temp_c\"],"
                    + "\"partition\":\"gauges/month=01/levels.csv\",\"retyped\":[\"level_cm: integer\"]}]");

            Files.delete(feb);
            HarvestSummary second = catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            // One member left: no set any more, the file is a dataset of its own.
            assertThat(second.datasets()).isEqualTo(1);
            assertThat(catalog.reader().datasets(null, 0, 10, null)).extracting(d -> d.name() + " " + d.kind())
                    .containsExactly("gauges/month=01/levels.csv file");
        }
    }

    @Test
    void cellValuesReachTheStoreOnlyWhenSamplingIsOnAndPartitionsKeepOnlyTheirSchema() throws Exception {
        // Invented data: one plain file and a two-member partition set with a sentinel and a negative level.
        Path lake = Files.createDirectories(temp.resolve("lake"));
        Files.writeString(lake.resolve("gauges.csv"), "gauge,level,read_on\nG1,-3.5,2026-01-04\nG2,12.25,2026-02-11\n");
        for (String month : List.of("01", "02")) {
            Path part = Files.createDirectories(lake.resolve("levels/month=" + month));
            Files.writeString(part.resolve("levels.csv"), "gauge,level\nG1,-999\nG2,4." + month + "\n");
        }
        for (boolean sampling : List.of(false, true)) {
            try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog-" + sampling))) {
                catalog.harvestFolder(lake, false, sampling, HarvestProgress.NONE);
                String details = details(catalog, lake.resolve("gauges.csv").toUri().toString());
                if (sampling) {
                    assertThat(details).contains("\"min\":\"-3.5\"", "\"max\":\"12.25\"",
                            "\"min\":\"2026-01-04\"", "\"max\":\"2026-02-11\"");
                } else {
                    assertThat(details).doesNotContain("\"min\"", "\"max\"", "-3.5", "12.25", "2026-01-04");
                }
                assertThat(details).contains("\"distinct_estimate\":2");
                // -999 in a column that is otherwise never negative is missing (README, the -999 judgment): the
                // set's level column is nullable whichever statistics its partitions were read with.
                DatasetView set = catalog.reader().findDatasets(lake.resolve("levels").toUri() + "month=*/levels.csv")
                        .stream().findFirst().flatMap(d -> catalog.reader().dataset(d.id(), null)).orElseThrow();
                assertThat(set.columns()).extracting(ColumnView::name, ColumnView::type, ColumnView::nullable)
                        .containsExactly(org.assertj.core.groups.Tuple.tuple("gauge", "text", false),
                                org.assertj.core.groups.Tuple.tuple("level", "decimal", true));
            }
        }
    }

    private static String details(Catalog catalog, String uri) {
        return catalog.reader().findDatasets(uri).stream().findFirst()
                .flatMap(d -> catalog.reader().dataset(d.id(), null)).orElseThrow().details();
    }
}
