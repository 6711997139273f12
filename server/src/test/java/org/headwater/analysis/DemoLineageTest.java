package org.headwater.analysis;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.SCRIPT;

import java.nio.file.Path;
import java.util.Set;
import java.util.TreeSet;
import org.headwater.Catalog;
import org.headwater.harvest.HarvestProgress;
import org.headwater.testing.TestCatalogs;
import org.headwater.testing.Workspaces;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Static lineage of the demo workspace after one harvest, against ground truth written by hand from its code. */
class DemoLineageTest {

    @TempDir
    Path temp;

    @Test
    void everyReadAndWriteOfTheDemoScriptsBecomesExactlyTheExpectedEdges() throws Exception {
        // expected: read by hand from the demo's scripts (see examples/quillwater-lab). The commented-out
        // read of sampling_visits_2025-02.json and the `if False:` read of tablet_export_legacy.csv are absent.
        Set<String> expected = new TreeSet<>(Set.of(
                "field/sampling_visits_*.json -> derived/visits_clean.csv via scripts/clean_field_visits.py",
                "field/probe_log.ndjson -> derived/visits_clean.csv via scripts/clean_field_visits.py",
                "lab/nitrate_results_2025.csv -> derived/lab_merged.csv via scripts/merge_lab_results.py",
                "lab/ion_chromatograph_2025.csv -> derived/lab_merged.csv via scripts/merge_lab_results.py",
                "lab/turbidity_bench_2025.txt -> derived/lab_merged.csv via scripts/merge_lab_results.py",
                "lab/conductivity_legacy_2025.csv -> derived/lab_merged.csv via scripts/merge_lab_results.py",
                "stations/readings/year=*/month=*/readings.csv -> derived/station_monthly_summary.csv via scripts/build_station_summary.py",
                "stations/station_register.csv -> derived/station_monthly_summary.csv via scripts/build_station_summary.py",
                "derived/station_monthly_summary.csv -> derived/trend_coefficients.csv via models/trend_model.R",
                "derived/station_monthly_summary.csv -> bulletin/figures/fig1_no3_trend.png via models/trend_model.R",
                "derived/station_monthly_summary.csv -> bulletin/figures/fig3_ion_balance.pdf via models/trend_model.R",
                "derived/lab_merged.csv -> derived/trend_coefficients.csv via models/trend_model.R",
                "derived/lab_merged.csv -> bulletin/figures/fig1_no3_trend.png via models/trend_model.R",
                "derived/lab_merged.csv -> bulletin/figures/fig3_ion_balance.pdf via models/trend_model.R",
                "derived/visits_clean.csv -> bulletin/figures/fig2_do_by_station.svg via notebooks/explore_oxygen.ipynb",
                "station -> monthly_station_summary via sql/views.sql",
                "station_reading -> monthly_station_summary via sql/views.sql",
                "lab_result -> lab_exceedance via sql/views.sql",
                "station -> lab_exceedance via sql/views.sql"));
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog"))) {
            var summary = catalog.harvestFolder(Workspaces.demo(), false, HarvestProgress.NONE);
            assertThat(summary.errors()).isZero();
            var source = DATASET.as("s");
            var target = DATASET.as("t");
            Set<String> actual = new TreeSet<>(catalog.store().dsl()
                    .select(source.NAME, target.NAME, SCRIPT.NAME).from(LINEAGE_EDGE)
                    .join(source).on(source.ID.eq(LINEAGE_EDGE.SOURCE_DATASET_ID))
                    .join(target).on(target.ID.eq(LINEAGE_EDGE.TARGET_DATASET_ID))
                    .join(SCRIPT).on(SCRIPT.ID.eq(LINEAGE_EDGE.SCRIPT_ID))
                    .where(LINEAGE_EDGE.VALID_TO.isNull(), LINEAGE_EDGE.EVIDENCE.eq("static"))
                    .fetch(r -> r.value1() + " -> " + r.value2() + " via " + r.value3()));
            assertThat(actual).isEqualTo(expected);

            // Harvesting again changes nothing, analysis included.
            assertThat(catalog.harvestFolder(Workspaces.demo(), true, HarvestProgress.NONE).changes()).isZero();
        }
    }

    @Test
    void aStarInOneSqlFileExpandsFromATableAnotherFileDefined(@TempDir Path lake) throws Exception {
        java.nio.file.Files.writeString(lake.resolve("a_tables.sql"), "CREATE TABLE gauge (gauge_id INT, level_cm INT);\n");
        java.nio.file.Files.writeString(lake.resolve("b_views.sql"), "CREATE VIEW gauge_copy AS SELECT * FROM gauge;\n");
        try (Catalog catalog = TestCatalogs.fresh(temp.resolve("catalog2"))) {
            // SQL files are read in name order: a_tables.sql defines gauge before b_views.sql selects from it.
            catalog.harvestFolder(lake, false, HarvestProgress.NONE);
            long view = catalog.reader().findDatasets("gauge_copy").get(0).id();
            // expected: SELECT * over gauge(gauge_id, level_cm) copies both columns (SQL standard, 7.12 <query specification>)
            assertThat(catalog.reader().dataset(view, null).orElseThrow().columns()).extracting(c -> c.name())
                    .containsExactly("gauge_id", "level_cm");
            assertThat(catalog.reader().columnFlowsInto(view)).extracting(f -> f.sourceColumn() + ">" + f.targetColumn() + " " + f.role())
                    .containsExactly("gauge_id>gauge_id direct", "level_cm>level_cm direct");
        }
    }
}
