package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;
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

// Expected values: worked out by hand from LineageFixture's edge table (see its comment for the rule).
// The walks only read, so one catalog serves the whole class.
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
class DatasetWalkTest {
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

    /** (dataset id, distance) pairs in the order the walk reports them. */
    private List<List<Long>> reach(DatasetReach r) {
        return r.reached().stream().map(x -> List.of(x.datasetId(), (long) x.distance())).toList();
    }

    private List<Long> at(String uri, long distance) {
        return List.of(f.id(uri), distance);
    }

    @Test
    void loadsEveryDatasetIdentityAndEveryCurrentEdge() {
        assertThat(graph.datasetCount()).isEqualTo(11);
        assertThat(graph.edgeCount()).isEqualTo(13);
        assertThat(graph.asOf()).isNull();
    }

    @Test
    void downstreamOfAPartitionReachesEveryDescendantOnceNearestFirst() {
        DatasetReach r = graph.downstream(f.id(P_JAN), Query.everything());

        // The diamond (READINGS to SUMMARY by two ways) reports SUMMARY once; the cycles end the walk.
        assertThat(reach(r)).containsExactly(at(READINGS, 1), at(ENRICHED, 2), at(FLAGGED, 2), at(SUMMARY, 3),
                at(FIGURE, 4), at(TREND, 4), at(TREND_CACHE, 5));
        assertThat(r.startInCycle()).isFalse();
    }

    @Test
    void aDiamondKeepsThePathFoundFirstAmongEquallyShortOnes() {
        DatasetReach r = graph.downstream(f.id(P_JAN), Query.everything());

        // e5 (to ENRICHED) entered the catalog before e6 (to FLAGGED), so SUMMARY is first reached through e7.
        assertThat(r.find(f.id(SUMMARY)).orElseThrow().path()).containsExactly(
                f.hop("e1"), f.hop("e5"), f.hop("e7"));
        assertThat(r.find(f.id(TREND_CACHE)).orElseThrow().path()).containsExactly(
                f.hop("e1"), f.hop("e5"), f.hop("e7"), f.hop("e10"), f.hop("e12"));
    }

    @Test
    void hopsCarryScriptRunEvidenceAndConfidenceOfTheirEdge() {
        Hop qc = graph.downstream(f.id(READINGS), Query.everything()).find(f.id(FLAGGED)).orElseThrow().path().get(0);

        assertThat(qc).isEqualTo(new Hop(f.edgeId("e6"), f.id(READINGS), f.id(FLAGGED),
                f.script(LineageFixture.QC), "run-qc-0001", Evidence.RUNTIME, 1.0));
    }

    @Test
    void aDatasetThatRewritesItselfIsInACycleAndNotItsOwnDescendant() {
        DatasetReach r = graph.downstream(f.id(TREND), Query.everything());

        assertThat(reach(r)).containsExactly(at(TREND_CACHE, 1));
        assertThat(r.startInCycle()).isTrue();
    }

    @Test
    void upstreamListsInputsNearestFirstWithPathsInTheDirectionDataFlows() {
        DatasetReach r = graph.upstream(f.id(SUMMARY), Query.everything());

        assertThat(reach(r)).containsExactly(at(ENRICHED, 1), at(FLAGGED, 1), at(SITES, 2), at(READINGS, 2),
                at(P_JAN, 3), at(P_FEB, 3), at(P_MAR, 3));
        assertThat(r.find(f.id(P_FEB)).orElseThrow().path()).containsExactly(f.hop("e2"), f.hop("e5"), f.hop("e7"));
        assertThat(r.startInCycle()).isFalse();
    }

    @Test
    void everyPartitionOfAPartitionedInputIsItsOwnUpstreamDatasetWithItsOwnEdge() {
        DatasetReach r = graph.upstream(f.id(READINGS), Query.everything());

        assertThat(r.reached()).containsExactly(
                new Reached(f.id(P_JAN), 1, f.hops("e1")),
                new Reached(f.id(P_FEB), 1, f.hops("e2")),
                new Reached(f.id(P_MAR), 1, f.hops("e3")));
    }

