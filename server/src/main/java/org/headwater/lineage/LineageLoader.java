package org.headwater.lineage;

import static org.headwater.store.schema.Tables.COLUMN_LINEAGE;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;

import java.time.Instant;
import java.util.ArrayList;
import java.util.Collection;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.function.Consumer;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.model.DatasetKind;
import org.headwater.model.Evidence;
import org.headwater.store.Store;
import org.headwater.store.Validity;
import org.jooq.DSLContext;
import org.jooq.Record;

/**
 * Reads the rows the lineage graph is made of: dataset identities, lineage edges and their column flows,
 * either in bulk (everything in force now or at an instant) or by id (what a committed batch changed).
 */
public final class LineageLoader {
    /** Rows travel from H2 in pages of this size, so a million edges never sit in one result list. */
    private static final int FETCH_SIZE = 10_000;
    /** Keeps {@code id in (…)} lists to a size every database accepts. */
    private static final int CHUNK = 1_000;

    private final DSLContext db;

    public LineageLoader(Store store) {
        this.db = store.dsl();
    }

    /** Every dataset identity; identities are never deleted, so this is the same for any instant. */
    public void datasets(Consumer<DatasetRow> sink) {
        try (var cursor = db.select(DATASET.ID, DATASET.KIND, DATASET.SOURCE_ID).from(DATASET)
                .orderBy(DATASET.ID).fetchSize(FETCH_SIZE).fetchLazy()) {
            for (Record r : cursor) {
                sink.accept(datasetRow(r));
            }
        }
    }

    public List<DatasetRow> datasets(Collection<Long> ids) {
        List<DatasetRow> rows = new ArrayList<>();
        for (List<Long> chunk : chunks(ids)) {
            db.select(DATASET.ID, DATASET.KIND, DATASET.SOURCE_ID).from(DATASET).where(DATASET.ID.in(chunk))
                    .orderBy(DATASET.ID).forEach(r -> rows.add(datasetRow(r)));
        }
        return rows;
    }

    /** Edges in force at {@code asOf} (now when null), in id order. */
    public void edges(Instant asOf, Consumer<EdgeRow> sink) {
        var e = LINEAGE_EDGE;
        try (var cursor = edgeSelect().where(Validity.at(e.VALID_FROM, e.VALID_TO, asOf)).orderBy(e.ID)
                .fetchSize(FETCH_SIZE).fetchLazy()) {
            for (Record r : cursor) {
                sink.accept(edgeRow(r));
            }
        }
    }

    /** Edge rows by id, current or not, in id order; ids the store does not hold are left out. */
    public List<EdgeRow> edgesById(Collection<Long> ids) {
        List<EdgeRow> rows = new ArrayList<>();
        for (List<Long> chunk : chunks(ids)) {
            edgeSelect().where(LINEAGE_EDGE.ID.in(chunk)).orderBy(LINEAGE_EDGE.ID).forEach(r -> rows.add(edgeRow(r)));
        }
        rows.sort((a, b) -> Long.compare(a.id(), b.id()));
        return rows;
    }

    /**
     * Every column flow the store holds, of every edge version, one list per edge version in id order,
     * flows in the order they were recorded (the order influencing flows are spread over target columns).
     * A bulk load keeps the lists of the edge versions it loaded: that picks the flows in force at any
     * instant without joining the edge table, which would read the same rows and cost a lookup each.
     */
    public void columnFlows(Consumer<List<ColumnFlowRow>> sink) {
        var c = COLUMN_LINEAGE;
        try (var cursor = db.select(c.EDGE_ID, c.SOURCE_COLUMN, c.TARGET_COLUMN, c.ROLE).from(c)
                .orderBy(c.EDGE_ID, c.ID)
                .fetchSize(FETCH_SIZE).fetchLazy()) {
            List<ColumnFlowRow> group = new ArrayList<>();
            for (Record r : cursor) {
                ColumnFlowRow row = flowRow(r);
                if (!group.isEmpty() && group.get(0).edgeId() != row.edgeId()) {
                    sink.accept(group);
                    group = new ArrayList<>();
                }
                group.add(row);
            }
            if (!group.isEmpty()) {
                sink.accept(group);
            }
        }
    }

    /** Column flows of the given edges, keyed by edge id; edges without flows are absent. */
    public Map<Long, List<ColumnFlowRow>> columnFlowsOf(Collection<Long> edgeIds) {
        Map<Long, List<ColumnFlowRow>> flows = new LinkedHashMap<>();
        var c = COLUMN_LINEAGE;
        for (List<Long> chunk : chunks(edgeIds)) {
            db.select(c.EDGE_ID, c.SOURCE_COLUMN, c.TARGET_COLUMN, c.ROLE).from(c).where(c.EDGE_ID.in(chunk))
                    .orderBy(c.EDGE_ID, c.ID)
                    .forEach(r -> {
                        ColumnFlowRow row = flowRow(r);
                        flows.computeIfAbsent(row.edgeId(), k -> new ArrayList<>()).add(row);
                    });
        }
        return flows;
    }

    private org.jooq.SelectJoinStep<? extends Record> edgeSelect() {
        var e = LINEAGE_EDGE;
        return db.select(e.ID, e.SOURCE_DATASET_ID, e.TARGET_DATASET_ID, e.SCRIPT_ID, e.RUN_ID, e.EVIDENCE,
                e.CONFIDENCE, e.VALID_TO).from(e);
    }

    private static EdgeRow edgeRow(Record r) {
        var e = LINEAGE_EDGE;
        return new EdgeRow(r.get(e.ID), r.get(e.SOURCE_DATASET_ID), r.get(e.TARGET_DATASET_ID), r.get(e.SCRIPT_ID),
                r.get(e.RUN_ID), Evidence.of(r.get(e.EVIDENCE)), r.get(e.CONFIDENCE), r.get(e.VALID_TO) == null);
    }

    private static DatasetRow datasetRow(Record r) {
        return new DatasetRow(r.get(DATASET.ID), DatasetKind.of(r.get(DATASET.KIND)), r.get(DATASET.SOURCE_ID));
    }

    private static ColumnFlowRow flowRow(Record r) {
        var c = COLUMN_LINEAGE;
        return new ColumnFlowRow(r.get(c.EDGE_ID), r.get(c.SOURCE_COLUMN), r.get(c.TARGET_COLUMN),
                ColumnRole.valueOf(r.get(c.ROLE).toUpperCase(Locale.ROOT)));
    }

    private static List<List<Long>> chunks(Collection<Long> ids) {
        List<Long> all = List.copyOf(ids);
        List<List<Long>> chunks = new ArrayList<>();
        for (int i = 0; i < all.size(); i += CHUNK) {
            chunks.add(all.subList(i, Math.min(all.size(), i + CHUNK)));
        }
        return chunks;
    }
}
