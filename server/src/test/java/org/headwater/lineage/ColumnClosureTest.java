package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;
import static org.headwater.ingest.Observation.ColumnRole.DERIVED;
import static org.headwater.ingest.Observation.ColumnRole.DIRECT;
import static org.headwater.ingest.Observation.ColumnRole.INFLUENCING;
import static org.headwater.lineage.LineageFixture.ENRICHED;
import static org.headwater.lineage.LineageFixture.FIGURE;
import static org.headwater.lineage.LineageFixture.FLAGGED;
import static org.headwater.lineage.LineageFixture.P_FEB;
import static org.headwater.lineage.LineageFixture.P_JAN;
import static org.headwater.lineage.LineageFixture.P_MAR;
import static org.headwater.lineage.LineageFixture.READINGS;
import static org.headwater.lineage.LineageFixture.SITES;
import static org.headwater.lineage.LineageFixture.SUMMARY;
import static org.headwater.lineage.LineageFixture.TREND;
import static org.headwater.lineage.LineageFixture.TREND_CACHE;

import java.nio.file.Path;
import java.util.List;
import java.util.Set;
import org.headwater.Catalog;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.io.TempDir;

// Expected values: worked out by hand from LineageFixture's edge table. Column edges of a node are taken
// in edge-id order, an edge's own flows before the spread of its influencing flows; an influencing flow
// without a target column reaches every column its script writes into the target (LOOKUP: GraphIndex).
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class ColumnClosureTest {
    private Catalog catalog;
    private LineageFixture f;
    private LineageGraph graph;

    @BeforeAll
    void open(@TempDir Path temp) {
        catalog = TestCatalogs.fresh(temp);
        f = LineageFixture.ingest(catalog);
        graph = LineageGraph.load(catalog.store());
    }

    @AfterAll
    void close() {
        // Null when the set-up was skipped (no such component here): nothing to close.
        if (catalog != null) {
            catalog.close();
        }
    }

    private record At(ColumnKey column, int distance) {
    }

    private At at(String uri, String column, int distance) {
        return new At(f.column(uri, column), distance);
    }

    private static List<At> listed(ColumnReach r) {
        return r.reached().stream().map(x -> new At(x.column(), x.distance())).toList();
    }

    @Test
    void valuesFlowThroughDirectAndDerivedColumnsAndTheInfluencedOnesAreIndirect() {
        ColumnClosure c = graph.downstreamColumns(f.id(P_JAN), "level_raw", Query.everything());

        assertThat(c.start()).isEqualTo(f.column(P_JAN, "level_raw"));
        assertThat(listed(c.flows())).containsExactly(at(READINGS, "level_cm", 1), at(ENRICHED, "level_cm", 2),
                at(FLAGGED, "flag", 2), at(SUMMARY, "mean_level", 3), at(FIGURE, null, 4), at(TREND, "mean_level", 4),
                at(TREND, "trend", 5), at(TREND_CACHE, "trend", 6));
        // The flag computed from the level filters the summary's rows, and so its site list.
        assertThat(listed(c.indirect())).containsExactly(at(SUMMARY, "site_name", 3), at(TREND, "site_name", 4));
    }

    @Test
    void columnPathsListEveryColumnHopWithItsRoleAndDatasetEdge() {
        ColumnClosure c = graph.downstreamColumns(f.id(P_JAN), "level_raw", Query.everything());

        assertThat(c.flows().find(f.column(TREND_CACHE, "trend")).orElseThrow().path()).containsExactly(
                f.columnHop("e1", "level_raw", "level_cm", DERIVED),
                f.columnHop("e5", "level_cm", "level_cm", DIRECT),
                f.columnHop("e7", "level_cm", "mean_level", DERIVED),
                f.columnHop("e10", "mean_level", "mean_level", DIRECT),
                f.columnHop("e11", "mean_level", "trend", DERIVED),
                f.columnHop("e12", "trend", "trend", DIRECT));
        assertThat(c.flows().find(f.column(FIGURE, null)).orElseThrow().path()).containsExactly(
                f.columnHop("e1", "level_raw", "level_cm", DERIVED),
                f.columnHop("e5", "level_cm", "level_cm", DIRECT),
                f.columnHop("e7", "level_cm", "mean_level", DERIVED),
                f.columnHop("e9", "mean_level", null, DERIVED));
        assertThat(c.indirect().find(f.column(TREND, "site_name")).orElseThrow().path()).containsExactly(
                f.columnHop("e1", "level_raw", "level_cm", DERIVED),
                f.columnHop("e6", "level_cm", "flag", DERIVED),
                f.columnHop("e8", "flag", "site_name", INFLUENCING),
                f.columnHop("e10", "site_name", "site_name", DIRECT));
    }

    @Test
    void aFilterColumnReachesEveryOutputOnlyIndirectly() {
        ColumnClosure c = graph.downstreamColumns(f.id(READINGS), "ts", Query.everything());

        assertThat(listed(c.flows())).containsExactly(at(ENRICHED, "ts", 1), at(FLAGGED, "ts", 1));
        assertThat(listed(c.indirect())).containsExactly(at(SUMMARY, "site_name", 2), at(SUMMARY, "mean_level", 2),
                at(FIGURE, null, 3), at(TREND, "site_name", 3), at(TREND, "mean_level", 3), at(TREND, "trend", 4),
                at(TREND_CACHE, "trend", 5));
        // The figure's script writes no named column, so what filters it reaches the figure as a whole.
        assertThat(c.indirect().find(f.column(FIGURE, null)).orElseThrow().path()).containsExactly(
                f.columnHop("e5", "ts", "ts", DIRECT),
                f.columnHop("e7", "ts", "site_name", INFLUENCING),
                f.columnHop("e9", "site_name", null, INFLUENCING));
    }

    @Test
    void aJoinKeyOfOneInputInfluencesColumnsTheSameScriptCopiesFromTheOtherInput() {
        ColumnClosure c = graph.upstreamColumns(f.id(SUMMARY), "mean_level", Query.everything());

        assertThat(listed(c.flows())).containsExactly(at(ENRICHED, "level_cm", 1), at(READINGS, "level_cm", 2),
                at(P_JAN, "level_raw", 3), at(P_FEB, "level_raw", 3), at(P_MAR, "level_raw", 3));
        assertThat(listed(c.indirect())).containsExactly(at(ENRICHED, "ts", 1), at(FLAGGED, "flag", 1),
                at(SITES, "site_id", 2), at(READINGS, "site_id", 2), at(READINGS, "ts", 2),
                at(P_JAN, "site_id", 3), at(P_FEB, "site_id", 3), at(P_MAR, "site_id", 3),
                at(P_JAN, "ts", 3), at(P_FEB, "ts", 3), at(P_MAR, "ts", 3));
        // SITES.site_id is join.py's join key; the level column join.py copies from READINGS depends on it.
        assertThat(c.indirect().find(f.column(SITES, "site_id")).orElseThrow().path()).containsExactly(
                f.columnHop("e4", "site_id", "level_cm", INFLUENCING),
                f.columnHop("e7", "level_cm", "mean_level", DERIVED));
        assertThat(c.indirect().find(f.column(P_JAN, "site_id")).orElseThrow().path()).containsExactly(
                f.columnHop("e1", "site_id", "site_id", DIRECT),
                f.columnHop("e5", "site_id", "level_cm", INFLUENCING),
                f.columnHop("e7", "level_cm", "mean_level", DERIVED));
    }

    @Test
    void columnCyclesEndTheWalkAndAreReported() {
        ColumnClosure throughCache = graph.downstreamColumns(f.id(TREND), "trend", Query.everything());
        assertThat(listed(throughCache.flows())).containsExactly(at(TREND_CACHE, "trend", 1));
        assertThat(throughCache.flows().startInCycle()).isTrue();

        ColumnClosure rewritten = graph.downstreamColumns(f.id(TREND), "mean_level", Query.everything());
        assertThat(listed(rewritten.flows())).containsExactly(at(TREND, "trend", 1), at(TREND_CACHE, "trend", 2));
        assertThat(rewritten.flows().startInCycle()).isTrue();
        assertThat(rewritten.indirect().isEmpty()).isTrue();
    }

    @Test
    void edgeFiltersApplyToTheDatasetEdgeAColumnEdgeBelongsTo() {
        ColumnClosure c = graph.downstreamColumns(f.id(P_JAN), "level_raw",
                Query.everything().withEvidence(Set.of(Evidence.STATIC)));

        assertThat(listed(c.flows())).containsExactly(at(READINGS, "level_cm", 1), at(ENRICHED, "level_cm", 2),
                at(SUMMARY, "mean_level", 3), at(TREND, "mean_level", 4), at(TREND, "trend", 5));
        assertThat(c.indirect().isEmpty()).isTrue();
    }

    @Test
    void depthAndKindLimitColumnWalksAsTheyDoDatasetWalks() {
        ColumnClosure shallow = graph.downstreamColumns(f.id(P_JAN), "level_raw", Query.everything().withMaxDepth(2));
        assertThat(listed(shallow.flows())).containsExactly(at(READINGS, "level_cm", 1), at(ENRICHED, "level_cm", 2),
                at(FLAGGED, "flag", 2));
        assertThat(shallow.indirect().isEmpty()).isTrue();

        ColumnClosure tables = graph.downstreamColumns(f.id(P_JAN), "level_raw",
                Query.everything().withKinds(Set.of(DatasetKind.TABLE)));
        assertThat(listed(tables.flows())).containsExactly(at(SUMMARY, "mean_level", 3));
        assertThat(listed(tables.indirect())).containsExactly(at(SUMMARY, "site_name", 3));
    }

    @Test
    void aColumnNoFlowMentionsReachesNothing() {
        ColumnClosure c = graph.downstreamColumns(f.id(READINGS), "battery_volts", Query.everything());

        assertThat(c.flows().isEmpty()).isTrue();
        assertThat(c.indirect().isEmpty()).isTrue();
        assertThat(c.start()).isEqualTo(f.column(READINGS, "battery_volts"));
    }
}
