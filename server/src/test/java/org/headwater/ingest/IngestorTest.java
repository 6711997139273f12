package org.headwater.ingest;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.assertThatThrownBy;

import java.nio.file.Path;
import java.time.Instant;
import java.util.List;
import java.util.Set;
import org.headwater.Catalog;
import org.headwater.ingest.Observation.ColumnFlow;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.ingest.Observation.DatasetGone;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.ingest.Observation.NoteSet;
import org.headwater.ingest.Observation.OwnerAssigned;
import org.headwater.model.ColumnDef;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.store.Views.ColumnView;
import org.headwater.store.Views.DatasetView;
import org.headwater.testing.SteppingClock;
import org.headwater.testing.TestCatalogs;
import org.junit.jupiter.api.AfterEach;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class IngestorTest {
    private static final String RAW = "file:///lake/raw/gauges.csv";
    private static final String CLEAN = "file:///lake/clean/gauges.csv";
    private static final Instant MODIFIED = Instant.parse("2026-02-03T04:05:06.123456789Z");

    @TempDir
    Path temp;

    private final SteppingClock clock = new SteppingClock(Instant.parse("2026-03-01T00:00:00Z"));
    private Catalog catalog;

    @BeforeEach
    void open() {
        catalog = TestCatalogs.fresh(temp, clock);
    }

    @AfterEach
    void close() {
        if (catalog != null) {
            catalog.close();
        }
    }

    private static DatasetSeen gauges(String uri, List<ColumnDef> columns, long size) {
        return new DatasetSeen(uri, uri.substring(uri.indexOf("/lake/") + 6), DatasetKind.FILE, null, "csv", size,
                MODIFIED, "ab".repeat(32), 3L, true, "{\"delimiter\":\",\"}", null, columns);
    }

    private static final List<ColumnDef> V1 = List.of(
            new ColumnDef("gauge_id", "integer", false), new ColumnDef("level_cm", "decimal", true));

    @Test
    void storesAndReadsBackEveryFactOfADatasetThroughJooq() {
        catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120)));

        DatasetView d = catalog.reader().findDatasets(RAW).stream().findFirst()
                .flatMap(s -> catalog.reader().dataset(s.id(), null)).orElseThrow();
        assertThat(d.uri()).isEqualTo(RAW);
        assertThat(d.name()).isEqualTo("raw/gauges.csv");
        assertThat(d.kind()).isEqualTo("file");
        assertThat(d.present()).isTrue();
        assertThat(d.format()).isEqualTo("csv");
        assertThat(d.sizeBytes()).isEqualTo(120L);
        // The store keeps microseconds (H2 and PostgreSQL timestamp precision).
        assertThat(d.modifiedAt()).isEqualTo(Instant.parse("2026-02-03T04:05:06.123456Z"));
        assertThat(d.contentHash()).isEqualTo("ab".repeat(32));
        assertThat(d.rowCount()).isEqualTo(3L);
        assertThat(d.rowCountExact()).isTrue();
        assertThat(d.details()).isEqualTo("{\"delimiter\":\",\"}");
        assertThat(d.schemaVersion()).isEqualTo(1);
        assertThat(d.columns()).containsExactly(
                new ColumnView(1, "gauge_id", "integer", false), new ColumnView(2, "level_cm", "decimal", true));
    }

    @Test
    void applyingTheSameObservationTwiceChangesNothing() {
        List<Change> first = catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120)));
        int log = catalog.reader().changeLogSize();
        List<Change> second = catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120)));

        assertThat(first).extracting(Change::operation).containsExactly("created", "state", "schema");
        assertThat(second).isEmpty();
        assertThat(catalog.reader().changeLogSize()).isEqualTo(log);
    }

    @Test
    void aChangedHeaderStartsASecondSchemaVersionAndKeepsTheFirst() {
        catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120)));
        Instant between = clock.between();
        List<ColumnDef> v2 = List.of(new ColumnDef("gauge_id", "integer", false), new ColumnDef("level_mm", "integer", false));
        catalog.ingestor().apply("test", List.of(gauges(RAW, v2, 130)));

        long id = catalog.reader().findDatasets(RAW).get(0).id();
        var history = catalog.reader().schemaHistory(id);
        assertThat(history).extracting(h -> h.version()).containsExactly(1, 2);
        assertThat(history.get(0).validTo()).isEqualTo(history.get(1).validFrom());
        assertThat(history.get(1).columns()).extracting(ColumnView::name).containsExactly("gauge_id", "level_mm");
        assertThat(history.get(1).drift()).isEqualTo(
                new org.headwater.store.Views.Drift(List.of("level_mm"), List.of("level_cm"), List.of()));

        DatasetView before = catalog.reader().dataset(id, between).orElseThrow();
        assertThat(before.schemaVersion()).isEqualTo(1);
        assertThat(before.sizeBytes()).isEqualTo(120L);
        assertThat(before.columns()).extracting(ColumnView::name).containsExactly("gauge_id", "level_cm");
        assertThat(catalog.reader().dataset(id, null).orElseThrow().sizeBytes()).isEqualTo(130L);
    }

    @Test
    void aVanishedDatasetEndsItsValidityAndKeepsItsHistory() {
        catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120)));
        Instant whilePresent = clock.between();
        catalog.ingestor().apply("test", List.of(new DatasetGone(RAW)));
        List<Change> again = catalog.ingestor().apply("test", List.of(new DatasetGone(RAW)));

        long id = catalog.reader().findDatasets(RAW).get(0).id();
        assertThat(again).isEmpty();
        assertThat(catalog.reader().dataset(id, null).orElseThrow().present()).isFalse();
        assertThat(catalog.reader().dataset(id, whilePresent).orElseThrow().present()).isTrue();
        assertThat(catalog.reader().datasetCount()).isZero();
    }

    @Test
    void edgesAreStoredOnceWithTheirColumnFlowsAndNewVersionsWhenTheyChange() {
        catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120), gauges(CLEAN, V1, 90)));
        var edge = new EdgeSeen(RAW, CLEAN, null, "cd".repeat(32), null, Evidence.STATIC, 0.9,
                List.of(new ColumnFlow("level_cm", "level_cm", ColumnRole.DIRECT),
                        new ColumnFlow("gauge_id", null, ColumnRole.INFLUENCING)));
        List<Change> first = catalog.ingestor().apply("test", List.of(edge));
        List<Change> repeated = catalog.ingestor().apply("test", List.of(edge));
        var stronger = new EdgeSeen(RAW, CLEAN, null, "cd".repeat(32), null, Evidence.STATIC, 0.95, edge.columns());
        List<Change> changed = catalog.ingestor().apply("test", List.of(stronger));

        assertThat(first).extracting(Change::operation).containsExactly("created");
        assertThat(repeated).isEmpty();
        assertThat(changed).extracting(Change::operation).containsExactly("updated");
        long clean = catalog.reader().findDatasets(CLEAN).get(0).id();
        var upstream = catalog.reader().dataset(clean, null).orElseThrow().upstream();
        assertThat(upstream).hasSize(1);
        assertThat(upstream.get(0).datasetName()).isEqualTo("raw/gauges.csv");
        assertThat(upstream.get(0).evidence()).isEqualTo("static");
        assertThat(upstream.get(0).confidence()).isEqualTo(0.95);
    }

    @Test
    void notesAndOwnersKeepEarlierVersions() {
        catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120)));
        catalog.ingestor().apply("api", List.of(new NoteSet(RAW, "Gauge levels", Set.of("hydrology"), "ana"),
                new OwnerAssigned(RAW, "field-team", "team", "declared by ana")));
        Instant first = clock.between();
        catalog.ingestor().apply("api", List.of(new NoteSet(RAW, "Gauge levels, 15 min", Set.of("hydrology", "raw"), "ben")));

        long id = catalog.reader().findDatasets(RAW).get(0).id();
        DatasetView now = catalog.reader().dataset(id, null).orElseThrow();
        DatasetView then = catalog.reader().dataset(id, first).orElseThrow();
        assertThat(now.description()).isEqualTo("Gauge levels, 15 min");
        assertThat(now.tags()).containsExactly("hydrology", "raw");
        assertThat(then.description()).isEqualTo("Gauge levels");
        assertThat(now.owners()).extracting(o -> o.name() + "/" + o.reason()).containsExactly("field-team/declared by ana");
    }

    @Test
    void aBatchThatNamesAnUnknownDatasetIsRolledBackWhole() {
        var batch = List.of(gauges(RAW, V1, 120), new NoteSet("file:///nowhere.csv", "x", Set.of(), "ana"));
        assertThatThrownBy(() -> catalog.ingestor().apply("api", batch)).isInstanceOf(UnknownDatasetException.class);
        assertThat(catalog.reader().findDatasets(RAW)).isEmpty();
        assertThat(catalog.reader().changeLogSize()).isZero();
    }

    @Test
    void aScriptWithMoreReferencesThanOneInsertHoldsEachInCodeOrderAndReadsNoDatasetTwice() {
        // 1,203 references (more than two statements' worth) to 7 datasets, 3 of which no harvest has seen.
        catalog.ingestor().apply("test", List.of(gauges(RAW, V1, 120)));
        String script = "file:///lake/scripts/many_reads.py";
        catalog.ingestor().apply("test", List.of(new Observation.ScriptSeen(script, "scripts/many_reads.py",
                org.headwater.model.Language.PYTHON, null, 10L, MODIFIED, "cd".repeat(32), null, null, null, List.of())));
        List<Observation.Reference> references = new java.util.ArrayList<>();
        for (int i = 0; i < 1203; i++) {
            String uri = i % 7 == 0 ? RAW : "file:///lake/derived/part_" + (i % 4) + ".csv";
            references.add(new Observation.Reference(i % 2 == 0 ? "read" : "write", "pattern_" + i, true, uri,
                    "pandas.read_csv", "pd.read_csv(p)", i + 1, 4, null, 0.9));
        }
        catalog.ingestor().apply("test", List.of(new Observation.ScriptReferencesSeen(script, "cd".repeat(32),
                references, List.of())));

        long scriptId = catalog.reader().findScripts(script).get(0).id();
        List<org.headwater.store.Views.ReferenceView> stored = catalog.reader().references(scriptId);
        assertThat(stored).hasSize(1203);
        for (int i = 0; i < 1203; i++) {
            assertThat(stored.get(i).pattern()).isEqualTo("pattern_" + i);
            assertThat(stored.get(i).line()).isEqualTo(i + 1);
            assertThat(stored.get(i).dataset()).isEqualTo(i % 7 == 0 ? "raw/gauges.csv" : "derived/part_" + (i % 4) + ".csv");
        }
        // Each unseen dataset got one identity (named by DatasetNames.fallbackName, its last two path parts), however
        // many references name it.
        for (int k = 0; k < 4; k++) {
            assertThat(catalog.reader().findDatasets("file:///lake/derived/part_" + k + ".csv")).hasSize(1);
        }
    }
}
