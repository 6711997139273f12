package org.headwater.analysis.script;

import static org.assertj.core.api.Assertions.assertThat;

import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.headwater.model.DatasetKind;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * The hand-written fixture workspace (an invented beekeeping cooperative): every read and write its
 * scripts make, as a person reading them would list it. // reference: the fixture's own code, read by
 * hand; line numbers counted in the files under src/test/resources/scripts/workspace
 */
class ScriptFixtureGroundTruthTest {
    private static Path root;
    private static Map<Path, ScriptAnalysis> driven;

    @BeforeAll
    static void analyseWorkspace() throws IOException {
        root = Refs.resource("/scripts/workspace");
        driven = Refs.byScript(new WorkspaceAnalysis().analyze(root, AnalysisContext.defaults()));
    }

    private static ScriptAnalysis driven(String script) {
        return driven.get(Path.of(script));
    }

    private static ScriptAnalysis alone(String script) throws IOException {
        return new ScriptAnalyzer().analyze(root, Path.of(script), AnalysisContext.defaults());
    }

    @Test
    void shellDriverRunsEveryScriptWithTheArgumentsBashWouldPass() {
        List<ScriptInvocation> runs = driven("run_pipeline.sh").invocations();
        assertThat(runs).extracting(i -> i.script() + " " + i.args() + " in '" + i.workingDir() + "' @" + i.line()).containsExactly(
                "pipeline/ingest_scales.py [--apiaries, north, south, --out, work/weights_long.parquet] in '' @7",
                "pipeline/nectar_flow.py [work/weights_long.parquet] in '' @8",
                "pipeline/yearly_report.py [2023] in '' @11",
                "pipeline/yearly_report.py [2024] in '' @11",
                "analysis/swarm_risk.R [work/weights_long.parquet] in '' @13",
                "notebooks/colony_review.ipynb [] in 'notebooks' @14");
    }

    @Test
    void ingestFollowsAliasesLoopsSiblingConstantsAndFileRelativePaths() {
        ScriptAnalysis a = driven("pipeline/ingest_scales.py");
        assertThat(Refs.of(a)).containsExactly(
                "READ raw/scales/apiary=*/readings.csv @21",
                "READ pipeline/hive_registry.json @24",
                "READ raw/weather/q*_2024.csv @28",
                "READ raw/calibration.txt @30",
                "READ raw/sensor_007.json @31",
                "READ ? @37 [os.environ[\"BRAMBLECOMBE_EXTRA\"]]",
                "READ raw/hives.csv @39",
                "WRITE work/weights_long.parquet @44",
                "WRITE work/calibration.pkl @46",
                "WRITE work/ingest_note.txt @47");
        assertThat(Refs.find(a, "raw/scales/apiary=*/readings.csv").instances())
                .containsExactly("raw/scales/apiary=north/readings.csv", "raw/scales/apiary=south/readings.csv");
        assertThat(Refs.find(a, "raw/weather/q*_2024.csv").instances())
                .containsExactly("raw/weather/q1_2024.csv", "raw/weather/q2_2024.csv", "raw/weather/q3_2024.csv", "raw/weather/q4_2024.csv");
        assertThat(Refs.find(a, "raw/weather/q*_2024.csv").function()).isEqualTo("pandas.read_csv");
        assertThat(Refs.find(a, "raw/scales/apiary=*/readings.csv").kind()).isEqualTo(DatasetKind.FILE_SET);
        assertThat(Refs.find(a, "pipeline/hive_registry.json").function()).isEqualTo("builtins.open");
    }

    @Test
    void commentedOutAndUnreachableReadsYieldNothing() throws IOException {
        assertThat(alone("pipeline/ingest_scales.py").references()).extracting(DataReference::expressionText)
                .noneMatch(e -> e.contains("old_scales") || e.contains("legacy_scales") || e.contains("never_used"));
        assertThat(alone("analysis/swarm_risk.R").references()).extracting(DataReference::expressionText)
                .noneMatch(e -> e.contains("commented_out") || e.contains("never_read"));
        assertThat(alone("reports/season_summary.Rmd").references()).extracting(DataReference::expressionText)
                .noneMatch(e -> e.contains("draft_only") || e.contains("shown_not_run"));
    }

