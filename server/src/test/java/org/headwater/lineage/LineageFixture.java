package org.headwater.lineage;

import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.RUN;
import static org.headwater.store.schema.Tables.SCRIPT;

import java.time.Clock;
import java.time.Instant;
import java.time.OffsetDateTime;
import java.time.ZoneOffset;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.headwater.Catalog;
import org.headwater.ingest.Observation;
import org.headwater.ingest.Observation.ColumnFlow;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.ingest.Observation.DatasetSeen;
import org.headwater.ingest.Observation.EdgeSeen;
import org.headwater.ingest.Observation.ScriptSeen;
import org.headwater.ingest.Sources;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.model.Language;

/**
 * The hand-made lineage the graph tests walk: an invented lab whose water-level loggers drop one CSV per
 * month. Every expected answer in the tests was worked out by hand from the tables below (a breadth-first
 * walk taking each node's edges in the order they are listed here, which is the order they enter the
 * store and so their id order).
 *
 * <pre>
 *  P_JAN ─e1─┐                          ┌─e9 (declared 0.5)──▶ FIGURE
 *  P_FEB ─e2─┼─▶ READINGS ─e5─▶ ENRICHED ─e7 (static 0.8)─▶ SUMMARY ─┤
 *  P_MAR ─e3─┘       │     SITES ─e4─▶┘                   ▲          └─e10─▶ TREND ◀─e11 (itself)
 *                    └─e6 (runtime)─▶ FLAGGED ─e8 (runtime 0.95)┘               │ ▲
 *                                                                      e12 ▼ │ e13 (inferred 0.7)
 *                                                                          TREND_CACHE
 * </pre>
 *
 * The three monthly files are the partitioned input (source "logger-drop"); everything else belongs to
 * the source "lab-share". READINGS to SUMMARY is a diamond; TREND rewrites itself and forms a two-step
 * cycle with TREND_CACHE.
 */
final class LineageFixture {
    static final String LAB = "file:///lab/";
    static final String P_JAN = LAB + "raw/logger/2026-01.csv";
    static final String P_FEB = LAB + "raw/logger/2026-02.csv";
    static final String P_MAR = LAB + "raw/logger/2026-03.csv";
    static final String SITES = LAB + "ref/sites.csv";
    static final String READINGS = LAB + "work/readings.parquet";
    static final String ENRICHED = LAB + "work/enriched.parquet";
    static final String FLAGGED = LAB + "work/flagged.parquet";
    static final String SUMMARY = LAB + "db/level_summary";
    static final String FIGURE = LAB + "figures/levels.png";
    static final String TREND = LAB + "work/trend.parquet";
    static final String TREND_CACHE = LAB + "work/trend_cache/";

    static final String MERGE = LAB + "scripts/merge.py";
    static final String JOIN = LAB + "scripts/join.py";
    static final String QC = LAB + "scripts/qc.py";
    static final String SUMMARISE = LAB + "scripts/summary.sql";
    static final String PLOT = LAB + "scripts/plot.py";
    static final String TRENDS = LAB + "scripts/trend.py";
    static final String CACHE = LAB + "scripts/cache.py";

    static final String QC_RUN = "run-qc-0001";

    /** One row of the edge table: name, endpoints, script, evidence, confidence, run and column flows. */
    record Edge(String name, String from, String to, String script, Evidence evidence, double confidence,
            String runId, List<ColumnFlow> columns) {
        EdgeSeen seen() {
            return new EdgeSeen(from, to, script, "h-" + name, runId, evidence, confidence, columns);
        }
    }

