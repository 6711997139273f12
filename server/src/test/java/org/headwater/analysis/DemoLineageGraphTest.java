package org.headwater.analysis;

import static org.assertj.core.api.Assertions.assertThat;

import java.nio.file.Path;
import java.util.Set;
import java.util.TreeSet;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.lineage.Query;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The catalog's in-memory lineage graph follows the harvest through the ingestion path. */
class DemoLineageGraphTest {

    @TempDir
    Path temp;

    @Test
    void everythingDownstreamOfTheNitrateResultsIsReachedThroughTheGraph() throws Exception {
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            long nitrate = catalog.reader().findDatasets("lab/nitrate_results_2025.csv").get(0).id();
            var reach = catalog.lineage().downstream(nitrate, Query.everything());
            Set<String> names = new TreeSet<>();
            for (long id : reach.datasetIds()) {
                names.add(catalog.reader().dataset(id, null).orElseThrow().name());
            }
            // expected, by hand from the demo's code: merge_lab_results.py writes lab_merged.csv, which
            // trend_model.R reads to write the coefficients and two bulletin figures.
            assertThat(names).containsExactly("bulletin/figures/fig1_no3_trend.png", "bulletin/figures/fig3_ion_balance.pdf",
                    "derived/lab_merged.csv", "derived/trend_coefficients.csv");
        }
    }
}