    @Test
    void unresolvablePathIsKeptWithItsExpressionAndPosition() {
        DataReference r = driven("pipeline/ingest_scales.py").references().stream().filter(x -> !x.resolved()).findFirst().orElseThrow();
        assertThat(r.pathPattern()).isNull();
        assertThat(r.expressionText()).isEqualTo("os.environ[\"BRAMBLECOMBE_EXTRA\"]");
        assertThat(r.line()).isEqualTo(37);
        assertThat(r.column()).isEqualTo(9);
        assertThat(r.function()).isEqualTo("pandas.read_csv");
    }

    @Test
    void withoutTheDriverArgparseDefaultsAreUsed() throws IOException {
        ScriptAnalysis a = alone("pipeline/ingest_scales.py");
        assertThat(Refs.find(a, "raw/scales/apiary=*/readings.csv").instances()).containsExactly(
                "raw/scales/apiary=north/readings.csv", "raw/scales/apiary=south/readings.csv", "raw/scales/apiary=east/readings.csv");
        assertThat(Refs.of(a)).contains("WRITE work/weights.parquet @44");
    }

    @Test
    void ingestShowsColumnLineageThroughRenameAssignmentMergeAndSelection() {
        assertThat(Refs.flowsInto(driven("pipeline/ingest_scales.py"), "work/weights_long.parquet")).containsExactly(
                "hive_id <- raw/scales/apiary=*/readings.csv#hive_id (direct)",
                "hive_id <- raw/hives.csv#hive_id (direct)",
                "ts <- raw/scales/apiary=*/readings.csv#ts (direct)",
                "weight_kg <- raw/scales/apiary=*/readings.csv#w_kg (direct)",
                "weight_lb <- raw/scales/apiary=*/readings.csv#w_kg (derived)",
                "queen_year <- raw/hives.csv#queen_year (direct)");
        DatasetFlow flow = driven("pipeline/ingest_scales.py").flows().get(0);
        assertThat(flow.datasetLevelOnly()).isFalse();
        assertThat(flow.sources()).containsExactly("raw/scales/apiary=*/readings.csv", "raw/hives.csv");
    }

    @Test
    void nectarFlowFindsSqlTablesFiguresAndTheArgvPath() {
        ScriptAnalysis a = driven("pipeline/nectar_flow.py");
        assertThat(Refs.of(a)).containsExactly(
                "READ work/weights_long.parquet @12",
                "WRITE work/nectar_daily.csv @13",
                "READ table:hive_inspections @16",
                "WRITE table:inspections_copy @17",
                "READ work/weights_long.parquet @19",
                "WRITE work/weights_copy.parquet @20",
                "WRITE reports/nectar_flow.png @23",
                "WRITE reports/nectar_flow_current.pdf @24",
                "WRITE reports/brood_frames.svg @26",
                "WRITE work/nectar_summary.csv @29");
        assertThat(a.references()).extracting(DataReference::function).containsExactly(
                "polars.read_parquet", "polars.DataFrame.write_csv", "pandas.read_sql", "pandas.DataFrame.to_sql",
                "pyarrow.parquet.read_table", "pyarrow.parquet.write_table", "matplotlib.figure.Figure.savefig",
                "matplotlib.pyplot.savefig", "seaborn.FacetGrid.savefig", "*.to_csv");
        // common practice, no source: a method on a receiver of unknown type is a heuristic, so less sure
        assertThat(Refs.find(a, "work/nectar_summary.csv").confidence()).isEqualTo(0.6);
        assertThat(Refs.find(a, "reports/nectar_flow.png").kind()).isEqualTo(DatasetKind.FIGURE);
    }

    @Test
    void withoutTheDriverSysArgvFallsBackToTheDefaultBesideIt() throws IOException {
        assertThat(Refs.of(alone("pipeline/nectar_flow.py"))).startsWith("READ work/weights.parquet @12");
    }

    @Test
    void eachDriverInvocationGivesItsOwnPaths() {
        assertThat(Refs.of(driven("pipeline/yearly_report.py"))).containsExactly(
                "READ raw/harvest_2023.csv @7",
                "WRITE reports/harvest_2023.md @8",
                "READ raw/harvest_2024.csv @7",
                "WRITE reports/harvest_2024.md @8");
    }