    static final Map<String, Edge> EDGES = edges(
            new Edge("e1", P_JAN, READINGS, MERGE, Evidence.STATIC, 1.0, null, partitionColumns()),
            new Edge("e2", P_FEB, READINGS, MERGE, Evidence.STATIC, 1.0, null, partitionColumns()),
            new Edge("e3", P_MAR, READINGS, MERGE, Evidence.STATIC, 1.0, null, partitionColumns()),
            new Edge("e4", SITES, ENRICHED, JOIN, Evidence.STATIC, 0.9, null, List.of(
                    influencing("site_id"), direct("site_name", "site_name"))),
            new Edge("e5", READINGS, ENRICHED, JOIN, Evidence.STATIC, 0.9, null, List.of(
                    influencing("site_id"), direct("ts", "ts"), direct("level_cm", "level_cm"))),
            new Edge("e6", READINGS, FLAGGED, QC, Evidence.RUNTIME, 1.0, QC_RUN, List.of(
                    derived("level_cm", "flag"), direct("ts", "ts"))),
            new Edge("e7", ENRICHED, SUMMARY, SUMMARISE, Evidence.STATIC, 0.8, null, List.of(
                    direct("site_name", "site_name"), derived("level_cm", "mean_level"), influencing("ts"))),
            new Edge("e8", FLAGGED, SUMMARY, SUMMARISE, Evidence.RUNTIME, 0.95, null, List.of(
                    influencing("flag"))),
            new Edge("e9", SUMMARY, FIGURE, PLOT, Evidence.DECLARED, 0.5, null, List.of(
                    new ColumnFlow("mean_level", null, ColumnRole.DERIVED), influencing("site_name"))),
            new Edge("e10", SUMMARY, TREND, TRENDS, Evidence.STATIC, 0.9, null, List.of(
                    direct("mean_level", "mean_level"), direct("site_name", "site_name"))),
            new Edge("e11", TREND, TREND, TRENDS, Evidence.STATIC, 0.9, null, List.of(
                    direct("mean_level", "mean_level"), derived("mean_level", "trend"))),
            new Edge("e12", TREND, TREND_CACHE, CACHE, Evidence.INFERRED, 0.7, null, List.of(
                    direct("trend", "trend"))),
            new Edge("e13", TREND_CACHE, TREND, CACHE, Evidence.INFERRED, 0.7, null, List.of(
                    direct("trend", "trend"))));

    final Catalog catalog;
    final long loggerSource;
    final long labSource;

    private LineageFixture(Catalog catalog, long loggerSource, long labSource) {
        this.catalog = catalog;
        this.loggerSource = loggerSource;
        this.labSource = labSource;
    }

    /** Applies the fixture through the real ingestor: datasets and scripts in one batch, edges in a second. */
    static LineageFixture ingest(Catalog catalog) {
        // The source rows' own timestamps do not matter; a separate clock keeps a stepping test clock's times.
        Sources sources = new Sources(catalog.store(), Clock.systemUTC());
        long logger = sources.ensure("logger-drop", "folder", LAB + "raw/logger/");
        long lab = sources.ensure("lab-share", "folder", LAB);
        List<Observation> things = new ArrayList<>();
        things.add(dataset(P_JAN, DatasetKind.FILE, logger));
        things.add(dataset(P_FEB, DatasetKind.FILE, logger));
        things.add(dataset(P_MAR, DatasetKind.FILE, logger));
        things.add(dataset(SITES, DatasetKind.FILE, lab));
        things.add(dataset(READINGS, DatasetKind.FILE, lab));
        things.add(dataset(ENRICHED, DatasetKind.FILE, lab));
        things.add(dataset(FLAGGED, DatasetKind.FILE, lab));
        things.add(dataset(SUMMARY, DatasetKind.TABLE, lab));
        things.add(dataset(FIGURE, DatasetKind.FIGURE, lab));
        things.add(dataset(TREND, DatasetKind.FILE, lab));
        things.add(dataset(TREND_CACHE, DatasetKind.FILE_SET, lab));
        for (String script : List.of(MERGE, JOIN, QC, SUMMARISE, PLOT, TRENDS, CACHE)) {
            Language language = script.endsWith(".sql") ? Language.SQL : Language.PYTHON;
            things.add(new ScriptSeen(script, script.substring(LAB.length()), language, lab, 100L, null, "s-" + script, null, null, null, List.of()));
        }
        catalog.ingestor().apply("test", things);
        LineageFixture fixture = new LineageFixture(catalog, logger, lab);
        fixture.recordRun();
        catalog.ingestor().apply("test", EDGES.values().stream().map(Edge::seen).toList());
        return fixture;
    }

