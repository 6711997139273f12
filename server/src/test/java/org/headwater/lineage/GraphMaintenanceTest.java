package org.headwater.lineage;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;
import static org.headwater.store.schema.Tables.COLUMN_LINEAGE;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.lineage.LineageFixture.CACHE;
import static org.headwater.lineage.LineageFixture.ENRICHED;
import static org.headwater.lineage.LineageFixture.FIGURE;
import static org.headwater.lineage.LineageFixture.FLAGGED;
import static org.headwater.lineage.LineageFixture.JOIN;
import static org.headwater.lineage.LineageFixture.LAB;
import static org.headwater.lineage.LineageFixture.P_JAN;
import static org.headwater.lineage.LineageFixture.READINGS;
import static org.headwater.lineage.LineageFixture.SITES;
import static org.headwater.lineage.LineageFixture.SUMMARISE;
import static org.headwater.lineage.LineageFixture.SUMMARY;
import static org.headwater.lineage.LineageFixture.TREND;
import static org.headwater.lineage.LineageFixture.TREND_CACHE;
import static org.headwater.lineage.LineageFixture.derived;
import static org.headwater.lineage.LineageFixture.direct;
import static org.headwater.lineage.LineageFixture.influencing;

import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;
import org.headwater.Catalog;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.ingest.Observation.EdgeGone;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.testing.SteppingClock;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

// Expected values: worked out by hand from LineageFixture's edge table and the changes each test applies;
// the equivalence test takes a graph rebuilt from the store as its reference.
class GraphMaintenanceTest {
    private static final String ARCHIVE = LAB + "archive/levels.png";
    private static final String LOOKUP = LAB + "ref/stations.csv";

    @TempDir
    Path temp;

    private final SteppingClock clock = new SteppingClock(Instant.parse("2026-03-01T00:00:00Z"));
    private Catalog catalog;
    private LineageFixture f;
    private LineageGraph graph;

    @BeforeEach
    void open() {
        catalog = TestCatalogs.fresh(temp, clock);
        f = LineageFixture.ingest(catalog);
        graph = LineageGraph.load(catalog.store());
        catalog.ingestor().addListener(graph);
    }

    @AfterEach
    void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    private void apply(Object... observations) {
        List<org.headwater.ingest.Observation> batch = new ArrayList<>();
        for (Object o : observations) {
            batch.add((org.headwater.ingest.Observation) o);
        }
        catalog.ingestor().apply("test", batch);
    }

    private long currentEdge(String from, String to) {
        return catalog.store().dsl().select(LINEAGE_EDGE.ID).from(LINEAGE_EDGE)
                .where(LINEAGE_EDGE.SOURCE_DATASET_ID.eq(f.id(from)), LINEAGE_EDGE.TARGET_DATASET_ID.eq(f.id(to)),
                        LINEAGE_EDGE.VALID_TO.isNull())
                .fetchSingle(LINEAGE_EDGE.ID);
    }

    @Test
    void anEdgeCommittedAfterLoadingIsWalkedAtOnce() {
        apply(new EdgeSeen(FIGURE, ARCHIVE, null, null, null, Evidence.DECLARED, 1.0, List.of()));

        Hop archived = new Hop(currentEdge(FIGURE, ARCHIVE), f.id(FIGURE), f.id(ARCHIVE), null, null, Evidence.DECLARED, 1.0);
        assertThat(graph.downstream(f.id(SUMMARY), Query.everything()).find(f.id(ARCHIVE)).orElseThrow())
                .isEqualTo(new Reached(f.id(ARCHIVE), 2, List.of(f.hop("e9"), archived)));
        assertThat(graph.edgeCount()).isEqualTo(14);
        assertThat(graph.datasetCount()).isEqualTo(12);
    }

    @Test
    void anEdgeThatIsGoneIsNoLongerWalkedAtEitherLevel() {
        apply(new EdgeGone(TREND, TREND_CACHE, CACHE, Evidence.INFERRED));

        DatasetReach fromTrend = graph.downstream(f.id(TREND), Query.everything());
        assertThat(fromTrend.isEmpty()).isTrue();
        assertThat(fromTrend.startInCycle()).isTrue(); // e11, TREND rewriting itself, is still there
        assertThat(graph.upstream(f.id(TREND_CACHE), Query.everything()).isEmpty()).isTrue();
        ColumnClosure trend = graph.downstreamColumns(f.id(TREND), "trend", Query.everything());
        assertThat(trend.flows().isEmpty()).isTrue();
        assertThat(trend.flows().startInCycle()).isFalse();
        assertThat(graph.edgeCount()).isEqualTo(12);
    }

