package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Map;
import org.junit.jupiter.api.Assumptions;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The demo workspace examples/quillwater-lab: what its scripts read and write. // reference: the
 * ground truth stated for the demo workspace in the project's issue 4 (datasets per script), and its
 * README (scripts run from the workspace root, the notebook from notebooks/)
 */
class DemoWorkspaceGroundTruthTest {
    private static Map<Path, ScriptAnalysis> scripts;

    @BeforeAll
    static void analyse() throws IOException {
        Path demo = External.demoWorkspace();
        Assumptions.assumeTrue(Files.isDirectory(demo.resolve("scripts")),
                "the demo workspace examples/quillwater-lab is not in this checkout: skipping");
        scripts = Refs.byScript(new WorkspaceAnalysis().analyze(demo, AnalysisContext.defaults()));
    }

    private static ScriptAnalysis script(String name) {
        return scripts.get(Path.of(name));
    }

    @Test
    void cleanFieldVisitsReadsTheMonthsOfItsArgparseDefaultAndTheProbeLog() {
        ScriptAnalysis a = script("scripts/clean_field_visits.py");
        assertThat(Refs.of(a)).containsExactly(
                "READ field/sampling_visits_*.json @33",
                "READ field/probe_log.ndjson @51",
                "WRITE derived/visits_clean.csv @65");
        assertThat(Refs.find(a, "field/sampling_visits_*.json").instances())
                .containsExactly("field/sampling_visits_2025-03.json", "field/sampling_visits_2025-04.json");
    }

    @Test
    void cleanFieldVisitsCommentedOutAndIfFalseReadsYieldNothing() {
        assertThat(script("scripts/clean_field_visits.py").references()).extracting(DataReference::expressionText)
                .noneMatch(e -> e.contains("2025-02") || e.contains("tablet_export_legacy"));
    }

    @Test
    void mergeLabResultsFollowsConstantsImportedFromConfig() {
        assertThat(Refs.of(script("scripts/merge_lab_results.py"))).containsExactly(
                "READ lab/nitrate_results_2025.csv @25",
                "READ lab/ion_chromatograph_2025.csv @26",
                "READ lab/turbidity_bench_2025.txt @27",
                "READ lab/conductivity_legacy_2025.csv @28",
                "WRITE derived/lab_merged.csv @40");
    }

    @Test
    void mergeLabResultsShowsEveryOutputColumnsOrigin() {
        assertThat(script("scripts/merge_lab_results.py").flows()).singleElement()
                .satisfies(f -> assertThat(f.datasetLevelOnly()).isFalse());
        assertThat(Refs.flowsInto(script("scripts/merge_lab_results.py"), "derived/lab_merged.csv")).contains(
                "sample_id <- lab/nitrate_results_2025.csv#sample_id (direct)",
                "conductivity_us_cm <- lab/conductivity_legacy_2025.csv#conductivity_µS/cm (direct)",
                "turbidity_ntu <- lab/turbidity_bench_2025.txt#turbidity_ntu (direct)");
    }

    @Test
    void buildStationSummaryReadsSixMonthlyPartitions() {
        ScriptAnalysis a = script("scripts/build_station_summary.py");
        assertThat(Refs.of(a)).containsExactly(
                "READ stations/readings/year=2025/month=*/readings.csv @23",
                "READ stations/station_register.csv @28",
                "WRITE derived/station_monthly_summary.csv @45");
        assertThat(Refs.find(a, "stations/readings/year=2025/month=*/readings.csv").instances()).containsExactly(
                "stations/readings/year=2025/month=01/readings.csv", "stations/readings/year=2025/month=02/readings.csv",
                "stations/readings/year=2025/month=03/readings.csv", "stations/readings/year=2025/month=04/readings.csv",
                "stations/readings/year=2025/month=05/readings.csv", "stations/readings/year=2025/month=06/readings.csv");
    }

    @Test
    void trendModelReadsItsFirstArgumentAndWritesCoefficientsAndFigures() {
        assertThat(Refs.of(script("models/trend_model.R"))).containsExactly(
                "READ derived/station_monthly_summary.csv @24",
                "READ derived/lab_merged.csv @25",
                "WRITE derived/trend_coefficients.csv @44",
                "WRITE bulletin/figures/fig1_no3_trend.png @53",
                "WRITE bulletin/figures/fig3_ion_balance.pdf @66");
    }

    @Test
    void notebookRunsFromNotebooksFolder() {
        assertThat(Refs.of(script("notebooks/explore_oxygen.ipynb"))).containsExactly(
                "READ derived/visits_clean.csv @cell2:1",
                "WRITE bulletin/figures/fig2_do_by_station.svg @cell4:7");
    }

    @Test
    void runAllInvokesTheScriptsWithArguments() {
        assertThat(script("run_all.sh").invocations()).extracting(i -> i.script() + " " + i.args()).containsExactly(
                "scripts/clean_field_visits.py [--field-dir, field, --months, 2025-03, 2025-04, --out, derived/visits_clean.csv]",
                "scripts/merge_lab_results.py [--out, derived/lab_merged.csv]",
                "scripts/build_station_summary.py [--months, 1, 2, 3, 4, 5, 6, --out, derived/station_monthly_summary.csv]",
                "models/trend_model.R [derived/station_monthly_summary.csv]",
                "notebooks/explore_oxygen.ipynb []");
    }
}