    /** No observation reports runs yet (runtime connectors are a later issue); this row stands in for one. */
    private void recordRun() {
        OffsetDateTime t = OffsetDateTime.ofInstant(Instant.parse("2026-03-01T00:00:00Z"), ZoneOffset.UTC);
        catalog.store().dsl().insertInto(RUN)
                .set(RUN.ID, QC_RUN)
                .set(RUN.SCRIPT_ID, script(QC))
                .set(RUN.STARTED_AT, t)
                .set(RUN.ARGUMENTS, "[]")
                .set(RUN.RECEIVED_AT, t)
                .execute();
    }

    long id(String datasetUri) {
        return catalog.store().dsl().select(DATASET.ID).from(DATASET).where(DATASET.URI.eq(datasetUri))
                .fetchSingle(DATASET.ID);
    }

    long script(String scriptUri) {
        return catalog.store().dsl().select(SCRIPT.ID).from(SCRIPT).where(SCRIPT.URI.eq(scriptUri))
                .fetchSingle(SCRIPT.ID);
    }

    /** The store id of the current row of a fixture edge, found by its natural key. */
    long edgeId(String name) {
        Edge e = EDGES.get(name);
        return catalog.store().dsl().select(LINEAGE_EDGE.ID).from(LINEAGE_EDGE)
                .where(LINEAGE_EDGE.SOURCE_DATASET_ID.eq(id(e.from())), LINEAGE_EDGE.TARGET_DATASET_ID.eq(id(e.to())),
                        LINEAGE_EDGE.SCRIPT_ID.eq(script(e.script())), LINEAGE_EDGE.EVIDENCE.eq(e.evidence().word()),
                        LINEAGE_EDGE.VALID_TO.isNull())
                .fetchSingle(LINEAGE_EDGE.ID);
    }

    /** The hop a path should list for a fixture edge, from the edge table above. */
    Hop hop(String name) {
        Edge e = EDGES.get(name);
        return new Hop(edgeId(name), id(e.from()), id(e.to()), script(e.script()), e.runId(), e.evidence(),
                e.confidence());
    }

    List<Hop> hops(String... names) {
        return java.util.Arrays.stream(names).map(this::hop).toList();
    }

    /** A column hop of a fixture edge; {@code toColumn} null is the target dataset as a whole. */
    ColumnHop columnHop(String name, String fromColumn, String toColumn, ColumnRole role) {
        Edge e = EDGES.get(name);
        return new ColumnHop(edgeId(name), column(e.from(), fromColumn), column(e.to(), toColumn), role,
                script(e.script()), e.runId(), e.evidence(), e.confidence());
    }

    ColumnKey column(String datasetUri, String column) {
        return new ColumnKey(id(datasetUri), column);
    }

    static DatasetSeen dataset(String uri, DatasetKind kind, Long source) {
        return new DatasetSeen(uri, uri.substring(LAB.length()), kind, source, "csv", 10L, null, null, null, false,
                null, null, null);
    }

    private static List<ColumnFlow> partitionColumns() {
        return List.of(direct("site_id", "site_id"), direct("ts", "ts"), derived("level_raw", "level_cm"));
    }

    static ColumnFlow direct(String from, String to) {
        return new ColumnFlow(from, to, ColumnRole.DIRECT);
    }

    static ColumnFlow derived(String from, String to) {
        return new ColumnFlow(from, to, ColumnRole.DERIVED);
    }

    static ColumnFlow influencing(String from) {
        return new ColumnFlow(from, null, ColumnRole.INFLUENCING);
    }

    private static Map<String, Edge> edges(Edge... edges) {
        Map<String, Edge> byName = new LinkedHashMap<>();
        for (Edge e : edges) {
            byName.put(e.name(), e);
        }
        return byName;
    }
}