    @Test
    void withoutADriverAnArgvPathIsUnresolved() throws IOException {
        assertThat(Refs.of(alone("pipeline/yearly_report.py"))).containsExactly(
                "READ ? @7 [f\"raw/harvest_{season}.csv\"]",
                "WRITE ? @8 [f\"reports/harvest_{season}.md\"]");
        assertThat(alone("pipeline/yearly_report.py").references().get(0).pathPattern()).isEqualTo("raw/harvest_*.csv");
    }

    @Test
    void rScriptFollowsFilePathHerePasteSprintfAndCommandArgs() {
        ScriptAnalysis a = driven("analysis/swarm_risk.R");
        assertThat(Refs.of(a)).containsExactly(
                "READ work/weights_long.parquet @9",
                "READ raw/queen_records.csv @11",
                "READ raw/apiary_sites.xlsx @12",
                "READ raw/mites_*.csv @14",
                "READ raw/frames/frame_*.csv @17",
                "READ ? @23 [Sys.getenv(\"BRAMBLECOMBE_EXTRA_CSV\")]",
                "WRITE work/swarm_scores.csv @29",
                "WRITE reports/swarm_risk.png @31",
                "WRITE work/swarm_scores.rds @34",
                "WRITE table:swarm_scores @37",
                "READ table:hive_inspections @38");
        assertThat(Refs.find(a, "raw/mites_*.csv").instances()).containsExactly("raw/mites_2022.csv", "raw/mites_2023.csv", "raw/mites_2024.csv");
        assertThat(Refs.find(a, "raw/frames/frame_*.csv").instances()).containsExactly(
                "raw/frames/frame_01.csv", "raw/frames/frame_02.csv", "raw/frames/frame_03.csv");
        assertThat(Refs.find(a, "raw/queen_records.csv").function()).isEqualTo("utils::read.csv");
        assertThat(Refs.find(a, "reports/swarm_risk.png").kind()).isEqualTo(DatasetKind.FIGURE);
    }

    @Test
    void rWithoutTheDriverUsesTheDefaultBesideCommandArgs() throws IOException {
        ScriptAnalysis a = alone("analysis/swarm_risk.R");
        assertThat(Refs.of(a).get(0)).isEqualTo("READ work/weights.parquet @9");
        assertThat(a.warnings()).contains("line 9: no command-line argument given (args[1]); the default beside it is used");
    }

    @Test
    void dplyrVerbsShowColumnLineage() {
        assertThat(Refs.flowsInto(driven("analysis/swarm_risk.R"), "work/swarm_scores.csv")).containsExactly(
                "hive_id <- raw/queen_records.csv#hive (direct)",
                "queen_age <- raw/queen_records.csv#queen_year (derived)",
                "marked <- raw/queen_records.csv#is_marked (direct)");
    }

    @Test
    void notebookRunsFromItsFolderAndSkipsMagicsShellLinesAndBashCells() {
        ScriptAnalysis a = driven("notebooks/colony_review.ipynb");
        assertThat(Refs.of(a)).containsExactly(
                "READ work/weights_long.parquet @cell2:1",
                "WRITE reports/colony_review.png @cell4:2",
                "WRITE work/colony_stats.csv @cell4:3");
        assertThat(a.flows()).singleElement().satisfies(f -> assertThat(f.datasetLevelOnly()).isTrue());
    }

    @Test
    void rMarkdownRunsChunksFromTheDocumentFolderAndSkipsEvalFalse() throws IOException {
        assertThat(Refs.of(alone("reports/season_summary.Rmd"))).containsExactly(
                "READ work/nectar_daily.csv @14",
                "WRITE reports/figures/nectar_daily.png @15",
                "READ work/swarm_scores.rds @27");
    }

    @Test
    void scriptsFolderPolicyResolvesAgainstTheScriptsOwnFolder() throws IOException {
        AnalysisContext fromScriptFolder = new AnalysisContext(WorkingDirectory.SCRIPT_FOLDER, WorkingDirectory.SCRIPT_FOLDER, List.of());
        ScriptAnalysis a = new ScriptAnalyzer().analyze(root, Path.of("pipeline/yearly_report.py"),
                fromScriptFolder.withInvocations(List.of(new ScriptInvocation(Path.of("pipeline/yearly_report.py"), List.of("2030"), null, Path.of("x.sh"), 1))));
        assertThat(Refs.of(a)).containsExactly("READ pipeline/raw/harvest_2030.csv @7", "WRITE pipeline/reports/harvest_2030.md @8");
    }
}