    @Test
    void depthLimitStopsTheWalkAtThatManyHops() {
        assertThat(reach(graph.downstream(f.id(P_JAN), Query.everything().withMaxDepth(2))))
                .containsExactly(at(READINGS, 1), at(ENRICHED, 2), at(FLAGGED, 2));
        assertThat(graph.downstream(f.id(P_JAN), Query.everything().withMaxDepth(0)).isEmpty()).isTrue();
        // TREND's own loop is one hop long: it counts within depth 1.
        assertThat(graph.downstream(f.id(TREND), Query.everything().withMaxDepth(1)).startInCycle()).isTrue();
    }

    @Test
    void evidenceFilterFollowsOnlyEdgesOfThatEvidence() {
        DatasetReach staticOnly = graph.downstream(f.id(P_JAN), Query.everything().withEvidence(Set.of(Evidence.STATIC)));
        assertThat(reach(staticOnly)).containsExactly(at(READINGS, 1), at(ENRICHED, 2), at(SUMMARY, 3), at(TREND, 4));

        DatasetReach runtimeOnly = graph.downstream(f.id(READINGS), Query.everything().withEvidence(Set.of(Evidence.RUNTIME)));
        assertThat(runtimeOnly.reached()).containsExactly(
                new Reached(f.id(FLAGGED), 1, f.hops("e6")),
                new Reached(f.id(SUMMARY), 2, f.hops("e6", "e8")));
    }

    @Test
    void confidenceFilterRoutesAroundAWeakEdgeOfTheDiamond() {
        DatasetReach r = graph.downstream(f.id(P_JAN), Query.everything().withMinConfidence(0.9));

        // e7 (0.8), e9 (0.5) and e12 (0.7) fall below 0.9; e5 (exactly 0.9) is kept.
        assertThat(reach(r)).containsExactly(at(READINGS, 1), at(ENRICHED, 2), at(FLAGGED, 2), at(SUMMARY, 3),
                at(TREND, 4));
        assertThat(r.find(f.id(SUMMARY)).orElseThrow().path()).containsExactly(f.hop("e1"), f.hop("e6"), f.hop("e8"));
    }

    @Test
    void aConfidenceEqualToTheMinimumIsFollowed() {
        DatasetReach r = graph.downstream(f.id(TREND), Query.everything().withMinConfidence(0.7));

        assertThat(r.reached()).containsExactly(new Reached(f.id(TREND_CACHE), 1, f.hops("e12")));
        assertThat(graph.downstream(f.id(TREND), Query.everything().withMinConfidence(0.71)).isEmpty()).isTrue();
    }

    @Test
    void kindFilterReportsOnlyThoseKindsButWalksThroughTheOthers() {
        DatasetReach r = graph.downstream(f.id(P_JAN),
                Query.everything().withKinds(Set.of(DatasetKind.TABLE, DatasetKind.FIGURE)));

        assertThat(r.reached()).containsExactly(
                new Reached(f.id(SUMMARY), 3, f.hops("e1", "e5", "e7")),
                new Reached(f.id(FIGURE), 4, f.hops("e1", "e5", "e7", "e9")));
    }

    @Test
    void sourceFilterReportsOnlyDatasetsOfThatSource() {
        DatasetReach r = graph.upstream(f.id(SUMMARY), Query.everything().withSources(Set.of(f.loggerSource)));

        assertThat(reach(r)).containsExactly(at(P_JAN, 3), at(P_FEB, 3), at(P_MAR, 3));
    }

    @Test
    void aDatasetWithoutEdgesOrUnknownToTheCatalogReachesNothing() {
        assertThat(graph.upstream(f.id(P_JAN), Query.everything()).isEmpty()).isTrue();
        DatasetReach unknown = graph.downstream(987_654L, Query.everything());
        assertThat(unknown.isEmpty()).isTrue();
        assertThat(unknown.start()).isEqualTo(987_654L);
    }
}