    @Test
    void aChangedEdgeReplacesItsEarlierVersionWithItsNewFacts() {
        long before = f.edgeId("e7");
        // summary.sql no longer filters on ts, and its confidence went up.
        apply(new EdgeSeen(ENRICHED, SUMMARY, SUMMARISE, "h-e7b", null, Evidence.STATIC, 0.85, List.of(
                direct("site_name", "site_name"), derived("level_cm", "mean_level"))));
        long after = f.edgeId("e7");

        assertThat(after).isNotEqualTo(before);
        assertThat(graph.edgeCount()).isEqualTo(13);
        DatasetReach r = graph.downstream(f.id(P_JAN), Query.everything().withMinConfidence(0.85));
        Hop e7 = new Hop(after, f.id(ENRICHED), f.id(SUMMARY), f.script(SUMMARISE), null, Evidence.STATIC, 0.85);
        assertThat(r.find(f.id(SUMMARY)).orElseThrow().path()).containsExactly(f.hop("e1"), f.hop("e5"), e7);
        assertThat(graph.downstreamColumns(f.id(READINGS), "ts", Query.everything()).indirect().isEmpty()).isTrue();
    }

    @Test
    void influenceSpreadsToAColumnThatAnotherEdgeOfTheSameScriptWritesLater() {
        ColumnKey station = f.column(ENRICHED, "station");
        assertThat(graph.downstreamColumns(f.id(SITES), "site_id", Query.everything()).indirect().find(station)).isEmpty();

        apply(LineageFixture.dataset(LOOKUP, DatasetKind.FILE, f.labSource),
                new EdgeSeen(LOOKUP, ENRICHED, JOIN, "h-join2", null, Evidence.STATIC, 0.9,
                        List.of(direct("station_code", "station"))));

        // e4 itself did not change: its join key now also decides the rows of the new column join.py writes.
        assertThat(graph.downstreamColumns(f.id(SITES), "site_id", Query.everything()).indirect().find(station))
                .hasValue(new ReachedColumn(station, 1,
                        List.of(f.columnHop("e4", "site_id", "station", ColumnRole.INFLUENCING))));
    }

    @Test
    void aDatasetKindCorrectedLaterIsFilteredByItsNewKind() {
        apply(new EdgeSeen(FIGURE, ARCHIVE, null, null, null, Evidence.DECLARED, 1.0, List.of()));
        Query tables = Query.everything().withKinds(Set.of(DatasetKind.TABLE));
        // An edge may name a dataset no harvest has seen; the catalog records it as kind "other".
        assertThat(graph.downstream(f.id(FIGURE), tables).isEmpty()).isTrue();

        apply(LineageFixture.dataset(ARCHIVE, DatasetKind.TABLE, f.labSource));

        assertThat(graph.downstream(f.id(FIGURE), tables).datasetIds()).containsExactly(f.id(ARCHIVE));
    }

    @Test
    void aGraphKeptCurrentAnswersLikeOneRebuiltFromTheStore() {
        apply(new EdgeGone(TREND, TREND_CACHE, CACHE, Evidence.INFERRED),
                new EdgeSeen(FIGURE, ARCHIVE, null, null, null, Evidence.DECLARED, 1.0, List.of()));
        apply(new EdgeSeen(ENRICHED, SUMMARY, SUMMARISE, "h-e7b", null, Evidence.STATIC, 0.85, List.of(
                influencing("ts"), derived("level_cm", "mean_level"))));
        apply(LineageFixture.dataset(LOOKUP, DatasetKind.FILE, f.labSource),
                new EdgeSeen(LOOKUP, ENRICHED, JOIN, "h-join2", null, Evidence.STATIC, 0.9,
                        List.of(direct("station_code", "station"), influencing("station_code"))));
        apply(new EdgeGone(READINGS, FLAGGED, LineageFixture.QC, Evidence.RUNTIME),
                new EdgeSeen(TREND, TREND_CACHE, CACHE, "h-e12b", null, Evidence.INFERRED, 0.7,
                        List.of(direct("trend", "trend"))));

        LineageGraph rebuilt = LineageGraph.load(catalog.store());

        assertThat(graph.edgeCount()).isEqualTo(rebuilt.edgeCount());
        assertThat(graph.columnEdgeCount()).isEqualTo(rebuilt.columnEdgeCount());
        List<Long> ids = catalog.store().dsl().select(DATASET.ID).from(DATASET).fetch(DATASET.ID);
        assertThat(ids).hasSize(rebuilt.datasetCount());
        for (long id : ids) {
            assertThat(graph.downstream(id, Query.everything()).reached())
                    .isEqualTo(rebuilt.downstream(id, Query.everything()).reached());
            assertThat(graph.upstream(id, Query.everything()).reached())
                    .isEqualTo(rebuilt.upstream(id, Query.everything()).reached());
        }
        for (ColumnKey column : everyColumnTheStoreNames()) {
            ColumnClosure kept = graph.downstreamColumns(column.datasetId(), column.column(), Query.everything());
            ColumnClosure fresh = rebuilt.downstreamColumns(column.datasetId(), column.column(), Query.everything());
            assertThat(kept.flows().reached()).isEqualTo(fresh.flows().reached());
            assertThat(kept.indirect().reached()).isEqualTo(fresh.indirect().reached());
            ColumnClosure keptUp = graph.upstreamColumns(column.datasetId(), column.column(), Query.everything());
            ColumnClosure freshUp = rebuilt.upstreamColumns(column.datasetId(), column.column(), Query.everything());
            assertThat(keptUp.flows().reached()).isEqualTo(freshUp.flows().reached());
            assertThat(keptUp.indirect().reached()).isEqualTo(freshUp.indirect().reached());
        }
    }

