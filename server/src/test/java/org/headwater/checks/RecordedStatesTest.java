package org.headwater.checks;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.time.Duration;
import java.time.Instant;
import java.util.Map;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.search.SearchRequest;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The search's freshness facet counts the states the checks recorded, and follows the next recorded check. */
class RecordedStatesTest {
    @TempDir
    Path temp;

    @Test
    void theFreshnessFacetShowsRecordedStatesAndFollowsANewCheck() throws Exception {
        Path lake = apiary();
        Path comb = lake.resolve("comb_weights.csv");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            SearchRequest hives = SearchRequest.of("hive", null, 10);
            assertThat(catalog.index().search(hives).facets().get("freshness")).isEqualTo(Map.of("unknown", 2));

            catalog.freshness().record();
            assertThat(catalog.index().search(hives).facets().get("freshness"))
                    .isEqualTo(Map.of("late", 1, "unknown", 1));

            // The file is brought up to date and checked again: the facet follows without a reindex.
            Files.setLastModifiedTime(comb, FileTime.from(Instant.now()));
            Files.writeString(comb, "hive,kg\nH1,2.7\n");
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            catalog.freshness().record();
            assertThat(catalog.index().search(hives).facets().get("freshness"))
                    .isEqualTo(Map.of("fresh", 1, "unknown", 1));
        }
    }

    @Test
    void aRemovedDatasetsCheckEndsWithItAndStaysInItsHistory() throws Exception {
        Path lake = apiary();
        Path comb = lake.resolve("comb_weights.csv");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            catalog.freshness().record();
            long combId = catalog.reader().findDatasets("comb_weights.csv").get(0).id();
            Instant whileLate = Instant.now();
            Thread.sleep(5);

            Files.delete(comb);
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);

            assertThat(catalog.freshness().recordedAsOf(Instant.now()).checks()).extracting(Check::name)
                    .containsExactly("queen_marks.csv");
            assertThat(catalog.freshness().recordedAsOf(whileLate).checks()).extracting(Check::name)
                    .containsExactly("comb_weights.csv", "queen_marks.csv");
            History history = catalog.freshness().history(combId).orElseThrow();
            assertThat(history.checks()).extracting(History.Entry::state).containsExactly("late");
            assertThat(history.checks().get(0).endedAt()).isNotNull();
            assertThat(catalog.index().search(SearchRequest.of("hive", null, 10)).facets().get("freshness"))
                    .isEqualTo(Map.of("unknown", 1));
        }
    }

    /**
     * Two hive files; comb_weights.csv is ten days old against a one-day limit, so late once checked
     * (README, Freshness: "late when older than the max age").
     */
    private Path apiary() throws Exception {
        Path lake = Files.createDirectories(temp.resolve("apiary"));
        Path comb = lake.resolve("comb_weights.csv");
        Files.writeString(comb, "hive,kg\nH1,2.5\n");
        Files.writeString(lake.resolve("queen_marks.csv"), "hive,colour\nH1,blue\n");
        Files.setLastModifiedTime(comb, FileTime.from(Instant.now().minus(Duration.ofDays(10))));
        Files.writeString(lake.resolve(".headwater-freshness"), "comb_weights.csv  max-age 1d\n");
        return lake;
    }
}
