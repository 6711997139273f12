package org.headwater.lineage;

import static org.headwater.store.schema.Tables.COLUMN_LINEAGE;
import static org.headwater.store.schema.Tables.DATASET;
import static org.headwater.store.schema.Tables.LINEAGE_EDGE;
import static org.headwater.store.schema.Tables.SCRIPT;

import java.time.OffsetDateTime;
import java.util.ArrayList;
import java.util.List;
import java.time.ZoneOffset;
import java.util.Locale;
import org.headwater.ingest.Observation.ColumnRole;
import org.headwater.model.Evidence;
import org.headwater.store.Store;
import org.jooq.BatchBindStep;
import org.jooq.DSLContext;

/**
 * Writes a {@link SyntheticLineage} into a catalog store with jOOQ batches, below the ingestor: a million
 * edges one observation at a time would measure the ingestion path, not the closure.
 */
final class BenchmarkStore {
    private static final int BATCH = 10_000;
    private static final OffsetDateTime T = OffsetDateTime.of(2026, 3, 1, 0, 0, 0, 0, ZoneOffset.UTC);

    private BenchmarkStore() {
    }

    static void fill(Store store, SyntheticLineage g) {
        DSLContext db = store.dsl();
        Batch datasets = new Batch(db, db.insertInto(DATASET, DATASET.ID, DATASET.URI, DATASET.NAME, DATASET.KIND,
                DATASET.FIRST_SEEN).values((Long) null, null, null, null, null));
        for (long id = 1; id <= g.datasets(); id++) {
            String name = "bench/layer-" + ((id - 1) / (g.datasets() / g.layers())) + "/set-" + id + ".parquet";
            datasets.add(id, "file:///" + name, name, "file", T);
        }
        datasets.flush();
        Batch scripts = new Batch(db, db.insertInto(SCRIPT, SCRIPT.ID, SCRIPT.URI, SCRIPT.NAME, SCRIPT.LANGUAGE,
                SCRIPT.FIRST_SEEN).values((Long) null, null, null, null, null));
        for (long id = 1; id <= g.scripts(); id++) {
            scripts.add(id, "file:///bench/scripts/step-" + id + ".py", "scripts/step-" + id + ".py", "python", T);
        }
        scripts.flush();
        Evidence[] evidence = Evidence.values();
        Batch edges = new Batch(db, db.insertInto(LINEAGE_EDGE, LINEAGE_EDGE.ID, LINEAGE_EDGE.SOURCE_DATASET_ID,
                LINEAGE_EDGE.TARGET_DATASET_ID, LINEAGE_EDGE.SCRIPT_ID, LINEAGE_EDGE.EVIDENCE, LINEAGE_EDGE.CONFIDENCE,
                LINEAGE_EDGE.FINGERPRINT, LINEAGE_EDGE.VALID_FROM)
                .values((Long) null, null, null, null, null, null, null, null));
        for (int e = 0; e < g.edges(); e++) {
            edges.add((long) e + 1, g.source()[e], g.target()[e], (long) g.script()[e], evidence[g.evidence()[e]].word(),
                    g.confidence()[e], "bench", T);
        }
        edges.flush();
        ColumnRole[] roles = ColumnRole.values();
        Batch flows = new Batch(db, db.insertInto(COLUMN_LINEAGE, COLUMN_LINEAGE.ID, COLUMN_LINEAGE.EDGE_ID,
                COLUMN_LINEAGE.SOURCE_COLUMN, COLUMN_LINEAGE.TARGET_COLUMN, COLUMN_LINEAGE.ROLE)
                .values((Long) null, null, null, null, null));
        for (int e = 0; e < g.edges(); e++) {
            flows.add((long) e + 1, (long) e + 1, SyntheticLineage.column(g.sourceColumn()[e]),
                    SyntheticLineage.column(g.targetColumn()[e]), roles[g.role()[e]].name().toLowerCase(Locale.ROOT));
        }
        flows.flush();
    }

    /** A jOOQ batch of one insert, executed in its own transaction every {@value #BATCH} rows. */
    private static final class Batch {
        private final DSLContext db;
        private final org.jooq.Query insert;
        private final List<Object[]> rows = new ArrayList<>(BATCH);

        Batch(DSLContext db, org.jooq.Query insert) {
            this.db = db;
            this.insert = insert;
        }

        void add(Object... row) {
            rows.add(row);
            if (rows.size() == BATCH) {
                flush();
            }
        }

        void flush() {
            if (rows.isEmpty()) {
                return;
            }
            // One commit per batch: in autocommit mode H2 would commit after every row of the batch.
            db.transaction(configuration -> {
                BatchBindStep step = configuration.dsl().batch(insert);
                for (Object[] row : rows) {
                    step = step.bind(row);
                }
                step.execute();
            });
            rows.clear();
        }
    }
}
