package org.headwater.search;

import java.io.IOException;
import java.nio.file.Path;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * The search on a second workspace it was not built on (the invented bakery cooperative), scored on a
 * query set judged by hand before the first run ({@code search/bakery-judgements.tsv}) with nDCG@10
 * (Järvelin and Kekäläinen 2002), so that the ranking is seen to generalise beyond the demo.
 */
class BakerySearchRelevanceTest {
    @TempDir
    static Path temp;

    static Catalog catalog;

    @BeforeAll
    static void harvestTheBakery() throws IOException {
        catalog = TestCatalogs.fresh(temp.resolve("catalog"));
        catalog.harvestFolder(Workspaces.bakery(), false, HarvestProgress.NONE);
    }

    @AfterAll
    static void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    @Test
    void theJudgedBakeryQuerySetScoresAtLeastPointNineNdcgAtTenWithTheFirstHitRelevantForFourInFive() throws IOException {
        DemoSearchRelevanceTest.assertMeetsTheTargets(catalog, DemoSearchRelevanceTest.judgements("/search/bakery-judgements.tsv"));
    }
}