    private Set<ColumnKey> everyColumnTheStoreNames() {
        Set<ColumnKey> columns = new LinkedHashSet<>();
        catalog.store().dsl().select(LINEAGE_EDGE.SOURCE_DATASET_ID, LINEAGE_EDGE.TARGET_DATASET_ID,
                        COLUMN_LINEAGE.SOURCE_COLUMN, COLUMN_LINEAGE.TARGET_COLUMN)
                .from(COLUMN_LINEAGE).join(LINEAGE_EDGE).on(LINEAGE_EDGE.ID.eq(COLUMN_LINEAGE.EDGE_ID))
                .forEach(r -> {
                    columns.add(new ColumnKey(r.value1(), r.value3()));
                    if (r.value4() != null) {
                        columns.add(new ColumnKey(r.value2(), r.value4()));
                    }
                });
        assertThat(columns).hasSizeGreaterThan(20);
        return columns;
    }

    @Test
    void aGraphAsOfAnEarlierInstantShowsTheLineageOfThatInstant() {
        Instant beforeChanges = clock.between();
        long oldE7 = f.edgeId("e7");
        apply(new EdgeGone(TREND, TREND_CACHE, CACHE, Evidence.INFERRED),
                new EdgeSeen(ENRICHED, SUMMARY, SUMMARISE, "h-e7b", null, Evidence.STATIC, 0.85, List.of()));

        LineageGraph then = LineageGraph.loadAsOf(catalog.store(), beforeChanges);

        assertThat(then.asOf()).isEqualTo(beforeChanges);
        assertThat(then.edgeCount()).isEqualTo(13);
        DatasetReach r = then.downstream(f.id(P_JAN), Query.everything());
        assertThat(r.datasetIds()).containsExactly(f.id(READINGS), f.id(ENRICHED), f.id(FLAGGED), f.id(SUMMARY),
                f.id(FIGURE), f.id(TREND), f.id(TREND_CACHE));
        assertThat(r.find(f.id(SUMMARY)).orElseThrow().path().get(2))
                .isEqualTo(new Hop(oldE7, f.id(ENRICHED), f.id(SUMMARY), f.script(SUMMARISE), null, Evidence.STATIC, 0.8));
        // The column flows of the old e7 version belong to that instant as well.
        assertThat(then.downstreamColumns(f.id(READINGS), "ts", Query.everything()).indirect().size()).isEqualTo(7);

        LineageGraph now = LineageGraph.load(catalog.store());
        assertThat(now.edgeCount()).isEqualTo(12);
        assertThat(now.downstream(f.id(TREND), Query.everything()).isEmpty()).isTrue();
        assertThat(LineageGraph.loadAsOf(catalog.store(), Instant.parse("2026-01-01T00:00:00Z")).edgeCount()).isZero();
    }

    @Test
    void aGraphOfThePastRefusesToFollowChanges() {
        LineageGraph then = LineageGraph.loadAsOf(catalog.store(), clock.between());

        assertThatThrownBy(() -> then.committed(List.of()))
                .isInstanceOf(IllegalStateException.class)
                .hasMessageContaining("does not follow changes");
    }
}
